# SPDX-License-Identifier: MIT
"""Bad input to period_position, mann_kendall_p, the seasonal theil_sen_slope
and mad: a clear error, never a crash; NULL follows SQL conventions.

Every message has one shape (ext/sqlite/arguments.h):
    fn(): argument N (name) = <value>: <what was expected>
README ("Seasons and anomalies") is the source of what is
an error: pairs that do not nest, TEXT that SQLite does not read as a
number, BLOBs and infinities (for y and x: a season is any value but NULL). The full texts were read, judged clear, and
pinned here.
"""
import sqlite3

import pytest

from conftest import connect

NEST = ("expected a pair that nests: second, minute or hour periods in a longer cycle whose length "
        "they divide (in a day or longer when they divide 24 hours); day in N days, week, "
        "half-month, month, quarter or year; week in year; half-month in month, quarter or year; "
        "month, quarter or year periods in a longer month-based cycle that is a whole number of them "
        "and begins where one of them begins")


def refused(spec, cycle, spec_words, cycle_words):
    return (f"SELECT period_position('2026-03-05', '{spec}', '{cycle}')",
            f"period_position(): argument 3 (cycle) = '{cycle}': '{spec_words}' periods do not nest "
            f"in '{cycle_words}' cycles; " + NEST)


# Every kind of refused pair (README: a week within a month, a month within
# a week, a cycle not longer than the spec; and the grid and count rules the
# README states).
REFUSED = [
    refused("week", "month", "week", "month"),
    refused("month", "week", "month", "week"),
    refused("day", "day", "day", "day"),
    refused("hour", "hour", "hour", "hour"),
    refused("month", "month", "month", "month"),
    refused("year", "year", "year", "year"),
    refused("year", "quarter", "year", "quarter"),
    refused("quarter", "half-month", "quarter", "half-month"),
    refused("half-month", "week", "half-month", "week"),
    refused("half-month", "half-month", "half-month", "half-month"),
    refused("week", "quarter", "week", "quarter"),
    refused("week", "2 years", "week", "2 years"),
    refused("week", "week", "week", "week"),
    refused("2 weeks", "year", "2 weeks", "year"),
    refused("2 days", "week", "2 days", "week"),
    refused("day", "hour", "day", "hour"),
    refused("7 minutes", "hour", "7 minutes", "hour"),
    refused("7 hours", "day", "7 hours", "day"),
    refused("PT24H", "day", "24 hours", "day"),
    refused("2 months", "quarter", "2 months", "quarter"),
    refused("quarter", "year starting february", "quarter", "year starting february"),
    refused("month", "month from 2024-01-15", "month", "month from 2024-01-15"),
    refused("day", "month from 2024-01-15 06:00", "day", "month from 2024-01-15 06:00:00"),
    refused("half-month", "month from 2024-01-15", "half-month", "month from 2024-01-15"),
    refused("week", "year from 2024-01-01", "week", "year from 2024-01-01"),
]

NOT_A_NUMBER = "expected a number"
BLOB = "expected a number, not a BLOB"
NOT_FINITE = "expected a finite number"

