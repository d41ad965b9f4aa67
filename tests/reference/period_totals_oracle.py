# SPDX-License-Identifier: MIT
"""An independent aggregation for period_totals' rows.

DESIGN.md "Period totals in one pass", written a second time in plain Python:
dicts keyed by (segment, item, serial), Python ints and math.fsum for the
totals, zoneinfo (through period_oracle.ZoneClock) for local days, and
period_oracle.period_of for every period's bounds, label and serial. Nothing
here comes from the extension.

Rows are tuples (ts, item, qty, amount, segment).
"""
import datetime as dt
import math
import random
import sqlite3

import pytest

import period_oracle as oracle

COLUMNS = ("segment", "all_segments", "item", "period_start", "period_end", "label", "serial",
           "covered_start", "covered_end", "sales", "qty", "amount")


def text_of(ms):
    return oracle.wall_of(ms).isoformat(" ", "seconds")


ITEMS = ["tea", "coffee", "Äpfel", "cocoa \"dark\"", "chai's", "matcha 抹茶"]
SEGMENTS = ["north", "south", 7, None]


def seeded_rows(seed, n, low, high, items=ITEMS, kinds=("text",), segments=SEGMENTS):
    """Rows (ts, item, qty, amount, segment) at random instants in [low, high):
    cents as REAL, some whole amounts as INTEGER, some NULLs."""
    rng = random.Random(seed)
    rows = []
    low_ms, high_ms = oracle.ms_of(low), oracle.ms_of(high)
    for _ in range(n):
        ms = rng.randrange(low_ms, high_ms) // 1000 * 1000
        kind = rng.choice(kinds)
        ts = {"text": text_of(ms), "int": ms // 1000, "jd": oracle.julian_day(ms),
              "date": oracle.wall_of(ms).date().isoformat()}[kind]
        roll = rng.random()
        if roll < 0.05:
            amount = None
        elif roll < 0.25:
            amount = rng.randrange(-20, 500)
        else:
            amount = rng.randrange(-2000, 50000) / 100
        qty = None if rng.random() < 0.05 else rng.randrange(1, 9)
        rows.append((ts, rng.choice(items), qty, amount, rng.choice(segments)))
    return rows


def exact_total(values):
    """oracle: exact_sum's rule (DESIGN.md) — Python's exact int sum while every
    value is an int and the sum fits in 64 bits, else math.fsum; None when no value."""
    values = [v for v in values if v is not None]
    if not values:
        return None
    if all(isinstance(v, int) for v in values):
        total = sum(values)
        if -2**63 <= total < 2**63:
            return total
    return math.fsum(values)


def value_order(value):
    """SQLite's order of values: NULL, numbers, TEXT (bytewise), BLOBs (common practice: SQLite docs,
    "Sort Order")."""
    if value is None:
        return (0, 0)
    if isinstance(value, (int, float)):
        return (1, value)
    if isinstance(value, str):
        return (2, value.encode())
    return (3, bytes(value))


def kind_of(ts):
    if isinstance(ts, str):
        return "date" if len(ts) == 10 else "text"
    if isinstance(ts, int):
        return "int"
    return "jd"


def instant_of(ts, clock):
    """README "Time values": a bare date is a local day on the clock, a date-time
    without offset is UTC, a number by SQLite's auto rule."""
    if isinstance(ts, str):
        if len(ts) == 10:
            return clock.first_instant(dt.datetime.fromisoformat(ts))
        return oracle.ms_of(dt.datetime.fromisoformat(ts))
    if isinstance(ts, int):
        return ts * 1000
    return oracle.julian_ms(ts)


def day_start(clock, ms, days_later=0):
    """The first instant of the local day holding ms (zoneinfo), or of a later day."""
    day = clock.local(ms)[0].date() + dt.timedelta(days=days_later)
    return clock.first_instant(dt.datetime.combine(day, dt.time()))


def data_range(spec, clock, earliest, latest):
    """DESIGN: from the start of the local day of the earliest row to the end of the
    local day of the latest; sub-day specs: the period of the earliest to the end of
    the period of the latest."""
    if spec.sub_day:
        return oracle.period_of(spec, earliest, clock).start, oracle.period_of(spec, latest, clock).end
    return day_start(clock, earliest), day_start(clock, latest, 1)


