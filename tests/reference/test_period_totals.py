# SPDX-License-Identifier: MIT
"""period_totals(source, spec [, zone]) against an independent aggregation.

DESIGN.md "Period totals in one pass": one row per segment (and the rollup)
per item per period over the data's range, empty periods included; sales is
the row count, qty and amount are exact sums (0 for an empty period). The
expected rows are built by tests/reference/period_totals_oracle.py with plain
dicts, Python ints and math.fsum over seeded tables; every period's bounds,
label and serial come from tests/reference/period_oracle.py (datetime
arithmetic, zoneinfo for zones), never from the extension. Ranges, coverage
and segments in detail: test_period_totals_ranges.py.
"""
import math
import random
import sqlite3
import zlib

import pytest

from conftest import connect
import period_oracle as oracle
from period_oracle import Spec

counts = {}


@pytest.fixture(scope="module", autouse=True)
def report_counts():
    yield
    print(f"\ncompared: {counts}")


def count(name, n):
    counts[name] = counts.get(name, 0) + n


from period_totals_oracle import (error_of, expected_rows, first_difference, make_sales, same_rows,
                                  seeded_rows)

NO_SEGMENT = ("ts", "item", "qty", "amount")


CASES = [
    # (spec text, oracle spec, zone)
    ("week", Spec("week"), None),
    ("half-month", Spec("half-month"), None),
    ("quarter starting april", Spec("quarter", year_start=4), None),
    ("month", Spec("month"), "America/Denver"),
    ("day", Spec("day"), "America/Denver"),
    ("week starting sunday", Spec("week", week_start=6), "Europe/Berlin"),
    ("hour", Spec("hour"), None),
    ("15 minutes", Spec("minute", count=15), None),
    ("hour", Spec("hour"), "America/Denver"),
]


@pytest.mark.parametrize("spec_text,spec,zone", CASES, ids=[f"{c[0]}|{c[2]}" for c in CASES])
def test_totals_match_an_independent_aggregation(spec_text, spec, zone):
    sub_day = spec.sub_day
    low = oracle.dt.datetime(2025, 2, 20) if not sub_day else oracle.dt.datetime(2025, 10, 30)
    high = oracle.dt.datetime(2026, 12, 5) if not sub_day else oracle.dt.datetime(2025, 11, 6)
    rows = seeded_rows(zlib.crc32(f"{spec_text}|{zone}".encode()), 3000, low, high)
    db = connect()
    make_sales(db, rows)
    clock = oracle.ZoneClock(zone) if zone else None
    if zone:
        got = db.execute("SELECT * FROM period_totals('sales', ?, ?)", (spec_text, zone)).fetchall()
    else:
        got = db.execute("SELECT * FROM period_totals('sales', ?)", (spec_text,)).fetchall()
    want = expected_rows(rows, spec, clock)  # oracle: period_totals_oracle (dicts, math.fsum, zoneinfo)
    assert same_rows(got, want), first_difference(got, want)
    count("cells", len(want))
    db.close()


@pytest.mark.parametrize("kind", ["int", "jd"])
def test_boundaries_come_back_in_the_representation_of_ts(kind):
    rows = seeded_rows(11, 500, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 9, 1),
                       kinds=(kind,))
    db = connect()
    make_sales(db, rows)
    got = db.execute("SELECT * FROM period_totals('sales', 'month')").fetchall()
    want = expected_rows(rows, Spec("month"))  # oracle: period_totals_oracle, in the rows' representation
    assert same_rows(got, want), first_difference(got, want)
    count("cells", len(want))


def test_a_source_without_item_is_one_group_and_without_qty_gives_null_qty():
    rows = seeded_rows(12, 800, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 6, 1))
    db = connect()
    make_sales(db, rows, "no_item", ("ts", "qty", "amount", "segment"))
    make_sales(db, rows, "no_qty", ("ts", "item", "amount", "segment"))
    make_sales(db, rows, "bare", ("amount", "ts"))
    # oracle: period_totals_oracle.expected_rows without the missing columns
    got = db.execute("SELECT * FROM period_totals('no_item', 'week')").fetchall()
    want = expected_rows(rows, Spec("week"), has_item=False)
    assert same_rows(got, want) and {row[2] for row in got} == {None}
    got = db.execute("SELECT * FROM period_totals('no_qty', 'week')").fetchall()
    want = expected_rows(rows, Spec("week"), has_qty=False)
    assert same_rows(got, want) and {row[10] for row in got} == {None}
    got = db.execute("SELECT * FROM period_totals('bare', 'week')").fetchall()
    want = expected_rows(rows, Spec("week"), has_item=False, has_qty=False, has_segment=False)
    assert same_rows(got, want) and {row[1] for row in got} == {1}
    count("cells", 3 * len(want))


