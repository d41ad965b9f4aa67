# SPDX-License-Identifier: MIT
"""Bad input to median, percentile_cont and theil_sen_slope: a clear error, never a crash.

Every message has one shape (the common brief, ext/sqlite/arguments.h):
    fn(): argument N (name) = <value>: <what was expected>
Each case names the function, the argument by position and name, and the
value as SQLite hands it over; the full text was read, judged clear, and
pinned. README ("Statistics: aggregates that are also sliding windows") is the source of what is an error: TEXT that
SQLite does not read as a number, BLOBs and infinities; p outside [0, 1] or
changing within a group.
"""
import sqlite3

import pytest

from conftest import connect


def prefix(function, position, name, value):
    return f"{function}(): argument {position} ({name}) = {value}: "


NOT_A_NUMBER = "expected a number"
NOT_FINITE = "expected a finite number"
BLOB = "expected a number, not a BLOB"
P_RANGE = "expected a number from 0 to 1"


def same_p(first):
    return f"expected the same p on every row of the group (the first row's was {first})"


# (SQL query, function, position, name, value as shown, what was expected)
CASES = [
    ("SELECT percentile_cont(NULL, 2)", "percentile_cont", 2, "p", "2", P_RANGE),
    ("SELECT median('abc')", "median", 1, "x", "'abc'", NOT_A_NUMBER),
    ("SELECT median('1,234.50')", "median", 1, "x", "'1,234.50'", NOT_A_NUMBER),  # the README's own example
    ("SELECT median(X'00FF')", "median", 1, "x", "a BLOB of 2 bytes", BLOB),
    ("SELECT median(1e999)", "median", 1, "x", "inf", NOT_FINITE),
    ("SELECT median(-1e999)", "median", 1, "x", "-inf", NOT_FINITE),
    ("SELECT percentile_cont('twelve', 0.5)", "percentile_cont", 1, "x", "'twelve'", NOT_A_NUMBER),
    ("SELECT percentile_cont(X'01', 0.5)", "percentile_cont", 1, "x", "a BLOB of 1 byte", BLOB),
    ("SELECT percentile_cont(1, 1.5)", "percentile_cont", 2, "p", "1.5", P_RANGE),
    ("SELECT percentile_cont(1, -0.25)", "percentile_cont", 2, "p", "-0.25", P_RANGE),
    ("SELECT percentile_cont(1, 50)", "percentile_cont", 2, "p", "50", P_RANGE),  # a percent, not a fraction
    ("SELECT percentile_cont(1, 'half')", "percentile_cont", 2, "p", "'half'", NOT_A_NUMBER),
    ("SELECT percentile_cont(1, X'3035')", "percentile_cont", 2, "p", "a BLOB of 2 bytes", BLOB),
    ("SELECT percentile_cont(1, 1e999)", "percentile_cont", 2, "p", "inf", NOT_FINITE),
    ("WITH t(x, p) AS (VALUES (1, 0.5), (2, 0.9)) SELECT percentile_cont(x, p) FROM t",
     "percentile_cont", 2, "p", "0.9", same_p("0.5")),
    ("WITH t(x, p) AS (VALUES (1, 0.25), (NULL, 0.75)) SELECT percentile_cont(x, p) FROM t",
     "percentile_cont", 2, "p", "0.75", same_p("0.25")),
    ("WITH t(x) AS (VALUES (1), (2), (3))"
     " SELECT percentile_cont(x, 0.1 * x) OVER (ORDER BY x ROWS 1 PRECEDING) FROM t", "percentile_cont", 2, "p", "0.2", same_p("0.1")),
    ("WITH t(i, x) AS (VALUES (1, 1), (2, 2), (3, 'n/a'))"
     " SELECT median(x) OVER (ORDER BY i ROWS 2 PRECEDING) FROM t",
     "median", 1, "x", "'n/a'", NOT_A_NUMBER),
    ("SELECT theil_sen_slope('up', 1)", "theil_sen_slope", 1, "y", "'up'", NOT_A_NUMBER),
    ("SELECT theil_sen_slope(1, '2024-01-05')", "theil_sen_slope", 2, "x", "'2024-01-05'",
     NOT_A_NUMBER),
    ("SELECT theil_sen_slope(1, X'01')", "theil_sen_slope", 2, "x", "a BLOB of 1 byte", BLOB),
    ("SELECT theil_sen_slope(-1e999, 1)", "theil_sen_slope", 1, "y", "-inf", NOT_FINITE),
    ("WITH t(y, x) AS (VALUES (1, 1), (2, 2), (1e999, 3))"
     " SELECT theil_sen_slope(y, x) OVER (ORDER BY x ROWS 3 PRECEDING) FROM t", "theil_sen_slope", 1, "y", "inf", NOT_FINITE),
]


