# SPDX-License-Identifier: MIT
# ctest-labels: postgres
"""almanac in PostgreSQL gives the SQLite module's answers, query by query.

The same seeded table (seeded_sales.py: 120,000 rows, TEXT and typed times,
three zones) is loaded into SQLite, with the built almanac.so in Python's
sqlite3 module, and into a PostgreSQL 15 server of our own (pg_servers.py)
with the extension installed from this build. Each query runs in both; the
answers are compared value by value (engine_answers.py).
Source of every expected value: the SQLite module's answer to the same query
(`# oracle: almanac.so in sqlite3`). Exact functions (period keys and labels,
exact_sum, moving_mean, median, mad, theil_sen_slope, mann_kendall_p — the same
core and the same C library on this machine — sparkline and the charts) must
give the same bits; resid_sd, slope_stderr and ewma the same value within
1e-12 relative. Typed PostgreSQL times (timestamptz, timestamp, date) are
compared with the SQLite form that means the same: Unix seconds for an
instant, local wall-clock TEXT for a timestamp, a TEXT date for a date.
"""
import pytest

from conftest import connect
import engine_answers
import seeded_sales
from pg_servers import PrivateInstallation, Server

ROWS = 120_000
counts = {}


@pytest.fixture(scope="module")
def rows():
    return seeded_sales.generate(ROWS)


@pytest.fixture(scope="module")
def lite(rows):
    connection = connect()
    seeded_sales.load_sqlite(connection, rows)
    yield connection
    connection.close()


@pytest.fixture(scope="module")
def pg(rows):
    with PrivateInstallation() as installation, Server(installation, "single") as server:
        connection = server.connect()
        connection.cursor().execute("CREATE EXTENSION almanac")
        seeded_sales.load_postgres(connection, rows)
        yield connection
        connection.close()
    print(f"\ncompared values: {counts}")


def fetch_pg(pg, sql):
    with pg.cursor() as cursor:
        cursor.execute(sql)
        return cursor.fetchall()


def check(name, lite, pg, sqlite_sql, pg_sql, **options):
    expected = lite.execute(sqlite_sql).fetchall()  # oracle: almanac.so in sqlite3, the same query
    got = fetch_pg(pg, pg_sql)
    assert expected, f"{name}: the SQLite query gave no rows, nothing would be compared"
    counts[name] = engine_answers.compare(name, expected, got, **options)


# (spec, with the shop's zone?): day and longer units, sub-day ones, fiscal, anchored
SPECS = [("week", True), ("month", True), ("quarter starting april", True), ("half-month", False),
         ("day", True), ("15 minutes", True), ("hour", True), ("year starting july", False),
         ("2 weeks from 2024-01-03", True), ("week starting sunday", True)]
# wall-clock times and dates, with ISO durations and multiples
LOCAL_SPECS = ["week", "month", "half-month", "P1D", "quarter starting april", "6 months", "hour", "3 hours"]
SUB_DAY = {"15 minutes", "hour", "3 hours"}


def spec_id(case):
    return f"{case[0]}{' zoned' if case[1] else ''}"


@pytest.mark.parametrize("case", SPECS, ids=spec_id)
def test_period_functions_on_text_times(lite, pg, case):
    spec, zoned = case
    z = ", zone" if zoned else ""
    columns = (f"period_floor({{t}}, '{spec}'{z}), period_end({{t}}, '{spec}'{z}), "
               f"period_label({{t}}, '{spec}'{z}), period_serial({{t}}, '{spec}'{z}), "
               f"period_shift({{t}}, 3, '{spec}'{z}), period_shift({{t}}, -14, '{spec}'{z})")
    check(f"text {spec_id(case)}", lite, pg,
          f"SELECT id, {columns.format(t='ts_text')} FROM sales ORDER BY id",
          f"SELECT id, {columns.format(t='ts_text')} FROM sales ORDER BY id")


@pytest.mark.parametrize("case", SPECS, ids=spec_id)
def test_period_functions_on_timestamptz(lite, pg, case):
    # An instant: PostgreSQL's timestamptz against SQLite's Unix seconds (x).
    spec, zoned = case
    z = ", zone" if zoned else ""
    pg_columns = (f"extract(epoch FROM period_floor(ts, '{spec}'{z})), extract(epoch FROM period_end(ts, '{spec}'{z})), "
                  f"period_label(ts, '{spec}'{z}), period_serial(ts, '{spec}'{z}), "
                  f"extract(epoch FROM period_shift(ts, 3, '{spec}'{z}))")
    lite_columns = (f"period_floor(x, '{spec}'{z}), period_end(x, '{spec}'{z}), period_label(x, '{spec}'{z}), "
                    f"period_serial(x, '{spec}'{z}), period_shift(x, 3, '{spec}'{z})")
    check(f"timestamptz {spec_id(case)}", lite, pg,
          f"SELECT id, {lite_columns} FROM sales ORDER BY id",
          f"SELECT id, {pg_columns} FROM sales ORDER BY id", numeric_ok=True)


