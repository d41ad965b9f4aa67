# SPDX-License-Identifier: MIT
"""Calendar periods without a zone, against plain Python datetime arithmetic.

Seeded random time values from 1900 to 2100, written in every TEXT form
The README lists and as Unix seconds (INTEGER and REAL) and Julian days (REAL),
go through period_floor, period_end, period_serial and period_label for each
spec below; the expected values come from tests/reference/period_oracle.py
(the README's rules written independently with `datetime`), computed at test
time, and must match exactly, SQL type included. period_shift is checked the
same way, plus a table of month-end, leap-year and half-month cases.
"""
import datetime as dt
import random

import pytest

from conftest import connect
import period_oracle as oracle
from period_oracle import Spec

SEED = 20260101
FULL = 100_000      # inputs for the main units
PART = 20_000       # inputs for each further variant
LOW_MS = oracle.ms_of(dt.datetime(1900, 1, 1))
HIGH_MS = oracle.ms_of(dt.datetime(2101, 1, 1))
D = dt.datetime

# (spec text as a user writes it, its meaning written by hand, how many inputs)
SPECS = [
    ("day", Spec("day"), FULL),
    ("week", Spec("week"), FULL),
    ("week starting sunday", Spec("week", week_start=6), FULL),
    ("half-month", Spec("half-month"), FULL),
    ("month", Spec("month"), FULL),
    ("quarter", Spec("quarter"), FULL),
    ("quarter starting april", Spec("quarter", year_start=4), FULL),
    ("year", Spec("year"), FULL),
    ("year starting july", Spec("year", year_start=7), FULL),
    ("hour", Spec("hour"), FULL),
    ("15 minutes", Spec("minute", 15), FULL),
    ("2 weeks", Spec("week", 2), FULL),
    # plural, case and spacing variants
    ("Days", Spec("day"), PART),
    ("  WEEK   Starting  Wednesday ", Spec("week", week_start=2), PART),
    ("week starting saturday", Spec("week", week_start=5), PART),
    ("week starting monday", Spec("week"), PART),
    ("3 days", Spec("day", 3), PART),
    ("10 days", Spec("day", 10), PART),
    ("4 weeks starting sunday", Spec("week", 4, week_start=6), PART),
    ("3 weeks", Spec("week", 3), PART),
    ("half-months", Spec("half-month"), PART),
    ("2 months", Spec("month", 2), PART),
    ("3 months", Spec("month", 3), PART),
    ("5 months", Spec("month", 5), PART),
    ("6 months", Spec("month", 6), PART),
    ("18 months", Spec("month", 18), PART),
    ("quarters", Spec("quarter"), PART),
    ("quarter starting january", Spec("quarter"), PART),
    ("quarter starting february", Spec("quarter", year_start=2), PART),
    ("quarter starting october", Spec("quarter", year_start=10), PART),
    ("2 quarters", Spec("quarter", 2), PART),
    ("2 quarters starting october", Spec("quarter", 2, year_start=10), PART),
    ("year starting january", Spec("year"), PART),
    ("year starting april", Spec("year", year_start=4), PART),
    ("year starting december", Spec("year", year_start=12), PART),
    ("3 years", Spec("year", 3), PART),
    ("10 years starting october", Spec("year", 10, year_start=10), PART),
    ("3 hours", Spec("hour", 3), PART),
    ("90 minutes", Spec("minute", 90), PART),
    ("7 minutes", Spec("minute", 7), PART),
    ("minute", Spec("minute"), PART),
    ("second", Spec("second"), PART),
    ("30 seconds", Spec("second", 30), PART),
    # `from` anchors
    ("month from 2024-01-15", Spec("month", start_from=D(2024, 1, 15)), PART),
    ("month from 2024-01-31", Spec("month", start_from=D(2024, 1, 31)), PART),
    ("3 months from 1999-11-30", Spec("month", 3, start_from=D(1999, 11, 30)), PART),
    ("quarter from 2024-02-15", Spec("quarter", start_from=D(2024, 2, 15)), PART),
    ("year from 2024-02-29", Spec("year", start_from=D(2024, 2, 29)), PART),
    ("2 weeks from 2024-01-03", Spec("week", 2, start_from=D(2024, 1, 3)), PART),
    ("week from 2024-01-03", Spec("week", start_from=D(2024, 1, 3)), PART),
    ("week starting wednesday from 2024-01-03", Spec("week", week_start=2, start_from=D(2024, 1, 3)), PART),
    ("10 days from 2000-02-29", Spec("day", 10, start_from=D(2000, 2, 29)), PART),
    ("hour from 2024-01-01 00:30", Spec("hour", start_from=D(2024, 1, 1, 0, 30)), PART),
    ("15 minutes from 2024-01-01 00:05", Spec("minute", 15, start_from=D(2024, 1, 1, 0, 5)), PART),
    ("45 seconds from 2024-01-01 00:00:10", Spec("second", 45, start_from=D(2024, 1, 1, 0, 0, 10)), PART),
    # ISO 8601 single-component durations
    ("P1W", Spec("week"), PART),
    ("P2W", Spec("week", 2), PART),
    ("P1D", Spec("day"), PART),
    ("P10D", Spec("day", 10), PART),
    ("P1M", Spec("month"), PART),
    ("P3M", Spec("month", 3), PART),
    ("P1Y", Spec("year"), PART),
    ("P2Y", Spec("year", 2), PART),
    ("PT1H", Spec("hour"), PART),
    ("PT6H", Spec("hour", 6), PART),
    ("PT15M", Spec("minute", 15), PART),
    ("PT30S", Spec("second", 30), PART),
    ("pt15m", Spec("minute", 15), PART),
]

