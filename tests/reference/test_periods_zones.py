# SPDX-License-Identifier: MIT
"""Zoned calendar periods against Python's zoneinfo (the IANA database Debian's tzdata installs).

Three zones with daylight saving: America/Denver (northern hemisphere),
Australia/Sydney (southern), Australia/Adelaide (a 30-minute offset, +09:30 /
+10:30). For every transition from 2000 to 2030, found by scanning zoneinfo:
local days around it (23 or 25 hours of elapsed time), hour, 15-minute and
minute periods across it (a repeated hour is two periods with distinct labels
and consecutive serials; a skipped hour is none), results fed back in with the
same zone (round trip), and numbers in giving instants out. Expected values
come from tests/reference/period_oracle.py, which does local calendars with
zoneinfo; the transitions themselves come from zoneinfo. Years after 2037,
where the zone files' footer rules take over, are in test_zones_after_2037.py.
"""
import datetime as dt
import random
import zlib

import pytest

from conftest import connect
import period_oracle as oracle
from period_oracle import Spec

ZONES = ["America/Denver", "Australia/Sydney", "Australia/Adelaide"]
HOUR_MS = 3600000
counts = {}


TRANSITIONS = {name: oracle.offset_changes(name, 2000, 2030) for name in ZONES}


def test_every_transition_is_covered():
    # zoneinfo: all three zones change twice a year throughout 2000-2030
    for name in ZONES:
        assert len(TRANSITIONS[name]) == 62, (name, len(TRANSITIONS[name]))
        kinds = {after > before for _, before, after in TRANSITIONS[name]}
        assert kinds == {True, False}
    # the 30-minute offset really is one (zoneinfo)
    assert {before for _, before, _ in TRANSITIONS["Australia/Adelaide"]} == {
        dt.timedelta(hours=9, minutes=30), dt.timedelta(hours=10, minutes=30)}


def utc_text(ms):
    return oracle.wall_of(ms).isoformat(" ", "seconds")  # no suffix: UTC, SQLite's convention


def local_text(clock, ms):
    wall, offset = clock.local(ms)
    return wall.isoformat(" ", "seconds") + oracle.format_offset(offset)  # a local reading with its offset