def test_an_attached_database_is_a_source_and_shops_total_in_one_query(tmp_path):
    main_rows = seeded_rows(13, 600, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 12, 1))
    shop_rows = seeded_rows(14, 700, oracle.dt.datetime(2025, 3, 1), oracle.dt.datetime(2026, 2, 1))
    shop = sqlite3.connect(tmp_path / "shop 2.db")
    make_sales(shop, shop_rows)
    shop.commit()
    shop.close()
    db = connect()
    make_sales(db, main_rows)
    db.execute("ATTACH ? AS shop2", (str(tmp_path / "shop 2.db"),))
    # oracle: period_totals_oracle.expected_rows of each file's own rows
    got = db.execute("SELECT * FROM period_totals('shop2.sales', 'month')").fetchall()
    assert same_rows(got, expected_rows(shop_rows, Spec("month")))
    got = db.execute("SELECT * FROM period_totals('main.sales', 'month')").fetchall()
    assert same_rows(got, expected_rows(main_rows, Spec("month")))
    # Both shops in one query: each shop's rollup rows side by side, in one result.
    got = db.execute("""SELECT 'main', item, serial, sales, amount FROM period_totals('main.sales', 'month')
                        WHERE all_segments
                        UNION ALL
                        SELECT 'shop2', item, serial, sales, amount FROM period_totals('shop2.sales', 'month')
                        WHERE all_segments
                        ORDER BY 2, 3, 1""").fetchall()
    want = sorted([("main", r[2], r[6], r[9], r[11]) for r in expected_rows(main_rows, Spec("month")) if r[1]] +
                  [("shop2", r[2], r[6], r[9], r[11]) for r in expected_rows(shop_rows, Spec("month")) if r[1]],
                  key=lambda r: (r[1].encode(), r[2], r[0]))
    assert got == want
    count("cells", len(want))


@pytest.mark.parametrize("name", ["daily sales", 'the "best" sales', "it's sales", "ventes été 販売", "a.b"])
def test_names_that_need_quoting_are_read_as_names(name):
    rows = seeded_rows(15, 200, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 4, 1))
    db = connect()
    make_sales(db, rows, name)
    got = db.execute("SELECT * FROM period_totals(?, 'month')", (name,)).fetchall()
    assert same_rows(got, expected_rows(rows, Spec("month")))  # oracle: period_totals_oracle
    count("cells", len(got))


def test_a_view_is_a_source():
    rows = seeded_rows(16, 300, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 4, 1))
    db = connect()
    make_sales(db, rows, "raw")
    db.execute("CREATE VIEW sales AS SELECT ts, item, qty, amount, segment FROM raw WHERE amount > 0")
    got = db.execute("SELECT * FROM period_totals('sales', 'week')").fetchall()
    positive = [r for r in rows if r[3] is not None and r[3] > 0]
    assert same_rows(got, expected_rows(positive, Spec("week")))  # oracle: period_totals_oracle


def test_items_come_in_sqlite_order_whatever_their_type():
    rows = [("2026-01-05", item, 1, 2.5, None) for item in ("b", 3, None, b"\x00", 1.5, "B", "a")]
    db = connect()
    make_sales(db, rows, columns=NO_SEGMENT)
    got = [r[0] for r in db.execute("SELECT item FROM period_totals('sales', 'day')")]
    assert got == [None, 1.5, 3, "B", "a", "b", b"\x00"]  # common practice: SQLite "Sort Order"


def test_integer_sums_that_overflow_64_bits_become_the_rounded_real():
    db = connect()
    rows = [("2026-01-05", "x", 2**62, 2**62, None)] * 3 + [("2026-01-06", "x", 2**62, -5, None)]
    make_sales(db, rows, columns=NO_SEGMENT)
    got = db.execute("SELECT qty, amount FROM period_totals('sales', 'day')").fetchall()
    # oracle: math.fsum of the Python ints, exact_sum's rule for a sum past 64 bits
    assert 3 * 2**62 >= 2**63  # so the first day's sums do not fit in 64 bits
    assert got == [(math.fsum([2**62] * 3), math.fsum([2**62] * 3)), (2**62, -5)]


def test_null_arguments_give_no_rows_and_null_ts_rows_are_skipped():
    db = connect()
    make_sales(db, [("2026-01-05", "x", 1, 1.0, None), (None, "x", 1, 100.0, None)], columns=NO_SEGMENT)
    assert db.execute("SELECT * FROM period_totals(NULL, 'week')").fetchall() == []
    assert db.execute("SELECT * FROM period_totals('sales', NULL)").fetchall() == []
    assert db.execute("SELECT * FROM period_totals('sales', 'week', NULL)").fetchall() == []
    assert db.execute("SELECT amount FROM period_totals('sales', 'week')").fetchall() == [(1.0,)]
    db.execute("CREATE TABLE empty(ts, amount)")
    assert db.execute("SELECT * FROM period_totals('empty', 'week')").fetchall() == []