counts = {}


@pytest.fixture(scope="module")
def inputs():
    rng = random.Random(SEED)
    return [oracle.random_input(rng, LOW_MS, HIGH_MS) for _ in range(FULL)]


@pytest.fixture(scope="module")
def loaded(inputs):
    connection = connect()
    connection.execute("CREATE TEMP TABLE inputs(id INTEGER PRIMARY KEY, v)")  # no affinity: types kept
    connection.executemany("INSERT INTO inputs VALUES (?, ?)", enumerate(item.value for item in inputs))
    kinds = dict(connection.execute("SELECT typeof(v), count(*) FROM inputs GROUP BY 1").fetchall())
    assert set(kinds) == {"text", "integer", "real"}, kinds
    yield connection
    connection.close()
    print(f"\ncompared: {counts}")


def mismatches(rows, expected, inputs, names):
    bad = []
    for index, (got, want) in enumerate(zip(rows, expected)):
        for name, g, w in zip(names, got, want):
            if not oracle.same_value(g, w):
                bad.append(f"{name}({inputs[index].value!r}) = {g!r}, expected {w!r}")
        if len(bad) >= 8:
            break
    return bad


@pytest.mark.parametrize("text,spec,size", SPECS, ids=[s[0].strip() for s in SPECS])
def test_floor_end_serial_label(loaded, inputs, text, spec, size):
    rows = loaded.execute(
        "SELECT period_floor(v, ?1), period_end(v, ?1), period_serial(v, ?1), period_label(v, ?1)"
        " FROM inputs WHERE id < ?2 ORDER BY id", (text, size)).fetchall()
    expected = []
    for item in inputs[:size]:
        # oracle: period_oracle.period_of (datetime arithmetic on the UTC calendar)
        period = oracle.period_of(spec, item.ms)
        expected.append((oracle.in_representation(item.kind, period.start, period.start_text),
                         oracle.in_representation(item.kind, period.end, period.end_text),
                         period.serial, period.label))
    assert len(rows) == size
    bad = mismatches(rows, expected, inputs, ("period_floor", "period_end", "period_serial", "period_label"))
    assert not bad, f"spec {text!r}:\n" + "\n".join(bad)
    counts[text] = 4 * size
    print(f"spec {text!r}: {4 * size} values compared")


def test_every_period_holds_its_time_and_neighbours_meet(loaded):
    # oracle: common practice — a period holds its t, ends where the next begins,
    # and the next one's serial is one more (checked through SQL alone)
    for text, _, _ in SPECS:
        bad = loaded.execute(
            "SELECT v, f, e FROM (SELECT v, period_floor(v, ?1) f, period_end(v, ?1) e,"
            " period_serial(v, ?1) s FROM inputs WHERE id < 2000 AND typeof(v) = 'integer')"
            # an end in [0, 5373484.5) seconds would read back as a Julian day (the auto rule)
            " WHERE NOT (e >= 0 AND e < 5373484.5) AND"
            " NOT (f <= v AND v < e AND period_floor(e, ?1) = e AND period_serial(e, ?1) = s + 1)"
            " LIMIT 3", (text,)).fetchall()
        assert not bad, f"spec {text!r}: {bad}"