def representations(clock, ms):
    """The same instant as the four inputs a user may hold: Unix INTEGER, UTC TEXT,
    local TEXT with offset, Julian day REAL."""
    whole = ms - ms % 1000
    return [(whole // 1000, "int", whole), (utc_text(whole), "text", whole),
            (local_text(clock, whole), "text", whole), (oracle.julian_day(ms), "jd", ms)]


@pytest.fixture(scope="module")
def db():
    connection = connect()
    yield connection
    connection.close()
    print(f"\ncompared: {counts}")


def compare(db, name, spec_text, spec, instants, tag):
    """period_floor/end/serial/label of every instant in every representation vs the oracle."""
    clock = oracle.ZoneClock(name)
    cases = [case for ms in instants for case in representations(clock, ms)]
    db.execute("DROP TABLE IF EXISTS zoned")
    db.execute("CREATE TEMP TABLE zoned(id INTEGER PRIMARY KEY, v)")
    db.executemany("INSERT INTO zoned VALUES (?, ?)", [(i, c[0]) for i, c in enumerate(cases)])
    rows = db.execute("SELECT period_floor(v, ?1, ?2), period_end(v, ?1, ?2), period_serial(v, ?1, ?2),"
                      " period_label(v, ?1, ?2) FROM zoned ORDER BY id", (spec_text, name)).fetchall()
    bad = []
    for (value, kind, ms), got in zip(cases, rows):
        # oracle: period_oracle.period_of on a zoneinfo clock
        period = oracle.period_of(spec, ms, clock)
        want = (oracle.in_representation(kind, period.start, period.start_text),
                oracle.in_representation(kind, period.end, period.end_text), period.serial, period.label)
        if not all(oracle.same_value(g, w) for g, w in zip(got, want)):
            bad.append(f"{spec_text!r} {name} {value!r}: got {tuple(got)!r}, expected {want!r}")
    counts[f"{tag} {spec_text} {name}"] = 4 * len(cases)
    assert not bad, f"{len(bad)} of {len(cases)} differ:\n" + "\n".join(bad[:8])
    return rows


AROUND = [-26, -25, -24, -23, -3, -1, 0, 1, 3, 23, 24, 25, 26]  # hours from the change


@pytest.mark.parametrize("name", ZONES)
def test_local_days_around_every_transition(db, name):
    instants = []
    for change, _, _ in TRANSITIONS[name]:
        instants += [change + h * HOUR_MS for h in AROUND] + [change - 1000, change + 1000]
    compare(db, name, "day", Spec("day"), instants, "day")


@pytest.mark.parametrize("name", ZONES)
def test_transition_days_last_23_or_25_hours(db, name):
    clock = oracle.ZoneClock(name)
    for change, before, after in TRANSITIONS[name]:
        start, end = db.execute("SELECT period_floor(?1, 'day', ?2), period_end(?1, 'day', ?2)",
                                (change // 1000, name)).fetchone()
        hours = 23 if after > before else 25  # common practice: a 1-hour change in these zones
        period = oracle.period_of(Spec("day"), change, clock)  # oracle: zoneinfo local midnights
        assert (period.end - period.start) // 1000 == hours * 3600
        assert end - start == hours * 3600, f"{name} day of {utc_text(change)}: {end - start} s"


SUB_DAY = [("hour", Spec("hour")), ("PT1H", Spec("hour")), ("15 minutes", Spec("minute", 15)),
           ("30 minutes", Spec("minute", 30)), ("minute", Spec("minute"))]


@pytest.mark.parametrize("spec_text,spec", SUB_DAY, ids=[s[0] for s in SUB_DAY])
@pytest.mark.parametrize("name", ZONES)
def test_sub_day_periods_across_every_transition(db, name, spec_text, spec):
    # a step that divides no unit, so every offset within a period is hit
    step, reach = (7 * 60000, 3 * HOUR_MS) if spec_text != "minute" else (23000, HOUR_MS)
    instants = []
    for change, _, _ in TRANSITIONS[name]:
        instants += list(range(change - reach, change + reach, step))
    compare(db, name, spec_text, spec, instants, "sub-day")


def walk(db, spec_text, name, first, steps):
    """Follows period_end from the period holding `first` (Unix seconds)."""
    rows = []
    start = db.execute("SELECT period_floor(?, ?, ?)", (first, spec_text, name)).fetchone()[0]
    for _ in range(steps):
        rows.append(db.execute("SELECT ?1, period_end(?1, ?2, ?3), period_label(?1, ?2, ?3),"
                               " period_serial(?1, ?2, ?3), period_floor(?1, ?2, ?3)",
                               (start, spec_text, name)).fetchone())
        start = rows[-1][1]
    return rows


@pytest.mark.parametrize("name", ZONES)
def test_repeated_hour_is_two_periods_and_skipped_hour_none(db, name):
    clock = oracle.ZoneClock(name)
    for change, before, after in TRANSITIONS[name]:
        rows = walk(db, "hour", name, (change - 3 * HOUR_MS) // 1000, 6)
        starts = [r[0] for r in rows]
        labels = [r[2] for r in rows]
        serials = [r[3] for r in rows]
        # every period is its own floor, neighbours meet, serials consecutive (ext/README.md "Zones")
        assert all(r[4] == r[0] for r in rows)
        assert serials == list(range(serials[0], serials[0] + 6)), (name, labels, serials)
        assert len(set(labels)) == 6, labels
        # oracle: zoneinfo local readings of each hour boundary
        assert labels == [oracle.period_of(Spec("hour"), s * 1000, clock).label for s in starts]
        assert all(b - a == 3600 for a, b in zip(starts, starts[1:]))  # all 1 h of elapsed time here
        readings = [label[:16] for label in labels]
        if after < before:
            # fall-back: the repeated local hour appears twice, with two different offsets
            repeated = (oracle.wall_of(change) + after).isoformat(" ", "minutes")
            assert readings.count(repeated) == 2, (name, labels)
            twice = [label for label in labels if label.startswith(repeated)]
            assert twice == [repeated + oracle.format_offset(before), repeated + oracle.format_offset(after)]
        else:
            # spring-forward: the skipped local hour has no period at all
            skipped = (oracle.wall_of(change) + before).isoformat(" ", "minutes")
            assert skipped not in readings, (name, labels)
            assert all(label[16:] in (oracle.format_offset(before), oracle.format_offset(after))
                       for label in labels)


@pytest.mark.parametrize("name", ZONES)
def test_quarter_hours_across_every_transition_are_consecutive(db, name):
    for change, before, after in TRANSITIONS[name]:
        rows = walk(db, "15 minutes", name, (change - HOUR_MS) // 1000, 8)
        serials = [r[3] for r in rows]
        assert serials == list(range(serials[0], serials[0] + 8))  # ext/README.md: one more than the one before
        assert len({r[2] for r in rows}) == 8
        assert all(b[0] - a[0] == 900 for a, b in zip(rows, rows[1:]))  # oracle: 15 min elapsed each


@pytest.mark.parametrize("spec_text", ["2 hours", "3 hours", "6 hours", "12 hours"])
@pytest.mark.parametrize("name", ZONES)
def test_multi_hour_units_stay_a_partition(db, name, spec_text):
    # ext/README.md ("Zones") says where the boundaries go; what must hold anyway: each period
    # holds its t, neighbours meet without overlap, serials rise by one.
    for change, _, _ in TRANSITIONS[name][:20]:
        rows = walk(db, spec_text, name, (change - 13 * HOUR_MS) // 1000, 30)
        assert all(r[0] < r[1] and r[4] == r[0] for r in rows)
        assert [r[3] for r in rows] == list(range(rows[0][3], rows[0][3] + 30))
        for t in range((change - 12 * HOUR_MS) // 1000, (change + 12 * HOUR_MS) // 1000, 1234):
            start, end = db.execute("SELECT period_floor(?1, ?2, ?3), period_end(?1, ?2, ?3)",
                                    (t, spec_text, name)).fetchone()
            assert start <= t < end and (start, end) in {(r[0], r[1]) for r in rows}


CALENDAR = [("day", Spec("day")), ("week", Spec("week")), ("week starting sunday", Spec("week", week_start=6)),
            ("half-month", Spec("half-month")), ("month", Spec("month")), ("quarter", Spec("quarter")),
            ("quarter starting july", Spec("quarter", year_start=7)), ("year", Spec("year")),
            ("year starting july", Spec("year", year_start=7)), ("3 days", Spec("day", 3)),
            ("2 weeks", Spec("week", 2)), ("6 months", Spec("month", 6)),
            ("month from 2024-01-31", Spec("month", start_from=dt.datetime(2024, 1, 31)))]


@pytest.mark.parametrize("spec_text,spec", CALENDAR, ids=[c[0] for c in CALENDAR])
@pytest.mark.parametrize("name", ZONES)
def test_local_calendar_periods_random_instants(db, name, spec_text, spec):
    rng = random.Random(zlib.crc32(f"{name} {spec_text}".encode()))
    low, high = oracle.ms_of(dt.datetime(2000, 1, 2)), oracle.ms_of(dt.datetime(2030, 12, 30))
    instants = [rng.randrange(low, high) for _ in range(2500)]
    # period starts themselves, midnights around changes included, are inputs too
    instants += [oracle.period_of(spec, change, oracle.ZoneClock(name)).start
                 for change, _, _ in TRANSITIONS[name]]
    compare(db, name, spec_text, spec, instants, "calendar")


SERIAL_SPECS = CALENDAR + [("hour", Spec("hour")), ("15 minutes", Spec("minute", 15))]


@pytest.mark.parametrize("spec_text,spec", SERIAL_SPECS, ids=[c[0] for c in SERIAL_SPECS])
@pytest.mark.parametrize("name", ZONES + [None])
def test_period_of_serial_gives_the_start_of_that_period(db, name, spec_text, spec):
    rng = random.Random(zlib.crc32(f"serial {name} {spec_text}".encode()))
    clock = oracle.ZoneClock(name) if name else oracle.UtcClock()
    low, high = oracle.ms_of(dt.datetime(1900, 1, 2)), oracle.ms_of(dt.datetime(2036, 12, 30))
    instants = [rng.randrange(low, high) for _ in range(400)]
    if name:
        instants += [change for change, _, _ in TRANSITIONS[name]]
    args = (spec_text, name) if name else (spec_text,)
    sql = "SELECT period_of_serial(?, ?, ?)" if name else "SELECT period_of_serial(?, ?)"
    for ms in instants:
        period = oracle.period_of(spec, ms, clock)
        # oracle: zoneinfo / datetime — the start of the period with that serial, local, with its
        # offset for sub-day units in a zone (period_oracle.period_of)
        assert db.execute(sql, (period.serial, *args)).fetchone()[0] == period.start_text, (ms, period.serial)
    counts[f"period_of_serial {spec_text} {name}"] = len(instants)


ROUND_TRIP_SPECS = ["day", "hour", "15 minutes", "minute", "week", "half-month", "month", "quarter starting july",
                    "year"]


@pytest.mark.parametrize("spec_text", ROUND_TRIP_SPECS)
@pytest.mark.parametrize("name", ZONES)
def test_round_trip(db, name, spec_text):
    # ext/README.md: feeding a zoned result back in with the same zone gives the same period
    instants = []
    for change, _, _ in TRANSITIONS[name]:
        instants += [change + h * HOUR_MS // 4 for h in range(-12, 12)]
    clock = oracle.ZoneClock(name)
    values = [v for ms in instants for v, _, _ in representations(clock, ms)]
    db.execute("DROP TABLE IF EXISTS trips")
    db.execute("CREATE TEMP TABLE trips(id INTEGER PRIMARY KEY, v)")
    db.executemany("INSERT INTO trips VALUES (?, ?)", enumerate(values))
    bad = db.execute(
        "SELECT v, f, e FROM (SELECT v, period_floor(v, ?1, ?2) f, period_end(v, ?1, ?2) e,"
        " period_serial(v, ?1, ?2) s, period_label(v, ?1, ?2) l FROM trips)"
        " WHERE period_floor(f, ?1, ?2) IS NOT f OR period_end(f, ?1, ?2) IS NOT e"
        " OR period_serial(f, ?1, ?2) IS NOT s OR period_label(f, ?1, ?2) IS NOT l"
        " OR period_floor(e, ?1, ?2) IS NOT e OR period_serial(e, ?1, ?2) IS NOT s + 1",
        (spec_text, name)).fetchall()
    counts[f"round trip {spec_text} {name}"] = len(values)
    assert not bad, f"{len(bad)} failures, e.g. {bad[:5]}"


CALENDAR_DAY_CASES = [
    # (bare local date, spec, zone) -> the period of that calendar day in the zone
    ("2026-03-08", "hour", "America/Denver"), ("2026-11-01", "hour", "America/Denver"),
    ("2026-11-01", "day", "America/Denver"), ("2026-03-08", "day", "America/Denver"),
    ("2026-10-04", "15 minutes", "Australia/Sydney"), ("2026-04-05", "day", "Australia/Adelaide"),
    ("2026-04-05", "hour", "Australia/Adelaide"), ("2026-01-01", "week", "Australia/Sydney"),
    # midnight skipped: Chile moved 00:00 -> 01:00 on 2022-09-11 (zoneinfo)
    ("2022-09-11", "day", "America/Santiago"), ("2022-09-11", "hour", "America/Santiago"),
    ("2022-09-11", "minute", "America/Santiago"),
]


@pytest.mark.parametrize("day,spec_text,name", CALENDAR_DAY_CASES)
def test_bare_date_is_the_local_calendar_day(db, day, spec_text, name):
    spec = {"hour": Spec("hour"), "day": Spec("day"), "15 minutes": Spec("minute", 15), "week": Spec("week"),
            "minute": Spec("minute")}[spec_text]
    clock = oracle.ZoneClock(name)
    # oracle: zoneinfo — the day begins at local midnight, or at its first instant when skipped
    period = oracle.period_of_day(spec, dt.date.fromisoformat(day), clock)
    got = db.execute("SELECT period_floor(?1, ?2, ?3), period_end(?1, ?2, ?3), period_serial(?1, ?2, ?3),"
                     " period_label(?1, ?2, ?3)", (day, spec_text, name)).fetchone()
    assert tuple(got) == (period.start_text, period.end_text, period.serial, period.label)


def test_skipped_midnight_day_is_23_hours(db):
    # oracle: zoneinfo — 2022-09-11 in Santiago runs from 04:00Z (01:00-03:00) to 03:00Z next day
    clock = oracle.ZoneClock("America/Santiago")
    period = oracle.period_of_day(Spec("day"), dt.date(2022, 9, 11), clock)
    noon = oracle.ms_of(dt.datetime(2022, 9, 11, 16)) // 1000
    start, end = db.execute("SELECT period_floor(?1, 'day', 'America/Santiago'),"
                            " period_end(?1, 'day', 'America/Santiago')", (noon,)).fetchone()
    assert (start, end) == (period.start // 1000, period.end // 1000)
    assert end - start == 23 * 3600


def test_zoned_forms_differ_from_utc_where_they_should(db):
    # oracle: zoneinfo — 2026-01-01 03:00 UTC is still 2025-12-31 in Denver (UTC-7)
    row = db.execute("SELECT period_floor('2026-01-01 03:00:00', 'day'),"
                     " period_floor('2026-01-01 03:00:00', 'day', 'America/Denver'),"
                     " period_label('2026-01-01 03:00:00', 'year', 'America/Denver'),"
                     " period_floor('2026-01-01 03:00:00', 'hour', 'Australia/Adelaide')").fetchone()
    adelaide = local_text(oracle.ZoneClock("Australia/Adelaide"), oracle.ms_of(dt.datetime(2026, 1, 1, 2, 30)))
    assert tuple(row) == ("2026-01-01", "2025-12-31", "2025", adelaide)
    assert adelaide == "2026-01-01 13:00:00+10:30"  # ACDT, +10:30 in January