def test_a_name_that_is_not_a_table_is_refused_and_never_runs_as_sql():
    db = connect()
    make_sales(db, [("2026-01-05", "x", 1, 1.0, None)], columns=NO_SEGMENT)
    db.execute("CREATE TABLE x(a)")
    assert error_of(db, "SELECT * FROM period_totals('sales; DROP TABLE x', 'week')") == (
        "period_totals(): argument 1 (source) = 'sales; DROP TABLE x': no table or view of that name"
        " (expected 'name' or 'schema.name')")
    assert db.execute("SELECT count(*) FROM sqlite_schema WHERE name = 'x'").fetchone() == (1,)
    assert error_of(db, "SELECT * FROM period_totals('nope.sales', 'week')") == (
        "period_totals(): argument 1 (source) = 'nope.sales': no table or view of that name"
        " (expected 'name' or 'schema.name')")
    assert error_of(db, "SELECT * FROM period_totals(12, 'week')") == (
        "period_totals(): argument 1 (source) = 12: expected TEXT, not a number")


def test_use_inside_a_view_or_trigger_is_refused():
    db = connect()
    make_sales(db, [("2026-01-05", "x", 1, 1.0, None)], columns=NO_SEGMENT)
    db.execute("CREATE TABLE log(n)")
    db.execute("CREATE VIEW weekly AS SELECT * FROM period_totals('sales', 'week')")
    message = error_of(db, "SELECT * FROM weekly")
    assert message == 'unsafe use of virtual table "period_totals"'  # SQLite's SQLITE_DIRECTONLY refusal
    db.execute("""CREATE TRIGGER t AFTER INSERT ON sales BEGIN
                  INSERT INTO log SELECT count(*) FROM period_totals('sales', 'week'); END""")
    assert error_of(db, "INSERT INTO sales VALUES ('2026-01-06', 'x', 1, 1.0)") == (
        'unsafe use of virtual table "period_totals"')


def test_text_money_is_refused_as_exact_sum_refuses_it():
    db = connect()
    make_sales(db, [("2026-01-05", "x", 1, 1.0, None), ("2026-01-06", "x", 1, "1,050.00", None)],
               columns=NO_SEGMENT)
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week')") == (
        "period_totals(): argument 1 (source) = 'sales': column amount holds '1,050.00':"
        " expected a number; money or quantities written as text must be read with to_amount()"
        " in the view that maps your table (README: \"Your data\")")
    db.execute("UPDATE sales SET amount = ' 1050.5 '")  # TEXT that SQLite reads as a number
    assert db.execute("SELECT amount FROM period_totals('sales', 'week')").fetchall() == [(2101.0,)]
    db.execute("UPDATE sales SET qty = x'01'")
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week')") == (
        "period_totals(): argument 1 (source) = 'sales': column qty holds a BLOB of 1 byte:"
        " expected a number, not a BLOB")


def test_bad_sources_and_times_name_what_was_expected():
    db = connect()
    db.execute("CREATE TABLE no_amount(ts, item)")
    assert error_of(db, "SELECT * FROM period_totals('no_amount', 'week')") == (
        "period_totals(): argument 1 (source) = 'no_amount': the source has no column amount"
        " (expected columns ts, amount, and optionally item, qty, segment)")
    make_sales(db, [("2026-02-30", "x", 1, 1.0, None)], columns=NO_SEGMENT)
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week')").startswith(
        "period_totals(): argument 1 (source) = 'sales': column ts holds '2026-02-30': ")
    assert error_of(db, "SELECT * FROM period_totals('sales', 'fortnight')").startswith(
        "period_totals(): argument 2 (spec) = 'fortnight': ")
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week', 'Mars/Olympus')").startswith(
        "period_totals(): argument 3 (zone) = 'Mars/Olympus': ")
    assert error_of(db, "SELECT * FROM period_totals()") == (
        "period_totals(): source is missing; expected period_totals(source, spec [, zone [, start [,"
        " stop]]])")


