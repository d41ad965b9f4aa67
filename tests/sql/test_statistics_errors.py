# SPDX-License-Identifier: MIT
"""Bad input to the statistics functions: a clear error, or NULL by SQL's rules, never a crash.

Every message has one shape (the common brief, ext/sqlite/arguments.h):
    fn(): argument N (name) = <value>: <what was expected>
Each case states the function, the argument by position and name, and the
value as SQLite hands it over; the full text was read, judged clear, and
pinned. README ("Statistics: aggregates that are also sliding windows") is the source of what is an error: TEXT that
SQLite does not read as a number, BLOBs and infinities; months and years as
a half-life; a half_life or min_values that changes within a group.
"""
import sqlite3

import pytest

from conftest import connect


def prefix(function, position, name, value):
    return f"{function}(): argument {position} ({name}) = {value}: "


NOT_A_NUMBER = "expected a number"
NOT_FINITE = "expected a finite number"
BLOB = "expected a number, not a BLOB"
MIN_VALUES = "expected a whole number from 1 to 1000000000"
NUMERIC_T = ("expected a number, because half_life is a number (give half_life as a period "
             "such as '7 days' for time values)")
POSITIVE = "expected a positive number or a period such as '7 days'"
NO_FIXED_LENGTH = "has no fixed length; expected seconds, minutes, hours, days or weeks"

