# SPDX-License-Identifier: MIT
"""period_position against Python's datetime and zoneinfo.

UTC: 100,000 seeded times from years 0002-9998 (inside Python's datetime range),
the same times for every allowed (spec, cycle) pair below; each expected
position is computed with datetime alone: isoweekday(), isocalendar(),
timetuple().tm_yday, month arithmetic for fiscal years, hour/minute/second
for sub-day positions. The one rule with no library call — the week number
for weeks that do not start on Monday, or years that do not start in
January — is written here from its definition in the README (the year that
holds the majority of the week's days), with datetime's day arithmetic.

Zones: America/Denver and Europe/Berlin, every day on which the UTC offset
changes from 2000 to 2030 (found with zoneinfo): every 10 minutes of the
local day, the hour of the day is the elapsed hours since the local
midnight that zoneinfo gives, plus one, so a 23-hour day has positions 1-23
and a 25-hour day 1-25; the weekday and the day of the month are those of
the zoneinfo local date.
"""
import datetime as dt
import random
import zoneinfo

import pytest

from conftest import connect

N_TIMES = 100_000
UTC = dt.timezone.utc


def monday_week_number(d):
    return d.isocalendar()[1]  # oracle: datetime.date.isocalendar()


def majority_week_number(d, week_start_iso, year_start_month):
    """README: a week belongs to the year that holds the majority (4 of 7) of its days."""
    week = d - dt.timedelta(days=(d.isoweekday() - week_start_iso) % 7)
    fourth = week + dt.timedelta(days=3)
    year = fourth.year if fourth.month >= year_start_month else fourth.year - 1
    begins = dt.date(year, year_start_month, 1)
    earliest = begins - dt.timedelta(days=3)
    first = earliest + dt.timedelta(days=(week_start_iso - earliest.isoweekday()) % 7)
    return (week - first).days // 7 + 1