def test_more_item_periods_than_the_limit_is_a_clear_error():
    db = connect()
    # 2026-01-05 to 2026-05-05 in seconds: 120 days * 86400 + 1 periods (arithmetic)
    make_sales(db, [("2026-01-05", "x", 1, 1.0, None), ("2026-05-05", "x", 1, 1.0, None)], columns=NO_SEGMENT)
    assert error_of(db, "SELECT * FROM period_totals('sales', 'second')") == (
        "period_totals(): argument 1 (source) = 'sales': 1 item over 10368001 periods are more"
        " item-period rows than the limit of 10000000: use a longer period, a shorter range or a smaller source")
    # 10 items x 1,000,001 seconds: past the limit only once the tenth item arrives
    # (2026-01-05 00:00:00 + 1,000,000 s = 2026-01-16 13:46:40, arithmetic)
    db.execute("DELETE FROM sales")
    db.executemany("INSERT INTO sales VALUES (?, ?, 1, 1)",
                   [("2026-01-05 00:00:00", "x"), ("2026-01-16 13:46:40", "x")] +
                   [("2026-01-06", f"y{k}") for k in range(1, 10)])
    assert error_of(db, "SELECT * FROM period_totals('sales', 'second')") == (
        "period_totals(): argument 1 (source) = 'sales': 10 items over 1000001 periods are more"
        " item-period rows than the limit of 10000000: use a longer period, a shorter range or a smaller source")
    db.execute("DELETE FROM sales WHERE item = 'y9'")  # nine items: 9,000,009 rows, within it
    assert db.execute("SELECT count(*), sum(sales) FROM period_totals('sales', 'second')").fetchone() == (
        9000009, 10)


def weekly_cells_both_ways(db):
    """The non-empty weekly cells from period_totals, and the same from GROUP BY with exact_sum."""
    got = db.execute("SELECT item, serial, sales, qty, amount FROM period_totals('sales', 'week')"
                     " WHERE sales > 0").fetchall()
    grouped = db.execute("""SELECT item, period_serial(ts, 'week') AS serial, count(*), exact_sum(qty),
                                   exact_sum(amount)
                            FROM sales GROUP BY item, serial ORDER BY item, serial""").fetchall()
    return got, grouped


def test_qty_and_amount_are_what_exact_sum_gives_over_the_same_rows():
    # DESIGN.md: "qty and amount are exact_sums"; whole-number TEXT counts as an INTEGER there.
    rows = seeded_rows(17, 1500, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 7, 1))
    rows = [(ts, item, str(qty) if qty is not None and qty % 3 == 0 else qty, amount, None)
            for ts, item, qty, amount, _ in rows]
    db = connect()
    make_sales(db, rows, columns=NO_SEGMENT)
    got, grouped = weekly_cells_both_ways(db)
    assert got == grouped
    count("cells", len(got))


def test_qty_is_read_only_when_the_query_uses_it():
    # README "period_totals": qty is read only when the query uses the qty column.
    db = connect()
    make_sales(db, [("2026-01-05", "x", x, 2.5, None) for x in (1, 2, "3 boxes")], columns=NO_SEGMENT)
    assert db.execute("SELECT item, sales, amount FROM period_totals('sales', 'week')").fetchall() == [
        ("x", 3, 7.5)]  # 3 rows of 2.5: 7.5 (arithmetic)
    assert error_of(db, "SELECT qty FROM period_totals('sales', 'week')") == (
        "period_totals(): argument 1 (source) = 'sales': column qty holds '3 boxes':"
        " expected a number; money or quantities written as text must be read with to_amount()"
        " in the view that maps your table (README: \"Your data\")")
    db.execute("UPDATE sales SET qty = 4 WHERE qty = '3 boxes'")
    assert db.execute("SELECT qty FROM period_totals('sales', 'week')").fetchall() == [(7,)]


def test_totals_far_apart_in_magnitude_are_still_exact_sums():
    # Cells whose totals leave the compact 128-bit form (magnitudes 1e300 and 1e-300 in one
    # cell, integers past 2^53 and near 2^63) against exact_sum over the same rows, which is
    # itself compared with math.fsum (test_exact_sum*.py); and against math.fsum directly.
    rng = random.Random(5)
    values = [1e300, -1e300, 1e-300, 5e-324, 2.0**53 + 1, 2**62, 2**62, -(2**62), 0.1, -0.0, 3]
    rows = []
    for i in range(2000):
        v = rng.choice(values)
        if isinstance(v, float) and rng.random() < 0.5:
            v = v * rng.random()
        rows.append((f"2026-01-{1 + i % 28:02d}", f"item {i % 7}", rng.choice(values[6:]), v, None))
    db = connect()
    make_sales(db, rows, columns=NO_SEGMENT)
    got, grouped = weekly_cells_both_ways(db)
    assert got == grouped
    by_cell = {}
    for ts, item, _, amount, _ in rows:
        serial = db.execute("SELECT period_serial(?, 'week')", (ts,)).fetchone()[0]
        by_cell.setdefault((item, serial), []).append(amount)
    for item, serial, _, _, amount in got:
        cell = by_cell[(item, serial)]
        if any(isinstance(v, float) for v in cell):
            assert amount == math.fsum(cell)  # Python's math.fsum, integers as their doubles
    count("cells", len(got))
