# SPDX-License-Identifier: MIT
"""The table-valued periods(start, stop, spec [, zone]) against an enumeration in plain datetime.

README: one row per period overlapping [start, stop), columns
period_start, period_end, label, serial, in order, period_start/period_end in
the representation of `start`; an eponymous virtual table whose arguments are
hidden columns; streamed, not materialised. Expected rows come from
tests/reference/period_oracle.py (datetime arithmetic; zoneinfo for zones):
the period holding start, then each next one while it starts before stop.
"""
import datetime as dt
import random
import subprocess

import pytest

from conftest import MODULE, connect
import period_oracle as oracle
from period_oracle import Spec

D = dt.datetime
counts = {}


@pytest.fixture(scope="module")
def db():
    connection = connect()
    yield connection
    connection.close()
    print(f"\ncompared: {counts}")


def enumerate_periods(spec, start_ms, stop_ms, kind, clock=None, start_is_day=None):
    """oracle: plain datetime enumeration — the period holding start, then its successors."""
    if stop_ms <= start_ms:
        return []  # no period overlaps an empty range
    period = (oracle.period_of_day(spec, start_is_day, clock) if start_is_day
              else oracle.period_of(spec, start_ms, clock))
    rows = []
    while period.start < stop_ms:
        rows.append((oracle.in_representation(kind, period.start, period.start_text),
                     oracle.in_representation(kind, period.end, period.end_text), period.label, period.serial))
        period = oracle.period_of(spec, period.end, clock)
    return rows


def same_rows(got, want):
    return len(got) == len(want) and all(
        all(oracle.same_value(g, w) for g, w in zip(a, b)) for a, b in zip(got, want))


def test_columns_in_order_and_hidden_arguments(db):
    cursor = db.execute("SELECT * FROM periods('2026-01-01', '2027-01-01', 'month')")
    rows = cursor.fetchall()
    assert [c[0] for c in cursor.description] == ["period_start", "period_end", "label", "serial"]  # ext/README.md
    want = enumerate_periods(Spec("month"), oracle.ms_of(D(2026, 1, 1)), oracle.ms_of(D(2027, 1, 1)), "text",
                             start_is_day=dt.date(2026, 1, 1))
    assert same_rows(rows, want), rows
    assert rows[0] == ("2026-01-01", "2026-02-01", "2026-01", (2026 - 1970) * 12)  # common practice
    # the arguments as hidden columns, constrained in WHERE (ext/README.md: eponymous virtual table)
    by_where = db.execute("SELECT * FROM periods WHERE start = '2026-01-01' AND stop = '2027-01-01'"
                          " AND spec = 'month'").fetchall()
    assert by_where == rows
    zoned = db.execute("SELECT * FROM periods WHERE start = '2026-01-01' AND stop = '2027-01-01'"
                       " AND spec = 'month' AND zone = 'America/Denver'").fetchall()
    assert zoned == rows  # bare local dates: the same months, now local ones (TEXT results are local dates)


def test_hidden_columns_can_be_selected(db):
    # ext/README.md: the arguments are hidden columns — so naming them gives them back (assumption: their names
    # are the argument names start, stop, spec, zone)
    row = db.execute("SELECT start, stop, spec, label FROM periods('2026-01-01', '2026-03-01', 'month')"
                     " LIMIT 1").fetchone()
    assert row == ("2026-01-01", "2026-03-01", "month", "2026-01")


YEAR_CASES = [("day", Spec("day")), ("week", Spec("week")), ("half-month", Spec("half-month")),
              ("month", Spec("month")), ("quarter", Spec("quarter")), ("year", Spec("year"))]


@pytest.mark.parametrize("year", [1900, 1970, 2000, 2004, 2012, 2015, 2020, 2026, 2100])
def test_a_year_of_days(db, year):
    first, last = f"{year}-01-01", f"{year + 1}-01-01"
    got = {text: db.execute("SELECT * FROM periods(?, ?, ?)", (first, last, text)).fetchall()
           for text, _ in YEAR_CASES}
    for text, spec in YEAR_CASES:
        want = enumerate_periods(spec, oracle.ms_of(D(year, 1, 1)), oracle.ms_of(D(year + 1, 1, 1)), "text",
                                 start_is_day=dt.date(year, 1, 1))
        assert same_rows(got[text], want), (year, text, got[text][:3], want[:3])
    days = [dt.date(year, 1, 1) + dt.timedelta(k) for k in range((dt.date(year + 1, 1, 1) - dt.date(year, 1, 1)).days)]
    assert len(got["day"]) == len(days)  # oracle: datetime
    assert len(got["half-month"]) == 24 and len(got["quarter"]) == 4 and len(got["month"]) == 12  # common practice
    # weeks overlapping a calendar year: one per distinct ISO week among its days (oracle: isocalendar());
    # 52 or 53 for an ISO week-numbering year (common practice), 53 or 54 for a calendar year
    assert len(got["week"]) == len({d.isocalendar()[:2] for d in days}) in (53, 54)


