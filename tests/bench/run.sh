#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The job-level benchmark: report jobs timed four ways, each way in its own
# process, on a seeded sales table generated once and cached in build/bench/.
#   tests/bench/run.sh [rows]        (default 10,000,000)
# Prints one table (seconds, almanac's ratios, peak memory per process, the
# issue's targets met or not, the bare scan), checks that the ways give the same
# answers (exit 1 if not: tests/bench/same_answers.py), then the per-row key
# cost beside SQLite's date(ts) with callgrind instruction counts on 200,000
# rows (skipped below 1,000,000 rows, the quick run CI makes to keep the script
# working and the answers checked). Needs GNU time and valgrind.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
rows="${1:-10000000}"
export ALMANAC_MODULE="${ALMANAC_MODULE:-$root/build/almanac.so}"
status=0
/usr/bin/python3 "$root/tests/bench/bench_jobs.py" "$rows" || status=$?
if [ "$rows" -ge 1000000 ]; then
  echo
  /usr/bin/python3 "$root/tests/bench/bench_periods.py" 2000000 --instructions
fi
exit $status
