#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The test command: installs what is missing, builds, runs every test with ctest.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
# chromium renders the charts and report.html in the browser tests; poppler-utils
# (pdftoppm) turns the printed report into images.
"$root/tests/setup.sh" --tests chromium fonts-dejavu-core poppler-utils
cd "$root/build"
ctest --output-on-failure -j 2 "$@"