# (SQL expression, function, position, name, value as shown, what was expected)
CASES = [
    ("var_samp('abc')", "var_samp", 1, "x", "'abc'", NOT_A_NUMBER),
    ("var_samp('1,234.50')", "var_samp", 1, "x", "'1,234.50'", NOT_A_NUMBER),  # the README's own example
    ("var_samp('12 apples')", "var_samp", 1, "x", "'12 apples'", NOT_A_NUMBER),
    ("var_pop(X'00')", "var_pop", 1, "x", "a BLOB of 1 byte", BLOB),
    ("stddev_samp(1e999)", "stddev_samp", 1, "x", "inf", NOT_FINITE),
    ("stddev_pop(-1e999)", "stddev_pop", 1, "x", "-inf", NOT_FINITE),
    ("covar_samp('x', 1)", "covar_samp", 1, "y", "'x'", NOT_A_NUMBER),
    ("covar_pop(1, 'x')", "covar_pop", 2, "x", "'x'", NOT_A_NUMBER),
    ("corr(X'', 1)", "corr", 1, "y", "a BLOB of 0 bytes", BLOB),
    ("regr_count('a', 1)", "regr_count", 1, "y", "'a'", NOT_A_NUMBER),
    ("regr_avgx(1, 'b')", "regr_avgx", 2, "x", "'b'", NOT_A_NUMBER),
    ("regr_avgy(1e999, 1)", "regr_avgy", 1, "y", "inf", NOT_FINITE),
    ("regr_sxx(1, X'AB')", "regr_sxx", 2, "x", "a BLOB of 1 byte", BLOB),
    ("regr_syy('NaN', 1)", "regr_syy", 1, "y", "'NaN'", NOT_A_NUMBER),
    ("regr_sxy('', 1)", "regr_sxy", 1, "y", "''", NOT_A_NUMBER),
    ("regr_slope('1e999', 1)", "regr_slope", 1, "y", "'1e999'", NOT_FINITE),
    ("regr_intercept(1, 'inf')", "regr_intercept", 2, "x", "'inf'", NOT_A_NUMBER),
    ("regr_r2('--1', 1)", "regr_r2", 1, "y", "'--1'", NOT_A_NUMBER),
    ("resid_sd('0x10', 1)", "resid_sd", 1, "y", "'0x10'", NOT_A_NUMBER),
    ("slope_stderr(1, 'one')", "slope_stderr", 2, "x", "'one'", NOT_A_NUMBER),
    ("moving_mean('abc')", "moving_mean", 1, "x", "'abc'", NOT_A_NUMBER),
    ("moving_mean(X'0102')", "moving_mean", 1, "x", "a BLOB of 2 bytes", BLOB),
    ("moving_mean(1, 0)", "moving_mean", 2, "min_values", "0", MIN_VALUES),
    ("moving_mean(1, 2.5)", "moving_mean", 2, "min_values", "2.5", MIN_VALUES),
    ("moving_mean(1, 'three')", "moving_mean", 2, "min_values", "'three'", NOT_A_NUMBER),
    ("moving_mean(1, 1000000001)", "moving_mean", 2, "min_values", "1000000001", MIN_VALUES),
    ("ewma('abc', 1, 2)", "ewma", 1, "x", "'abc'", NOT_A_NUMBER),
    ("ewma(1, 'abc', 2)", "ewma", 2, "t", "'abc'", NUMERIC_T),
    ("ewma(1, '2024-01-01', 2)", "ewma", 2, "t", "'2024-01-01'", NUMERIC_T),
    ("ewma(1, 1e999, 2)", "ewma", 2, "t", "inf", NOT_FINITE),
    ("ewma(1, 1e300, 1)", "ewma", 2, "t", "1e+300",
     "t / half_life is beyond 2^52: consecutive values of t are farther apart than a half-life"),
    ("ewma(1, '2024-02-30', '1 day')", "ewma", 2, "t", "'2024-02-30'",
     "no such date: 2024-02 has 29 days"),
    ("ewma(1, 'yesterday', '1 day')", "ewma", 2, "t", "'yesterday'",
     "expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, or a number "
     "(a Julian day below 5373484.5, Unix seconds otherwise)"),
    ("ewma(1, X'01', '1 day')", "ewma", 2, "t", "a BLOB of 1 byte",
     "expected a time value, not a BLOB"),
    ("ewma(1, 1, 0)", "ewma", 3, "half_life", "0", POSITIVE),
    ("ewma(1, 1, '-2')", "ewma", 3, "half_life", "'-2'", POSITIVE),
    ("ewma(1, 1, 1e999)", "ewma", 3, "half_life", "inf", NOT_FINITE),
    ("ewma(1, 1, X'01')", "ewma", 3, "half_life", "a BLOB of 1 byte",
     "expected a period such as '7 days' or a positive number, not a BLOB"),
    # README: months and years are refused as a half-life.
    ("ewma(1, '2024-01-01', '1 month')", "ewma", 3, "half_life", "'1 month'",
     "'month' " + NO_FIXED_LENGTH),
    ("ewma(1, '2024-01-01', 'P1Y')", "ewma", 3, "half_life", "'P1Y'", "'year' " + NO_FIXED_LENGTH),
    ("ewma(1, '2024-01-01', 'half-month')", "ewma", 3, "half_life", "'half-month'",
     "'half-month' " + NO_FIXED_LENGTH),
    ("ewma(1, '2024-01-01', 'fortnight')", "ewma", 3, "half_life", "'fortnight'",
     "unknown unit 'fortnight'; expected [count] unit [starting weekday|month] [from YYYY-MM-DD"
     "[ HH:MM[:SS]]] with unit one of second, minute, hour, day, week, half-month, month, quarter, "
     "year, or an ISO 8601 duration such as P1W or PT15M"),
]


@pytest.mark.parametrize("expression,function,position,name,value,expected", CASES,
                         ids=[c[0] for c in CASES])
def test_bad_argument(db, expression, function, position, name, value, expected):
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute(f"SELECT {expression}").fetchall()
    assert str(error.value) == prefix(function, position, name, value) + expected


