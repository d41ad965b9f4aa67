#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The test command: installs what is missing, builds, runs every test with ctest.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
# chromium renders the charts in the browser test.
"$root/tests/setup.sh" chromium fonts-dejavu-core
cd "$root/build"
ctest --output-on-failure -j 2 "$@"
