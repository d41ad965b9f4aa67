# SPDX-License-Identifier: MIT
"""period_position as a season key in an index and a generated column.

README: period_position is deterministic without a zone, as the period
functions, so a table can keep its season key in a generated column or index
it; the zoned form is not (a tz database update could change it) and SQLite
refuses it there.
"""
import datetime as dt
import sqlite3

import pytest

from conftest import connect


def test_the_zoneless_season_key_is_a_generated_column_and_an_index(db):
    db.executescript("""
        CREATE TABLE sales(id INTEGER PRIMARY KEY, ts TEXT, amount REAL,
                           weekday INTEGER GENERATED ALWAYS AS (period_position(ts, 'day', 'week')) STORED);
        CREATE INDEX sales_month ON sales(period_position(ts, 'month', 'year'));
    """)
    days = [dt.date(2025, 1, 1) + dt.timedelta(days=k) for k in range(400)]
    db.executemany("INSERT INTO sales(ts, amount) VALUES (?, 1)", [(f"{d} 12:00:00",) for d in days])
    got = db.execute("SELECT weekday, count(*) FROM sales GROUP BY weekday ORDER BY weekday").fetchall()
    expected = {}
    for d in days:
        expected[d.isoweekday()] = expected.get(d.isoweekday(), 0) + 1  # oracle: date.isoweekday()
    assert got == sorted(expected.items())
    plan = " ".join(r[3] for r in db.execute(
        "EXPLAIN QUERY PLAN SELECT count(*) FROM sales WHERE period_position(ts, 'month', 'year') = 3"))
    assert "sales_month" in plan  # SQLite uses the index on the expression
    march = db.execute("SELECT count(*) FROM sales WHERE period_position(ts, 'month', 'year') = 3").fetchone()[0]
    assert march == sum(1 for d in days if d.month == 3)  # oracle: date.month


def test_the_zoned_season_key_is_refused_in_an_index(db):
    db.execute("CREATE TABLE sales(ts TEXT)")
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute("CREATE INDEX zoned ON sales(period_position(ts, 'day', 'week', 'America/Denver'))")
    # SQLite's own message for a function that is not deterministic (common practice).
    assert "non-deterministic" in str(error.value)
