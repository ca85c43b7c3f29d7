#!/usr/bin/env bash
# Installs wirefield's build dependencies from Debian when any is missing.
# Does nothing when everything is present; needs root (or sudo) and apt-get otherwise.
set -euo pipefail
# The second line serves the hardening targets: clang with libFuzzer and the sanitizer
# runtimes (make fuzz), clang-tidy and cppcheck (make lint). The third serves the SVG layout
# test: a headless browser that lays the pictures out, and the font they name first.
packages=(cmake g++ make libeigen3-dev libboost-math-dev libcli11-dev libgtest-dev
          libbenchmark-dev nlohmann-json3-dev libfmt-dev liblapacke-dev libopenblas-dev
          clang libclang-rt-14-dev clang-tidy cppcheck
          chromium fonts-dejavu-core)
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
[ ${#missing[@]} -eq 0 ] && exit 0
echo "install-deps: installing ${missing[*]}"
if [ "$(id -u)" -eq 0 ]; then sudo=""; else sudo="sudo"; fi
export DEBIAN_FRONTEND=noninteractive
if ! $sudo apt-get install -y --no-install-recommends "${missing[@]}"; then
  $sudo apt-get update
  $sudo apt-get install -y --no-install-recommends "${missing[@]}"
fi
