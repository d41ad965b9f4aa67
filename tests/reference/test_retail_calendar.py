# SPDX-License-Identifier: MIT
"""Retail calendars (52/53-week years) against pandas and zoneinfo.

- Year ends: every weekday x anchor month x variation ('last', 'nearest'),
  1990-2060, against pandas.tseries.offsets.FY5253(weekday, startingMonth,
  variation) — in pandas, startingMonth is the month in which the year ends.
- Quarter ends: the same anchors against FY5253Quarter(..., qtr_with_extra_week=4).
- Months: the weeks of each month follow the pattern (4-4-5, 4-5-4, 5-4-4)
  within every quarter, the 53rd week in the twelfth month (common practice),
  laid on the pandas year ends.
- Every day 1990-2060 for a set of anchors: the week and month label, the
  serial (consecutive), period_position (week 1-53 of the retail year), and
  period_shift by +-1 and +-13, all computed here from the pandas year ends.
- Zones: the instant at which a Denver retail year turns, against zoneinfo.
- period_totals' retail months against the same calendar summed with math.fsum,
  and period_of_serial giving back the start of every retail period.
"""
import bisect
import datetime as dt
import zoneinfo

import pytest
from pandas import Timestamp
from pandas.tseries.offsets import FY5253, FY5253Quarter

from conftest import connect

WEEKDAYS = ["monday", "tuesday", "wednesday", "thursday", "friday", "saturday", "sunday"]
MONTHS = ["january", "february", "march", "april", "may", "june", "july", "august",
          "september", "october", "november", "december"]
FIRST, LAST = dt.date(1990, 1, 1), dt.date(2061, 1, 1)
DAY = dt.timedelta(days=1)


def anchor_words(weekday, month, variation):
    if variation == "last":
        return f"last {WEEKDAYS[weekday]} of {MONTHS[month - 1]}"
    return f"{WEEKDAYS[weekday]} nearest end of {MONTHS[month - 1]}"


def pandas_ends(offset, first=FIRST - dt.timedelta(days=800), last=LAST + dt.timedelta(days=800)):
    """The dates an offset lands on between first and last."""
    t = offset.rollforward(Timestamp(first))
    ends = []
    while t.date() <= last:
        ends.append(t.date())
        t = t + offset
    return ends


def year_ends(weekday, month, variation):
    # oracle: pandas.tseries.offsets.FY5253(weekday, startingMonth, variation)
    return pandas_ends(FY5253(weekday=weekday, startingMonth=month, variation=variation))


def year_name(end, month):
    """DESIGN: the year of the anchor month in which the retail year ends."""
    return end.year if end.month == month else end.year - 1 if month == 12 else end.year


def almanac_period_ends(db, spec, first=FIRST, last=LAST):
    """The last day of every period of `spec` overlapping [first, last)."""
    rows = db.execute("SELECT period_end FROM periods(?, ?, ?)",
                      (first.isoformat(), last.isoformat(), spec)).fetchall()
    return [dt.date.fromisoformat(end) - DAY for (end,) in rows]


def within(ends, first=FIRST, last=LAST):
    return [e for e in ends if first <= e < last]


ANCHORS = [(w, m, v) for w in range(7) for m in range(1, 13) for v in ("last", "nearest")]


def test_year_ends_agree_with_pandas_fy5253_for_every_anchor():
    db = connect()
    compared = 0
    for weekday, month, variation in ANCHORS:
        spec = "retail year ending " + anchor_words(weekday, month, variation)
        expected = within(year_ends(weekday, month, variation))  # oracle: pandas FY5253
        got = within(almanac_period_ends(db, spec))
        assert got == expected, spec
        # The label names the year of the anchor month in which the year ends (DESIGN).
        for end in expected:
            label = db.execute("SELECT period_label(?, ?)", (end.isoformat(), spec)).fetchone()[0]
            assert label == f"FY{year_name(end, month):04d}", (spec, end)
        compared += len(expected)
    print(f"{compared} year ends compared with pandas FY5253 over {len(ANCHORS)} anchors")
    assert compared > 168 * 70


def test_quarter_ends_agree_with_pandas_fy5253quarter_for_every_anchor():
    db = connect()
    compared = 0
    for weekday, month, variation in ANCHORS:
        spec = "retail quarter ending " + anchor_words(weekday, month, variation)
        # oracle: pandas.tseries.offsets.FY5253Quarter(..., qtr_with_extra_week=4)
        expected = within(pandas_ends(FY5253Quarter(weekday=weekday, startingMonth=month,
                                                    qtr_with_extra_week=4, variation=variation)))
        got = within(almanac_period_ends(db, spec))
        assert got == expected, spec
        compared += len(expected)
    print(f"{compared} quarter ends compared with pandas FY5253Quarter")
    assert compared > 168 * 280


