# SPDX-License-Identifier: MIT
"""One seeded table of sales, loaded into SQLite and into PostgreSQL alike.

Three shops in three zones (a northern and a southern daylight-saving rule and
a half-hour one), a few items each, three years of sales with extra rows on the
nights the clocks change. Every row carries its time three ways:

    ts_text  TEXT as shops export it: UTC 'YYYY-MM-DD HH:MM[:SS]', ISO 8601
             with 'T' and 'Z' and milliseconds, or local with its '+HH:MM'
    ts       the instant: PostgreSQL timestamptz; in SQLite the Unix seconds x
    local    the shop's wall-clock time: PostgreSQL timestamp, SQLite TEXT
    day      the shop's local date: PostgreSQL date, SQLite TEXT

x is the instant in Unix seconds (REAL, with the milliseconds) in both, the x
of the trend statistics; dow is the local ISO weekday (Python's
isoweekday()), a season; amount has NULLs, negative returns, cents, values
near 1e12 and near 1e-7 (so an inexact sum shows); qty is an integer.
Times are unique, so every order by x or ts is total.
"""
import contextlib
import datetime
import io
import random
import zoneinfo

SHOPS = (("denver", "America/Denver"), ("adelaide", "Australia/Adelaide"), ("kolkata", "Asia/Kolkata"))
ITEMS = ("tea", "coffee", "cocoa", "chai", "matcha")
START = datetime.datetime(2024, 1, 1, tzinfo=datetime.timezone.utc)
SPAN = 3 * 365 * 86400
COLUMNS = ("id", "shop", "zone", "item", "ts_text", "ts", "local", "day", "x", "qty", "amount", "dow")

PG_TABLE = """CREATE TABLE {name} (id integer PRIMARY KEY, shop text NOT NULL, zone text NOT NULL,
    item text NOT NULL, ts_text text NOT NULL, ts timestamptz NOT NULL, local timestamp NOT NULL,
    day date NOT NULL, x float8 NOT NULL, qty bigint NOT NULL, amount float8, dow integer NOT NULL)"""
SQLITE_TABLE = """CREATE TABLE {name} (id INTEGER PRIMARY KEY, shop TEXT, zone TEXT, item TEXT,
    ts_text TEXT, ts REAL, local TEXT, day TEXT, x REAL, qty INTEGER, amount REAL, dow INTEGER)"""


def transitions(zone, years=(2024, 2025, 2026)):
    """The UTC instants (Unix seconds) at which the zone's offset changes, found hour by hour."""
    tz = zoneinfo.ZoneInfo(zone)
    found = []
    for year in years:
        t = datetime.datetime(year, 1, 1, tzinfo=datetime.timezone.utc)
        end = datetime.datetime(year + 1, 1, 1, tzinfo=datetime.timezone.utc)
        previous = t.astimezone(tz).utcoffset()
        while t < end:
            t += datetime.timedelta(hours=1)
            offset = t.astimezone(tz).utcoffset()
            if offset != previous:
                found.append(int(t.timestamp()))
            previous = offset
    return found


def text_forms(instant, tz, rng):
    """ts_text: one of the forms SQLite's date functions read, for the same instant."""
    ms = instant.microsecond // 1000
    form = rng.randrange(4)
    if form == 0:
        text = instant.strftime("%Y-%m-%d %H:%M:%S") + (f".{ms:03d}" if ms else "")
    elif form == 1:
        text = instant.strftime("%Y-%m-%dT%H:%M:%S") + f".{ms:03d}Z"
    elif form == 2:
        local = instant.astimezone(tz)
        offset = local.utcoffset().total_seconds() // 60
        sign = "+" if offset >= 0 else "-"
        offset = abs(int(offset))
        text = local.strftime("%Y-%m-%d %H:%M:%S") + (f".{ms:03d}" if ms else "") + f"{sign}{offset // 60:02d}:{offset % 60:02d}"
    else:
        text = instant.strftime("%Y-%m-%d %H:%M") if instant.second == 0 and not ms else \
            instant.strftime("%Y-%m-%d %H:%M:%S") + (f".{ms:03d}" if ms else "")
    return text


def amount_of(rng):
    kind = rng.random()
    if kind < 0.01:
        return None
    if kind < 0.02:
        return 1e12 + rng.randrange(100) / 100
    if kind < 0.03:
        return rng.randrange(1, 1000) * 1e-7
    if kind < 0.06:
        return -rng.randrange(100, 5000) / 100
    return rng.randrange(50, 20000) / 100


def generate(rows=120_000, seed=20261204):
    """The rows as tuples in COLUMNS order, with Python values."""
    rng = random.Random(seed)
    zones = {zone: zoneinfo.ZoneInfo(zone) for _, zone in SHOPS}
    busy = {zone: transitions(zone) for _, zone in SHOPS}
    taken = set()
    result = []
    base = int(START.timestamp()) * 1000
    while len(result) < rows:
        shop, zone = SHOPS[len(result) % len(SHOPS)]
        if rng.random() < 0.05 and busy[zone]:
            # within six hours of a change of the clocks
            ms = (rng.choice(busy[zone]) + rng.randrange(-6 * 3600, 6 * 3600)) * 1000
        else:
            ms = base + rng.randrange(SPAN) * 1000
        if rng.random() < 0.25:
            ms += rng.randrange(1, 1000)
        if ms in taken:
            continue
        taken.add(ms)
        instant = datetime.datetime.fromtimestamp(ms / 1000, datetime.timezone.utc).replace(
            microsecond=(ms % 1000) * 1000)
        tz = zones[zone]
        local = instant.astimezone(tz)
        local_text = local.strftime("%Y-%m-%d %H:%M:%S") + (f".{ms % 1000:03d}" if ms % 1000 else "")
        result.append((len(result) + 1, shop, zone, rng.choice(ITEMS), text_forms(instant, tz, rng),
                       instant, local_text, local.date().isoformat(), ms / 1000, rng.randrange(1, 21),
                       amount_of(rng), local.isoweekday()))
    return result


def load_sqlite(connection, rows, name="sales"):
    connection.execute(SQLITE_TABLE.format(name=name))
    connection.executemany(f"INSERT INTO {name} VALUES ({','.join('?' * len(COLUMNS))})",
                           [r[:5] + (r[8],) + r[6:] for r in rows])
    connection.commit()


@contextlib.contextmanager
def sqlite_sales(rows):
    """A SQLite connection with the built almanac loaded and the rows in `sales`."""
    from conftest import connect
    connection = connect()
    try:
        load_sqlite(connection, rows)
        yield connection
    finally:
        connection.close()


def pg_copy_text(rows):
    """The rows in COPY's text format; floats in Python's shortest round-trip form (repr)."""
    out = io.StringIO()
    for r in rows:
        fields = []
        for value in r:
            if value is None:
                fields.append("\\N")
            elif isinstance(value, float):
                fields.append(repr(value))
            elif isinstance(value, datetime.datetime):
                fields.append(value.isoformat(" "))
            else:
                fields.append(str(value))
        out.write("\t".join(fields) + "\n")
    out.seek(0)
    return out


def load_postgres(connection, rows, name="sales", create=True):
    with connection.cursor() as cursor:
        if create:
            cursor.execute(PG_TABLE.format(name=name))
        cursor.copy_expert(f"COPY {name} ({', '.join(COLUMNS)}) FROM STDIN", pg_copy_text(rows))
        cursor.execute(f"ANALYZE {name}")