@pytest.mark.parametrize("spec", LOCAL_SPECS)
def test_period_functions_on_timestamp_and_date(lite, pg, spec):
    # A wall-clock timestamp reads as SQLite reads local TEXT without an offset;
    # a date as a TEXT date. SQLite's datetime() writes both floors in one form.
    check(f"timestamp {spec}", lite, pg,
          f"SELECT id, datetime(period_floor(local, '{spec}')), datetime(period_end(local, '{spec}')), "
          f"period_label(local, '{spec}'), period_serial(local, '{spec}') FROM sales ORDER BY id",
          f"SELECT id, to_char(period_floor(local, '{spec}'), 'YYYY-MM-DD HH24:MI:SS'), "
          f"to_char(period_end(local, '{spec}'), 'YYYY-MM-DD HH24:MI:SS'), "
          f"period_label(local, '{spec}'), period_serial(local, '{spec}') FROM sales ORDER BY id")
    if spec in SUB_DAY:
        return
    check(f"date {spec}", lite, pg,
          f"SELECT id, period_floor(day, '{spec}'), period_end(day, '{spec}'), period_label(day, '{spec}'), "
          f"period_serial(day, '{spec}'), period_shift(day, 2, '{spec}') FROM sales ORDER BY id",
          f"SELECT id, period_floor(day, '{spec}')::text, period_end(day, '{spec}')::text, "
          f"period_label(day, '{spec}'), period_serial(day, '{spec}'), period_shift(day, 2, '{spec}')::text "
          f"FROM sales ORDER BY id")


def test_period_positions(lite, pg):
    pairs = [("day", "week"), ("day", "week starting sunday"), ("month", "year"), ("month", "year starting april"),
             ("quarter", "year"), ("day", "month"), ("day", "year"), ("half-month", "year"), ("week", "year"),
             ("hour", "day")]
    columns = ", ".join(f"period_position({{t}}, '{spec}', '{cycle}', zone)" for spec, cycle in pairs)
    check("period_position text", lite, pg, f"SELECT id, {columns.format(t='ts_text')} FROM sales ORDER BY id",
          f"SELECT id, {columns.format(t='ts_text')} FROM sales ORDER BY id")
    check("period_position timestamptz", lite, pg, f"SELECT id, {columns.format(t='x')} FROM sales ORDER BY id",
          f"SELECT id, {columns.format(t='ts')} FROM sales ORDER BY id")


def test_valid_time_and_version(lite, pg):
    check("valid_time", lite, pg, "SELECT id, valid_time(ts_text), valid_time(local || 'x') FROM sales ORDER BY id",
          "SELECT id, valid_time(ts_text)::int, valid_time(local::text || 'x')::int FROM sales ORDER BY id")
    check("almanac_version", lite, pg, "SELECT almanac_version()", "SELECT almanac_version()")


def test_period_of_serial_and_periods(lite, pg):
    serials = "WITH RECURSIVE s(n) AS (SELECT -3000 UNION ALL SELECT n + 7 FROM s WHERE n + 7 <= 3000) "
    for spec, zone in (("week", None), ("month", "Australia/Adelaide"), ("hour", "America/Denver"),
                       ("half-month", None), ("quarter starting april", "Asia/Kolkata"), ("15 minutes", "America/Denver")):
        z = f", '{zone}'" if zone else ""
        check(f"period_of_serial {spec}", lite, pg,
              serials + f"SELECT n, period_of_serial(n, '{spec}'{z}) FROM s ORDER BY n",
              f"SELECT n, period_of_serial(n, '{spec}'{z}) FROM generate_series(-3000, 3000, 7) AS n ORDER BY n")
    for start, stop, spec, zone in (("2024-03-01", "2024-04-15", "hour", "America/Denver"),
                                    ("2024-01-01", "2027-01-01", "week", None),
                                    ("2024-09-25", "2024-10-20", "day", "Australia/Adelaide"),
                                    ("2020-02-10", "2031-07-01", "half-month", None),
                                    ("2024-01-01", "2026-12-31", "quarter starting april", "Asia/Kolkata")):
        z = f", '{zone}'" if zone else ""
        check(f"periods {spec}", lite, pg,
              f"SELECT period_start, period_end, label, serial FROM periods('{start}', '{stop}', '{spec}'{z})",
              f"SELECT period_start, period_end, label, serial FROM periods('{start}'::text, '{stop}'::text, '{spec}'{z})")