@pytest.mark.parametrize("pattern", ["4-4-5", "4-5-4", "5-4-4"])
def test_months_follow_the_pattern_with_the_53rd_week_in_the_last_month(pattern):
    db = connect()
    weeks = [int(w) for w in pattern.split("-")] * 4  # common practice: 4-4-5 and its rotations
    compared = 0
    for weekday, month, variation in [(5, 1, "last"), (5, 1, "nearest"), (6, 12, "nearest"),
                                      (4, 9, "last"), (0, 6, "nearest")]:
        ends = year_ends(weekday, month, variation)  # oracle: pandas FY5253
        spec = f"retail month {pattern} ending " + anchor_words(weekday, month, variation)
        for previous, end in zip(ends, ends[1:]):
            if not (FIRST <= previous and end < LAST):
                continue
            rows = db.execute("SELECT period_start, period_end, label FROM periods(?, ?, ?)",
                              ((previous + DAY).isoformat(), (end + DAY).isoformat(), spec)).fetchall()
            year_weeks = (end - previous).days // 7
            expected = list(weeks)
            expected[11] += year_weeks - 52
            got = [(dt.date.fromisoformat(b) - dt.date.fromisoformat(a)).days // 7 for a, b, _ in rows]
            assert got == expected, (spec, end)
            assert rows[0][0] == (previous + DAY).isoformat()
            name = year_name(end, month)
            assert [label for _, _, label in rows] == [f"FY{name}-P{p:02d}" for p in range(1, 13)]
            compared += 1
    print(f"{compared} retail years of months compared")
    assert compared > 300


DAILY_ANCHORS = [(5, 1, "last"), (5, 1, "nearest"), (6, 12, "nearest"), (3, 3, "last")]


def model(weekday, month, variation, pattern="4-4-5"):
    """Week and month starts of the retail calendar, from the pandas year ends."""
    ends = year_ends(weekday, month, variation)  # oracle: pandas FY5253
    weeks = [int(w) for w in pattern.split("-")] * 4  # common practice
    week_starts, month_starts, week_names, month_labels = [], [], {}, {}
    for previous, end in zip(ends, ends[1:]):
        start = previous + DAY
        name = year_name(end, month)
        n_weeks = (end - previous).days // 7
        lengths = list(weeks)
        lengths[11] += n_weeks - 52
        m_start = start
        for p, length in enumerate(lengths):
            month_starts.append(m_start)
            month_labels[m_start] = f"FY{name}-P{p + 1:02d}"
            m_start += dt.timedelta(weeks=length)
        for w in range(n_weeks):
            week_starts.append(start + dt.timedelta(weeks=w))
            week_names[start + dt.timedelta(weeks=w)] = (name, w + 1)
    return week_starts, month_starts, week_names, month_labels


def every_day():
    day = FIRST
    while day < LAST:
        yield day
        day += DAY


def shifted(starts, day, n):
    """DESIGN: keep the offset from the period start, clamped to the target period's last day."""
    i = bisect.bisect_right(starts, day) - 1
    offset = (day - starts[i]).days
    target, after = starts[i + n], starts[i + n + 1]
    return min(target + dt.timedelta(days=offset), after - DAY)


@pytest.mark.parametrize("weekday,month,variation", DAILY_ANCHORS)
def test_every_day_has_the_label_serial_position_and_shifts_of_its_retail_week(weekday, month, variation):
    db = connect()
    anchor = anchor_words(weekday, month, variation)
    week_spec, month_spec = "retail week ending " + anchor, "retail month ending " + anchor
    year_spec = "retail year ending " + anchor
    week_starts, month_starts, week_names, month_labels = model(weekday, month, variation)
    rows = db.execute(
        """WITH RECURSIVE d(day) AS (SELECT :first UNION ALL SELECT date(day, '+1 day') FROM d WHERE day < :last)
           SELECT day, period_label(day, :w), period_serial(day, :w), period_position(day, :w, :y),
                  period_shift(day, 1, :w), period_shift(day, -1, :w), period_shift(day, 13, :w),
                  period_shift(day, -13, :w), period_label(day, :m), period_serial(day, :m),
                  period_shift(day, 1, :m), period_shift(day, -1, :m), period_shift(day, 13, :m),
                  period_shift(day, -13, :m), period_position(day, :m, :y), period_position(day, 'day', :y),
                  period_position(day, :w, :m)
           FROM d""",
        {"first": FIRST.isoformat(), "last": (LAST - DAY).isoformat(), "w": week_spec,
         "m": month_spec, "y": year_spec}).fetchall()
    assert len(rows) == (LAST - FIRST).days
    previous = None
    for row, day in zip(rows, every_day()):
        assert row[0] == day.isoformat()
        w = week_starts[bisect.bisect_right(week_starts, day) - 1]
        name, week = week_names[w]
        assert row[1] == f"FY{name}-W{week:02d}", (week_spec, day)
        assert row[3] == week, (week_spec, day)
        for got, n in zip(row[4:8], (1, -1, 13, -13)):
            assert got == (day + dt.timedelta(weeks=n)).isoformat(), (week_spec, day, n)
        m = month_starts[bisect.bisect_right(month_starts, day) - 1]
        assert row[8] == month_labels[m], (month_spec, day)
        for got, n in zip(row[10:14], (1, -1, 13, -13)):
            assert got == shifted(month_starts, day, n).isoformat(), (month_spec, day, n)
        # Positions: the month of the year, the day of the year, the week of the month.
        year_start = w - dt.timedelta(weeks=week - 1)
        assert row[14] == int(month_labels[m][-2:]), (month_spec, day)
        assert row[15] == (day - year_start).days + 1, (year_spec, day)
        assert row[16] == (w - m).days // 7 + 1, (week_spec, month_spec, day)
        if previous is not None:
            # Serials are consecutive: one more exactly where a new period starts.
            assert row[2] - previous[2] == (1 if w == day else 0), (week_spec, day)
            assert row[9] - previous[9] == (1 if m == day else 0), (month_spec, day)
        previous = row
    # Serial 0 holds 1970-01-01 (DESIGN).
    assert db.execute("SELECT period_serial('1970-01-01', ?), period_serial('1970-01-01', ?)",
                      (week_spec, month_spec)).fetchone() == (0, 0)
    print(f"{len(rows)} days compared for '{anchor}'")


def test_the_instant_a_denver_retail_year_turns_agrees_with_zoneinfo():
    db = connect()
    denver = zoneinfo.ZoneInfo("America/Denver")
    spec = "retail year ending saturday nearest end of january"
    compared = 0
    ends = year_ends(5, 1, "nearest")  # oracle: pandas FY5253
    for end, next_end in zip(ends, ends[1:]):
        if not FIRST <= end < LAST:
            continue
        start = end + DAY
        # oracle: zoneinfo, the instant of local midnight at the start of the year
        turn = int(dt.datetime(start.year, start.month, start.day, tzinfo=denver).timestamp())
        got = db.execute("SELECT period_floor(?, ?, 'America/Denver'), period_serial(?, ?, 'America/Denver'),"
                         " period_serial(?, ?, 'America/Denver'), period_label(?, ?, 'America/Denver')",
                         (turn + 3600, spec, turn, spec, turn - 1, spec, turn, spec)).fetchone()
        assert got[0] == turn
        assert got[1] == got[2] + 1
        assert got[3] == f"FY{year_name(next_end, 1)}"
        compared += 1
    print(f"{compared} Denver year turns compared with zoneinfo")
    assert compared >= 70


def test_period_totals_sums_each_retail_month_of_the_pandas_calendar():
    import math
    import random
    db = connect()
    rng = random.Random(52)
    rows = []
    for _ in range(3000):
        day = dt.date(2023, 1, 1) + dt.timedelta(days=rng.randrange(4 * 365))
        rows.append((f"{day.isoformat()} {rng.randrange(24):02d}:{rng.randrange(60):02d}",
                     rng.choice(["tea", "cake", "jam"]), rng.randint(1, 5), round(rng.uniform(1, 40), 2)))
    db.execute("CREATE TABLE sales(ts, item, qty, amount)")
    db.executemany("INSERT INTO sales VALUES (?, ?, ?, ?)", rows)
    spec = "retail month 5-4-4 ending saturday nearest end of january"
    _, month_starts, _, month_labels = model(5, 1, "nearest", "5-4-4")
    expected = {}
    for ts, item, qty, amount in rows:
        day = dt.date.fromisoformat(ts[:10])
        label = month_labels[month_starts[bisect.bisect_right(month_starts, day) - 1]]
        expected.setdefault((item, label), []).append(amount)
    got = {(item, label): (sales, amount) for item, label, sales, amount in db.execute(
        "SELECT item, label, sales, amount FROM period_totals('sales', ?)", (spec,))}
    for key, amounts in expected.items():
        # oracle: the pandas FY5253 calendar above, summed with math.fsum
        assert got[key] == (len(amounts), math.fsum(amounts)), key
    # Empty months are listed as empty, never missing.
    assert all(sales == 0 for key, (sales, _) in got.items() if key not in expected)
    assert len(got) == 3 * len({label for _, label in got})
    print(f"{len(expected)} item-months compared")


@pytest.mark.parametrize("unit", ["year", "quarter", "month 4-5-4", "week"])
def test_period_of_serial_gives_back_the_start_of_every_retail_period(unit):
    db = connect()
    spec = f"retail {unit} ending friday nearest end of december"
    ends = year_ends(4, 12, "nearest")  # oracle: pandas FY5253
    rows = db.execute("SELECT period_start, serial, period_of_serial(serial, ?), "
                      "period_of_serial(serial, ?, 'America/Denver') FROM periods('1990-01-01', '2061-01-01', ?)",
                      (spec, spec, spec)).fetchall()
    serials = [serial for _, serial, _, _ in rows]
    assert serials == list(range(serials[0], serials[0] + len(rows)))
    assert all(start == back == zoned for start, _, back, zoned in rows)
    if unit == "year":
        starts = [dt.date.fromisoformat(start) for start, _, _, _ in rows]
        assert starts == [end + DAY for end in ends if starts[0] <= end + DAY <= starts[-1]]
        assert starts[0] <= FIRST < starts[1] and starts[-1] < LAST
