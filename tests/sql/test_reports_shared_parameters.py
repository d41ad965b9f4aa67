# SPDX-License-Identifier: MIT
"""The parameters every report shares mean the same in every report.

@item '*' (every item), one item, and an unknown item (the report stops with
one message naming the closest item, from known_name()), with and without
@by_segment, on a table with a segment column and on one without; a
parameter that makes no sense for a report is refused. Run in the real
sqlite3 shell on a small export written by demo/generate.py.
"""
import datetime as dt
import math
import sqlite3
from zoneinfo import ZoneInfo

import pytest

from report_shell import generate_export, run_report

REPORTS = ["totals", "compare", "trend", "noise_ranking", "weekday_profile", "seasonal_profile", "anomalies",
           "period_bars", "daily_chart"]
ZONE = "America/Denver"


@pytest.fixture(scope="module")
def databases(tmp_path_factory):
    folder = tmp_path_factory.mktemp("shared")
    with_segment = folder / "segments.db"
    generate_export(with_segment, "2024-01-01", "2025-06-29", 0.05)
    without = folder / "plain.db"
    connection = sqlite3.connect(without)
    connection.execute(f"ATTACH '{with_segment}' AS source")
    connection.execute("CREATE TABLE sales AS SELECT ts, item, qty, amount FROM source.sales")
    connection.commit()
    connection.close()
    return {"segment column": with_segment, "no segment column": without}


def run(database, report, **params):
    return run_report(database, report, ZONE, **params)


def items_of(database):
    connection = sqlite3.connect(database)
    names = [row[0] for row in connection.execute("SELECT DISTINCT item FROM sales ORDER BY item")]
    connection.close()
    return names


def dice_closest(wanted, names):
    """oracle: Dice's coefficient of the sets of adjacent letter pairs, case folded, ties by name."""
    def pairs(text):
        text = text.lower()
        return {text[k:k + 2] for k in range(len(text) - 1)}
    def score(name):
        a, b = pairs(wanted), pairs(name)
        return 2 * len(a & b) / (len(a) + len(b)) if a or b else 0.0
    return sorted(names, key=lambda name: (-score(name), name.encode()))[0]


@pytest.mark.parametrize("shape", ["segment column", "no segment column"])
@pytest.mark.parametrize("by_segment", [0, 1])
@pytest.mark.parametrize("report", REPORTS)
def test_every_item_with_a_star(databases, report, by_segment, shape):
    result = run(databases[shape], report, item="*", by_segment=by_segment)
    assert result.returncode == 0, result.stderr
    body = result.stdout
    if report == "period_bars":
        # one bar per period of every item together: '*' draws what no @item draws (the report's header)
        unset = run(databases[shape], report, by_segment=by_segment)
        assert unset.returncode == 0 and body == unset.stdout and "<svg" in body
        return
    names = items_of(databases[shape])
    if report == "daily_chart" and by_segment:
        names = ["all segments"] + (["Millrace", "Quarry Hill", "Lantern Square"] if shape == "segment column" else [])
    # common practice: a report for every item names more than one item (by segment: the segments)
    assert sum(name in body for name in names) >= min(3, len(names))


@pytest.mark.parametrize("shape", ["segment column", "no segment column"])
@pytest.mark.parametrize("report", REPORTS)
def test_one_item_is_that_item_only(databases, report, shape):
    # daily_chart by segment draws segments, not items: its one item is seen per item
    result = run(databases[shape], report, item="Espresso", by_segment=int(report != "daily_chart"))
    assert result.returncode == 0, result.stderr
    others = [name for name in items_of(databases[shape]) if name != "Espresso"]
    # the item chosen, and no other (the charts name their series in the legend)
    assert not any(f"'{name}'" in result.stdout or f">{name}<" in result.stdout for name in others)
    if report not in ("period_bars", "anomalies"):
        assert "Espresso" in result.stdout


@pytest.mark.parametrize("shape", ["segment column", "no segment column"])
@pytest.mark.parametrize("report", REPORTS)
def test_an_unknown_item_stops_the_report_naming_the_closest(databases, report, shape):
    wanted = "espreso"
    closest = dice_closest(wanted, items_of(databases[shape]))
    assert closest == "Espresso"  # the oracle agrees with a reader
    result = run(databases[shape], report, item=wanted, by_segment=1)
    assert result.returncode != 0
    assert (f"known_name(): argument 2 (wanted) = 'espreso': expected one of the items; "
            f"the closest is '{closest}'") in result.stderr
    assert result.stdout.strip() == ""  # nothing printed before the stop


def test_the_totals_of_every_item_match_plain_python_sums(databases):
    # oracle: math.fsum of the rows per (local month, item), zoneinfo for the local calendar
    database = databases["segment column"]
    result = run(database, "totals", item="*", unit="month")
    assert result.returncode == 0, result.stderr
    zone = ZoneInfo(ZONE)
    expected = {}
    connection = sqlite3.connect(database)
    for ts, item, amount in connection.execute("SELECT ts, item, amount FROM sales"):
        local = dt.datetime.fromisoformat(ts).replace(tzinfo=dt.timezone.utc).astimezone(zone)
        expected.setdefault((local.strftime("%Y-%m"), item), []).append(amount)
    # every item has every month of the range, 0 when it sold nothing (the report's header)
    for month in {m for m, _ in expected}:
        for item in {i for _, i in expected}:
            expected.setdefault((month, item), [])
    connection.close()
    rows = [line.split(",") for line in result.stdout.splitlines() if not line.startswith(("'range ", "'left out"))]
    got = {(r[0].strip("'"), r[2].strip("'")): float(r[8]) for r in rows if r[1] == "'all segments'"}
    assert set(got) == set(expected)
    for key, amounts in expected.items():
        assert got[key] == round(math.fsum(amounts), 2), key


@pytest.mark.parametrize("report, parameter, value, message", [
    ("trend", "unit", "month", "@unit = 'month': trend.sql judges whole ISO weeks; it takes no @unit"),
    ("noise_ranking", "last", 4, "@last = 4: noise_ranking.sql decomposes every whole day of the range"),
    ("weekday_profile", "unit", "month", "@unit = 'month': weekday_profile.sql profiles days"),
    ("seasonal_profile", "unit", "week", "@unit = 'week': seasonal_profile.sql profiles weekdays and months"),
    ("anomalies", "unit", "week", "@unit = 'week': anomalies.sql scores days"),
    ("period_bars", "start", "2024-03-04", "@start = '2024-03-04': period_bars.sql draws the last @last periods"),
    ("daily_chart", "unit", "week", "@unit = 'week': daily_chart.sql draws days"),
])
def test_a_parameter_that_makes_no_sense_is_refused(databases, report, parameter, value, message):
    # the issue: a report refuses a parameter it cannot use rather than ignoring it
    result = run(databases["segment column"], report, **{parameter: value})
    assert result.returncode != 0
    assert message in result.stderr
