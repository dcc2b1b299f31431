#!/usr/bin/env bash
# Simulates red-green colour-vision deficiency on screenshots or exported charts, to check that
# every series stays distinguishable by shape or dash pattern alone (issue 12, "Colour and shape").
#
#   scripts/colour-vision.sh OUT_DIR IMAGE...    writes OUT_DIR/NAME.deuteranopia.png and
#                                                OUT_DIR/NAME.protanopia.png for each image
#
# Method: Machado, Oliveira & Fernandes, "A Physiologically-based Model for Simulation of Color
# Vision Deficiency", IEEE TVCG 15(6), 2009, severity 1.0 matrices, applied in linear RGB. The
# matrix entries are the paper's Table 1 as commonly reproduced (written here from memory; a
# simulation aid for looking at images, not a measurement). Needs ImageMagick's `convert`.
set -euo pipefail
out=${1:?usage: colour-vision.sh OUT_DIR IMAGE...}
shift
mkdir -p "$out"
# The system ImageMagick (Debian imagemagick), not a wrapper earlier on PATH.
magick=/usr/bin/convert
[ -x "$magick" ] || magick=convert
deuteranopia="0.367322 0.860646 -0.227968  0.280085 0.672501 0.047413  -0.011820 0.042940 0.968881"
protanopia="0.152286 1.052583 -0.204868  0.114503 0.786281 0.099216  -0.003882 -0.048116 1.051998"
for image in "$@"; do
  name=$(basename "${image%.*}")
  for kind in deuteranopia protanopia; do
    matrix=${!kind}
    "$magick" "$image" -alpha off -colorspace RGB -color-matrix "$matrix" -colorspace sRGB \
      "$out/$name.$kind.png"
  done
done
echo "simulated $(($# * 2)) images in $out"
