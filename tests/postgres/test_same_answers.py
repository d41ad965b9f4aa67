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

import engine_answers
import seeded_sales
from pg_servers import almanac_server

ROWS = 120_000
counts = {}


@pytest.fixture(scope="module")
def rows():
    return seeded_sales.generate(ROWS)


@pytest.fixture(scope="module")
def lite(rows):
    with seeded_sales.sqlite_sales(rows) as connection:
        yield connection


@pytest.fixture(scope="module")
def pg(rows):
    with almanac_server("single", rows) as connection:
        yield connection
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


def share(case_list, case):
    """A third of the rows for each per-row query, the thirds taken in turn, so every
    row meets every kind of query while the run stays short."""
    return f"id % 3 = {case_list.index(case) % 3}"


def spec_id(case):
    return f"{case[0]}{' zoned' if case[1] else ''}"


@pytest.mark.parametrize("case", SPECS, ids=spec_id)
def test_period_functions_on_text_and_timestamptz(lite, pg, case):
    spec, zoned = case
    z = ", zone" if zoned else ""
    rows = share(SPECS, case)
    # TEXT times, the same in both engines
    columns = (f"period_floor(ts_text, '{spec}'{z}), period_end(ts_text, '{spec}'{z}), "
               f"period_label(ts_text, '{spec}'{z}), period_serial(ts_text, '{spec}'{z}), "
               f"period_shift(ts_text, 3, '{spec}'{z}), period_shift(ts_text, -14, '{spec}'{z})")
    query = f"SELECT id, {{columns}} FROM sales WHERE {rows} ORDER BY id"
    check(f"text {spec_id(case)}", lite, pg, query.format(columns=columns), query.format(columns=columns))
    # An instant: PostgreSQL's timestamptz against SQLite's Unix seconds (x).
    calls = [f"period_floor({{t}}, '{spec}'{z})", f"period_end({{t}}, '{spec}'{z})", f"period_label({{t}}, '{spec}'{z})",
             f"period_serial({{t}}, '{spec}'{z})", f"period_shift({{t}}, 3, '{spec}'{z})"]
    lite_columns = ", ".join(call.format(t="x") for call in calls)
    pg_columns = ", ".join(call.format(t="ts") if "label" in call or "serial" in call
                           else f"extract(epoch FROM {call.format(t='ts')})" for call in calls)
    check(f"timestamptz {spec_id(case)}", lite, pg, query.format(columns=lite_columns),
          query.format(columns=pg_columns), numeric_ok=True)


@pytest.mark.parametrize("spec", LOCAL_SPECS)
def test_period_functions_on_timestamp_and_date(lite, pg, spec):
    # A wall-clock timestamp reads as SQLite reads TEXT without an offset; a date
    # as a TEXT date. SQLite's datetime() writes both engines' floors in one form.
    rows = share(LOCAL_SPECS, spec)
    check(f"timestamp {spec}", lite, pg,
          f"SELECT id, datetime(period_floor(local, '{spec}')), datetime(period_end(local, '{spec}')), "
          f"datetime(period_shift(local, 5, '{spec}')), period_label(local, '{spec}'), period_serial(local, '{spec}'), "
          f"period_label(local, '{spec}', zone), period_serial(local, '{spec}', zone) FROM sales WHERE {rows} ORDER BY id",
          f"SELECT id, to_char(period_floor(local, '{spec}'), 'YYYY-MM-DD HH24:MI:SS'), "
          f"to_char(period_end(local, '{spec}'), 'YYYY-MM-DD HH24:MI:SS'), "
          f"to_char(period_shift(local, 5, '{spec}'), 'YYYY-MM-DD HH24:MI:SS'), "
          f"period_label(local, '{spec}'), period_serial(local, '{spec}'), "
          f"period_label(local, '{spec}', zone), period_serial(local, '{spec}', zone) FROM sales WHERE {rows} ORDER BY id")
    if spec in SUB_DAY:
        return
    check(f"date {spec}", lite, pg,
          f"SELECT id, period_floor(day, '{spec}'), period_end(day, '{spec}'), period_label(day, '{spec}'), "
          f"period_serial(day, '{spec}'), period_shift(day, 2, '{spec}'), period_floor(day, '{spec}', zone), "
          f"period_label(day, '{spec}', zone), period_serial(day, '{spec}', zone) FROM sales WHERE {rows} ORDER BY id",
          f"SELECT id, period_floor(day, '{spec}')::text, period_end(day, '{spec}')::text, "
          f"period_label(day, '{spec}'), period_serial(day, '{spec}'), period_shift(day, 2, '{spec}')::text, "
          f"period_floor(day, '{spec}', zone)::text, period_label(day, '{spec}', zone), "
          f"period_serial(day, '{spec}', zone) FROM sales WHERE {rows} ORDER BY id")


