# SPDX-License-Identifier: MIT
"""period_totals(source, spec [, zone [, start [, stop]]]): ranges, coverage and segments
against an independent aggregation.

DESIGN.md "Period totals in one pass": only rows with start <= ts < stop count, every
period that overlaps [start, stop) is listed, covered_start/covered_end are the part of
the period inside the range; a missing bound comes from the data (local days, or whole
periods for sub-day specs); a segment column gives per-segment rows over each segment's
own range and a rollup (all_segments = 1) whose totals are one exact sum of all rows.
Expected rows: tests/reference/period_totals_oracle.py (plain dicts, math.fsum, zoneinfo
local days, period_oracle periods), never the extension.
"""
import math
import sqlite3
import zlib

import pytest

from conftest import connect
import period_oracle as oracle
from period_oracle import Spec
from period_totals_oracle import (error_of, expected_rows, first_difference, make_sales, same_rows,
                                  seeded_rows, value_order)

dt = oracle.dt
DAY_LOW, DAY_HIGH = dt.datetime(2025, 2, 20), dt.datetime(2026, 2, 5)
HOUR_LOW, HOUR_HIGH = dt.datetime(2025, 10, 30), dt.datetime(2025, 11, 6)

# (spec text, oracle spec, zone, start, stop): bounds as SQL gives them (None: from the data).
# Bare dates are local days in the zone; date-times without offset are UTC.
CASES = [
    ("day", Spec("day"), None, "2025-03-05 13:30", "2025-09-17"),               # cuts both ends
    ("day", Spec("day"), "America/Denver", "2025-03-05 13:30", "2025-11-03 18:00"),
    ("week", Spec("week"), None, "2025-03-05", "2025-09-17 06:00"),
    ("week", Spec("week"), "Europe/Berlin", "2025-03-05", None),                 # only start
    ("week", Spec("week"), "America/Denver", None, "2025-10-29 13:00"),          # only stop
    ("half-month", Spec("half-month"), None, "2025-01-01", "2026-06-01"),        # wider than the data
    ("half-month", Spec("half-month"), "America/Denver", "2025-04-09 12:00", "2025-12-20"),
    ("month", Spec("month"), "Europe/Berlin", "2025-03-31 23:30", "2025-10-26 01:30"),
    ("month", Spec("month"), None, None, None),                                  # the data's own range
    ("quarter", Spec("quarter"), "America/Denver", "2025-05-15", "2026-01-10"),
    ("quarter", Spec("quarter"), None, None, "2025-12-01"),
    ("hour", Spec("hour"), None, "2025-10-31 10:30", "2025-11-04"),
    ("hour", Spec("hour"), "America/Denver", "2025-10-31 10:30", "2025-11-04 09:15"),  # across fall-back
    ("hour", Spec("hour"), "Europe/Berlin", None, None),
]


def bound_ms(text, clock):
    """A bound as an instant: a bare date is the local day's first instant (zoneinfo)."""
    if text is None:
        return None
    if len(text) == 10:
        return clock.first_instant(dt.datetime.fromisoformat(text))
    return oracle.ms_of(dt.datetime.fromisoformat(text))


def period_totals(db, spec, zone, start, stop, source="sales"):
    if zone:
        return db.execute("SELECT * FROM period_totals(?, ?, ?, ?, ?)",
                          (source, spec, zone, start, stop)).fetchall()
    # Without a zone the bounds go by their hidden columns; a missing one is left out.
    given = [(name, value) for name, value in (("start", start), ("stop", stop)) if value is not None]
    where = "".join(f" AND {name} = ?" for name, _ in given)
    return db.execute(f"SELECT * FROM period_totals WHERE source = ? AND spec = ?{where}",
                      (source, spec, *[value for _, value in given])).fetchall()


def check_against_oracle(db, rows, spec_text, spec, zone, start, stop, source="sales", **columns):
    """period_totals' rows equal period_totals_oracle.expected_rows (dicts, math.fsum, zoneinfo
    local days) over the same rows and bounds; returns them."""
    got = period_totals(db, spec_text, zone, start, stop, source)
    clock = oracle.ZoneClock(zone) if zone else oracle.UtcClock()
    want = expected_rows(rows, spec, clock, bound_ms(start, clock), bound_ms(stop, clock), **columns)
    assert same_rows(got, want), first_difference(got, want)  # oracle: period_totals_oracle
    return got


@pytest.mark.parametrize("spec_text,spec,zone,start,stop", CASES,
                         ids=[f"{c[0]}|{c[2]}|{c[3]}|{c[4]}" for c in CASES])