OTHER = [
    ("SELECT period_position('2026-02-30', 'day', 'week')",
     "period_position(): argument 1 (t) = '2026-02-30': "),
    ("SELECT period_position('2026-03-05', 'day from 2024-01-01', 'week')",
     "period_position(): argument 2 (spec) = 'day from 2024-01-01': expected a spec without "
     "'from': positions count from the start of the cycle"),
    ("SELECT period_position('2026-03-05', 'fortnight', 'week')",
     "period_position(): argument 2 (spec) = 'fortnight': "),
    ("SELECT period_position('2026-03-05', 'day', 'lunar month')",
     "period_position(): argument 3 (cycle) = 'lunar month': "),
    ("SELECT period_position('2026-03-05', 'day', 'week', 'Mars/Olympus')",
     "period_position(): argument 4 (zone) = 'Mars/Olympus': "),
    ("SELECT period_position('2026-03-05', 7, 'week')",
     "period_position(): argument 2 (spec) = 7: expected TEXT, not a number"),
    ("SELECT mann_kendall_p('abc', 1)", f"mann_kendall_p(): argument 1 (y) = 'abc': {NOT_A_NUMBER}"),
    ("SELECT mann_kendall_p(1, X'00')", f"mann_kendall_p(): argument 2 (x) = a BLOB of 1 byte: {BLOB}"),
    ("SELECT mann_kendall_p(1e999, 2)", f"mann_kendall_p(): argument 1 (y) = inf: {NOT_FINITE}"),
    ("SELECT theil_sen_slope('n/a', 2, 1)", f"theil_sen_slope(): argument 1 (y) = 'n/a': {NOT_A_NUMBER}"),
    ("SELECT theil_sen_slope(1, -1e999, 1)", f"theil_sen_slope(): argument 2 (x) = -inf: {NOT_FINITE}"),
    ("SELECT mad('n/a')", f"mad(): argument 1 (x) = 'n/a': {NOT_A_NUMBER}"),
    ("SELECT mad(X'0102')", f"mad(): argument 1 (x) = a BLOB of 2 bytes: {BLOB}"),
    ("SELECT mad(1e999)", f"mad(): argument 1 (x) = inf: {NOT_FINITE}"),
    ("WITH t(y, x, s) AS (VALUES (1, -1e308, 1), (2, 1e308, 1)) SELECT theil_sen_slope(y, x, s) FROM t",
     "theil_sen_slope(): the x values differ by more than the largest double, so no slope is finite"),
]


@pytest.mark.parametrize("sql,message", REFUSED, ids=[c[0].split("', '", 1)[1] for c in REFUSED])
def test_a_pair_that_does_not_nest_is_refused_with_the_pairs_that_do(db, sql, message):
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute(sql).fetchall()
    assert str(error.value) == message  # pinned: the full text (module docstring)


def assert_refused(db, sql, message):
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute(sql).fetchall()
    if message.endswith(": "):
        assert str(error.value).startswith(message)  # the parser's own words follow
        assert len(str(error.value)) > len(message) + 10
    else:
        assert str(error.value) == message


@pytest.mark.parametrize("sql,message", OTHER, ids=[c[0] for c in OTHER])
def test_bad_input_names_the_function_the_argument_and_the_value(db, sql, message):
    assert_refused(db, sql, message)


@pytest.mark.parametrize("sql", [
    "SELECT period_position(NULL, 'day', 'week')",
    "SELECT period_position('2026-03-05', NULL, 'week')",
    "SELECT period_position('2026-03-05', 'day', NULL)",
    "SELECT period_position('2026-03-05', 'day', 'week', NULL)",
    "SELECT mann_kendall_p(NULL, 1)",
    "SELECT mann_kendall_p(1, 1)",
    "SELECT theil_sen_slope(1, 2, NULL)",
    "SELECT mad(NULL)",
    "SELECT mad(x) FROM (SELECT 1 AS x WHERE 0)",
])
def test_null_and_empty_input_give_null(db, sql):
    # SQL convention (common practice): NULL in, NULL out; no rows, NULL.
    assert db.execute(sql).fetchone()[0] is None


def test_rows_with_a_null_season_are_skipped(db):
    # README: "rows with a NULL season are skipped"; by hand, season 1 alone has slope 2.
    got = db.execute("WITH t(y, x, s) AS (VALUES (1, 1, 1), (3, 2, 1), (100, 3, NULL)) "
                     "SELECT theil_sen_slope(y, x, s) FROM t").fetchone()[0]
    assert got == 2.0


@pytest.mark.parametrize("season", ["'winter'", "'1,5'", "X'00'", "9e999", "''"])
def test_any_value_but_null_is_a_season(db, season):
    # DESIGN "Trend, season and noise, apart": any non-NULL value is a season.
    # By hand: one season, two points, slope 2; S = 1 with Var(S) = 1, so
    # p = erfc(1/sqrt(2)) (math.erfc, from memory: 2(1 - Phi(1))).
    import math
    got = db.execute(f"WITH t(y, x) AS (VALUES (1, 1), (3, 2)) "
                     f"SELECT theil_sen_slope(y, x, {season}), mann_kendall_p(y, x, {season}) FROM t").fetchone()
    assert got[0] == 2.0
    assert got[1] == pytest.approx(math.erfc(1 / math.sqrt(2)), rel=1e-15)


