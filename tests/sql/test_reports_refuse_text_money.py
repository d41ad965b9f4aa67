# SPDX-License-Identifier: MIT
"""Every report in sql/ refuses money written as text instead of printing a wrong total.

A CSV loaded with the sqlite3 shell's .import leaves '1,050.00' as TEXT;
SQLite's own sum() reads it as 1 and a report would print a total that looks
right and is not. The reports add with exact_sum(), which stops with an error
that tells the user what to do. The reports are found by glob, so a report
added later is covered without touching this test.
"""
import pathlib
import subprocess

import pytest

from conftest import MODULE, SOURCE

# sql/data_check.sql is the one that must not stop: it lists such rows (test_reports_planted_faults.py).
REPORTS = sorted(r for r in (SOURCE / "sql").glob("*.sql") if r.name != "data_check.sql")
# The hint both refusals end with (the README "Reading shop exports": "'1,050.00'
# stops a report instead of counting as 1").
HINT = ("expected a number; money or quantities written as text must be read with to_amount() "
        "in the view that maps your table (README: \"Your data\")")
# The exact text of the refusal: exact_sum's (ext/sqlite/export_functions.cpp) in a
# report that sums the rows itself, period_totals' (ext/sqlite/period_totals_table.cpp,
# which names the source and the column) in one that reads its totals from it.
REFUSALS = ("exact_sum(): argument 1 (x) = '1,050.00': " + HINT,
            "period_totals(): argument 1 (source) = 'sales': column amount holds '1,050.00': " + HINT)

# Invented rows over two weeks, two items; the amount is TEXT as .import leaves it.
ROWS = [
    ("2026-03-02 10:15:00", "Rye loaf", 2, "'1,050.00'"),
    ("2026-03-03 11:20:00", "Rye loaf", 1, "'4.20'"),
    ("2026-03-04 09:05:00", "Oat bun", 3, "'5.10'"),
    ("2026-03-10 16:40:00", "Oat bun", 1, "'1.70'"),
    ("2026-03-12 08:30:00", "Rye loaf", 2, "'8.40'"),
]


def make_database(path, amount_as_text):
    lines = ["CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount TEXT);"]
    for ts, item, qty, amount in ROWS:
        if not amount_as_text:
            amount = amount.strip("'").replace(",", "")
        lines.append(f"INSERT INTO sales VALUES ('{ts}', '{item}', {qty}, {amount});")
    subprocess.run(["sqlite3", str(path)], input="\n".join(lines), check=True, text=True)


def run_report(database, report):
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    script = f".load {module}\n" + report.read_text()
    return subprocess.run(["sqlite3", "-bail", str(database)], input=script, capture_output=True,
                          text=True, timeout=300)


def test_the_report_library_is_not_empty():
    assert len(REPORTS) >= 1  # common practice: a glob that finds nothing tests nothing


@pytest.mark.parametrize("report", REPORTS, ids=[r.name for r in REPORTS])
def test_a_report_over_text_money_stops_with_the_helpful_error(report, tmp_path):
    database = tmp_path / "text_money.db"
    make_database(database, amount_as_text=True)
    result = run_report(database, report)
    assert result.returncode != 0, f"{report.name} printed a result over TEXT money:\n{result.stdout}"
    assert any(refusal in result.stderr for refusal in REFUSALS), result.stderr
    # No total slipped out before the error (the shell prints rows as they come).
    assert "1050" not in result.stdout and "1,050" not in result.stdout


@pytest.mark.parametrize("report", REPORTS, ids=[r.name for r in REPORTS])
def test_the_same_rows_with_numeric_money_run(report, tmp_path):
    # The control: the error above comes from the text money, not from the rows' shape.
    database = tmp_path / "numeric_money.db"
    make_database(database, amount_as_text=False)
    result = run_report(database, report)
    assert result.returncode == 0, result.stderr


@pytest.mark.parametrize("report", REPORTS, ids=[r.name for r in REPORTS])
def test_every_report_header_states_the_time_basis_and_points_to_to_amount(report):
    # The issue: each report header gains a short "Your data" note (time basis, to_time, to_amount).
    header = report.read_text().split("\nWITH", 1)[0]
    assert 'Your data (README, "Your data")' in header
    assert "to_time(text, format, zone)" in header and "to_amount()" in header
