# SPDX-License-Identifier: MIT
"""Every report in sql/ cleans up the temp objects it makes to read period_totals.

A report that reads its day totals with period_totals makes, for @by_segment,
a temp view whose item is [segment, item] (period_totals keys by item only),
and some gather rows in temp tables. Each drops them at its end, so running
reports one after another in one session, or in a session of your own, leaves
nothing behind but what a report documents: daily_chart.sql leaves its points
in temp.chart_points (its header, "Side effect"). Run with and without
@by_segment, on a table with a segment column and on one without.
"""
import subprocess

import pytest

from conftest import MODULE, SOURCE

REPORTS = sorted((SOURCE / "sql").glob("*.sql"))
# daily_chart.sql's header: "Side effect: leaves the points in the temp table chart_points".
DOCUMENTED = {"daily_chart.sql": ["chart_points"]}

# Invented rows over three weeks, two items, two shops.
ROWS = [
    ("2026-03-02 10:15:00", "Rye loaf", 2, 8.4, "North"),
    ("2026-03-03 11:20:00", "Rye loaf", 1, 4.2, "South"),
    ("2026-03-04 09:05:00", "Oat bun", 3, 5.1, "North"),
    ("2026-03-10 16:40:00", "Oat bun", 1, 1.7, "South"),
    ("2026-03-12 08:30:00", "Rye loaf", 2, 8.4, "North"),
    ("2026-03-19 13:00:00", "Oat bun", 2, 3.4, "North"),
]


def make_database(path, with_segment):
    columns = "ts TEXT, item TEXT, qty INTEGER, amount REAL" + (", segment TEXT" if with_segment else "")
    lines = [f"CREATE TABLE sales({columns});"]
    for ts, item, qty, amount, shop in ROWS:
        values = f"'{ts}', '{item}', {qty}, {amount}" + (f", '{shop}'" if with_segment else "")
        lines.append(f"INSERT INTO sales VALUES ({values});")
    subprocess.run(["sqlite3", str(path)], input="\n".join(lines), check=True, text=True)


@pytest.mark.parametrize("by_segment", [0, 1])
@pytest.mark.parametrize("with_segment", [True, False], ids=["segment column", "no segment column"])
@pytest.mark.parametrize("report", REPORTS, ids=[r.name for r in REPORTS])
def test_a_report_leaves_only_what_it_documents(report, with_segment, by_segment, tmp_path):
    database = tmp_path / "shop.db"
    make_database(database, with_segment)
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    script = (f".load {module}\n.parameter set @by_segment {by_segment}\n" + report.read_text()
              # sqlite_parameters is the shell's own table of the .parameter values
              + "\n.print --temp objects--\n"
              + "SELECT name FROM sqlite_temp_master WHERE name NOT LIKE 'sqlite!_%' ESCAPE '!' ORDER BY name;\n")
    result = subprocess.run(["sqlite3", "-bail", str(database)], input=script, capture_output=True, text=True,
                            timeout=300)
    assert result.returncode == 0, result.stderr
    left = result.stdout.split("--temp objects--\n", 1)[1].split()
    # common practice: a script cleans up its helpers; the header names what it keeps on purpose
    assert left == DOCUMENTED.get(report.name, [])