# ---- period_decomposition: errors name it (DESIGN "Trend, season and noise, apart") ----
DECOMPOSITION_USAGE = "expected period_decomposition(source, spec, cycle [, zone [, options]])"
SEASONAL = "expected an odd whole number of cycles from 7 to 1000001"
DECOMPOSITION = [
    ("SELECT * FROM period_decomposition('sales', 'week', 'month')",
     "period_decomposition(): argument 3 (cycle) = 'month': 'week' periods do not nest in 'month' cycles; " + NEST),
    ("SELECT * FROM period_decomposition('sales', 'month', 'week')",
     "period_decomposition(): argument 3 (cycle) = 'week': 'month' periods do not nest in 'week' cycles; " + NEST),
    ("SELECT * FROM period_decomposition('sales', 'day', 'week', NULL, '{\"seasonal\": 8}')",
     f"period_decomposition(): argument 5 (options) = '{{\"seasonal\": 8}}': key \"seasonal\" = 8: {SEASONAL}"),
    ("SELECT * FROM period_decomposition('sales', 'day', 'week', NULL, '{\"seasonal\": 5}')",
     f"period_decomposition(): argument 5 (options) = '{{\"seasonal\": 5}}': key \"seasonal\" = 5: {SEASONAL}"),
    ("SELECT * FROM period_decomposition('sales', 'day', 'week', 'UTC', '{\"period\": 7}')",
     "period_decomposition(): argument 5 (options) = '{\"period\": 7}': unknown key \"period\": "
     "expected \"seasonal\" or \"robust\""),
    ("SELECT * FROM period_decomposition('sales', 'day', 'week', 'UTC', '{\"robust\": \"yes\"}')",
     "period_decomposition(): argument 5 (options) = '{\"robust\": \"yes\"}': key \"robust\" = \"yes\": "
     "expected true or false"),
    ("SELECT * FROM period_decomposition('sales', 'day', 'week', 'UTC', '{seasonal: 9}')",
     "period_decomposition(): argument 5 (options) = '{seasonal: 9}': invalid JSON at byte 2: "),
    ("SELECT * FROM period_decomposition('no_such_table', 'day', 'week')",
     "period_decomposition(): argument 1 (source) = 'no_such_table': no table or view of that name "
     "(expected 'name' or 'schema.name')"),
    ("SELECT * FROM period_decomposition('sales', 'fortnight', 'week')",
     "period_decomposition(): argument 2 (spec) = 'fortnight': "),
    ("SELECT * FROM period_decomposition('sales', 'day', 'week', 'Mars/Olympus')",
     "period_decomposition(): argument 4 (zone) = 'Mars/Olympus': "),
    ("SELECT * FROM period_decomposition('sales', 'hour', 'year')",
     "period_decomposition(): argument 3 (cycle) = 'year': a cycle of 8766 'hour' periods; expected at most "
     "2000 (decompose a longer spec, such as 'day' in 'year')"),
    ("SELECT * FROM period_decomposition('sales', 'day')",
     "period_decomposition(): cycle is missing; " + DECOMPOSITION_USAGE),
]


@pytest.mark.parametrize("sql,message", DECOMPOSITION, ids=[c[0][34:] for c in DECOMPOSITION])
def test_bad_decomposition_input_names_period_decomposition(db, sql, message):
    db.execute("CREATE TABLE sales(ts TEXT, item TEXT, amount REAL)")
    db.execute("INSERT INTO sales VALUES ('2026-01-05', 'bread', 3.5)")
    assert_refused(db, sql, message)


def test_null_source_spec_or_cycle_give_no_rows_and_a_null_zone_is_no_zone(db):
    # SQL convention (common practice) for table functions, as period_totals: NULL argument, no rows
    db.execute("CREATE TABLE sales(ts TEXT, item TEXT, amount REAL)")
    db.execute("INSERT INTO sales VALUES ('2026-01-05', 'bread', 3.5)")
    for args in ("NULL, 'day', 'week'", "'sales', NULL, 'week'", "'sales', 'day', NULL"):
        assert db.execute(f"SELECT count(*) FROM period_decomposition({args})").fetchone()[0] == 0
    # one day, far from two whole weeks: listed with NULL parts
    got = db.execute("SELECT amount, trend, season, noise, weight "
                     "FROM period_decomposition('sales', 'day', 'week', NULL, NULL)").fetchall()
    assert got == [(3.5, None, None, None, None)]