@pytest.mark.parametrize("iso_year", [1998, 2004, 2009, 2015, 2020, 2026, 2027])
def test_an_iso_year_of_days_has_52_or_53_weeks(db, iso_year):
    monday = dt.date.fromisocalendar(iso_year, 1, 1)  # oracle: datetime ISO calendar
    next_monday = dt.date.fromisocalendar(iso_year + 1, 1, 1)
    rows = db.execute("SELECT label FROM periods(?, ?, 'week')", (monday.isoformat(), next_monday.isoformat())).fetchall()
    weeks = (next_monday - monday).days // 7
    assert weeks in (52, 53)  # common practice
    assert [r[0] for r in rows] == [f"{iso_year}-W{k:02d}" for k in range(1, weeks + 1)]


RANGE_SPECS = [
    ("day", Spec("day")), ("3 days", Spec("day", 3)), ("week", Spec("week")),
    ("week starting sunday", Spec("week", week_start=6)), ("2 weeks from 2024-01-03", Spec("week", 2, start_from=D(2024, 1, 3))),
    ("half-month", Spec("half-month")), ("month", Spec("month")), ("2 months", Spec("month", 2)),
    ("month from 2024-01-31", Spec("month", start_from=D(2024, 1, 31))), ("quarter", Spec("quarter")),
    ("quarter starting april", Spec("quarter", year_start=4)), ("year", Spec("year")),
    ("year starting july", Spec("year", year_start=7)), ("5 years", Spec("year", 5)), ("hour", Spec("hour")),
    ("15 minutes", Spec("minute", 15)), ("PT30S", Spec("second", 30)), ("P1W", Spec("week")), ("P3M", Spec("month", 3)),
]
TYPICAL_LENGTH_MS = {"second": 1000, "minute": 60000, "hour": 3600000, "day": oracle.MS_PER_DAY,
                     "week": 7 * oracle.MS_PER_DAY, "half-month": 15 * oracle.MS_PER_DAY,
                     "month": 30 * oracle.MS_PER_DAY, "quarter": 91 * oracle.MS_PER_DAY, "year": 365 * oracle.MS_PER_DAY}


