# SPDX-License-Identifier: MIT
"""Zones after 2037, where the OS zone files stop listing changes and their
footer rule (RFC 8536, a POSIX TZ string) takes over.

Oracle: Python's zoneinfo, which reads the same footer rules. For every change
of offset from 2038 through 2100 in America/Denver, Australia/Sydney,
Australia/Adelaide and Europe/London (found by scanning zoneinfo), instants at
15-minute steps from three hours before to three hours after the change, and
one second either side of it, as Unix INTEGER and as UTC TEXT: their second,
15-minute, hour and day periods (start, end, serial, label) against
tests/reference/period_oracle.py on a zoneinfo clock, and the local calendar
day of each change day given as a bare date.
"""
import datetime as dt

import pytest

from conftest import connect
import period_oracle as oracle
from period_oracle import Spec

ZONES = ["America/Denver", "Australia/Sydney", "Australia/Adelaide", "Europe/London"]
QUARTER_HOUR_MS = 15 * 60000
TRANSITIONS = {name: oracle.offset_changes(name, 2038, 2100) for name in ZONES}
SPECS = [("second", Spec("second")), ("15 minutes", Spec("minute", 15)), ("hour", Spec("hour")),
         ("day", Spec("day"))]
counts = {}


@pytest.fixture(scope="module")
def db():
    connection = connect()
    yield connection
    connection.close()
    print(f"\ncompared: {counts} (total {sum(counts.values())})")


def test_every_year_through_2100_has_its_two_changes():
    # zoneinfo: each of the four zones changes twice a year, 63 years
    for name in ZONES:
        assert len(TRANSITIONS[name]) == 126, (name, len(TRANSITIONS[name]))


def utc_text(ms):
    return oracle.wall_of(ms).isoformat(" ", "seconds")


@pytest.mark.parametrize("spec_text,spec", SPECS, ids=[s[0] for s in SPECS])
@pytest.mark.parametrize("name", ZONES)
def test_periods_around_every_change_match_zoneinfo(db, name, spec_text, spec):
    clock = oracle.ZoneClock(name)
    instants = []
    for change, _, _ in TRANSITIONS[name]:
        instants += range(change - 12 * QUARTER_HOUR_MS, change + 13 * QUARTER_HOUR_MS, QUARTER_HOUR_MS)
        instants += [change - 1000, change + 1000]
    cases = [(ms // 1000, "int", ms) for ms in instants] + [(utc_text(ms), "text", ms) for ms in instants]
    db.execute("DROP TABLE IF EXISTS later")
    db.execute("CREATE TEMP TABLE later(id INTEGER PRIMARY KEY, v)")
    db.executemany("INSERT INTO later VALUES (?, ?)", [(i, c[0]) for i, c in enumerate(cases)])
    rows = db.execute("SELECT period_floor(v, ?1, ?2), period_end(v, ?1, ?2), period_serial(v, ?1, ?2),"
                      " period_label(v, ?1, ?2) FROM later ORDER BY id", (spec_text, name)).fetchall()
    bad = []
    for (value, kind, ms), got in zip(cases, rows):
        # oracle: period_oracle.period_of on a zoneinfo clock (zoneinfo applies the footer rule)
        period = oracle.period_of(spec, ms, clock)
        want = (oracle.in_representation(kind, period.start, period.start_text),
                oracle.in_representation(kind, period.end, period.end_text), period.serial, period.label)
        if tuple(got) != want:
            bad.append(f"{spec_text!r} {name} {value!r}: got {tuple(got)!r}, expected {want!r}")
    counts[f"{spec_text} {name}"] = 4 * len(cases)
    assert not bad, f"{len(bad)} of {len(cases)} differ:\n" + "\n".join(bad[:8])


@pytest.mark.parametrize("name", ZONES)
def test_change_days_are_23_or_25_hours_long(db, name):
    clock = oracle.ZoneClock(name)
    for change, before, after in TRANSITIONS[name]:
        day = clock.local(change)[0].date()
        # oracle: zoneinfo; the local day begins at its first instant (period_of_day)
        period = oracle.period_of_day(Spec("day"), day, clock)
        floor, end, seconds = db.execute(
            "SELECT period_floor(?1, 'day', ?2), period_end(?1, 'day', ?2),"
            " period_end(?3, 'day', ?2) - period_floor(?3, 'day', ?2)",
            (day.isoformat(), name, change // 1000)).fetchone()
        assert (floor, end) == (day.isoformat(), (day + dt.timedelta(days=1)).isoformat())
        assert seconds == (period.end - period.start) // 1000, (name, day)
        # common practice: these four zones change by one hour (Adelaide too: +09:30/+10:30)
        assert seconds == (23 if after > before else 25) * 3600
    counts[f"change days {name}"] = len(TRANSITIONS[name])