# ------------------------------------------------------------------ representation rules

REPRESENTATION_CASES = [
    # (SQL expression, expected value, source)
    ("period_floor(2451545.0, 'day')", 2451544.5, "from memory: J2000.0 = JD 2451545.0 = 2000-01-01 12:00"),
    ("period_floor(2451545, 'day')", 2451544.5, "ext/README.md: INTEGER 2451545 is a Julian day by the auto rule"),
    ("period_end(2451545.0, 'day')", 2451545.5, "from memory: J2000.0"),
    ("period_floor(-1, 'second')", -1, "ext/README.md: -1 is 1969-12-31 23:59:59"),
    ("period_floor(-1, 'day')", -86400, "ext/README.md: -1 is 1969-12-31 23:59:59"),
    ("period_floor(-1.0, 'day')", -86400.0, "ext/README.md: REAL Unix seconds give REAL"),
    ("period_floor(5373484.5, 'day')", 5356800.0, "ext/README.md: 5373484.5 is Unix seconds (1970-03-03)"),
    ("period_floor(5373484.0, 'day')", 5373483.5, "ext/README.md: below 5373484.5 a Julian day (9999-12-31)"),
    ("period_floor(1700000000, 'hour')", 1699999200, "oracle: datetime (2023-11-14 22:13:20 UTC)"),
    ("period_floor('2000-01-01 12:00:00', 'day')", "2000-01-01", "ext/README.md: TEXT in, TEXT out"),
    ("period_floor('2000-01-01 12:34:56', 'hour')", "2000-01-01 12:00:00", "ext/README.md: sub-day TEXT form"),
    ("period_floor('2000-01-01', 'hour')", "2000-01-01 00:00:00", "ext/README.md: a bare date is its UTC midnight"),
    ("period_floor('2000-01-01T12:34:56.789Z', 'second')", "2000-01-01 12:34:56", "ext/README.md: sub-day TEXT form"),
    ("period_floor('2000-01-01 01:30+02:00', 'day')", "1999-12-31", "ext/README.md: an offset makes an instant"),
    ("period_floor('2000-01-01 12:34:56.999', 'second')", "2000-01-01 12:34:56", "ext/README.md: .fff allowed"),
]


@pytest.mark.parametrize("text", ["2000-01-01 12:34:56.999999", "2000-01-01 12:34:56.9994", "1999-12-31 23:59:59.9996",
                                  "2000-01-01 12:34:56.123456789", "2000-01-01T00:00:00.0005Z"])
def test_long_fractions_round_to_the_millisecond_as_sqlite_does(loaded, text):
    # oracle: SQLite's own instant for the text, julianday() (rounded to the millisecond; note that
    # SQLite's datetime(text) shows the written seconds truncated, datetime(julianday(text)) the instant)
    (got, want) = loaded.execute("SELECT period_floor(?1, 'second'), datetime(julianday(?1))",
                                 (text,)).fetchone()
    assert got == want, f"{text}: {got} vs SQLite {want}"


@pytest.mark.parametrize("expression,expected,source", REPRESENTATION_CASES,
                         ids=[case[0] for case in REPRESENTATION_CASES])
def test_representation_rules(loaded, expression, expected, source):
    (got,) = loaded.execute(f"SELECT {expression}").fetchone()
    assert oracle.same_value(got, expected), f"{expression} = {got!r}, expected {expected!r} ({source})"


def test_representation_matches_sqlite_julianday(loaded):
    # oracle: SQLite's own julianday(date(v, 'start of month')), so that a user's
    # period_floor(jd, 'month') = julianday(...) comparison holds bit for bit
    rows = loaded.execute(
        "SELECT v, period_floor(v, 'month') = julianday(date(v, 'start of month'))"
        " FROM inputs WHERE typeof(v) = 'real' AND v >= 0 AND v < 5373484.5 AND id < 20000").fetchall()
    assert rows and all(ok for _, ok in rows), [v for v, ok in rows if not ok][:5]


def test_numeric_text_reads_as_a_number(loaded):
    # ext/README.md: numeric TEXT is read as a number (JD 2451545 = 2000-01-01 12:00, from memory)
    (valid, day) = loaded.execute("SELECT valid_time('2451545'), period_label('2451545', 'day')").fetchone()
    assert (valid, day) == (1, "2000-01-01")
    (label,) = loaded.execute("SELECT period_label('1700000000', 'day')").fetchone()
    assert label == "2023-11-14"  # oracle: datetime.utcfromtimestamp(1700000000).date()
    assert label == dt.datetime.utcfromtimestamp(1700000000).date().isoformat()