@pytest.mark.parametrize("sql,function,position,name,value,expected", CASES,
                         ids=[case[0][:60] for case in CASES])
def test_bad_argument(sql, function, position, name, value, expected):
    connection = connect()
    with pytest.raises(sqlite3.OperationalError) as error:
        connection.execute(sql).fetchall()
    # oracle: the message shape of the common brief, with the README's rule.
    assert str(error.value) == prefix(function, position, name, value) + expected
    connection.close()


@pytest.mark.parametrize("sql,message", [
    ("WITH t(y, x) AS (VALUES (1, -1e308), (2, 1e308)) SELECT theil_sen_slope(y, x) FROM t",
     "theil_sen_slope(): the x values differ by more than the largest double, so no slope is finite"),
    ("WITH t(y, x) AS (VALUES (-1e308, 1), (1e308, 2)) SELECT theil_sen_slope(y, x) FROM t",
     "theil_sen_slope(): the y values differ by more than the largest double, so no slope is finite"),
])
def test_overflowing_differences(sql, message):
    connection = connect()
    with pytest.raises(sqlite3.OperationalError) as error:
        connection.execute(sql).fetchall()
    # oracle: IEEE 754 — 1e308 − (−1e308) exceeds the largest double, about 1.8e308 (from memory).
    assert str(error.value) == message
    connection.close()


def test_nulls_are_skipped_not_errors(db):
    # SQL convention (common practice): NULL arguments skip the row. A p that
    # is out of range is still an error on a row whose x is NULL: the query
    # is wrong whatever the data.
    assert db.execute("SELECT median(NULL), percentile_cont(NULL, 0.5), percentile_cont(1, NULL),"
                      " theil_sen_slope(NULL, 1), theil_sen_slope(1, NULL)").fetchone() == (
        None, None, None, None, None)
    # Fewer than two distinct x: no slope (README).
    assert db.execute("WITH t(y, x) AS (VALUES (1, 5), (2, 5)) SELECT theil_sen_slope(y, x) FROM t").fetchone() == (None,)


def test_the_same_p_may_repeat_in_other_forms(db):
    # 0.5, '0.5' and 5e-1 are one number (README: numeric TEXT is a number).
    assert db.execute("WITH t(x, p) AS (VALUES (1, 0.5), (2, '0.5'), (4, 5e-1))"
                      " SELECT percentile_cont(x, p) FROM t"
                      ).fetchone() == (2.0,)  # median of 1, 2, 4 (by hand)


def test_p_may_differ_between_groups_and_partitions(db):
    # "the same for the whole group" (README): each GROUP BY group and each
    # window partition has its own p.
    rows = "WITH t(g, x) AS (VALUES ('a', 1), ('a', 2), ('a', 3), ('b', 10), ('b', 20))"
    assert db.execute(rows + " SELECT g, percentile_cont(x, CASE g WHEN 'a' THEN 0 ELSE 1 END)"
                      " FROM t GROUP BY g ORDER BY g").fetchall() == [("a", 1.0), ("b", 20.0)]
    assert db.execute(rows + " SELECT percentile_cont(x, CASE g WHEN 'a' THEN 0 ELSE 1 END)"
                      " OVER (PARTITION BY g) FROM t ORDER BY g").fetchall() == [
        (1.0,), (1.0,), (1.0,), (20.0,), (20.0,)]  # minimum and maximum (common practice)
