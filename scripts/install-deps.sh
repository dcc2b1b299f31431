#!/usr/bin/env bash
# Installs the Debian 12 packages Calivera needs to build, test and run; does nothing when they
# are all present. Must run as root (or with sudo available).
set -euo pipefail
packages=(
  build-essential cmake ninja-build pkg-config
  qt6-base-dev qt6-charts-dev qt6-svg-dev libqt6opengl6-dev libgl1-mesa-dev
  libeigen3-dev libboost-math-dev nlohmann-json3-dev libssl-dev libreadstat-dev libpqxx-dev
  postgresql-15
  libgtest-dev libgmock-dev
  poppler-utils fonts-dejavu-core
  clang libclang-rt-14-dev
)
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -eq 0 ]; then
  exit 0
fi
echo "installing: ${missing[*]}"
SUDO=""
[ "$(id -u)" -eq 0 ] || SUDO="sudo"
export DEBIAN_FRONTEND=noninteractive
$SUDO apt-get update -qq
$SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}"