# ------------------------------------------------------------------ period_shift

SHIFT_SPECS = [
    ("day", Spec("day")), ("3 days", Spec("day", 3)), ("week", Spec("week")), ("2 weeks", Spec("week", 2)),
    ("half-month", Spec("half-month")), ("month", Spec("month")), ("2 months", Spec("month", 2)),
    ("quarter", Spec("quarter")), ("quarter starting april", Spec("quarter", year_start=4)),
    ("year", Spec("year")), ("5 years", Spec("year", 5)), ("hour", Spec("hour")),
    ("15 minutes", Spec("minute", 15)), ("second", Spec("second")), ("P1M", Spec("month")),
    ("P1W", Spec("week")), ("PT15M", Spec("minute", 15)), ("P1Y", Spec("year")),
]
SHIFT_SIZE = 5_000
PLAIN_FORMS = [form for form in oracle.TEXT_FORMS if form[2] == ""]


def shift_inputs(seed, forms, kinds=("text", "int", "real", "jd"), weights=(7, 1, 1, 1)):
    rng = random.Random(seed)
    cases = []
    for _ in range(SHIFT_SIZE):
        item = oracle.random_input(rng, oracle.ms_of(D(1901, 1, 1)), oracle.ms_of(D(2100, 1, 1)),
                                   kinds, weights, forms)
        cases.append((item, rng.randint(-40, 40)))
    return cases


def expected_shift(spec, item, n):
    # oracle: period_oracle.shift_wall (datetime arithmetic, month-end clamping)
    moved = oracle.shift_wall(spec, oracle.wall_of(item.ms), n)
    if item.kind == "text":
        return oracle.write_text(moved, item.precision, item.separator, item.suffix)
    return oracle.in_representation(item.kind, oracle.ms_of(moved), None)


def run_shift(connection, text, spec, cases):
    if spec.sub_day:  # a bare date shifted by hours is not asked of period_shift here
        cases = [(item, n) for item, n in cases if item.precision != "date"]
    connection.execute("DROP TABLE IF EXISTS shifts")
    connection.execute("CREATE TEMP TABLE shifts(id INTEGER PRIMARY KEY, v, n)")
    connection.executemany("INSERT INTO shifts VALUES (?, ?, ?)",
                           [(i, item.value, n) for i, (item, n) in enumerate(cases)])
    rows = connection.execute("SELECT period_shift(v, n, ?) FROM shifts ORDER BY id", (text,)).fetchall()
    bad = [f"period_shift({item.value!r}, {n}, {text!r}) = {got!r}, expected {want!r}"
           for (got,), (item, n) in zip(rows, cases)
           if not oracle.same_value(got, want := expected_shift(spec, item, n))]
    return len(cases), bad


@pytest.mark.parametrize("text,spec", SHIFT_SPECS, ids=[s[0] for s in SHIFT_SPECS])
def test_shift_random(loaded, text, spec):
    compared, bad = run_shift(loaded, text, spec, shift_inputs(SEED + 1, PLAIN_FORMS))
    assert not bad, "\n".join(bad[:8])
    counts["shift " + text] = compared


@pytest.mark.parametrize("text,spec", SHIFT_SPECS[:12], ids=[s[0] for s in SHIFT_SPECS[:12]])
def test_shift_keeps_a_trailing_z(loaded, text, spec):
    # ext/README.md: period_shift keeps the input's own TEXT form — read here as keeping
    # its T separator, precision and trailing Z as well (assumption)
    z_forms = [form for form in oracle.TEXT_FORMS if form[2] == "Z"]
    compared, bad = run_shift(loaded, text, spec, shift_inputs(SEED + 2, z_forms, ("text",), (1,))[:500])
    assert not bad, "\n".join(bad[:8])
    counts["shift Z " + text] = compared