def test_period_positions(lite, pg):
    pairs = [("day", "week"), ("day", "week starting sunday"), ("month", "year"), ("month", "year starting april"),
             ("quarter", "year"), ("day", "month"), ("day", "year"), ("half-month", "year"), ("week", "year"),
             ("hour", "day")]
    zoned = ", ".join(f"period_position({{t}}, '{spec}', '{cycle}', zone)" for spec, cycle in pairs)
    unzoned = zoned.replace(", zone)", ")")
    query = "SELECT id, {columns} FROM sales WHERE id % 3 = {n} ORDER BY id"  # a third of the rows each
    check("period_position text", lite, pg, query.format(columns=zoned.format(t="ts_text"), n=0),
          query.format(columns=zoned.format(t="ts_text"), n=0))
    check("period_position timestamptz", lite, pg, query.format(columns=zoned.format(t="x"), n=1),
          query.format(columns=zoned.format(t="ts"), n=1))
    typed = f"{unzoned.format(t='local')}, {unzoned.format(t='day')}"
    check("period_position timestamp and date", lite, pg, query.format(columns=typed, n=2),
          query.format(columns=typed, n=2))


def test_valid_time_and_versions(lite, pg):
    check("valid_time", lite, pg,
          "SELECT id, valid_time(ts_text), valid_time(local || 'x'), valid_time(x), valid_time(local), valid_time(day) "
          "FROM sales ORDER BY id",
          "SELECT id, valid_time(ts_text)::int, valid_time(local::text || 'x')::int, valid_time(ts)::int, "
          "valid_time(local)::int, valid_time(day)::int FROM sales ORDER BY id")
    check("almanac_version", lite, pg, "SELECT almanac_version(), almanac_tz_version()",
          "SELECT almanac_version(), almanac_tz_version()")


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
        # an instant: timestamptz bounds against SQLite's Unix seconds
        check(f"periods timestamptz {spec}", lite, pg,
              f"SELECT period_start, period_end, label, serial FROM "
              f"periods(unixepoch('{start}'), unixepoch('{stop}'), '{spec}'{z})",
              f"SELECT extract(epoch FROM period_start), extract(epoch FROM period_end), label, serial FROM "
              f"periods('{start}'::timestamptz, '{stop}'::timestamptz, '{spec}'{z})", numeric_ok=True)
        if spec not in SUB_DAY:
            check(f"periods date {spec}", lite, pg,
                  f"SELECT period_start, period_end, label, serial FROM periods('{start}', '{stop}', '{spec}'{z})",
                  f"SELECT period_start::text, period_end::text, label, serial FROM "
                  f"periods('{start}'::date, '{stop}'::date, '{spec}'{z})")
        check(f"periods timestamp {spec}", lite, pg,
              f"SELECT datetime(period_start), datetime(period_end), label, serial FROM "
              f"periods('{start} 00:00:00', '{stop} 00:00:00', '{spec}')",
              f"SELECT to_char(period_start, 'YYYY-MM-DD HH24:MI:SS'), to_char(period_end, 'YYYY-MM-DD HH24:MI:SS'), "
              f"label, serial FROM periods('{start}'::timestamp, '{stop}'::timestamp, '{spec}')")


def test_reading_exports(lite, pg):
    # The export readers over texts made from the seeded rows.
    check("to_time", lite, pg,
          "SELECT id, to_time(strftime('%d/%m/%Y %H:%M', local), '%d/%m/%Y %H:%M', zone), "
          "to_time(strftime('%d/%m/%Y %H:%M', local), '%d/%m/%Y %H:%M'), "
          "to_time(strftime('%Y%m%d', local), '%Y%m%d') FROM sales ORDER BY id",
          "SELECT id, to_time(to_char(local, 'DD/MM/YYYY HH24:MI'), '%d/%m/%Y %H:%M', zone), "
          "to_time(to_char(local, 'DD/MM/YYYY HH24:MI'), '%d/%m/%Y %H:%M'), "
          "to_time(to_char(local, 'YYYYMMDD'), '%Y%m%d') FROM sales ORDER BY id")
    # spreadsheet serial days made from the instant the same way in both engines
    serial = "(x / 86400.0 + 25569.0)"
    check("to_time excel", lite, pg,
          f"SELECT id, to_time({serial}, 'excel'), to_time({serial}, 'excel', zone) FROM sales ORDER BY id",
          f"SELECT id, to_time({serial}, 'excel'), to_time({serial}, 'excel', zone) FROM sales ORDER BY id")
    amounts = ("CASE id % 4 WHEN 0 THEN '$' || {a} WHEN 1 THEN {a} || ' EUR' "
               "WHEN 2 THEN '(' || {a} || ')' ELSE replace({a}, '.', ',') END")
    query = ("SELECT id, to_amount({texts}, CASE id % 4 WHEN 3 THEN ',' ELSE '.' END) FROM sales "
             "WHERE amount BETWEEN 0 AND 999 ORDER BY id")
    check("to_amount", lite, pg, query.format(texts=amounts.format(a="printf('%.2f', amount)")),
          query.format(texts=amounts.format(a="to_char(amount, 'FM9990.00')")))
    check("to_amount one argument", lite, pg,
          "SELECT id, to_amount('EUR ' || printf('%.2f', amount)) FROM sales WHERE amount > 0 ORDER BY id",
          "SELECT id, to_amount('EUR ' || to_char(amount, 'FM9999999999990.00')) FROM sales WHERE amount > 0 ORDER BY id")


