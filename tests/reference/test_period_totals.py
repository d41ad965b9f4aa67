# SPDX-License-Identifier: MIT
"""period_totals(source, spec [, zone]) against an independent aggregation.

DESIGN.md "Period totals in one pass": one row per item per period from the
period of the earliest row to that of the latest, empty periods included, in
item order then period order; sales is the row count, qty and amount are
exact sums (0 for an empty period). The expected rows are built here with
plain dicts, Python ints and math.fsum over seeded tables; every period's
bounds, label and serial come from tests/reference/period_oracle.py
(datetime arithmetic, zoneinfo for zones), never from the extension.
"""
import math
import zlib
import random
import sqlite3

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


def text_of(ms):
    return oracle.wall_of(ms).isoformat(" ", "seconds")


ITEMS = ["tea", "coffee", "Äpfel", "cocoa \"dark\"", "chai's", "matcha 抹茶"]


def seeded_rows(seed, n, low, high, items=ITEMS, kinds=("text",)):
    """Rows (ts, item, qty, amount) at random instants in [low, high):
    cents as REAL, some whole amounts as INTEGER, some NULLs."""
    rng = random.Random(seed)
    rows = []
    low_ms, high_ms = oracle.ms_of(low), oracle.ms_of(high)
    for _ in range(n):
        ms = rng.randrange(low_ms, high_ms) // 1000 * 1000
        kind = rng.choice(kinds)
        ts = {"text": text_of(ms), "int": ms // 1000, "jd": oracle.julian_day(ms)}[kind]
        roll = rng.random()
        if roll < 0.05:
            amount = None
        elif roll < 0.25:
            amount = rng.randrange(-20, 500)
        else:
            amount = rng.randrange(-2000, 50000) / 100
        qty = None if rng.random() < 0.05 else rng.randrange(1, 9)
        rows.append((ts, rng.choice(items), qty, amount))
    return rows


def exact_total(values):
    """oracle: exact_sum's rule (DESIGN.md) — Python's exact int sum while every
    value is an int and the sum fits in 64 bits, else math.fsum; None when no value."""
    values = [v for v in values if v is not None]
    if not values:
        return None
    if all(isinstance(v, int) for v in values):
        total = sum(values)
        if -2**63 <= total < 2**63:
            return total
    return math.fsum(values)


def ms_of_ts(ts):
    if isinstance(ts, str):
        return oracle.ms_of(oracle.dt.datetime.fromisoformat(ts))
    if isinstance(ts, int):
        return ts * 1000
    return oracle.julian_ms(ts)


def item_order(item):
    """SQLite's order of values: NULL, numbers, TEXT (bytewise), BLOBs (common practice: SQLite docs,
    "Sort Order")."""
    if item is None:
        return (0, 0)
    if isinstance(item, (int, float)):
        return (1, item)
    if isinstance(item, str):
        return (2, item.encode())
    return (3, bytes(item))


def expected_rows(rows, spec, clock=None, has_item=True, has_qty=True, kind="text"):
    """oracle: period_oracle.period_of per row, plain dicts, exact_total per cell."""
    cells = {}
    periods = {}
    for ts, item, qty, amount in rows:
        if ts is None:
            continue
        period = oracle.period_of(spec, ms_of_ts(ts), clock)
        periods[period.serial] = period
        cell = cells.setdefault((item if has_item else None, period.serial), [0, [], []])
        cell[0] += 1
        cell[1].append(qty)
        cell[2].append(amount)
    if not cells:
        return []
    first = min(periods.values(), key=lambda p: p.serial)
    last = max(periods)
    span = [first]
    while span[-1].serial < last:
        span.append(oracle.period_of(spec, span[-1].end, clock))
    items = sorted({item for item, _ in cells}, key=item_order)
    want = []
    for item in items:
        for period in span:
            cell = cells.get((item, period.serial))
            sales = cell[0] if cell else 0
            qty = (exact_total(cell[1]) if cell else 0) if has_qty else None
            amount = exact_total(cell[2]) if cell else 0
            want.append((item, oracle.in_representation(kind, period.start, period.start_text),
                         oracle.in_representation(kind, period.end, period.end_text), period.label,
                         period.serial, sales, qty, amount))
    return want


def same_rows(got, want):
    if len(got) != len(want):
        return False
    return all(all(oracle.same_value(g, w) for g, w in zip(a, b)) for a, b in zip(got, want))


def make_sales(db, rows, name="sales", columns=("ts", "item", "qty", "amount"), schema="main"):
    quoted = '"' + name.replace('"', '""') + '"'
    db.execute(f"CREATE TABLE {schema}.{quoted}({', '.join(columns)})")
    index = {"ts": 0, "item": 1, "qty": 2, "amount": 3}
    db.executemany(f"INSERT INTO {schema}.{quoted} VALUES ({', '.join('?' * len(columns))})",
                   [tuple(row[index[c]] for c in columns) for row in rows])


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
    want = expected_rows(rows, spec, clock)
    assert same_rows(got, want), next((g, w) for g, w in zip(got, want) if not same_rows([g], [w]))
    count("cells", len(want))
    db.close()


@pytest.mark.parametrize("kind", ["int", "jd"])
def test_boundaries_come_back_in_the_representation_of_ts(kind):
    rows = seeded_rows(11, 500, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 9, 1),
                       kinds=(kind,))
    db = connect()
    make_sales(db, rows)
    got = db.execute("SELECT * FROM period_totals('sales', 'month')").fetchall()
    want = expected_rows(rows, Spec("month"), kind=kind)
    assert same_rows(got, want)
    count("cells", len(want))


