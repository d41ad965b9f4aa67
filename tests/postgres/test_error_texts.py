# SPDX-License-Identifier: MIT
# ctest-labels: postgres
"""A bad input fails in PostgreSQL with the SQLite module's message, word for word.

Each case is one call written for each engine with the same values: TEXT in
SQLite is `text` (or the spec or zone literal, untyped, as a user writes it) in
PostgreSQL; SQLite's 9e999 is PostgreSQL's 'Infinity'::float8.
Sources: the message is the SQLite module's (`# oracle: almanac.so in sqlite3`,
which tests/sql/test_bad_input_catalogue.py pins to the documented texts); that
a PostgreSQL error with a SQLSTATE of class 22 is the fitting kind of error for
a bad value is PostgreSQL's own classification (Appendix A, "PostgreSQL Error
Codes": class 22, data exception).
"""
import psycopg2
import pytest

from conftest import connect
from pg_servers import almanac_server

LONG_SPEC = "d" * 201
# (SQLite expression, PostgreSQL expression); None: the same text
CASES = [
    # time values
    ("period_floor('2026-02-30', 'day')", "period_floor('2026-02-30'::text, 'day')"),
    ("period_end('next tuesday', 'week')", "period_end('next tuesday'::text, 'week')"),
    ("period_label('', 'month')", "period_label(''::text, 'month')"),
    ("period_serial('2026-01-01 25:00', 'day')", "period_serial('2026-01-01 25:00'::text, 'day')"),
    ("period_floor('1700000000000', 'day')", "period_floor('1700000000000'::text, 'day')"),
    ("period_shift('2026-13-01', 1, 'day')", "period_shift('2026-13-01'::text, 1, 'day')"),
    ("period_position('2026-02-29', 'day', 'week')", "period_position('2026-02-29'::text, 'day', 'week')"),
    ("(SELECT count(*) FROM periods('2026-02-30', '2027-01-01', 'month'))",
     "(SELECT count(*) FROM periods('2026-02-30'::text, '2027-01-01'::text, 'month'))"),
    ("(SELECT count(*) FROM periods('2026-01-01', 'later', 'month'))",
     "(SELECT count(*) FROM periods('2026-01-01'::text, 'later'::text, 'month'))"),
    ("period_end('9999-12-31', 'day')", "period_end('9999-12-31'::text, 'day')"),
    # specs, untyped literals in PostgreSQL as a user writes them
    ("period_floor('2026-01-01', 'fortnight')", "period_floor('2026-01-01'::text, 'fortnight')"),
    ("period_end('2026-01-01', '0 days')", "period_end('2026-01-01'::text, '0 days')"),
    ("period_label('2026-01-01', 'P1M2D')", "period_label('2026-01-01'::text, 'P1M2D')"),
    ("period_serial('2026-01-01', '')", "period_serial('2026-01-01'::text, '')"),
    (f"period_floor('2026-01-01', '{LONG_SPEC}')", f"period_floor('2026-01-01'::text, '{LONG_SPEC}')"),
    ("period_shift('2026-01-01', 1, 'week starting someday')", "period_shift('2026-01-01'::text, 1, 'week starting someday')"),
    ("period_of_serial(1, 'fortnight')", None),
    ("period_floor('2026-01-01', 'week starting sunday from 2024-01-03')",
     "period_floor('2026-01-01'::text, 'week starting sunday from 2024-01-03')"),
    ("period_position('2026-01-01', 'fortnight', 'year')", "period_position('2026-01-01'::text, 'fortnight', 'year')"),
    ("period_position('2026-01-01', 'week', 'month')", "period_position('2026-01-01'::text, 'week', 'month')"),
    ("period_position('2026-01-01', 'day', 'day')", "period_position('2026-01-01'::text, 'day', 'day')"),
    ("(SELECT count(*) FROM periods('2026-01-01', '2027-01-01', '5 fortnights'))",
     "(SELECT count(*) FROM periods('2026-01-01'::text, '2027-01-01'::text, '5 fortnights'))"),
    # zones
    ("period_floor('2026-01-01', 'day', '../../etc/passwd')", "period_floor('2026-01-01'::text, 'day', '../../etc/passwd')"),
    ("period_end('2026-01-01', 'day', 'Mars/Olympus_Mons')", "period_end('2026-01-01'::text, 'day', 'Mars/Olympus_Mons')"),
    ("period_label('2026-01-01', 'day', 'america/denver')", "period_label('2026-01-01'::text, 'day', 'america/denver')"),
    ("period_serial('2026-01-01', 'day', '')", "period_serial('2026-01-01'::text, 'day', '')"),
    ("period_of_serial(1, 'day', '/etc/localtime')", None),
    ("to_time('2026-01-01 10:00', '%Y-%m-%d %H:%M', 'Nowhere/City')", None),
    # numbers out of their range
    ("period_shift('2026-01-31', 1000000000, 'month')", "period_shift('2026-01-31'::text, 1000000000, 'month')"),
    ("period_of_serial(9000000, 'day')", None),
    ("moving_mean(1.5, 0)", None),
    ("moving_mean(1.5, -1)", None),
    # numbers that are not finite
    ("exact_sum(9e999)", "exact_sum('Infinity'::float8)"),
    ("moving_mean(-9e999)", "moving_mean('-Infinity'::float8)"),
    ("median(9e999)", "median('Infinity'::float8)"),
    ("mad(9e999)", "mad('Infinity'::float8)"),
    ("theil_sen_slope(9e999, 1)", "theil_sen_slope('Infinity'::float8, 1)"),
    ("theil_sen_slope(1, 9e999)", "theil_sen_slope(1, 'Infinity'::float8)"),
    ("mann_kendall_p(1, -9e999)", "mann_kendall_p(1, '-Infinity'::float8)"),
    ("resid_sd(9e999, 1)", "resid_sd('Infinity'::float8, 1)"),
    ("slope_stderr(1, 9e999)", "slope_stderr(1, 'Infinity'::float8)"),
    ("ewma(9e999, 1, 1)", "ewma('Infinity'::float8, 1, 1)"),
    # half lives
    ("ewma(1, '2026-01-01', '1 month')", "ewma(1, '2026-01-01'::timestamptz, '1 month')"),
    ("ewma(1, '2026-01-01', 'fortnight')", "ewma(1, '2026-01-01'::timestamptz, 'fortnight')"),
    ("ewma(1, 1, 0)", None),
    ("ewma(1, 1, -1)", None),
    # reading exports
    ("to_time('2026-01-01', '%Q')", None),
    ("to_time('2026-13-01', '%Y-%m-%d')", None),
    ("to_time('60', 'excel')", None),
    ("to_time('31/04/2026', '%d/%m/%Y')", None),
    ("to_amount('12.3.4')", None),
    ("to_amount('1,05.00')", None),
    ("to_amount('-(12)')", None),
    ("to_amount('twelve')", None),
    ("to_amount('12', ';')", None),
    # charts
    ("svg_line_chart(1, 1, 'a', 'medium')", None),
    ("svg_line_chart(1, 1, 'a', 'raw', '{')", None),
    ("svg_line_chart(1, 1, 'a', 'raw', '{\"x\":1}')", None),
    ("svg_bar_chart(1, 1, 'a', '{\"width\": 5}')", None),
    ("sparkline(1, 'next tuesday')", "sparkline(1, 'next tuesday'::text)"),
]


