#!/usr/bin/env bash
# Configures and builds Calivera in ./build (Release, Ninja). Extra arguments go to cmake.
set -euo pipefail
cd "$(dirname "$0")/.."
jobs=$(nproc 2>/dev/null || echo 2)
cmake -S . -B build -G Ninja -DCMAKE_BUILD_TYPE=Release "$@" >/dev/null
cmake --build build -j "$jobs"