def test_ranges_and_segments_match_an_independent_aggregation(spec_text, spec, zone, start, stop):
    low, high = (HOUR_LOW, HOUR_HIGH) if spec.sub_day else (DAY_LOW, DAY_HIGH)
    seed = zlib.crc32(f"{spec_text}|{zone}|{start}|{stop}".encode())
    rows = seeded_rows(seed, 2000, low, high, kinds=("text", "text", "text", "date"))
    db = connect()
    make_sales(db, rows)
    got = check_against_oracle(db, rows, spec_text, spec, zone, start, stop)
    assert any(r[1] == 0 and r[0] is None for r in got)  # the NULL segment has its own rows
    db.close()


def test_rows_come_rollup_first_then_segment_item_period_with_consecutive_serials():
    rows = seeded_rows(3, 1500, DAY_LOW, DAY_HIGH)
    db = connect()
    make_sales(db, rows)
    got = db.execute("SELECT all_segments, segment, item, serial FROM period_totals('sales', 'week',"
                     " 'America/Denver', '2025-04-02', '2025-11-20 12:00')").fetchall()
    # DESIGN row order: rollup first, then by segment, item, period (SQLite's value order).
    keys = [(-a, value_order(s), value_order(i), serial) for a, s, i, serial in got]
    assert keys == sorted(keys)
    by_series = {}
    for a, s, i, serial in got:
        by_series.setdefault((a, s, i), []).append(serial)
    for serials in by_series.values():
        assert serials == list(range(serials[0], serials[0] + len(serials)))  # consecutive (DESIGN)
    # Every (segment, item) of one range lists the same periods: zero fill (DESIGN).
    assert len({tuple(v) for v in by_series.values()}) == 1


def test_each_segment_has_its_own_range_from_its_own_rows():
    rows = ([("2026-01-07 10:00", "tea", 1, 2.5, "north"), ("2026-01-29 08:00", "tea", 1, 1.5, "north")] +
            [("2026-01-14 12:00", "tea", 1, 4.0, "south"), ("2026-01-15 23:00", "cocoa", 2, 3.0, "south")])
    db = connect()
    make_sales(db, rows)
    got = db.execute("SELECT segment, all_segments, item, label, covered_start, covered_end, amount"
                     " FROM period_totals('sales', 'week')").fetchall()
    want = [tuple(r[k] for k in (0, 1, 2, 5, 7, 8, 11)) for r in expected_rows(rows, Spec("week"))]
    assert same_rows(got, want)  # oracle: period_totals_oracle
    # By hand (ISO weeks, common practice): south runs from Wed 14 to the end of Thu 15 January.
    assert [r for r in got if r[0] == "south"] == [
        ("south", 0, "cocoa", "2026-W03", "2026-01-14", "2026-01-16", 3.0),
        ("south", 0, "tea", "2026-W03", "2026-01-14", "2026-01-16", 4.0)]


def test_the_rollup_is_one_exact_sum_of_all_rows_not_a_sum_of_the_segments_sums():
    rows = [("2026-01-05", "x", 1, 1e16, "a"), ("2026-01-05", "x", 1, 1.0, "a"),
            ("2026-01-05", "x", 1, 1.0, "b"), ("2026-01-05", "x", 1, -1e16, "b")]
    db = connect()
    make_sales(db, rows)
    got = db.execute("SELECT all_segments, segment, amount FROM period_totals('sales', 'day')").fetchall()
    amounts = [r[3] for r in rows]
    assert got[0] == (1, None, math.fsum(amounts))  # oracle: math.fsum of all four rows (= 2.0)
    assert math.fsum([got[1][2], got[2][2]]) != got[0][2]  # the segments' rounded sums would not give it
    assert got[1:] == [(0, "a", math.fsum(amounts[:2])), (0, "b", math.fsum(amounts[2:]))]


def test_the_rollup_equals_math_fsum_of_every_row_of_each_cell_on_seeded_data():
    rows = seeded_rows(8, 3000, DAY_LOW, DAY_HIGH)
    rows = [(ts, item, qty, amount * 1e12 if isinstance(amount, float) and qty == 3 else amount, segment)
            for ts, item, qty, amount, segment in rows]
    db = connect()
    make_sales(db, rows)
    got = db.execute("SELECT item, serial, amount FROM period_totals('sales', 'month', 'Europe/Berlin',"
                     " '2025-03-01', '2026-01-01') WHERE all_segments AND sales > 0").fetchall()
    clock = oracle.ZoneClock("Europe/Berlin")
    low, high = bound_ms("2025-03-01", clock), bound_ms("2026-01-01", clock)
    cells = {}
    for ts, item, _, amount, _ in rows:
        ms = oracle.ms_of(dt.datetime.fromisoformat(ts))
        if low <= ms < high and amount is not None:
            cells.setdefault((item, oracle.period_of(Spec("month"), ms, clock).serial), []).append(amount)
    for item, serial, amount in got:
        values = cells[(item, serial)]
        if any(isinstance(v, float) for v in values):
            assert amount == math.fsum(values)  # oracle: math.fsum over the cell's rows
    assert len(got) == len(cells)


