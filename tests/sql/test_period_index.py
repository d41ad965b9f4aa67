# SPDX-License-Identifier: MIT
"""period_floor(ts, 'week') in an index on an expression and in a generated column.

README: the scalar functions are registered deterministic in their forms
without a zone, so they can be used in indexes on expressions and generated
columns; the zoned forms are not (a tz database update could change them).
Checked with EXPLAIN QUERY PLAN through Python's sqlite3 module and through
the real sqlite3 shell with `.load`.
"""
import datetime as dt
import os
import random
import tempfile

import pytest

from conftest import connect, run_shell

SCHEMA = """
CREATE TABLE sales(id INTEGER PRIMARY KEY, ts TEXT, amount REAL);
CREATE INDEX sales_week ON sales(period_floor(ts, 'week'));
CREATE TABLE sales2(id INTEGER PRIMARY KEY, ts TEXT, amount REAL,
                    week TEXT GENERATED ALWAYS AS (period_floor(ts, 'week')) VIRTUAL,
                    month TEXT GENERATED ALWAYS AS (period_label(ts, 'month')) STORED);
CREATE INDEX sales2_week ON sales2(week);
"""


def fill(connection, rows=2000):
    rng = random.Random(11)
    start = dt.datetime(2025, 1, 1)
    values = [(start + dt.timedelta(minutes=rng.randrange(0, 525600 * 2))).isoformat(" ") for _ in range(rows)]
    connection.executemany("INSERT INTO sales(ts, amount) VALUES (?, 1.0)", [(v,) for v in values])
    connection.executemany("INSERT INTO sales2(ts, amount) VALUES (?, 1.0)", [(v,) for v in values])
    connection.commit()
    return values


def monday_of(text):
    day = dt.date.fromisoformat(text[:10])
    return (day - dt.timedelta(days=day.weekday())).isoformat()  # oracle: datetime.date.weekday()


@pytest.fixture
def indexed():
    connection = connect()
    connection.executescript(SCHEMA)
    values = fill(connection)
    yield connection, values
    connection.close()


def plan(connection, sql):
    return " | ".join(row[-1] for row in connection.execute("EXPLAIN QUERY PLAN " + sql).fetchall())


def test_index_on_expression_is_used(indexed):
    connection, values = indexed
    sql = "SELECT count(*) FROM sales WHERE period_floor(ts, 'week') = '2025-03-03'"
    assert "USING INDEX sales_week" in plan(connection, sql) or "USING COVERING INDEX sales_week" in plan(connection, sql)
    (count,) = connection.execute(sql).fetchone()
    assert count == sum(monday_of(v) == "2025-03-03" for v in values) > 0  # oracle: datetime
    grouped = "SELECT period_floor(ts, 'week'), count(*) FROM sales GROUP BY 1 ORDER BY 1"
    assert "sales_week" in plan(connection, grouped)
    got = connection.execute(grouped).fetchall()
    want = sorted({monday_of(v) for v in values})
    assert [row[0] for row in got] == want and sum(row[1] for row in got) == len(values)


def test_generated_columns_and_their_index(indexed):
    connection, values = indexed
    sql = "SELECT count(*) FROM sales2 WHERE week BETWEEN '2025-03-03' AND '2025-03-31'"
    assert "sales2_week" in plan(connection, sql)
    (count,) = connection.execute(sql).fetchone()
    assert count == sum("2025-03-03" <= monday_of(v) <= "2025-03-31" for v in values)  # oracle: datetime
    months = connection.execute("SELECT month, count(*) FROM sales2 GROUP BY 1 ORDER BY 1").fetchall()
    assert [m for m, _ in months] == sorted({v[:7] for v in values})  # oracle: the TEXT itself, YYYY-MM
    # still right after updates: the index follows the expression
    connection.execute("UPDATE sales SET ts = '2030-07-04 10:00:00' WHERE id = 1")
    assert connection.execute("SELECT count(*) FROM sales WHERE period_floor(ts, 'week') = '2030-07-01'"
                              ).fetchone() == (1,)  # oracle: 2030-07-04 is a Thursday (datetime)
    assert dt.date(2030, 7, 4).weekday() == 3
    assert connection.execute("PRAGMA integrity_check").fetchone() == ("ok",)


@pytest.mark.parametrize("ddl", [
    "CREATE INDEX z ON sales(period_floor(ts, 'week', 'America/Denver'))",
    "CREATE TABLE z(ts TEXT, w TEXT GENERATED ALWAYS AS (period_floor(ts, 'week', 'America/Denver')))",
    "CREATE INDEX z ON sales(period_label(ts, 'day', 'Australia/Sydney'))",
    "CREATE INDEX z ON sales(period_serial(ts, 'hour', 'Australia/Adelaide'))",
])
def test_zoned_forms_are_refused(indexed, ddl):
    connection, _ = indexed
    with pytest.raises(Exception) as caught:
        connection.execute(ddl)
        connection.execute("INSERT INTO z(ts) VALUES ('2026-01-01')") if ddl.startswith("CREATE TABLE") else None
    assert "non-deterministic" in str(caught.value)  # SQLite's own message


def test_every_unzoned_form_is_allowed_in_an_index(indexed):
    connection, _ = indexed
    for i, expression in enumerate(["period_floor(ts, 'month')", "period_end(ts, 'week')", "period_label(ts, 'week')",
                                    "period_serial(ts, 'day')", "period_shift(ts, 1, 'month')", "valid_time(ts)"]):
        connection.execute(f"CREATE INDEX ok{i} ON sales({expression})")
    assert connection.execute("PRAGMA integrity_check").fetchone() == ("ok",)


def test_through_the_sqlite3_shell():
    # the real shell with .load, on a database file the Python side then reads
    with tempfile.TemporaryDirectory() as folder:
        path = os.path.join(folder, "shop.db")
        output = run_shell(SCHEMA + """
INSERT INTO sales(ts, amount) VALUES ('2026-01-01 10:00:00', 5), ('2026-01-04 23:59:59', 7), ('2026-01-05', 1);
INSERT INTO sales2(ts, amount) SELECT ts, amount FROM sales;
EXPLAIN QUERY PLAN SELECT sum(amount) FROM sales WHERE period_floor(ts, 'week') = '2025-12-29';
SELECT sum(amount) FROM sales WHERE period_floor(ts, 'week') = '2025-12-29';
SELECT week, month FROM sales2 ORDER BY id;
""", database=path)
        assert "sales_week" in output
        lines = output.strip().split("\n")
        # oracle: datetime — 2026-01-01 (Thu) and 2026-01-04 (Sun) are in the week of Monday 2025-12-29
        assert monday_of("2026-01-01") == monday_of("2026-01-04") == "2025-12-29" != monday_of("2026-01-05")
        assert lines[-4:] == ["12.0", "2025-12-29|2026-01", "2025-12-29|2026-01", "2026-01-05|2026-01"]
        # the index holds expression values; reading it needs the module loaded
        connection = connect(path)
        assert connection.execute("PRAGMA integrity_check").fetchone() == ("ok",)
        assert "sales_week" in plan(connection, "SELECT * FROM sales WHERE period_floor(ts, 'week') = '2025-12-29'")
        connection.close()
        with pytest.raises(RuntimeError) as caught:
            run_shell("CREATE INDEX z ON sales(period_floor(ts, 'week', 'America/Denver'));", database=path)
        assert "non-deterministic" in str(caught.value)
