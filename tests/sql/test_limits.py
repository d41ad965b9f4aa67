# SPDX-License-Identifier: MIT
"""Every documented limit (README "Limits"): just under it the query works and
its memory stays bounded; just past it, a clear error.

Each query runs in a fresh sqlite3 shell, whose peak memory is read from the
kernel (ru_maxrss of a runner process's only child), so one limit's memory is
not mixed with another's. The bounds are generous multiples of what the data
needs: they catch unbounded growth (a copy per row, a leak per frame), not
small changes.
"""
import subprocess
import sys

import pytest

from conftest import MODULE

MODULE_NAME = MODULE[:-3] if MODULE.endswith(".so") else MODULE
# The rows 1..n: the sqlite3 shell's own generate_series, about a third of the
# work of a recursive CTE for the same 10,000,000 values (the values and their
# order are the same, so the results are too).
ROWS_10M = "WITH r(n) AS (SELECT value FROM generate_series(1, {n})) "


# A fresh Python process runs the shell and reports the kernel's peak for its one child.
RUNNER = """
import resource, subprocess, sys
result = subprocess.run(sys.argv[1:], input=sys.stdin.read(), capture_output=True, text=True)
sys.stdout.write(result.stdout)
sys.stderr.write(result.stderr)
sys.stderr.write(f"\\npeak-kb {resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss}")
sys.exit(result.returncode)
"""


def shell(sql):
    """(stdout, stderr, peak resident memory of the shell in MB)."""
    result = subprocess.run([sys.executable, "-c", RUNNER, "sqlite3", ":memory:"],
                            input=f".load {MODULE_NAME}\n{sql};\n", capture_output=True, text=True, timeout=600)
    assert result.returncode in (0, 1), result.stderr
    stderr, peak = result.stderr.rsplit("\npeak-kb ", 1)
    return result.stdout.strip(), stderr.strip(), int(peak) / 1024


def error_of(stderr):
    return stderr.split(": ", 1)[1] if stderr.startswith("Runtime error") else stderr


# (name, query just under the limit, its expected output, memory bound in MB,
#  query just past the limit, the exact error)
LIMITS = [
    ("order-statistic frame: 10,000,000 values",
     ROWS_10M.format(n=10_000_000) + "SELECT median(n) FROM r", "5000000.5", 1200,
     ROWS_10M.format(n=10_000_001) + "SELECT median(n) FROM r",
     "median(): a group or window frame holds at most 10000000 values; narrow the frame (ROWS n PRECEDING) "
     "or split the group"),
    ("periods() range: 10,000,000 periods",
     "SELECT count(*) FROM periods('2026-01-01', '2026-04-26 17:46:40', 'second')", "10000000", 64,
     "SELECT count(*) FROM periods('2026-01-01', '2026-04-26 17:46:41', 'second')",
     "periods(): the range holds 10000001 periods; at most 10000000 per call: narrow the range or use a "
     "longer spec"),
    ("chart points: 200,000 rows",
     ROWS_10M.format(n=200_000) + "SELECT length(svg_line_chart(n, n % 97, 'a')) > 0 FROM r", "1", 400,
     ROWS_10M.format(n=200_001) + "SELECT length(svg_line_chart(n, n % 97, 'a')) > 0 FROM r",
     "svg_line_chart(): more than 200000 points; a chart holds at most 200000 rows: aggregate first (e.g. one "
     "row per series and day)"),
    ("chart series: 64",
     ROWS_10M.format(n=64) + "SELECT length(svg_line_chart(n, n, 's' || n)) > 0 FROM r", "1", 64,
     ROWS_10M.format(n=65) + "SELECT length(svg_line_chart(n, n, 's' || n)) > 0 FROM r",
     "svg_line_chart(): more than 64 series; a chart holds at most 64 (8 colours x 8 dash patterns): chart "
     "the top items only"),
    ("spec text: 200 bytes",
     "SELECT period_label('2026-03-05', printf('%.197c', ' ') || 'day')", "2026-03-05", 64,
     "SELECT period_label('2026-03-05', printf('%.198c', ' ') || 'day')",
     "period_label(): argument 2 (spec) = '" + " " * 60 + "...': a spec is at most 200 bytes long; this one "
     "has 201"),
    ("format text: 200 bytes",
     "SELECT to_time('2026-03-05' || printf('%.192c', 'x'), '%Y-%m-%d' || printf('%.192c', 'x'))",
     "2026-03-05", 64,
     "SELECT to_time('2026-03-05' || printf('%.193c', 'x'), '%Y-%m-%d' || printf('%.193c', 'x'))",
     "to_time(): argument 2 (format) = '%Y-%m-%d" + "x" * 52 + "...': a format is at most 200 bytes long; "
     "this one has 201"),
    ("options text: 100,000 bytes",
     "SELECT length(svg_line_chart(1, 1, 'a', 'raw', '{' || printf('%.99998c', ' ') || '}')) > 0", "1", 64,
     "SELECT length(svg_line_chart(1, 1, 'a', 'raw', '{' || printf('%.99999c', ' ') || '}')) > 0",
     "svg_line_chart(): argument 5 (options) = '{" + " " * 59 + "...': options are at most 100000 bytes of "
     "JSON; these have 100001"),
]


@pytest.mark.parametrize("name,under,expected,bound_mb,past,error", LIMITS, ids=[limit[0] for limit in LIMITS])
def test_limit(name, under, expected, bound_mb, past, error):
    out, err, peak_mb = shell(under)
    # source: README "Limits" (each value just under its limit works)
    assert (out, err) == (expected, ""), err
    assert peak_mb < bound_mb, f"{name}: {peak_mb:.0f} MB just under the limit"
    out, err, _ = shell(past)
    assert error_of(err) == error  # source: README "Limits", the documented error text
    assert out == ""