def test_a_source_without_segment_item_or_qty_with_a_range():
    rows = seeded_rows(9, 800, DAY_LOW, DAY_HIGH)
    db = connect()
    make_sales(db, rows, "no_segment", ("ts", "item", "qty", "amount"))
    make_sales(db, rows, "bare", ("ts", "amount"))
    bounds = ("week", Spec("week"), "America/Denver", "2025-06-10", "2025-08-20 17:00")
    got = check_against_oracle(db, rows, *bounds, source="no_segment", has_segment=False)
    assert {r[1] for r in got} == {1}
    check_against_oracle(db, rows, *bounds, source="bare", has_item=False, has_qty=False, has_segment=False)


def test_an_attached_source_with_segments_and_a_range(tmp_path):
    rows = seeded_rows(10, 1200, DAY_LOW, DAY_HIGH)
    shop = sqlite3.connect(tmp_path / "shop 2.db")
    make_sales(shop, rows)
    shop.commit()
    shop.close()
    db = connect()
    db.execute("ATTACH ? AS shop2", (str(tmp_path / "shop 2.db"),))
    check_against_oracle(db, rows, "half-month", Spec("half-month"), "Europe/Berlin", "2025-05-20",
                         "2025-10-02 12:00", source="shop2.sales")


@pytest.mark.parametrize("kind", ["int", "jd"])
def test_covered_bounds_come_back_in_the_representation_of_ts(kind):
    rows = seeded_rows(11, 500, DAY_LOW, DAY_HIGH, kinds=(kind,))
    db = connect()
    make_sales(db, rows)
    check_against_oracle(db, rows, "month", Spec("month"), "America/Denver", "2025-03-10 12:00", "2025-07-04")


def test_a_range_without_rows_lists_nothing_and_an_empty_range_too():
    db = connect()
    make_sales(db, seeded_rows(12, 50, DAY_LOW, DAY_HIGH))
    assert db.execute("SELECT * FROM period_totals('sales', 'week', 'UTC', '2030-01-01', NULL)").fetchall() == []
    assert db.execute("SELECT * FROM period_totals('sales', 'week', 'UTC', '2025-06-01', '2025-06-01')"
                      ).fetchall() == []


def test_a_start_after_the_stop_and_invalid_times_are_errors_naming_the_argument():
    db = connect()
    make_sales(db, [("2026-01-05", "x", 1, 1.0, None)])
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week', 'UTC', '2026-03-01', '2026-02-01')") == (
        "period_totals(): argument 4 (start) = '2026-03-01': expected a time not after stop"
        " (argument 5 = '2026-02-01')")
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week', 'UTC', '2026-02-30', NULL)").startswith(
        "period_totals(): argument 4 (start) = '2026-02-30': ")
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week', 'UTC', NULL, 'soon')").startswith(
        "period_totals(): argument 5 (stop) = 'soon': ")
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week', NULL, x'00', NULL)").startswith(
        "period_totals(): argument 4 (start) = a BLOB of 1 byte: ")


def test_the_memory_limit_counts_every_segment_and_the_rollup():
    db = connect()
    # 2026-01-05 to 2026-02-14 in seconds: 40 * 86400 + 1 = 3,456,001 periods; 2 segments and
    # the rollup x 1 item: 10,368,003 item-period rows, past 10,000,000 (arithmetic).
    rows = [("2026-01-05", "x", 1, 1.0, "a"), ("2026-02-14", "x", 1, 1.0, "b")]
    make_sales(db, rows)
    make_sales(db, rows, "no_segment", ("ts", "item", "qty", "amount"))
    assert error_of(db, "SELECT * FROM period_totals('sales', 'second')") == (
        "period_totals(): argument 1 (source) = 'sales': 1 item over 3456001 periods in 2 segments and"
        " their rollup are more item-period rows than the limit of 10000000: use a longer period,"
        " a shorter range or a smaller source")
    assert db.execute("SELECT count(*) FROM period_totals('no_segment', 'second')").fetchone() == (3456001,)
    # A range wider than the data counts too: 120 days of seconds (arithmetic: 10,368,000).
    assert error_of(db, "SELECT * FROM period_totals('no_segment', 'second', 'UTC', '2026-01-01',"
                        " '2026-05-01')") == (
        "period_totals(): argument 1 (source) = 'no_segment': 1 item over 10368000 periods are more"
        " item-period rows than the limit of 10000000: use a longer period, a shorter range or a"
        " smaller source")
