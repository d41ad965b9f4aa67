# SPDX-License-Identifier: MIT
"""An independent reference calendar for the period checks.

The README's rules ("Time values", "Calendar period functions", "Specs",
"Labels", "Zones") written a second time, in plain Python `datetime`
arithmetic, with `zoneinfo` for local clocks. Nothing here is derived from
the extension's code: the specs are built by hand (not parsed), so a test
compares the extension's reading of a spec text with what the text means.

Instants are integers of milliseconds since 1970-01-01 00:00 UTC; wall-clock
readings are naive datetimes. Every expected value in the tests comes from a
function in this file, and each test says so beside its assertion.
"""
import calendar
import datetime as dt
from dataclasses import dataclass
from typing import Optional
from zoneinfo import ZoneInfo

EPOCH = dt.datetime(1970, 1, 1)
MS = dt.timedelta(milliseconds=1)
UTC = dt.timezone.utc
# Julian day of 1970-01-01 00:00 UTC is 2440587.5 (from memory; it follows
# from the J2000.0 epoch 2451545.0 = 2000-01-01 12:00 and the 10957.5 days
# between), i.e. SQLite's iJD offset in milliseconds.
UNIX_EPOCH_JD_MS = 210866760000000
MS_PER_DAY = 86400000

SUB_DAY_SECONDS = {"second": 1, "minute": 60, "hour": 3600}
MONTHS_PER_UNIT = {"month": 1, "quarter": 3, "year": 12}


@dataclass(frozen=True)
class Spec:
    """A period spec as the README defines it, written out by hand."""

    unit: str                          # second minute hour day week half-month month quarter year
    count: int = 1
    week_start: int = 0                # datetime.weekday(): Monday = 0
    year_start: int = 1                # month the (fiscal) year starts
    start_from: Optional[dt.datetime] = None  # `from`: a wall-clock moment at which a period starts

    @property
    def sub_day(self):
        return self.unit in SUB_DAY_SECONDS

    @property
    def month_based(self):
        return self.unit in MONTHS_PER_UNIT

    @property
    def fiscal(self):
        return self.unit in ("quarter", "year") and self.year_start != 1


def ms_of(wall):
    """Milliseconds since the epoch of a naive UTC reading."""
    return (wall - EPOCH) // MS


def wall_of(ms):
    return EPOCH + dt.timedelta(milliseconds=ms)


def add_months(wall, k):
    """wall + k months, the day clamped to the month's last day (time of day kept)."""
    index = wall.month - 1 + k
    year, month = wall.year + index // 12, index % 12 + 1
    return wall.replace(year=year, month=month, day=min(wall.day, calendar.monthrange(year, month)[1]))


def month_index(wall):
    return (wall.year - 1970) * 12 + wall.month - 1