def test_reading_exports(lite, pg):
    # The export readers over texts made from the seeded rows.
    check("to_time", lite, pg,
          "SELECT id, to_time(strftime('%d/%m/%Y %H:%M', local), '%d/%m/%Y %H:%M', zone), "
          "to_time(strftime('%d/%m/%Y %H:%M', local), '%d/%m/%Y %H:%M'), "
          "to_time(strftime('%Y%m%d', local), '%Y%m%d') FROM sales ORDER BY id",
          "SELECT id, to_time(to_char(local, 'DD/MM/YYYY HH24:MI'), '%d/%m/%Y %H:%M', zone), "
          "to_time(to_char(local, 'DD/MM/YYYY HH24:MI'), '%d/%m/%Y %H:%M'), "
          "to_time(to_char(local, 'YYYYMMDD'), '%Y%m%d') FROM sales ORDER BY id")
    amounts = ("CASE id % 4 WHEN 0 THEN '$' || {a} WHEN 1 THEN {a} || ' EUR' "
               "WHEN 2 THEN '(' || {a} || ')' ELSE replace({a}, '.', ',') END")
    query = ("SELECT id, to_amount({texts}, CASE id % 4 WHEN 3 THEN ',' ELSE '.' END) FROM sales "
             "WHERE amount BETWEEN 0 AND 999 ORDER BY id")
    check("to_amount", lite, pg, query.format(texts=amounts.format(a="printf('%.2f', amount)")),
          query.format(texts=amounts.format(a="to_char(amount, 'FM9990.00')")))


# family: (exact calls, calls within 1e-12 relative); {t} is the time column of the engine
FAMILIES = {
    "sums": ("exact_sum(amount), exact_sum(qty), moving_mean(amount), moving_mean(qty), moving_mean(amount, 100)", ""),
    "order statistics": ("median(amount), median(qty), mad(amount)", ""),
    "trends": ("theil_sen_slope(amount, x), theil_sen_slope(amount, x, dow), mann_kendall_p(amount, x), "
               "mann_kendall_p(amount, x, dow), mann_kendall_p(qty, x)", ""),
    "moments": ("", "resid_sd(amount, x), slope_stderr(amount, x), ewma(amount, x, 604800.0), ewma(amount, {t}, '2 weeks')"),
    "sparkline": ("sparkline(amount, x), sparkline(qty, {t})", ""),
}
GROUPINGS = ["", "shop, item", "shop, item, period_label({t}, 'month', zone)", "shop, period_serial({t}, 'week', zone)"]


@pytest.mark.parametrize("grouping", GROUPINGS, ids=lambda g: f"by ({g})")
@pytest.mark.parametrize("family", FAMILIES)
def test_aggregates(lite, pg, family, grouping):
    exact, close = FAMILIES[family]
    keys = grouping + ", " if grouping else ""
    group = f" GROUP BY {grouping} ORDER BY {grouping}" if grouping else ""
    offset = len(grouping.split(", ")) if grouping else 0
    calls = ", ".join(c for c in (exact, close) if c)
    first_close = offset + (exact.count("(") if exact else 0)  # one parenthesis per call
    query = f"SELECT {keys}{calls} FROM sales{group}"
    inexact = range(first_close, first_close + close.count(", ") + 1) if close else ()
    check(f"{family} by ({grouping})", lite, pg, query.format(t="ts_text"), query.format(t="ts"), inexact=inexact)


def test_charts(lite, pg):
    weekly = ("SELECT shop, period_floor({t}, 'week') AS week, exact_sum(amount) AS total FROM sales "
              "WHERE item = 'tea' AND {t} < {until} GROUP BY shop, week")
    lite_weekly = weekly.format(t="ts_text", until="'2024-07-01'")
    pg_weekly = weekly.format(t="ts_text", until="'2024-07-01'::text")
    for chart in ("svg_line_chart(week, total, shop)", "svg_line_chart(week, total, shop, 'smooth', "
                  "'{\"title\": \"Tea <weekly>\", \"width\": 640}')",
                  "svg_bar_chart(week, total, shop)", "svg_bar_chart(week, total, shop, '{\"y_caption\": \"EUR\"}')"):
        check(chart, lite, pg, f"SELECT {chart} FROM ({lite_weekly})", f"SELECT {chart} FROM ({pg_weekly}) AS w")