@pytest.mark.parametrize("text,spec", RANGE_SPECS, ids=[s[0] for s in RANGE_SPECS])
def test_random_ranges(db, text, spec):
    rng = random.Random(f"periods {text}")
    low, high = oracle.ms_of(D(1900, 1, 1)), oracle.ms_of(D(2099, 1, 1))
    compared = 0
    plain = [form for form in oracle.TEXT_FORMS if form[2] != "offset"]
    for _ in range(60):
        start = oracle.random_input(rng, low, high, forms=plain)
        length = TYPICAL_LENGTH_MS[spec.unit] * spec.count
        stop = oracle.random_input(rng, start.ms + rng.randrange(0, 120) * length // 3 + 1,
                                   start.ms + 120 * length // 3 + 2, forms=plain)
        got = db.execute("SELECT period_start, period_end, label, serial FROM periods(?, ?, ?)",
                         (start.value, stop.value, text)).fetchall()
        want = enumerate_periods(spec, start.ms, stop.ms, start.kind)
        assert same_rows(got, want), f"periods({start.value!r}, {stop.value!r}, {text!r}):\n{got[:3]}\n{want[:3]}"
        compared += len(want)
    counts[text] = compared


def test_boundaries_and_empty_ranges(db):
    # a start on a boundary is the first row; a stop on a boundary ends the last row (ext/README.md: [start, stop))
    rows = db.execute("SELECT period_start, period_end FROM periods('2026-02-01', '2026-04-01', 'month')").fetchall()
    assert rows == [("2026-02-01", "2026-03-01"), ("2026-03-01", "2026-04-01")]  # common practice
    rows = db.execute("SELECT label FROM periods('2026-02-01 00:00:01', '2026-04-01 00:00:01', 'month')").fetchall()
    assert rows == [("2026-02",), ("2026-03",), ("2026-04",)]  # common practice: overlapping periods
    # no period overlaps an empty range (ext/README.md: overlapping [start, stop)); reversed ranges likewise (assumption)
    assert db.execute("SELECT count(*) FROM periods('2026-02-01', '2026-02-01', 'day')").fetchone() == (0,)
    assert db.execute("SELECT count(*) FROM periods('2026-03-01', '2026-02-01', 'day')").fetchone() == (0,)


def test_numeric_starts_keep_their_representation(db):
    # ext/README.md: period_start/period_end in the representation of start (oracle: datetime below)
    start, stop = oracle.ms_of(D(2024, 1, 15, 10)), oracle.ms_of(D(2024, 4, 1))
    for value, kind in ((start // 1000, "int"), (start / 1000, "real"), (oracle.julian_day(start), "jd"),
                        ("2024-01-15 10:00:00", "text")):
        got = db.execute("SELECT * FROM periods(?, '2024-04-01', 'month')", (value,)).fetchall()
        assert same_rows(got, enumerate_periods(Spec("month"), start, stop, kind)), (kind, got)


@pytest.mark.parametrize("name", ["America/Denver", "Australia/Sydney", "Australia/Adelaide"])
def test_zoned_days_of_hours(db, name):
    # oracle: zoneinfo — every local day around each 2020-2030 change, as hours and as 15 minutes
    clock = oracle.ZoneClock(name)
    lengths = set()
    for k in range((dt.date(2031, 1, 1) - dt.date(2020, 1, 1)).days):
        local_day = dt.date(2020, 1, 1) + dt.timedelta(days=k)
        day_period = oracle.period_of_day(Spec("day"), local_day, clock)
        if day_period.end - day_period.start == oracle.MS_PER_DAY:
            continue  # only the local days with a change
        next_day = (local_day + dt.timedelta(days=1)).isoformat()
        for text, spec in (("hour", Spec("hour")), ("15 minutes", Spec("minute", 15))):
            got = db.execute("SELECT * FROM periods(?, ?, ?, ?)",
                             (local_day.isoformat(), next_day, text, name)).fetchall()
            want = enumerate_periods(spec, day_period.start, day_period.end, "text", clock, local_day)
            assert same_rows(got, want), (name, local_day, text, got[:4], want[:4])
            assert len({row[2] for row in got}) == len(got)  # ext/README.md: labels never shared
            counts[f"{name} {text}"] = counts.get(f"{name} {text}", 0) + len(got)
            if text == "hour":
                lengths.add(len(got))
    assert lengths == {23, 25}  # common practice: a 1-hour daylight-saving change


def test_zoned_numeric_start(db):
    # numbers in, instants out: the local months of Sydney as Unix seconds (oracle: zoneinfo)
    clock = oracle.ZoneClock("Australia/Sydney")
    start, stop = oracle.ms_of(D(2025, 12, 20)), oracle.ms_of(D(2026, 12, 20))
    got = db.execute("SELECT * FROM periods(?, ?, 'month', 'Australia/Sydney')", (start // 1000, stop // 1000)).fetchall()
    assert same_rows(got, enumerate_periods(Spec("month"), start, stop, "int", clock)), got[:3]


def test_empty_periods_are_rows_in_a_report(db):
    # the job: weeks with no sales still appear, with a count of 0 (oracle: datetime enumeration)
    db.execute("CREATE TEMP TABLE sales(ts TEXT, amount REAL)")
    rng = random.Random(7)
    sale_days = sorted({dt.date(2026, 1, 1) + dt.timedelta(rng.randrange(0, 90)) for _ in range(12)})
    db.executemany("INSERT INTO sales VALUES (?, 1.0)", [(d.isoformat() + " 12:00:00",) for d in sale_days])
    got = db.execute("SELECT p.label, count(s.ts) FROM periods('2026-01-01', '2026-04-01', 'week') p"
                     " LEFT JOIN sales s ON s.ts >= p.period_start AND s.ts < p.period_end"
                     " GROUP BY p.serial ORDER BY p.serial").fetchall()
    first_monday = dt.date(2025, 12, 29)
    want = []
    monday = first_monday
    while monday < dt.date(2026, 4, 1):
        year, week, _ = monday.isocalendar()
        want.append((f"{year}-W{week:02d}", sum(monday <= d < monday + dt.timedelta(7) for d in sale_days)))
        monday += dt.timedelta(7)
    assert got == want
    assert any(n == 0 for _, n in got)


def test_arguments_from_another_table(db):
    # table-valued functions take column values from a join (SQLite's table-valued function rules)
    db.execute("CREATE TEMP TABLE ranges(a, b, s)")
    db.executemany("INSERT INTO ranges VALUES (?, ?, ?)", [("2026-01-01", "2026-03-01", "month"),
                                                           ("2026-01-01", "2026-01-04", "day")])
    got = db.execute("SELECT r.s, p.label FROM ranges r, periods(r.a, r.b, r.s) p ORDER BY r.s, p.serial").fetchall()
    assert got == [("day", "2026-01-01"), ("day", "2026-01-02"), ("day", "2026-01-03"),
                   ("month", "2026-01"), ("month", "2026-02")]  # common practice


def test_streamed_not_materialised():
    # 9998 years of seconds (~3e11 rows) cannot be built in memory; taking three must be immediate.
    # Run in a fresh shell under a 2 GiB address-space limit; the 120 s limit is a hang guard, not a timing.
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    script = (f".load {module}\nSELECT label FROM periods('0001-01-01', '9999-01-01', 'second') LIMIT 3;\n"
              "SELECT count(*) FROM (SELECT 1 FROM periods('2000-01-01', '2000-01-08', 'second'));\n")
    result = subprocess.run(["bash", "-c", "ulimit -v 2097152; exec sqlite3 -bail :memory:"], input=script,
                            capture_output=True, text=True, timeout=120)
    assert result.returncode == 0, result.stderr
    assert result.stdout.split("\n")[:4] == ["0001-01-01 00:00:00", "0001-01-01 00:00:01", "0001-01-01 00:00:02",
                                              str(7 * 86400)]  # oracle: common practice, 604800 s in a week
