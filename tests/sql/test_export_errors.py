# SPDX-License-Identifier: MIT
"""Bad input to exact_sum, to_amount and to_time: a clear error, or NULL by SQL's rules, never a crash.

Every message has one shape (ext/sqlite/arguments.h):
    fn(): argument N (name) = <value>: <what was expected>
DESIGN.md ("Reading shop exports") is the source of what is an error; each
full text was read, judged clear, and pinned.
"""
import sqlite3

import pytest

from conftest import connect


def prefix(function, position, name, value):
    return f"{function}(): argument {position} ({name}) = {value}: "


TEXT_MONEY = ("expected a number; money or quantities written as text must be read with "
              "to_amount() in the view that maps your table (README: \"Your data\")")

# (SQL, function, position, name, value as shown, what was expected)
CASES = [
    ("SELECT exact_sum('1,050.00')", "exact_sum", 1, "x", "'1,050.00'", TEXT_MONEY),
    ("SELECT exact_sum('$4.20')", "exact_sum", 1, "x", "'$4.20'", TEXT_MONEY),
    ("SELECT exact_sum('')", "exact_sum", 1, "x", "''", TEXT_MONEY),
    ("SELECT exact_sum('12 apples')", "exact_sum", 1, "x", "'12 apples'", TEXT_MONEY),
    ("SELECT exact_sum(X'00')", "exact_sum", 1, "x", "a BLOB of 1 byte", "expected a number, not a BLOB"),
    ("SELECT exact_sum(1e999)", "exact_sum", 1, "x", "inf", "expected a finite number"),
    ("SELECT exact_sum('-1e999')", "exact_sum", 1, "x", "'-1e999'", "expected a finite number"),
    ("SELECT exact_sum(x) OVER (ORDER BY n ROWS 1 PRECEDING) FROM (SELECT 1 AS n, 2 AS x UNION ALL SELECT 2, 'two')",
     "exact_sum", 1, "x", "'two'", TEXT_MONEY),
]


@pytest.mark.parametrize("sql,function,position,name,value,expected", CASES,
                         ids=[case[0] for case in CASES])
def test_bad_input_gives_the_exact_error(sql, function, position, name, value, expected):
    db = connect()
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute(sql).fetchall()
    # oracle: the contract's message shape, with the text pinned above
    assert str(error.value) == prefix(function, position, name, value) + expected


def test_null_follows_sql_conventions():
    db = connect()
    # SQL's rules (common practice): a sum of no rows or only NULLs is NULL.
    assert db.execute("SELECT exact_sum(x) FROM (SELECT NULL AS x)").fetchone() == (None,)
    assert db.execute("SELECT exact_sum(x) FROM (SELECT 1 AS x) WHERE 0").fetchone() == (None,)
