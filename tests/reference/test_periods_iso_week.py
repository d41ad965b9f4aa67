# SPDX-License-Identifier: MIT
"""Week labels against ISO 8601 week dates, through datetime.date.isocalendar().

Every day from 1900-01-01 to 2100-12-31 (and a seeded random time of day on
each) gets period_label(..., 'week') = 'YYYY-Www' with the ISO week-numbering
year, period_floor(..., 'week') = the Monday of that ISO week, and the same
for the spellings that mean the same week (`P1W`, `week starting monday`).
"""
import datetime as dt
import random

import pytest

from conftest import connect

FIRST, LAST = dt.date(1900, 1, 1), dt.date(2100, 12, 31)
DAYS = [FIRST + dt.timedelta(days=k) for k in range((LAST - FIRST).days + 1)]


def iso_label(day):
    year, week, _ = day.isocalendar()  # oracle: datetime.date.isocalendar()
    return f"{year:04d}-W{week:02d}"


def iso_monday(day):
    return day - dt.timedelta(days=day.isocalendar()[2] - 1)  # oracle: datetime.date.isocalendar()


@pytest.fixture(scope="module")
def days_table():
    connection = connect()
    rng = random.Random(8601)
    connection.execute("CREATE TEMP TABLE days(id INTEGER PRIMARY KEY, d TEXT, t TEXT)")
    connection.executemany(
        "INSERT INTO days VALUES (?, ?, ?)",
        [(i, day.isoformat(), f"{day.isoformat()} {rng.randrange(24):02d}:{rng.randrange(60):02d}:"
                              f"{rng.randrange(60):02d}") for i, day in enumerate(DAYS)])
    yield connection
    connection.close()


@pytest.mark.parametrize("spec", ["week", "P1W", "week starting monday", "Weeks", "week from 2024-01-01"])
@pytest.mark.parametrize("column", ["d", "t"])
def test_week_labels_match_isocalendar(days_table, spec, column):
    rows = days_table.execute(f"SELECT period_label({column}, ?), period_floor({column}, ?) FROM days ORDER BY id",
                              (spec, spec)).fetchall()
    expected = [(iso_label(day), iso_monday(day).isoformat()) for day in DAYS]
    bad = [(day, got, want) for day, got, want in zip(DAYS, rows, expected) if tuple(got) != want]
    assert not bad, f"{spec!r} on {column}: {bad[:8]}"
    print(f"{spec!r} on {column}: {2 * len(DAYS)} values compared")


def test_53_week_years_match_isocalendar(days_table):
    # oracle: datetime.date.isocalendar() of Dec 28, which is always in the year's last ISO week
    for year in range(1900, 2101):
        (label,) = days_table.execute("SELECT period_label(?, 'week')", (f"{year}-12-28",)).fetchone()
        assert label == f"{year}-W{dt.date(year, 12, 28).isocalendar()[1]:02d}"


def test_week_serials_count_iso_weeks(days_table):
    # oracle: datetime — serial 0 is the ISO week holding 1970-01-01 (Monday 1969-12-29),
    # so the serial is whole weeks between Mondays
    rows = days_table.execute("SELECT period_serial(d, 'week') FROM days ORDER BY id").fetchall()
    epoch_monday = dt.date(1969, 12, 29)
    bad = [(day, got) for day, (got,) in zip(DAYS, rows) if got != (iso_monday(day) - epoch_monday).days // 7]
    assert not bad, bad[:8]


ISO_EXAMPLES = [
    # (date, ISO week date): ISO 8601 week dates from memory, confirmed with isocalendar() below
    ("2008-12-29", "2009-W01", 1),
    ("2010-01-03", "2009-W53", 7),
    ("2005-01-01", "2004-W53", 6),
]


@pytest.mark.parametrize("day,week,weekday", ISO_EXAMPLES)
def test_iso_8601_examples(days_table, day, week, weekday):
    year, number, iso_weekday = dt.date.fromisoformat(day).isocalendar()  # oracle: isocalendar()
    assert (f"{year}-W{number:02d}", iso_weekday) == (week, weekday), "remembered ISO week date vs isocalendar()"
    for value in (day, day + " 23:59:59", day + "T00:00:00Z"):
        (label,) = days_table.execute("SELECT period_label(?, 'week')", (value,)).fetchone()
        assert label == week, f"period_label({value!r}, 'week') = {label!r}, expected {week!r} (ISO 8601, from memory)"


def test_zoned_week_label_uses_the_local_date(days_table):
    # 2010-01-03 03:00 UTC is still 2010-01-02 in Denver: ISO 2009-W53 either way;
    # 2008-12-29 03:00 UTC is 2008-12-28 in Denver: 2008-W52 (oracle: zoneinfo + isocalendar())
    from zoneinfo import ZoneInfo
    for utc_text in ("2008-12-29 03:00:00", "2008-12-29 12:00:00", "2010-01-04 06:59:59", "2010-01-04 07:00:00"):
        local = dt.datetime.fromisoformat(utc_text).replace(tzinfo=dt.timezone.utc).astimezone(
            ZoneInfo("America/Denver"))
        (label,) = days_table.execute("SELECT period_label(?, 'week', 'America/Denver')", (utc_text,)).fetchone()
        assert label == iso_label(local.date()), f"{utc_text}: {label}"