@pytest.fixture(scope="module")
def pg():
    with almanac_server("errors") as connection:
        yield connection


def sqlite_message(sql):
    db = connect()
    try:
        db.execute(f"SELECT {sql}").fetchall()
    except Exception as error:
        return str(error)
    finally:
        db.close()
    raise AssertionError(f"SQLite accepted {sql}: no error to compare")


def test_there_are_at_least_30_cases():
    assert len(CASES) >= 30
    assert len({sqlite for sqlite, _ in CASES}) == len(CASES), "a case is listed twice"


@pytest.mark.parametrize("sqlite_sql,pg_sql", CASES, ids=[c[0][:80] for c in CASES])
def test_same_message(pg, sqlite_sql, pg_sql):
    expected = sqlite_message(sqlite_sql)  # oracle: almanac.so in sqlite3
    with pg.cursor() as cursor:
        with pytest.raises(psycopg2.Error) as caught:
            cursor.execute(f"SELECT {pg_sql or sqlite_sql}")
            cursor.fetchall()
    error = caught.value
    assert error.diag.message_primary == expected, f"SQLSTATE {error.pgcode}: {error.pgerror}"
    # PostgreSQL's Appendix A: class 22 is "data exception", the class of a bad value.
    assert error.pgcode and error.pgcode.startswith("22"), f"SQLSTATE {error.pgcode} for {expected}"
