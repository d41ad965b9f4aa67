#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Shared by demo/run.sh and tests/run.sh: installs the Debian packages that are
# missing (as root; otherwise prints the one apt-get line to run), then builds.
#   tests/setup.sh [extra-package ...]
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"

packages=(g++ cmake make libsqlite3-dev sqlite3 libhowardhinnant-date-dev catch2 tzdata
          python3 python3-numpy python3-pandas python3-scipy python3-pytest "$@")
missing=()
for package in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$package" 2>/dev/null | grep -q "install ok installed" ||
    missing+=("$package")
done
if [ ${#missing[@]} -gt 0 ]; then
  if [ "$(id -u)" -eq 0 ]; then
    echo "almanac: installing ${missing[*]}"
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -q
    apt-get install -y -q --no-install-recommends "${missing[@]}"
  else
    echo "almanac: missing Debian packages; run this, then try again:" >&2
    echo "  sudo apt-get update && sudo apt-get install -y ${missing[*]}" >&2
    exit 1
  fi
fi

cmake -S "$root" -B "$root/build" -DCMAKE_BUILD_TYPE=Release > "$root/build.log" 2>&1 ||
  { cat "$root/build.log"; exit 1; }
cmake --build "$root/build" -j "$(nproc)" >> "$root/build.log" 2>&1 ||
  { cat "$root/build.log"; exit 1; }
echo "almanac: built $root/build/almanac.so"