# family: (exact calls, calls within 1e-12 relative); {t} is the time column of the engine
FAMILIES = {
    "sums": ("exact_sum(amount), exact_sum(qty), exact_sum(dow), exact_sum(CAST(qty AS smallint)), "
             "moving_mean(amount), moving_mean(qty), "
             "moving_mean(amount, 100)", ""),
    "order statistics": ("median(amount), median(qty), mad(amount)", ""),
    "trends": ("theil_sen_slope(amount, x), theil_sen_slope(amount, x, dow), mann_kendall_p(amount, x), "
               "mann_kendall_p(amount, x, dow), mann_kendall_p(qty, x)", ""),
    "moments": ("", "resid_sd(amount, x), slope_stderr(amount, x), ewma(amount, x, 604800.0), "
                    "ewma(amount, {t}, '2 weeks'), ewma(amount, ts_text, '5 days'), ewma(amount, local, 'PT36H'), "
                    "ewma(amount, day, 'P7D')"),
    "sparkline": ("sparkline(amount, x), sparkline(qty, {t}), sparkline(amount, ts_text)", ""),
    # Wall-clock times of different shops can be equal, and DESIGN leaves the order
    # of equal x open, so this one is compared only within a shop.
    "sparkline over wall-clock times": ("sparkline(amount, local)", ""),
}
WITHIN_A_SHOP = {"sparkline over wall-clock times"}
GROUPINGS = ["", "shop, item", "shop, item, period_label({t}, 'month', zone)", "shop, period_serial({t}, 'week', zone)"]


AGGREGATE_CASES = [(family, grouping) for family in FAMILIES for grouping in GROUPINGS
                   if family not in WITHIN_A_SHOP or grouping.startswith("shop")]


@pytest.mark.parametrize("family,grouping", AGGREGATE_CASES, ids=[f"{f} by ({g})" for f, g in AGGREGATE_CASES])
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


# x of a chart in each engine's types: (SQLite, PostgreSQL) — a TEXT date, a date,
# an instant (UTC TEXT in SQLite, timestamptz), a wall-clock time, a number
CHART_X = {
    "text": ("period_floor(ts_text, 'week')", "period_floor(ts_text, 'week')"),
    "date": ("period_floor(day, 'week')", "period_floor(day, 'week')"),
    "timestamptz": ("datetime(period_floor(x, 'week'), 'unixepoch')", "period_floor(ts, 'week')"),
    "timestamp": ("datetime(period_floor(local, 'week'))", "period_floor(local, 'week')"),
    "number": ("period_serial(x, 'week')", "period_serial(ts, 'week')::float8"),
}
CHARTS = ("svg_line_chart(week, total, shop)",
          "svg_line_chart(week, total, shop, 'smooth', '{\"title\": \"Tea <weekly>\", \"width\": 640}')",
          "svg_bar_chart(week, total, shop)", "svg_bar_chart(week, total, shop, '{\"y_caption\": \"EUR\"}')")


@pytest.mark.parametrize("x", CHART_X)
def test_charts(lite, pg, x):
    weekly = ("SELECT shop, {week} AS week, exact_sum(amount) AS total FROM sales "
              "WHERE item = 'tea' AND ts_text < '2024-07' GROUP BY shop, week ORDER BY shop, week")
    lite_week, pg_week = CHART_X[x]
    for chart in CHARTS:
        check(f"{chart} over {x}", lite, pg, f"SELECT {chart} FROM ({weekly.format(week=lite_week)})",
              f"SELECT {chart} FROM ({weekly.format(week=pg_week)}) AS w")


def test_every_function_of_the_extension_is_compared(pg):
    # source: PostgreSQL's catalogs, the functions and aggregates that belong to the extension
    rows = fetch_pg(pg, """SELECT DISTINCT p.proname FROM pg_proc p
        JOIN pg_depend d ON d.classid = 'pg_proc'::regclass AND d.objid = p.oid AND d.deptype = 'e'
        JOIN pg_extension e ON e.oid = d.refobjid AND e.extname = 'almanac'
        WHERE p.proname !~ '^almanac_' AND p.prorettype <> 'cstring'::regtype
          AND p.proname !~ '_(in|out|recv|send)$'""")
    names = {name for (name,) in rows} | {"almanac_version", "almanac_tz_version"}
    text = open(__file__, encoding="utf-8").read()
    missing = sorted(name for name in names if f"{name}(" not in text)
    assert not missing, f"functions of the extension that no query here compares: {missing}"
    assert len(names) >= 25, sorted(names)
