#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Runs the locale regression test: generates a German locale (decimal comma,
# '.' for thousands) with localedef into a folder of the test's own, so the
# machine's configured locales do not matter, and points glibc at it with LOCPATH.
#   locale_test.sh <almanac_locale_test binary> <work folder>
set -euo pipefail
binary="$1"
work="$2"
mkdir -p "$work"
if [ ! -f "$work/de_DE.UTF-8/LC_NUMERIC" ]; then
  # localedef exits 1 for warnings about the source data; the files are written all the same.
  localedef -i de_DE -f UTF-8 "$work/de_DE.UTF-8" || [ -f "$work/de_DE.UTF-8/LC_NUMERIC" ]
fi
LOCPATH="$work" exec "$binary" de_DE.UTF-8
