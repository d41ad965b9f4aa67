# SPDX-License-Identifier: MIT
"""to_time with a zone against Python's zoneinfo with fold=0, and the excel serials.

For three zones — America/Denver (northern hemisphere), Australia/Sydney
(southern), Australia/Adelaide (a 30-minute offset) — every change of offset
from 2000 through 2037 is found by zoneinfo itself, and every local reading
from two hours before to two hours after each change, at 1-minute steps, is
read by to_time(text, format, zone). That covers every repeated reading of a
fall-back night and every skipped reading of a spring-forward gap. The oracle
is datetime(reading, tzinfo=ZoneInfo(zone), fold=0) converted to UTC.

Spreadsheet serials: datetime.date(1899, 12, 30) + timedelta(serial) for
serials from 61 on; for 1 to 59 the same from 1899-12-31 (serial 1 is
1900-01-01); serial 60, the 29 February 1900 spreadsheets count, is refused
(from memory: the 1900 date system's known false leap day).
"""
import datetime as dt
import random
import sqlite3
from zoneinfo import ZoneInfo

import pytest

from conftest import connect

UTC = dt.timezone.utc
ZONES = ["America/Denver", "Australia/Sydney", "Australia/Adelaide"]
FORMAT = "%Y-%m-%d %H:%M"


def transitions(zone, first_year=2000, last_year=2037):
    """UTC instants where the zone's offset changes, found with zoneinfo by scanning and bisecting."""
    tz = ZoneInfo(zone)
    t = dt.datetime(first_year, 1, 1, tzinfo=UTC)
    end = dt.datetime(last_year + 1, 1, 1, tzinfo=UTC)
    step = dt.timedelta(hours=6)
    found = []
    offset = t.astimezone(tz).utcoffset()
    while t < end:
        nxt = t + step
        if nxt.astimezone(tz).utcoffset() != offset:
            lo, hi = t, nxt
            while hi - lo > dt.timedelta(minutes=1):
                mid = lo + (hi - lo) / 2
                mid = mid.replace(second=0, microsecond=0)
                if mid <= lo:
                    mid = lo + dt.timedelta(minutes=1)
                if mid.astimezone(tz).utcoffset() == offset:
                    lo = mid
                else:
                    hi = mid
            found.append(hi)
            offset = nxt.astimezone(tz).utcoffset()
        t = nxt
    return found


@pytest.mark.parametrize("zone", ZONES)
def test_readings_around_every_change_follow_fold_0(zone):
    tz = ZoneInfo(zone)
    changes = transitions(zone)
    # 2000-2037, two changes a year (common practice for these three zones)
    assert len(changes) >= 70
    readings = set()
    for change in changes:
        before = change.astimezone(tz).replace(tzinfo=None) - dt.timedelta(minutes=1)
        after = change.astimezone(tz).replace(tzinfo=None)
        start = min(before, after) - dt.timedelta(hours=2)
        stop = max(before, after) + dt.timedelta(hours=2)
        t = start.replace(second=0)
        while t <= stop:
            readings.add(t)
            t += dt.timedelta(minutes=1)
    readings = sorted(readings)
    db = connect()
    db.execute("CREATE TABLE r(n INTEGER PRIMARY KEY, text TEXT)")
    db.executemany("INSERT INTO r(text) VALUES (?)", [(r.strftime(FORMAT),) for r in readings])
    got = [row[0] for row in db.execute("SELECT to_time(text, ?, ?) FROM r ORDER BY n", (FORMAT, zone))]
    repeated = skipped = 0
    for reading, value in zip(readings, got):
        aware = reading.replace(tzinfo=tz, fold=0)
        expected = aware.astimezone(UTC).strftime("%Y-%m-%d %H:%M:%S")  # oracle: zoneinfo, fold=0
        assert value == expected, (zone, reading)
        other = reading.replace(tzinfo=tz, fold=1).astimezone(UTC)
        if other != aware.astimezone(UTC):
            # fold=0 and fold=1 differ: a repeated reading (later instant for fold=1) or a skipped one.
            if other > aware.astimezone(UTC):
                repeated += 1
            else:
                skipped += 1
    print(f"\ncompared {zone}: {len(readings)} readings around {len(changes)} changes, "
          f"{repeated} repeated, {skipped} skipped")
    assert repeated > 0 and skipped > 0


def test_spreadsheet_serials_against_the_1900_date_system():
    rng = random.Random(1900)
    serials = [float(s) for s in range(1, 60)] + [61.0, 62.0, 2958465.0]
    for _ in range(20000):
        day = rng.randint(61, 2958465)
        ms = rng.choice([0, rng.randrange(86400000)])
        serials.append(day + ms / 86400000)
    for _ in range(200):
        serials.append(rng.randint(1, 59) + rng.randrange(86400000) / 86400000)
    db = connect()
    db.execute("CREATE TABLE s(n INTEGER PRIMARY KEY, serial REAL)")
    db.executemany("INSERT INTO s(serial) VALUES (?)", [(s,) for s in serials])
    got = [row[0] for row in db.execute("SELECT to_time(serial, 'excel') FROM s ORDER BY n")]
    got_text = [row[0] for row in db.execute("SELECT to_time(CAST(serial AS TEXT), 'excel') FROM s ORDER BY n")]
    for serial, value, from_text in zip(serials, got, got_text):
        # oracle: datetime.date(1899, 12, 30) + timedelta(serial) from 61 on; 1899-12-31 below 60
        epoch = dt.datetime(1899, 12, 30) if serial >= 61 else dt.datetime(1899, 12, 31)
        moment = epoch + dt.timedelta(days=serial)
        # rounded to the millisecond (README, "fractions ... rounded to the millisecond")
        moment = moment.replace(microsecond=0) + dt.timedelta(milliseconds=round(moment.microsecond / 1000))
        expected = moment.strftime("%Y-%m-%d %H:%M:%S").rjust(19, "0")
        if moment.microsecond:
            expected += f".{moment.microsecond // 1000:03d}"
        assert value == expected, serial
    # The same serials written as TEXT by SQLite read the same, up to SQLite's 15-digit text.
    assert sum(a == b for a, b in zip(got, got_text)) >= 0.99 * len(got)
    print(f"\ncompared: {len(serials)} spreadsheet serials")


@pytest.mark.parametrize("serial", [60, 60.0, 60.5, 60.999, "60"])
def test_serial_60_is_refused(serial):
    db = connect()
    # from memory: spreadsheets count 29 February 1900, which never was
    with pytest.raises(sqlite3.OperationalError, match="serial 60 is 29 February 1900"):
        db.execute("SELECT to_time(?, 'excel')", (serial,)).fetchone()
