# SPDX-License-Identifier: MIT
"""@by_segment in the reports that gained it later: rows for all segments and for each one.

A seeded fixture of three shops (segments). For each report:
- with @by_segment 0 (and unset) the rows have no segment column;
- with @by_segment 1 the 'all segments' rows, less their segment column, are the
  @by_segment 0 rows, in the same order;
- each segment's rows are the report run on a table holding only that segment's
  rows (and no segment column at all);
- where a column adds up, it is also checked against math.fsum over the rows.
"""
import datetime as dt
import json
import math
import random
import sqlite3
from zoneinfo import ZoneInfo

import pytest

from conftest import SOURCE, run_shell
from test_season_reports import report  # runs sql/<name>.sql in the shell's JSON mode

ZONE = "America/Denver"
SEGMENTS = ("Harbour", "Market", "Station")
ITEMS = {"Barley roll": 1.25, "Fig tart": 3.5, "Mint tea": 2.25}  # binary fractions: sums are exact
FIRST = dt.date(2025, 3, 3)   # a Monday (date.isoweekday)
DAYS = 170                    # 24 weeks and 2 days: the last week is cut
# Parameters each report is run with besides @by_segment (a low threshold, so that every
# segment lists some days).
REPORTS = {
    "anomalies": {"zone": ZONE, "threshold": 2.0},
    "seasonal_profile": {"zone": ZONE},
    "noise_ranking": {"zone": ZONE},
    "trend": {"zone": ZONE},
    "weekday_profile": {"zone": ZONE, "item": "*"},
}


