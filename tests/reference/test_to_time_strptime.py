# SPDX-License-Identifier: MIT
"""to_time against Python's datetime.strptime, at test time.

Seeded random moments are written in 14 layouts that shop exports use
(day-first and month-first dates, two-digit years, the 12-hour clock with
AM/PM, month and weekday names, day of the year, fractional seconds, %z
offsets, a compact fixed-width form), some with unpadded numbers as US
exports write them. Each text is read by to_time through SQL and by
datetime.strptime(text, format); the results must be identical text:
'YYYY-MM-DD HH:MM:SS' (with '.fff' when the milliseconds are not zero),
'YYYY-MM-DD' for date-only formats, and the UTC instant for a reading with
an offset. strptime keeps microseconds; almanac keeps milliseconds, rounded
half up (its documented rule), which the comparison applies to the oracle's
microseconds.
"""
import datetime as dt
import random
import re

from conftest import connect

UTC = dt.timezone.utc
CASES_PER_FORMAT = 3700

# (format, years, unpadded): unpadded strips the leading zero of day, month
# and 12-hour clock numbers, as US exports write 3/5/2026 2:20 PM.
FORMATS = [
    ("%Y-%m-%d %H:%M:%S", (1, 9999), False),
    ("%d.%m.%Y %H:%M", (1, 9999), False),            # day-first (German exports)
    ("%m/%d/%Y %I:%M %p", (1000, 9999), True),       # month-first, 12-hour clock (US)
    ("%d/%m/%y %H:%M", (1969, 2068), False),         # two-digit year, day-first (UK)
    ("%m/%d/%y %I:%M:%S %p", (1969, 2068), True),    # two-digit year, month-first, 12-hour
    ("%d %b %Y %H:%M", (1, 9999), False),            # abbreviated month name
    ("%B %d, %Y %I:%M %p", (1, 9999), False),        # full month name
    ("%a, %d %b %Y %H:%M:%S", (1, 9999), False),     # weekday name
    ("%A %d %B %Y", (1, 9999), False),               # date only, full names
    ("%Y-%j %H:%M", (1, 9999), False),               # day of the year
    ("%Y-%m-%dT%H:%M:%S.%f", (1, 9999), False),      # fractional seconds
    ("%Y-%m-%dT%H:%M:%S%z", (1900, 2100), False),    # offset
    ("%d/%m/%Y", (1, 9999), True),                   # date only, unpadded
    ("%Y%m%d%H%M%S", (1, 9999), False),              # compact, fixed width
]


def random_moment(rng, years):
    start = dt.datetime(years[0], 1, 1)
    end = dt.datetime(years[1], 12, 31, 23, 59, 59)
    seconds = rng.randrange(int((end - start).total_seconds()) + 1)
    moment = start + dt.timedelta(seconds=seconds)
    return moment.replace(microsecond=rng.choice([0, rng.randrange(10 ** 6),
                                                  rng.randrange(1000) * 1000]))


def unpad(text):
    # Leading zeros of one- or two-digit numbers only, never of a four-digit year.
    return re.sub(r"(?<!\d)0(\d)(?!\d)", r"\1", text)


def write(moment, fmt, unpadded, rng):
    if "%z" in fmt:
        offset = dt.timedelta(minutes=15 * rng.randint(-48, 56))
        moment = moment.replace(tzinfo=dt.timezone(offset))
    # strftime does not pad years below 1000 on every platform; %Y reads four digits.
    text = moment.strftime(fmt.replace("%Y", f"{moment.year:04d}"))
    if "%f" in fmt:
        # Exports write 1 to 6 digits of a fraction.
        digits = rng.randint(1, 6)
        text = text[: len(text) - (6 - digits)]
    return unpad(text) if unpadded else text


def expected_text(text, fmt):
    parsed = dt.datetime.strptime(text, fmt)  # oracle: datetime.strptime
    if parsed.tzinfo is not None:
        parsed = parsed.astimezone(UTC).replace(tzinfo=None)  # oracle: the UTC instant
    if not any(d in fmt for d in ("%H", "%I")):
        return parsed.strftime("%Y-%m-%d").rjust(10, "0")
    # almanac's documented rounding: microseconds half up to the millisecond
    parsed = parsed.replace(microsecond=0) + dt.timedelta(milliseconds=(parsed.microsecond + 500) // 1000)
    base = f"{parsed.year:04d}-{parsed.month:02d}-{parsed.day:02d} {parsed:%H:%M:%S}"
    return base + (f".{parsed.microsecond // 1000:03d}" if parsed.microsecond else "")


def test_to_time_reads_what_strptime_reads():
    db = connect()
    rng = random.Random(20260305)
    total = 0
    for fmt, years, unpadded in FORMATS:
        texts = []
        while len(texts) < CASES_PER_FORMAT:
            moment = random_moment(rng, years)
            text = write(moment, fmt, unpadded, rng)
            try:
                expected = expected_text(text, fmt)
            except (ValueError, OverflowError):
                continue  # outside what Python's datetime holds (year 1 with an offset)
            texts.append((text, expected))
        db.execute("DROP TABLE IF EXISTS t")
        db.execute("CREATE TABLE t(n INTEGER PRIMARY KEY, text TEXT)")
        db.executemany("INSERT INTO t(text) VALUES (?)", [(t,) for t, _ in texts])
        got = [row[0] for row in db.execute("SELECT to_time(text, ?) FROM t ORDER BY n", (fmt,))]
        mismatches = [(t, e, g) for (t, e), g in zip(texts, got) if e != g]
        assert not mismatches, f"{fmt}: {len(mismatches)} differ, e.g. {mismatches[:3]}"
        total += len(texts)
    print(f"\ncompared: {total} texts in {len(FORMATS)} formats against datetime.strptime")
    assert total >= 50000