def bound_text(spec, clock, ms):
    """A covered bound as TEXT: a date for calendar units at a local day start, else
    a date-time with seconds (milliseconds when it has them), the offset in a zone."""
    wall, offset = clock.local(ms)
    if not spec.sub_day and wall.time() == dt.time() and clock.first_instant(wall) == ms:
        return wall.date().isoformat()
    text = wall.isoformat(" ", "milliseconds" if ms % 1000 else "seconds")
    return text + (oracle.format_offset(offset) if clock.name else "")


def in_representation(kind, spec, clock, ms, text):
    if kind in ("text", "date"):
        return text
    return oracle.in_representation(kind, ms, text)


def periods_overlapping(spec, clock, start, stop):
    """Every period of spec that overlaps [start, stop), by period_oracle.period_of."""
    if not start < stop:
        return []
    span = [oracle.period_of(spec, start, clock)]
    while span[-1].end < stop:
        span.append(oracle.period_of(spec, span[-1].end, clock))
    return span


def expected_rows(rows, spec, clock=None, start=None, stop=None, has_item=True, has_qty=True,
                  has_segment=True):
    """oracle: period_oracle for periods, zoneinfo for local days, dicts and exact_total
    (math.fsum) per cell. start and stop are instants (ms) or None (from the data)."""
    clock = clock or oracle.UtcClock()
    counted = []
    for ts, item, qty, amount, segment in rows:
        if ts is None:
            continue
        ms = instant_of(ts, clock)
        if (start is not None and ms < start) or (stop is not None and ms >= stop):
            continue
        counted.append((ms, ts, item if has_item else None, qty, amount, segment))
    if not counted:
        return []
    earliest = min(counted, key=lambda r: (r[0], ["text", "date", "int", "jd"].index(kind_of(r[1]))))
    kind = kind_of(earliest[1])
    groups = [(1, None, counted)]
    if has_segment:
        by_segment = {}
        for row in counted:
            by_segment.setdefault(row[5], []).append(row)
        for segment in sorted(by_segment, key=value_order):
            groups.append((0, segment, by_segment[segment]))
    want = []
    for all_segments, segment, group_rows in groups:
        low, high = data_range(spec, clock, min(r[0] for r in group_rows), max(r[0] for r in group_rows))
        range_start = start if start is not None else low
        range_stop = stop if stop is not None else high
        cells = {}
        for ms, _, item, qty, amount, _ in group_rows:
            cells.setdefault((item, oracle.period_of(spec, ms, clock).serial), []).append((qty, amount))
        span = periods_overlapping(spec, clock, range_start, range_stop)
        for item in sorted({item for item, _ in cells}, key=value_order):
            for period in span:
                cell = cells.get((item, period.serial))
                sales = len(cell) if cell else 0
                qty = (exact_total([q for q, _ in cell]) if cell else 0) if has_qty else None
                amount = exact_total([a for _, a in cell]) if cell else 0
                covered_start = max(period.start, range_start)
                covered_end = min(period.end, range_stop)
                want.append((
                    None if all_segments else segment, all_segments, item,
                    in_representation(kind, spec, clock, period.start, period.start_text),
                    in_representation(kind, spec, clock, period.end, period.end_text),
                    period.label, period.serial,
                    in_representation(kind, spec, clock, covered_start,
                                      bound_text(spec, clock, covered_start)),
                    in_representation(kind, spec, clock, covered_end, bound_text(spec, clock, covered_end)),
                    sales, qty, amount))
    return want


def same_rows(got, want):
    """Exact equality, SQL type included (5 is not 5.0), row for row."""
    if len(got) != len(want):
        return False
    return all(all(oracle.same_value(g, w) for g, w in zip(a, b)) for a, b in zip(got, want))


def first_difference(got, want):
    if len(got) != len(want):
        return f"{len(got)} rows, expected {len(want)}"
    return next(((g, w) for g, w in zip(got, want) if not same_rows([g], [w])), None)


def make_sales(db, rows, name="sales", columns=("ts", "item", "qty", "amount", "segment"),
               schema="main"):
    quoted = '"' + name.replace('"', '""') + '"'
    db.execute(f"CREATE TABLE {schema}.{quoted}({', '.join(columns)})")
    index = {"ts": 0, "item": 1, "qty": 2, "amount": 3, "segment": 4}
    db.executemany(f"INSERT INTO {schema}.{quoted} VALUES ({', '.join('?' * len(columns))})",
                   [tuple(row[index[c]] for c in columns) for row in rows])


def error_of(db, sql, parameters=()):
    """The message of the error a query raises (the tests' own helper, not an oracle)."""
    with pytest.raises(sqlite3.OperationalError) as raised:
        db.execute(sql, parameters).fetchall()
    return str(raised.value)
