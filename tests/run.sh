#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The test command: installs what is missing, builds, runs every test with ctest.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
# chromium renders the charts and report.html in the browser tests; poppler-utils
# (pdftoppm) turns the printed report into images; clang (with its sanitizer and
# libFuzzer runtimes) and valgrind serve tests/hardening/stages.sh; the package
# test (tests/packaging) needs CPack's dpkg-shlibdeps and file, lintian, gcc and
# pkgconf for its C program (zlib1g-dev for SQLite's private -lz in a static
# link), g++-multilib builds unit.32bit, locales gives the locale test its
# localedef, GNU time measures the processes of the job benchmark (bench.jobs);
# g++-mingw-w64-x86-64-posix, wine64 and npm (which fetches the SQLite
# amalgamation) serve the Windows stage. python3-venv gives the wheel test
# (tests/python) its fresh virtual environment and pip, python3-wheel the wheel
# reader that checks the archive's hashes; the desktop-client test
# (tests/desktop) runs sqlitebrowser under xvfb, drives it with xdotool, reads
# its copied result grid with xclip and takes screenshots with imagemagick.
# python3-psycopg2 is the PostgreSQL client of tests/postgres (label postgres).
# Debian's npm package is asked for only when no npm is on the PATH: a machine
# whose Node.js comes with its own npm (NodeSource's nodejs) refuses Debian's.
# Each stage prints its elapsed seconds (the whole must stay under 30 minutes).
started=$SECONDS
took() { echo "almanac: $1 took $((SECONDS - started)) s"; started=$SECONDS; }
npm_package=()
command -v npm > /dev/null || npm_package=(npm)
"$root/tests/setup.sh" --tests chromium fonts-dejavu-core poppler-utils \
  clang libclang-rt-14-dev valgrind \
  dpkg-dev file lintian gcc pkgconf zlib1g-dev g++-multilib locales time \
  g++-mingw-w64-x86-64-posix gcc-mingw-w64-x86-64-posix wine64 \
  python3-venv python3-wheel xvfb sqlitebrowser xdotool xclip imagemagick python3-psycopg2 \
  "${npm_package[@]}"
took "installing and building"
cd "$root/build"
# The 32-bit unit tests are built only where -m32 links (g++-multilib, installed above).
ctest -N -R '^unit[.]32bit$' | grep -q 'Total Tests: 1' ||
  { echo "almanac: unit.32bit was not built (g++-multilib missing?)" >&2; exit 1; }
ctest --output-on-failure -j 2 "$@"
took ctest
# almanac.dll under wine against the Linux module (about 1 minute on a warm
# machine, 5 on a fresh one); skipped, like the stages below, when arguments
# choose a subset of the ctests.
[ $# -gt 0 ] || { "$root/tests/windows/run.sh"; took "the Windows stage"; }
# Sanitizers, fuzzing, threads and valgrind (about 10 minutes); skipped when
# arguments choose a subset of the ctests.
[ $# -gt 0 ] || { "$root/tests/hardening/stages.sh"; took "the hardening stages"; }