def month_start(index):
    return dt.datetime(1970 + index // 12, index % 12 + 1, 1)


def format_offset(offset):
    seconds = int(offset.total_seconds())
    sign = "-" if seconds < 0 else "+"
    seconds = abs(seconds)
    return f"{sign}{seconds // 3600:02d}:{seconds % 3600 // 60:02d}"


# ---------------------------------------------------------------- wall-clock periods


def wall_period(spec, wall):
    """(start, end, serial) of the period holding a wall-clock reading, on the
    wall clock itself: the calendar part of the README, without any zone."""
    if spec.unit == "half-month":
        # 1st-15th and 16th-last (common practice: semi-monthly pay periods)
        second_half = wall.day >= 16
        start = wall.replace(day=16 if second_half else 1, hour=0, minute=0, second=0, microsecond=0)
        end = add_months(start.replace(day=1), 1) if second_half else start.replace(day=16)
        serial = month_index(wall) * 2 + (1 if second_half else 0)
        return start, end, serial
    if spec.month_based:
        unit_months = MONTHS_PER_UNIT[spec.unit]
        length = unit_months * spec.count
        if spec.start_from is None:
            # multiples are counted from the single period (month, quarter or
            # year, aligned on its start month) that holds 1970-01-01
            first = -((-(spec.year_start - 1)) % unit_months)
            k = (month_index(wall) - first) // length
            return month_start(first + k * length), month_start(first + (k + 1) * length), k
        anchor = spec.start_from

        def locate(moment):
            k = (month_index(moment) - month_index(anchor)) // length
            while add_months(anchor, k * length) > moment:
                k -= 1
            while add_months(anchor, (k + 1) * length) <= moment:
                k += 1
            return k

        k = locate(wall)
        return add_months(anchor, k * length), add_months(anchor, (k + 1) * length), k - locate(EPOCH)
    # fixed-length steps on the wall clock: sub-day units, days, weeks
    if spec.sub_day:
        step = dt.timedelta(seconds=SUB_DAY_SECONDS[spec.unit] * spec.count)
    else:
        step = dt.timedelta(days=spec.count * (7 if spec.unit == "week" else 1))
    if spec.start_from is not None:
        anchor = spec.start_from
    elif spec.unit == "week":
        anchor = EPOCH - dt.timedelta(days=(EPOCH.weekday() - spec.week_start) % 7)
    else:
        anchor = EPOCH
    k = (wall - anchor) // step
    return anchor + k * step, anchor + (k + 1) * step, k - (EPOCH - anchor) // step


def label_of(spec, start_wall, offset=None, end_wall=None):
    """README "Labels", from the period's start reading (and its offset, in a zone).
    Half-months, months, quarters and years counted `from` a date are labelled with
    their first and last day, the year of the last one only when it differs
    (README "Labels": 2026-02-15..03-14)."""
    suffix = "" if offset is None else format_offset(offset)
    if spec.start_from is not None and spec.unit in ("half-month", "month", "quarter", "year"):
        first, last = start_wall.date(), (end_wall - dt.timedelta(milliseconds=1)).date()
        return f"{first.isoformat()}..{last.isoformat()[5:] if last.year == first.year else last.isoformat()}"
    if spec.unit == "second":
        return start_wall.isoformat(" ", "seconds") + suffix
    if spec.sub_day:
        return start_wall.isoformat(" ", "minutes") + suffix
    day = start_wall.date()
    if spec.unit == "week" and spec.count == 1 and start_wall.weekday() == 0:
        year, week, _ = day.isocalendar()  # oracle: datetime.date.isocalendar()
        return f"{year:04d}-W{week:02d}"
    if spec.unit in ("day", "week"):
        return day.isoformat()
    if spec.unit == "half-month":
        if day.day == 1:
            return f"{day.year:04d}-{day.month:02d} (1-15)"
        return f"{day.year:04d}-{day.month:02d} (16-{calendar.monthrange(day.year, day.month)[1]:02d})"
    if spec.unit == "month":
        return f"{day.year:04d}-{day.month:02d}"
    if spec.fiscal:
        fiscal_year = day.year + 1 if day.month >= spec.year_start else day.year  # the year it ends
        if spec.unit == "year":
            return f"FY{fiscal_year:04d}"
        return f"FY{fiscal_year:04d}-Q{(day.month - spec.year_start) % 12 // 3 + 1}"
    if spec.unit == "quarter":
        return f"{day.year:04d}-Q{(day.month - 1) // 3 + 1}"
    return f"{day.year:04d}"


# ---------------------------------------------------------------- clocks


class UtcClock:
    name = None

    def local(self, ms):
        return wall_of(ms), None

    def first_instant(self, wall):
        return ms_of(wall)

    def offset_at(self, ms):
        return None


class ZoneClock:
    """A zone's wall clock, through zoneinfo (the IANA database Debian's tzdata installs)."""

    def __init__(self, name):
        self.name = name
        self.zone = ZoneInfo(name)

    def local(self, ms):
        aware = dt.datetime(1970, 1, 1, tzinfo=UTC) + dt.timedelta(milliseconds=ms)
        here = aware.astimezone(self.zone)
        return here.replace(tzinfo=None), here.utcoffset()

    def offset_at(self, ms):
        return self.local(ms)[1]

    def _instant(self, wall, fold):
        aware = wall.replace(tzinfo=self.zone, fold=fold)
        return ms_of(aware.astimezone(UTC).replace(tzinfo=None))

    def first_instant(self, wall):
        """The first instant whose reading is `wall`; for a skipped reading, the
        instant of the forward change that skipped it (README "Time values")."""
        readable = [ms for ms in {self._instant(wall, 0), self._instant(wall, 1)} if self.local(ms)[0] == wall]
        if readable:
            return min(readable)
        low, high = sorted({self._instant(wall, 0), self._instant(wall, 1)})
        before = self.offset_at(low)
        while high - low > 1:  # bisect for the change, to the millisecond
            middle = (low + high) // 2
            if self.offset_at(middle) == before:
                low = middle
            else:
                high = middle
        return high


def offset_changes(name, first_year, last_year):
    """Every change of UTC offset of zone `name` in [first_year, last_year], as
    (instant ms, offset before, offset after), from zoneinfo alone: a daily scan,
    then bisection to the millisecond."""
    clock = ZoneClock(name)
    t = ms_of(dt.datetime(first_year, 1, 1))
    stop = ms_of(dt.datetime(last_year + 1, 1, 1))
    found = []
    before = clock.offset_at(t)
    while t < stop:
        after = clock.offset_at(t + MS_PER_DAY)
        if after != before:
            low, high = t, t + MS_PER_DAY
            while high - low > 1:
                middle = (low + high) // 2
                if clock.offset_at(middle) == before:
                    low = middle
                else:
                    high = middle
            found.append((high, before, after))
            before = after
        t += MS_PER_DAY
    return found


@dataclass
class Period:
    start: int     # ms, inclusive
    end: int       # ms, exclusive
    serial: int
    label: str
    start_text: str
    end_text: str


def period_of(spec, ms, clock=None):
    """The period holding instant `ms` on `clock` (UTC when None)."""
    clock = clock or UtcClock()
    if spec.sub_day and clock.name is not None:
        return _zoned_sub_day_period(spec, ms, clock)
    wall, _ = clock.local(ms)
    start_wall, end_wall, serial = wall_period(spec, wall)
    start, end = clock.first_instant(start_wall), clock.first_instant(end_wall)
    if spec.sub_day:  # UTC
        return Period(start, end, serial, label_of(spec, start_wall, end_wall=end_wall),
                      start_wall.isoformat(" ", "seconds"), end_wall.isoformat(" ", "seconds"))
    return Period(start, end, serial, label_of(spec, start_wall, end_wall=end_wall),
                  start_wall.date().isoformat(), end_wall.date().isoformat())


def period_of_day(spec, day, clock=None):
    """The period holding a calendar day (bare YYYY-MM-DD): it begins at the
    clock's first instant of that day."""
    clock = clock or UtcClock()
    return period_of(spec, clock.first_instant(dt.datetime.combine(day, dt.time())), clock)


def _zoned_sub_day_period(spec, ms, clock):
    """README "Zones": sub-day periods are intervals of elapsed time whose
    boundaries fall on the local clock's round values. Written for units that
    divide an hour, in zones whose changes happen on a round local value."""
    length_ms = SUB_DAY_SECONDS[spec.unit] * spec.count * 1000
    assert 3600000 % length_ms == 0 and spec.start_from is None, "oracle covers units dividing an hour"
    wall, offset = clock.local(ms)
    since_midnight = (wall - wall.replace(hour=0, minute=0, second=0, microsecond=0)) // MS
    start = ms - since_midnight % length_ms
    # the boundary must carry the same offset (no change strictly inside)
    assert clock.offset_at(start) == offset, (clock.name, ms)
    end = start + length_ms
    epoch_start = clock.first_instant(EPOCH)
    assert (start - epoch_start) % length_ms == 0, "boundaries are whole steps of elapsed time here"
    serial = (start - epoch_start) // length_ms
    start_wall, start_offset = clock.local(start)
    end_wall, end_offset = clock.local(end)
    return Period(start, end, serial, label_of(spec, start_wall, start_offset),
                  start_wall.isoformat(" ", "seconds") + format_offset(start_offset),
                  end_wall.isoformat(" ", "seconds") + format_offset(end_offset))


# ---------------------------------------------------------------- representations


def unix_integer(ms):
    return ms // 1000


def unix_real(ms):
    return ms / 1000


def julian_day(ms):
    """REAL Julian day as SQLite's julianday() computes it: iJD/86400000.0
    (Python's int/int true division is correctly rounded, as that one division is)."""
    return (ms + UNIX_EPOCH_JD_MS) / MS_PER_DAY


def julian_ms(value):
    """A REAL Julian day read to the millisecond, as SQLite does (iJD = jd*86400000 + 0.5)."""
    return int(value * MS_PER_DAY + 0.5) - UNIX_EPOCH_JD_MS


def in_representation(kind, ms, text):
    """A boundary given back in the input's representation."""
    if kind == "text":
        return text
    if kind == "int":
        return unix_integer(ms)
    if kind == "real":
        return unix_real(ms)
    return julian_day(ms)


def same_value(got, expected):
    """Exact equality that also requires the same SQL type (5 is not 5.0)."""
    return type(got) is type(expected) and got == expected


# ---------------------------------------------------------------- period_shift


def shift_wall(spec, wall, n):
    """README: period_shift: t moved by n whole periods on the wall clock;
    months clamp to the month's last day; a half-month keeps t's offset from
    the start of its half, clamped to the target half; time of day is kept."""
    if spec.sub_day:
        return wall + dt.timedelta(seconds=SUB_DAY_SECONDS[spec.unit] * spec.count * n)
    if spec.unit in ("day", "week"):
        return wall + dt.timedelta(days=spec.count * n * (7 if spec.unit == "week" else 1))
    if spec.month_based:
        return add_months(wall, MONTHS_PER_UNIT[spec.unit] * spec.count * n)
    start, _, serial = wall_period(spec, wall)
    target = serial + n
    year, month = 1970 + (target // 2) // 12, (target // 2) % 12 + 1
    first_day = 16 if target % 2 else 1
    half_length = calendar.monthrange(year, month)[1] - 15 if target % 2 else 15
    day = first_day + min(wall.day - start.day, half_length - 1)
    return wall.replace(year=year, month=month, day=day)


# ---------------------------------------------------------------- inputs


@dataclass
class TimeInput:
    value: object          # what goes into SQL
    kind: str              # text, int (Unix seconds INTEGER), real (Unix seconds REAL), jd (Julian day REAL)
    ms: int                # the instant it denotes (midnight UTC for a bare date)
    precision: str = ""    # TEXT only: date, minutes, seconds, fraction
    separator: str = " "
    suffix: str = ""       # "", "Z" or "+HH:MM"


def write_text(wall, precision, separator=" ", suffix=""):
    """A wall reading in one of the TEXT forms SQLite's date functions read."""
    if precision == "date":
        return wall.date().isoformat()
    spec = {"minutes": "minutes", "seconds": "seconds", "fraction": "milliseconds"}[precision]
    return wall.isoformat(separator, spec) + suffix


def truncate(ms, precision):
    unit = {"date": MS_PER_DAY, "minutes": 60000, "seconds": 1000, "fraction": 1}[precision]
    return ms - ms % unit


TEXT_FORMS = [("date", " ", ""), ("minutes", " ", ""), ("seconds", " ", ""), ("fraction", " ", ""),
              ("seconds", "T", ""), ("minutes", "T", ""), ("seconds", " ", "Z"), ("fraction", "T", "Z"),
              ("seconds", " ", "offset"), ("minutes", "T", "offset"), ("fraction", " ", "offset")]


def random_input(rng, low_ms, high_ms, kinds=("text", "int", "real", "jd"), weights=(7, 1, 1, 1),
                 forms=TEXT_FORMS):
    """One seeded random time value in [low_ms, high_ms), in one representation."""
    ms = rng.randrange(low_ms, high_ms)
    kind = rng.choices(kinds, weights)[0]
    if kind in ("int", "real") and 0 <= ms < 5373484500:
        kind = "text"  # by SQLite's auto rule these numbers are Julian days, not Unix seconds
    if kind == "int":
        ms = truncate(ms, "seconds")
        return TimeInput(ms // 1000, kind, ms)
    if kind == "real":
        return TimeInput(ms / 1000, kind, ms)
    if kind == "jd":
        return TimeInput(julian_day(ms), kind, ms)
    precision, separator, suffix = rng.choice(forms)
    ms = truncate(ms, precision)
    if suffix == "offset":
        minutes = rng.randrange(-12 * 4, 14 * 4 + 1) * 15
        offset = dt.timedelta(minutes=minutes)
        suffix = format_offset(offset)
        text = write_text(wall_of(ms) + offset, precision, separator, suffix)
    else:
        text = write_text(wall_of(ms), precision, separator, suffix)
    return TimeInput(text, kind, ms, precision, separator, suffix)
