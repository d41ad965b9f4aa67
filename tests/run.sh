#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The test command: installs what is missing, builds, runs every test with ctest.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
<<<<<<< HEAD
# chromium renders the charts and report.html in the browser tests; poppler-utils
# (pdftoppm) turns the printed report into images.
"$root/tests/setup.sh" --tests chromium fonts-dejavu-core poppler-utils
=======
# chromium renders the charts in the browser test; clang (with its sanitizer and
# libFuzzer runtimes) and valgrind serve tests/hardening/stages.sh.
"$root/tests/setup.sh" chromium fonts-dejavu-core clang libclang-rt-14-dev valgrind
>>>>>>> a4e7127 (Hardening, first part: libFuzzer harnesses (time values, specs, zone names, chart options, every SQL function discovered from function_list) with seed corpus and replayed regressions; ALMANAC_SANITIZE; allocation-failure test; eight-thread test; tests/hardening/stages.sh (ASan+UBSan, fuzz, TSan, shell under valgrind) run by tests/run.sh)
cd "$root/build"
ctest --output-on-failure -j 2 "$@"
# Sanitizers, fuzzing, threads and valgrind (about 10 minutes); skipped when
# arguments choose a subset of the ctests.
[ $# -gt 0 ] || "$root/tests/hardening/stages.sh"
