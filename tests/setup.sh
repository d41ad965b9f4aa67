#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Shared by demo/run.sh and tests/run.sh: checks that the Debian packages are
# installed (installs the missing ones as root; otherwise prints the one apt-get
# line to run), then builds.
#   tests/setup.sh                      runtime: what the demo and a report need
#   tests/setup.sh --tests [package ...] runtime + the test packages + the given ones
#   tests/setup.sh --list               prints the runtime packages, one a line
# Runtime mode does not touch build/ when it was built after every source changed
# (so a cron job of a non-root user runs a report from a build made by root);
# with --tests the build always runs, as the tests need its test targets.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"

# What building almanac and running the demo need: the compiler, CMake, SQLite,
# the date library, the tz database, and python3 (standard library only) for
# demo/generate.py.
runtime=(g++ cmake make libsqlite3-dev sqlite3 libhowardhinnant-date-dev tzdata python3)
# What the tests need besides: Catch2 and the reference libraries.
# The PostgreSQL extension (ext/postgres) and its tests (tests/postgres) need
# the server and its headers.
tests=(catch2 python3-numpy python3-pandas python3-scipy python3-pytest
       postgresql-15 postgresql-server-dev-15)

with_tests=0
case ${1:-} in
  --list) printf '%s\n' "${runtime[@]}"; exit 0 ;;
  --tests) with_tests=1; shift ;;
esac
packages=("${runtime[@]}")
if [ $with_tests -eq 1 ]; then packages+=("${tests[@]}" "$@"); fi

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

module="$root/build/almanac.so"
# Written after every successful build: a build that changed nothing does not
# relink the module, so the module's own time says nothing.
stamp="$root/build/built.stamp"
if [ $with_tests -eq 0 ] && [ -f "$module" ] && [ -f "$stamp" ] &&
   [ -z "$(find "$root/ext" "$root/CMakeLists.txt" -newer "$stamp" -print -quit)" ]; then
  echo "almanac: $module is current"
  exit 0
fi

# Without Catch2 (a runtime-only machine) the module is built without its tests.
testing=ON
dpkg-query -W -f='${Status}' catch2 2>/dev/null | grep -q "install ok installed" || testing=OFF
cmake -S "$root" -B "$root/build" -DCMAKE_BUILD_TYPE=Release -DBUILD_TESTING=$testing > "$root/build.log" 2>&1 ||
  { cat "$root/build.log"; exit 1; }
cmake --build "$root/build" -j "$(nproc)" >> "$root/build.log" 2>&1 ||
  { cat "$root/build.log"; exit 1; }
touch "$stamp"
echo "almanac: built $module"