SHIFT_TABLE = [
    # (t, n, spec, expected, source)
    ("2024-01-31", 1, "month", "2024-02-29", "common practice: month-end clamping, leap year"),
    ("2023-01-31", 1, "month", "2023-02-28", "common practice: month-end clamping"),
    ("2024-03-31", -1, "month", "2024-02-29", "common practice: month-end clamping, negative n"),
    ("2024-01-31", 3, "months", "2024-04-30", "common practice: month-end clamping"),
    ("2024-01-31 10:30", 1, "month", "2024-02-29 10:30", "ext/README.md: a date-time keeps its time of day"),
    ("2024-01-31T23:59:59", 13, "month", "2025-02-28T23:59:59", "common practice: clamping"),
    ("2024-02-29", 1, "year", "2025-02-28", "common practice: Feb 29 clamps in a common year"),
    ("2024-02-29", 4, "year", "2028-02-29", "from memory: 2028 is a leap year"),
    ("2024-02-29", -4, "years", "2020-02-29", "from memory: 2020 is a leap year"),
    ("2000-02-29", 100, "years", "2100-02-28", "from memory: 2100 is not a leap year"),
    ("1904-02-29", -4, "years", "1900-02-28", "from memory: 1900 is not a leap year"),
    ("2024-11-30", 1, "quarter", "2025-02-28", "common practice: clamping"),
    ("2024-05-31", -1, "quarter", "2024-02-29", "common practice: clamping"),
    ("2024-01-31", 1, "half-month", "2024-02-15", "ext/README.md: half-month offset clamped (16 days into a 15-day half)"),
    ("2024-01-31", 2, "half-month", "2024-02-29", "ext/README.md: half-month offset clamped to Feb 16-29"),
    ("2023-01-31", 2, "half-month", "2023-02-28", "ext/README.md: half-month offset clamped to Feb 16-28"),
    ("2024-01-15 08:00:00", 1, "half-month", "2024-01-30 08:00:00", "ext/README.md: offset 14 days kept"),
    ("2024-01-20", -1, "half-month", "2024-01-05", "ext/README.md: offset 4 days kept, negative n"),
    ("2024-02-29", -1, "half-month", "2024-02-14", "ext/README.md: offset 13 days kept"),
    ("2024-02-15", -3, "half-month", "2023-12-30", "ext/README.md: offset 14 days kept, into Dec 16-31"),
    ("1900-02-28", 1, "day", "1900-03-01", "from memory: 1900 is not a leap year"),
    ("2000-02-28", 1, "day", "2000-02-29", "from memory: 2000 is a leap year"),
    ("2024-01-01 00:00:00", -1, "second", "2023-12-31 23:59:59", "common practice"),
    ("2024-01-31", 0, "month", "2024-01-31", "common practice: n = 0 is t"),
    ("2024-03-10 12:00:00", 1, "day", "2024-03-11 12:00:00", "common practice: UTC days are 24 h"),
    ("2024-12-30", -1, "P1M", "2024-11-30", "common practice"),
    (1706659200, 1, "month", 1709164800, "oracle below (2024-01-31 -> 2024-02-29 as Unix seconds)"),
    (2460340.5, 1, "month", 2460369.5, "oracle below (2024-01-31 -> 2024-02-29 as Julian days)"),
]


@pytest.mark.parametrize("t,n,spec_text,expected,source", SHIFT_TABLE,
                         ids=[f"{c[0]}{c[1]:+d} {c[2]}" for c in SHIFT_TABLE])
def test_shift_table(loaded, t, n, spec_text, expected, source):
    spec = {"month": Spec("month"), "months": Spec("month"), "year": Spec("year"), "years": Spec("year"),
            "quarter": Spec("quarter"), "half-month": Spec("half-month"), "day": Spec("day"),
            "second": Spec("second"), "P1M": Spec("month")}[spec_text]
    # oracle: period_oracle.shift_wall, which must agree with the stated source
    if isinstance(t, str):
        precision = "date" if len(t) == 10 else "minutes" if len(t) == 16 else "seconds"
        item = oracle.TimeInput(t, "text", oracle.ms_of(dt.datetime.fromisoformat(t)), precision,
                                "T" if "T" in t else " ")
    elif isinstance(t, int):
        item = oracle.TimeInput(t, "int", t * 1000)
    else:
        item = oracle.TimeInput(t, "jd", oracle.julian_ms(t))
    assert oracle.same_value(expected_shift(spec, item, n), expected), "oracle and stated source disagree"
    (got,) = loaded.execute("SELECT period_shift(?, ?, ?)", (t, n, spec_text)).fetchone()
    assert oracle.same_value(got, expected), f"period_shift({t!r}, {n}, {spec_text!r}) = {got!r} ({source})"