GROUP_CASES = [
    # A constant argument that changes between rows of one group.
    ("SELECT moving_mean(v, v) FROM (SELECT 1 AS v UNION ALL SELECT 2)",
     prefix("moving_mean", 2, "min_values", "2") +
     "expected the same min_values in every row (the first was 1)"),
    ("SELECT ewma(v, v, h) FROM (SELECT 1 AS v, 2 AS h UNION ALL SELECT 2, 3)",
     prefix("ewma", 3, "half_life", "3") + "expected the same half_life in every row (the first was 2)"),
    ("SELECT ewma(v, t, h) FROM (SELECT 1 AS v, '2024-01-01' AS t, '1 day' AS h "
     "UNION ALL SELECT 2, '2024-01-02', '2 days')",
     prefix("ewma", 3, "half_life", "'2 days'") +
     "expected the same half_life in every row (the first was '1 day')"),
    ("SELECT ewma(v, t, h) FROM (SELECT 1 AS v, '2024-01-01' AS t, '1 day' AS h "
     "UNION ALL SELECT 2, '2024-01-02', 3)",
     prefix("ewma", 3, "half_life", "3") +
     "expected the same half_life in every row (the first was '1 day')"),
    # The error surfaces from inside a sliding frame too.
    ("SELECT var_samp(v) OVER (ROWS 2 PRECEDING) FROM (SELECT 1 AS v UNION ALL SELECT 'x')",
     prefix("var_samp", 1, "x", "'x'") + NOT_A_NUMBER),
    ("SELECT regr_slope(y, x) OVER (ORDER BY x ROWS 1 PRECEDING) FROM "
     "(SELECT 1 AS y, 1 AS x UNION ALL SELECT X'FF', 2)",
     prefix("regr_slope", 1, "y", "a BLOB of 1 byte") + BLOB),
]


@pytest.mark.parametrize("sql,expected", GROUP_CASES, ids=[f"group{i}" for i in range(len(GROUP_CASES))])
def test_bad_group(db, sql, expected):
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute(sql).fetchall()
    assert str(error.value) == expected


def test_wrong_argument_count_is_sqlites_own_error(db):
    # SQLite's message for an arity that is not registered (common practice).
    with pytest.raises(sqlite3.OperationalError, match="wrong number of arguments to function moving_mean"):
        db.execute("SELECT moving_mean(1, 2, 3)").fetchall()


NULL_CASES = [
    # SQL conventions (ISO/IEC 9075 aggregates): NULL rows are skipped, empty groups give NULL,
    # REGR_COUNT gives 0; README: n < 2 for sample statistics, n < 3 for resid_sd.
    ("SELECT var_samp(NULL)", None),
    ("SELECT var_samp(5)", None),
    ("SELECT var_pop(5)", 0.0),
    ("SELECT regr_count(NULL, 1)", 0),
    ("SELECT regr_count(y, x) FROM (SELECT 1 AS y, NULL AS x UNION ALL SELECT 2, 3)", 1),
    ("SELECT covar_samp(1, 2)", None),
    ("SELECT resid_sd(y, x) FROM (SELECT 1 AS y, 1 AS x UNION ALL SELECT 2, 3)", None),
    ("SELECT slope_stderr(y, x) FROM (SELECT 1 AS y, 1 AS x UNION ALL SELECT 2, 1 UNION ALL SELECT 3, 1)", None),
    ("SELECT moving_mean(1, NULL)", None),
    ("SELECT moving_mean(v, 3) FROM (SELECT 1 AS v UNION ALL SELECT 2)", None),
    ("SELECT ewma(1, NULL, 2)", None),
    ("SELECT ewma(1, 1, NULL)", None),
    ("SELECT ewma(NULL, '2024-01-01', '1 day')", None),
    ("SELECT var_samp(v) FROM (SELECT 1 AS v) WHERE v > 1", None),
    ("SELECT var_samp(' 12.5') IS NULL, var_pop(' 12.5')", (1, 0.0)),  # numeric TEXT is a number
]


@pytest.mark.parametrize("sql,expected", NULL_CASES, ids=[c[0] for c in NULL_CASES])
def test_null_conventions(db, sql, expected):
    row = db.execute(sql).fetchone()
    assert (row if isinstance(expected, tuple) else row[0]) == expected


def test_case_count():
    print(f"{len(CASES) + len(GROUP_CASES) + 1} bad-input cases with exact text")
    assert len(CASES) + len(GROUP_CASES) >= 30