def test_a_source_without_item_is_one_group_and_without_qty_gives_null_qty():
    rows = seeded_rows(12, 800, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 6, 1))
    db = connect()
    make_sales(db, rows, "no_item", ("ts", "qty", "amount"))
    make_sales(db, rows, "no_qty", ("ts", "item", "amount"))
    make_sales(db, rows, "bare", ("amount", "ts"))
    got = db.execute("SELECT * FROM period_totals('no_item', 'week')").fetchall()
    want = expected_rows(rows, Spec("week"), has_item=False)
    assert same_rows(got, want) and {row[0] for row in got} == {None}
    got = db.execute("SELECT * FROM period_totals('no_qty', 'week')").fetchall()
    want = expected_rows(rows, Spec("week"), has_qty=False)
    assert same_rows(got, want) and {row[6] for row in got} == {None}
    got = db.execute("SELECT * FROM period_totals('bare', 'week')").fetchall()
    assert same_rows(got, expected_rows(rows, Spec("week"), has_item=False, has_qty=False))
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
    got = db.execute("SELECT * FROM period_totals('shop2.sales', 'month')").fetchall()
    assert same_rows(got, expected_rows(shop_rows, Spec("month")))
    got = db.execute("SELECT * FROM period_totals('main.sales', 'month')").fetchall()
    assert same_rows(got, expected_rows(main_rows, Spec("month")))
    # Both shops in one query: each shop's rows side by side, in one result.
    got = db.execute("""SELECT 'main', item, serial, sales, amount FROM period_totals('main.sales', 'month')
                        UNION ALL
                        SELECT 'shop2', item, serial, sales, amount FROM period_totals('shop2.sales', 'month')
                        ORDER BY 2, 3, 1""").fetchall()
    want = sorted([("main", r[0], r[4], r[5], r[7]) for r in expected_rows(main_rows, Spec("month"))] +
                  [("shop2", r[0], r[4], r[5], r[7]) for r in expected_rows(shop_rows, Spec("month"))],
                  key=lambda r: (r[1].encode(), r[2], r[0]))
    assert got == want
    count("cells", len(want))


@pytest.mark.parametrize("name", ["daily sales", 'the "best" sales', "it's sales", "ventes été 販売", "a.b"])
def test_names_that_need_quoting_are_read_as_names(name):
    rows = seeded_rows(15, 200, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 4, 1))
    db = connect()
    make_sales(db, rows, name)
    got = db.execute("SELECT * FROM period_totals(?, 'month')", (name,)).fetchall()
    assert same_rows(got, expected_rows(rows, Spec("month")))
    count("cells", len(got))


def test_a_view_is_a_source():
    rows = seeded_rows(16, 300, oracle.dt.datetime(2025, 1, 1), oracle.dt.datetime(2025, 4, 1))
    db = connect()
    make_sales(db, rows, "raw")
    db.execute("CREATE VIEW sales AS SELECT ts, item, qty, amount FROM raw WHERE amount > 0")
    got = db.execute("SELECT * FROM period_totals('sales', 'week')").fetchall()
    positive = [r for r in rows if r[3] is not None and r[3] > 0]
    assert same_rows(got, expected_rows(positive, Spec("week")))


def test_items_come_in_sqlite_order_whatever_their_type():
    rows = [("2026-01-05", item, 1, 2.5) for item in ("b", 3, None, b"\x00", 1.5, "B", "a")]
    db = connect()
    make_sales(db, rows)
    got = [r[0] for r in db.execute("SELECT item FROM period_totals('sales', 'day')")]
    assert got == [None, 1.5, 3, "B", "a", "b", b"\x00"]  # common practice: SQLite "Sort Order"


def test_integer_sums_that_overflow_64_bits_become_the_rounded_real():
    db = connect()
    rows = [("2026-01-05", "x", 2**62, 2**62)] * 3 + [("2026-01-06", "x", 2**62, -5)]
    make_sales(db, rows)
    got = db.execute("SELECT qty, amount FROM period_totals('sales', 'day')").fetchall()
    # oracle: math.fsum of the Python ints, exact_sum's rule for a sum past 64 bits
    assert 3 * 2**62 >= 2**63  # so the first day's sums do not fit in 64 bits
    assert got == [(math.fsum([2**62] * 3), math.fsum([2**62] * 3)), (2**62, -5)]