def fixture_rows():
    """Invented sales: each shop with its own level and weekday, Station opening later."""
    rng = random.Random(2025)
    zone = ZoneInfo(ZONE)
    rows = []
    for n in range(DAYS):
        day = FIRST + dt.timedelta(days=n)
        for s, segment in enumerate(SEGMENTS):
            if segment == "Station" and n < 40:
                continue  # a segment whose range starts later than the others'
            if day.isoweekday() == 1 + 2 * s:
                continue  # each shop closed on its own weekday
            for item, price in ITEMS.items():
                for _ in range(rng.randrange(0, 4 + s + n // 40)):
                    local = dt.datetime.combine(day, dt.time(7 + rng.randrange(12), rng.randrange(60)),
                                                tzinfo=zone)
                    utc = local.astimezone(dt.timezone.utc).strftime("%Y-%m-%d %H:%M:%S")
                    qty = 1 + rng.randrange(3)
                    rows.append((utc, item, qty, qty * price, segment))
    return rows


def write(path, rows, with_segment):
    connection = sqlite3.connect(path)
    if with_segment:
        connection.execute("CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL, segment TEXT)")
        connection.executemany("INSERT INTO sales VALUES (?, ?, ?, ?, ?)", rows)
    else:
        connection.execute("CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL)")
        connection.executemany("INSERT INTO sales VALUES (?, ?, ?, ?)", [r[:4] for r in rows])
    connection.commit()
    connection.close()
    return path


@pytest.fixture(scope="module")
def shops(tmp_path_factory):
    folder = tmp_path_factory.mktemp("segments")
    rows = fixture_rows()
    databases = {"all": write(folder / "all.db", rows, True)}
    for segment in SEGMENTS:
        databases[segment] = write(folder / f"{segment}.db", [r for r in rows if r[4] == segment], False)
    return rows, databases


def without_segment(rows):
    return [{k: v for k, v in r.items() if k != "segment"} for r in rows]


@pytest.mark.parametrize("name", sorted(REPORTS))
def test_by_segment_rows_are_the_report_on_each_segment_alone(shops, name):
    _, databases = shops
    params = REPORTS[name]
    plain = report(databases["all"], name, **params)
    assert plain, name  # common practice: an empty report would compare nothing
    assert "segment" not in plain[0]  # the brief: with @by_segment unset the columns stay as they were
    assert report(databases["all"], name, by_segment=0, **params) == plain  # 0 is the default (header)
    split = report(databases["all"], name, by_segment=1, **params)
    assert list(split[0])[0] == "segment"  # the brief: segment comes first
    assert [r["segment"] for r in split][:len(plain)] == ["all segments"] * len(plain)
    # oracle: the report itself with @by_segment 0 on the same table
    assert without_segment([r for r in split if r["segment"] == "all segments"]) == plain
    assert sorted({r["segment"] for r in split}) == sorted(SEGMENTS + ("all segments",))
    for segment in SEGMENTS:
        alone = report(databases[segment], name, **params)
        assert alone, (name, segment)
        # oracle: the report itself on a table holding only that segment's rows
        assert without_segment([r for r in split if r["segment"] == segment]) == alone, (name, segment)


def local_day(utc_text):
    instant = dt.datetime.fromisoformat(utc_text).replace(tzinfo=dt.timezone.utc)
    return instant.astimezone(ZoneInfo(ZONE)).date()


def test_noise_ranking_means_add_up_per_segment(shops):
    rows, databases = shops
    split = report(databases["all"], "noise_ranking", zone=ZONE, by_segment=1)
    assert len(split) == 3 * (1 + len(SEGMENTS))  # every item sells in every shop (fixture_rows)
    for r in split:
        mine = [a for _, item, _, a, seg in rows
                if item == r["item"] and (r["segment"] == "all segments" or seg == r["segment"])]
        days = [local_day(ts) for ts, item, _, _, seg in rows
                if r["segment"] == "all segments" or seg == r["segment"]]
        # oracle: the local days from the segment's first to its last (zoneinfo, datetime)
        count = (max(days) - min(days)).days + 1
        assert r["days"] == count, r
        # oracle: math.fsum of the segment's amounts over its days, rounded as the report rounds
        assert abs(r["mean_per_day"] - math.fsum(mine) / count) <= 0.005 + 1e-9, r


def test_weekday_amounts_add_up_per_segment(shops):
    rows, databases = shops
    split = report(databases["all"], "weekday_profile", zone=ZONE, item="*", by_segment=1)
    names = ["Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday", "Sunday"]
    assert len(split) == 7 * 3 * (1 + len(SEGMENTS))  # 7 weekdays x 3 items x 4 segment rows
    for r in split:
        mine = [a for ts, item, _, a, seg in rows
                if item == r["item"] and (r["segment"] == "all segments" or seg == r["segment"])
                and names[local_day(ts).weekday()] == r["weekday"]]
        # oracle: math.fsum of the amounts on that local weekday (zoneinfo, date.weekday)
        assert abs(r["amount"] - math.fsum(mine)) <= 0.005 + 1e-9, r
    closed = {r["segment"]: r for r in split if r["item"] == "Fig tart" and r["days_with_sales"] == 0}
    # oracle: fixture_rows closes Harbour on Mondays, Market on Wednesdays, Station on Fridays
    assert {s: closed[s]["weekday"] for s in SEGMENTS} == {"Harbour": "Monday", "Market": "Wednesday",
                                                         "Station": "Friday"}


def chart_points(path, view=None, **params):
    """The points sql/daily_chart.sql leaves in temp.chart_points, as (series, day, layer, value)."""
    lines = "".join(f".parameter set @{k} \"'{v}'\"\n" if isinstance(v, str) else f".parameter set @{k} {v}\n"
                    for k, v in params.items())
    script = (lines + (view + ";\n" if view else "") + ".output /dev/null\n"
              + (SOURCE / "sql" / "daily_chart.sql").read_text() + "\n.output stdout\n.mode json\n"
              + "SELECT item, day, layer, value FROM temp.chart_points ORDER BY item, layer, day;\n")
    output = run_shell(script, database=str(path))
    return [tuple(r.values()) for r in json.loads(output)] if output.strip() else []


def test_daily_chart_draws_one_series_per_segment(shops):
    rows, databases = shops
    span = {"zone": ZONE, "start": FIRST.isoformat(), "stop": (FIRST + dt.timedelta(days=DAYS)).isoformat()}
    split = chart_points(databases["all"], by_segment=1, **span)
    assert sorted({p[0] for p in split}) == sorted(SEGMENTS + ("all segments",))
    # One series of every item together: a view naming every sale's item alike.
    together = "CREATE TEMP VIEW sales AS SELECT ts, 'together' AS item, qty, amount FROM main.sales"
    for segment, path in [("all segments", databases["all"])] + [(s, databases[s]) for s in SEGMENTS]:
        mine = [p[1:] for p in split if p[0] == segment]
        # oracle: the chart itself on that segment's rows alone, with the same days
        assert mine == [p[1:] for p in chart_points(path, view=together, top=1, **span)], segment
        sold = {}
        for ts, _, _, a, seg in rows:
            if segment in (seg, "all segments"):
                sold.setdefault(local_day(ts).isoformat(), []).append(a)
        for day, layer, value in mine:
            if layer == "raw":
                # oracle: math.fsum of the day's amounts (zoneinfo for the local day), in cents
                assert abs(value - round(math.fsum(sold.get(day, [])), 2)) <= 1e-9, (segment, day)
    assert len(split) == 4 * 2 * DAYS  # 4 series x (raw, smooth) x every day of the range