def quarter_start(d):
    return dt.date(d.year, 3 * ((d.month - 1) // 3) + 1, 1)


def fiscal_start(d, month):
    return dt.date(d.year if d.month >= month else d.year - 1, month, 1)


# (spec, cycle, oracle on a naive UTC datetime)
PAIRS = [
    ("day", "week", lambda t: t.isoweekday()),
    ("day", "week starting sunday", lambda t: t.isoweekday() % 7 + 1),
    ("day", "week starting friday", lambda t: (t.isoweekday() - 5) % 7 + 1),
    ("day", "month", lambda t: t.day),
    ("day", "half-month", lambda t: t.day if t.day <= 15 else t.day - 15),
    ("day", "quarter", lambda t: (t.date() - quarter_start(t.date())).days + 1),
    ("day", "year", lambda t: t.timetuple().tm_yday),
    ("day", "year starting april", lambda t: (t.date() - fiscal_start(t.date(), 4)).days + 1),
    ("day", "2 weeks", None),  # checked below against the cycle's own period_floor
    ("week", "year", lambda t: monday_week_number(t.date())),
    ("P1W", "P1Y", lambda t: monday_week_number(t.date())),
    ("week starting sunday", "year", lambda t: majority_week_number(t.date(), 7, 1)),
    ("week", "year starting july", lambda t: majority_week_number(t.date(), 1, 7)),
    ("half-month", "month", lambda t: 1 if t.day <= 15 else 2),
    ("half-month", "quarter", lambda t: 2 * ((t.month - 1) % 3) + (t.day > 15) + 1),
    ("half-month", "year", lambda t: 2 * (t.month - 1) + (t.day > 15) + 1),
    ("month", "quarter", lambda t: (t.month - 1) % 3 + 1),
    ("month", "year", lambda t: t.month),
    ("month", "year starting april", lambda t: (t.month - 4) % 12 + 1),
    ("2 months", "year", lambda t: (t.month - 1) // 2 + 1),
    ("quarter", "year", lambda t: (t.month - 1) // 3 + 1),
    ("quarter", "year starting october", lambda t: ((t.month - 10) % 12) // 3 + 1),
    ("quarter starting april", "year", lambda t: (t.month - 1) // 3 + 1),
    ("month", "6 months", lambda t: (t.month - 1) % 6 + 1),
    ("hour", "day", lambda t: t.hour + 1),
    ("3 hours", "day", lambda t: t.hour // 3 + 1),
    ("hour", "week", lambda t: (t.isoweekday() - 1) * 24 + t.hour + 1),
    ("hour", "month", lambda t: (t.day - 1) * 24 + t.hour + 1),
    ("minute", "hour", lambda t: t.minute + 1),
    ("15 minutes", "hour", lambda t: t.minute // 15 + 1),
    ("15 minutes", "day", lambda t: t.hour * 4 + t.minute // 15 + 1),
    ("second", "minute", lambda t: t.second + 1),
    ("minute", "day", lambda t: t.hour * 60 + t.minute + 1),
]


@pytest.fixture(scope="module")
def times():
    rng = random.Random(20260305)
    # Years 0002-9998: the week-number oracle looks a few days past either end.
    first = int((dt.datetime(2, 1, 1) - dt.datetime(1970, 1, 1)).total_seconds())
    last = int((dt.datetime(9999, 1, 1) - dt.datetime(1970, 1, 1)).total_seconds()) - 1
    values = []
    for _ in range(N_TIMES):
        if rng.random() < 0.5:
            s = rng.randint(first, last)
        else:  # half of them near today, where data lives
            s = rng.randint(946684800, 2524608000)
        values.append(dt.datetime(1970, 1, 1) + dt.timedelta(seconds=s))
    connection = connect()
    connection.execute("CREATE TABLE t(id INTEGER PRIMARY KEY, ts TEXT)")
    connection.executemany("INSERT INTO t VALUES (?, ?)",
                           [(i, v.strftime("%Y-%m-%d %H:%M:%S").zfill(19)) for i, v in enumerate(values)])
    yield connection, values
    connection.close()


@pytest.mark.parametrize("spec,cycle,oracle", PAIRS, ids=[f"{s} in {c}" for s, c, _ in PAIRS])
def test_positions_agree_with_datetime_on_100000_seeded_times(times, spec, cycle, oracle):
    connection, values = times
    got = [r[0] for r in connection.execute(
        "SELECT period_position(ts, ?, ?) FROM t ORDER BY id", (spec, cycle))]
    if oracle is None:
        # Days of a 2-week cycle: days since the cycle's period_floor, plus one (datetime arithmetic).
        floors = [r[0] for r in connection.execute(
            "SELECT period_floor(ts, ?) FROM t ORDER BY id", (cycle,))]
        expected = [(v.date() - dt.date.fromisoformat(f.zfill(10))).days + 1 for v, f in zip(values, floors)]
    else:
        expected = [oracle(v) for v in values]
    mismatches = [(values[i], got[i], expected[i]) for i in range(len(values)) if got[i] != expected[i]]
    print(f"{spec} in {cycle}: {len(values)} times compared")
    assert not mismatches[:5], f"{len(mismatches)} mismatches"
    assert len(values) == N_TIMES


def transition_days(name):
    """Local dates in 2000-2030 whose length is not 24 hours, found with zoneinfo."""
    zone = zoneinfo.ZoneInfo(name)
    days = []
    d = dt.date(2000, 1, 1)
    while d.year <= 2030:
        start = dt.datetime(d.year, d.month, d.day, tzinfo=zone)
        nxt = d + dt.timedelta(days=1)
        end = dt.datetime(nxt.year, nxt.month, nxt.day, tzinfo=zone)
        length = end.astimezone(UTC) - start.astimezone(UTC)
        if length != dt.timedelta(hours=24):
            days.append((d, start.astimezone(UTC), end.astimezone(UTC)))
        d = nxt
    return days


@pytest.mark.parametrize("name", ["America/Denver", "Europe/Berlin"])
def test_hours_of_a_local_day_follow_zoneinfo_on_every_transition_day(name, db):
    zone = zoneinfo.ZoneInfo(name)
    days = transition_days(name)
    # Two changes a year (oracle: zoneinfo), 31 years.
    assert len(days) == 62
    rows, expected = [], []
    lengths = set()
    for d, start, end in days:
        hours = int((end - start).total_seconds() // 3600)
        lengths.add(hours)
        t = start
        while t < end:
            local = t.astimezone(zone)
            rows.append(t.strftime("%Y-%m-%d %H:%M:%S"))
            # oracle: elapsed hours since zoneinfo's local midnight; zoneinfo's local date
            expected.append(((t - start) // dt.timedelta(hours=1) + 1, local.isoweekday(), local.day,
                             local.timetuple().tm_yday))
            t += dt.timedelta(minutes=10)
        # the last and first hour of the day, by elapsed time
        assert (end - start) // dt.timedelta(hours=1) == hours
    assert lengths == {23, 25}
    db.execute("CREATE TEMP TABLE z(id INTEGER PRIMARY KEY, ts TEXT)")
    db.executemany("INSERT INTO z(ts) VALUES (?)", [(r,) for r in rows])
    got = db.execute("SELECT period_position(ts, 'hour', 'day', ?1), period_position(ts, 'day', 'week', ?1), "
                     "period_position(ts, 'day', 'month', ?1), period_position(ts, 'day', 'year', ?1) "
                     "FROM z ORDER BY id", (name,)).fetchall()
    assert [tuple(g) for g in got] == expected
    tops = db.execute("SELECT max(period_position(ts, 'hour', 'day', ?1)) FROM z "
                      "GROUP BY period_floor(ts, 'day', ?1)", (name,)).fetchall()
    assert sorted({t[0] for t in tops}) == [23, 25]  # oracle: zoneinfo day lengths above
    print(f"{name}: {len(days)} transition days, {len(rows)} instants compared")