def test_null_arguments_give_no_rows_and_null_ts_rows_are_skipped():
    db = connect()
    make_sales(db, [("2026-01-05", "x", 1, 1.0), (None, "x", 1, 100.0)])
    assert db.execute("SELECT * FROM period_totals(NULL, 'week')").fetchall() == []
    assert db.execute("SELECT * FROM period_totals('sales', NULL)").fetchall() == []
    assert db.execute("SELECT * FROM period_totals('sales', 'week', NULL)").fetchall() == []
    assert db.execute("SELECT amount FROM period_totals('sales', 'week')").fetchall() == [(1.0,)]
    db.execute("CREATE TABLE empty(ts, amount)")
    assert db.execute("SELECT * FROM period_totals('empty', 'week')").fetchall() == []


def error_of(db, sql, parameters=()):
    with pytest.raises(sqlite3.OperationalError) as raised:
        db.execute(sql, parameters).fetchall()
    return str(raised.value)


def test_a_name_that_is_not_a_table_is_refused_and_never_runs_as_sql():
    db = connect()
    make_sales(db, [("2026-01-05", "x", 1, 1.0)])
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
    make_sales(db, [("2026-01-05", "x", 1, 1.0)])
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
    make_sales(db, [("2026-01-05", "x", 1, 1.0), ("2026-01-06", "x", 1, "1,050.00")])
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
        " (expected columns ts, amount, and optionally item, qty)")
    make_sales(db, [("2026-02-30", "x", 1, 1.0)])
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week')").startswith(
        "period_totals(): argument 1 (source) = 'sales': column ts holds '2026-02-30': ")
    assert error_of(db, "SELECT * FROM period_totals('sales', 'fortnight')").startswith(
        "period_totals(): argument 2 (spec) = 'fortnight': ")
    assert error_of(db, "SELECT * FROM period_totals('sales', 'week', 'Mars/Olympus')").startswith(
        "period_totals(): argument 3 (zone) = 'Mars/Olympus': ")
    assert error_of(db, "SELECT * FROM period_totals()") == (
        "period_totals(): source is missing; expected period_totals(source, spec [, zone])")


def test_more_item_periods_than_the_limit_is_a_clear_error():
    db = connect()
    # 2026-01-05 to 2026-05-05 in seconds: 120 days * 86400 + 1 periods (arithmetic)
    make_sales(db, [("2026-01-05", "x", 1, 1.0), ("2026-05-05", "x", 1, 1.0)])
    assert error_of(db, "SELECT * FROM period_totals('sales', 'second')") == (
        "period_totals(): argument 1 (source) = 'sales': 1 item over 10368001 periods are more"
        " item-period rows than the limit of 10000000: use a longer period or a smaller source")
    # 10 items x 1,000,001 seconds: past the limit only once the tenth item arrives
    # (2026-01-05 00:00:00 + 1,000,000 s = 2026-01-16 13:46:40, arithmetic)
    db.execute("DELETE FROM sales")
    db.executemany("INSERT INTO sales VALUES (?, ?, 1, 1)",
                   [("2026-01-05 00:00:00", "x"), ("2026-01-16 13:46:40", "x")] +
                   [("2026-01-06", f"y{k}") for k in range(1, 10)])
    assert error_of(db, "SELECT * FROM period_totals('sales', 'second')") == (
        "period_totals(): argument 1 (source) = 'sales': 10 items over 1000001 periods are more"
        " item-period rows than the limit of 10000000: use a longer period or a smaller source")
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
    rows = [(ts, item, str(qty) if qty is not None and qty % 3 == 0 else qty, amount)
            for ts, item, qty, amount in rows]
    db = connect()
    make_sales(db, rows)
    got, grouped = weekly_cells_both_ways(db)
    assert got == grouped
    count("cells", len(got))


def test_qty_is_read_only_when_the_query_uses_it():
    # README "period_totals": qty is read only when the query uses the qty column.
    db = connect()
    make_sales(db, [("2026-01-05", "x", x, 2.5) for x in (1, 2, "3 boxes")])
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
        rows.append((f"2026-01-{1 + i % 28:02d}", f"item {i % 7}", rng.choice(values[6:]), v))
    db = connect()
    make_sales(db, rows)
    got, grouped = weekly_cells_both_ways(db)
    assert got == grouped
    by_cell = {}
    for ts, item, _, amount in rows:
        serial = db.execute("SELECT period_serial(?, 'week')", (ts,)).fetchone()[0]
        by_cell.setdefault((item, serial), []).append(amount)
    for item, serial, _, _, amount in got:
        cell = by_cell[(item, serial)]
        if any(isinstance(v, float) for v in cell):
            assert amount == math.fsum(cell)  # Python's math.fsum, integers as their doubles
    count("cells", len(got))
