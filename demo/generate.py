#!/usr/bin/python3
# SPDX-License-Identifier: MIT
"""Writes the demo database of Hollow Oak Bakehouse, an invented bakery-café.

Hollow Oak is made up for this demo: three shops (Millrace, Quarry Hill,
Lantern Square) in the America/Denver time zone, twelve items, one row per
sale in a table

    sales(ts TEXT, item TEXT, qty INTEGER, amount REAL, shop TEXT,
          segment TEXT AS (shop))

with ts the UTC time of the sale as 'YYYY-MM-DD HH:MM:SS' (what a
point-of-sale export usually holds), qty the units sold and amount what was
paid (a promotion sells at a discount, so amount is not always qty x price).
segment is a generated column, the shop: the reports' @by_segment breaks their
figures down by it.

The default range is 2023-01-02 .. 2025-12-28 local: exactly the ISO weeks
2023-W01 .. 2025-W52, three whole years, so weekly trends are not pulled by a
half-covered week or season at either end.

What the data has, so that every report has something to find:
- trends: items that rise, fall or stay flat over the three years;
- weekly rhythm (commuter coffee on weekdays, bread on Saturdays) and yearly
  seasons (hot chocolate in winter, iced tea and tarts in summer, pumpkin
  loaf sold only from September to November — months with no rows at all);
- day-to-day noise from very small (espresso) to very large (granola jars,
  bought now and then by the case);
- promotion days, sold at a discount, that spike one item;
- closed days: holidays and a snow day with no rows at all, one shop closed
  on Mondays and another closed two weeks for refitting.

Deterministic: the same --seed and options give the same rows, byte for byte.
Python standard library only; run with /usr/bin/python3.

    demo/generate.py [--out demo/out/shop.db] [--seed 20230102]
                     [--start 2023-01-02] [--end 2025-12-28] [--scale 1.0]
"""
import argparse
import datetime as dt
import math
import os
import random
import sqlite3
import sys
import time
import zoneinfo

ZONE = "America/Denver"

# Shops: share of the chain's trade, first/last hour open on weekdays and Sundays.
SHOPS = [
    ("Millrace", 0.42, (6.5, 18.0), (8.0, 15.0)),
    ("Quarry Hill", 0.33, (7.0, 18.5), (8.0, 16.0)),
    ("Lantern Square", 0.25, (7.0, 17.0), (8.5, 14.0)),
]

# Item: price, units a day chain-wide at the start, growth over a year (fraction
# of the starting level), weekday factors Mon..Sun, yearly amplitude and the day
# of the year it peaks, day-to-day noise (sigma of a log-normal factor), hour of
# the day the item peaks, and how many units one sale usually has.
ITEMS = {
    "Country sourdough": dict(price=8.50, base=55, growth=0.0, week=(0.8, 0.85, 0.9, 0.95, 1.1, 1.6, 0.9),
                              season=(0.05, 340), noise=0.06, hour=12.0, qty="bread"),
    "Seeded rye": dict(price=7.75, base=30, growth=-0.16, week=(0.9, 0.9, 1.0, 1.0, 1.1, 1.3, 0.8),
                       season=(0.08, 20), noise=0.15, hour=11.5, qty="bread"),
    "Cardamom knot": dict(price=4.25, base=28, growth=0.45, week=(0.9, 0.9, 0.95, 1.0, 1.1, 1.3, 1.2),
                          season=(0.05, 350), noise=0.12, hour=9.5, qty="pastry"),
    "Butter croissant": dict(price=3.75, base=80, growth=0.0, week=(1.0, 0.95, 0.95, 1.0, 1.05, 1.2, 1.15),
                             season=(0.04, 300), noise=0.05, hour=8.5, qty="pastry"),
    "Almond croissant": dict(price=4.50, base=40, growth=-0.08, week=(0.95, 0.95, 1.0, 1.0, 1.05, 1.2, 1.1),
                             season=(0.05, 330), noise=0.10, hour=9.0, qty="pastry"),
    "Lemon curd tart": dict(price=5.50, base=18, growth=0.0, week=(0.7, 0.8, 0.9, 1.0, 1.2, 1.5, 1.3),
                            season=(0.35, 190), noise=0.35, hour=15.0, qty="pastry"),
    "Pumpkin loaf": dict(price=6.25, base=30, growth=0.05, week=(0.9, 0.9, 1.0, 1.0, 1.1, 1.3, 1.0),
                         season=(0.0, 0), noise=0.20, hour=11.0, qty="bread", months=(9, 10, 11)),
    "Espresso": dict(price=3.25, base=120, growth=0.0, week=(1.2, 1.2, 1.2, 1.15, 1.1, 0.6, 0.5),
                     season=(0.03, 30), noise=0.02, hour=7.8, qty="coffee"),
    "Oat milk latte": dict(price=5.25, base=50, growth=0.30, week=(1.1, 1.1, 1.1, 1.05, 1.0, 0.9, 0.8),
                           season=(0.05, 20), noise=0.05, hour=8.5, qty="coffee"),
    "Hot chocolate": dict(price=4.00, base=30, growth=0.0, week=(0.8, 0.8, 0.8, 0.9, 1.0, 1.4, 1.4),
                          season=(0.75, 15), noise=0.25, hour=14.0, qty="coffee"),
    "Iced hibiscus tea": dict(price=4.50, base=16, growth=0.25, week=(0.9, 0.9, 0.9, 1.0, 1.1, 1.3, 1.2),
                              season=(0.8, 200), noise=0.30, hour=14.5, qty="coffee"),
    "Granola jar": dict(price=12.00, base=5, growth=0.0, week=(1.0, 1.0, 1.0, 1.0, 1.0, 1.3, 1.1),
                        season=(0.0, 0), noise=0.70, hour=12.5, qty="case"),
}

# Units per sale: (qty, weight) by kind of item.
QTY = {
    "coffee": ((1, 80), (2, 15), (3, 4), (4, 1)),
    "pastry": ((1, 60), (2, 22), (3, 8), (4, 6), (6, 4)),
    "bread": ((1, 85), (2, 13), (3, 2)),
    "case": ((1, 70), (2, 15), (6, 10), (12, 5)),
}

# Promotions: item, first local day, days, demand multiplier, price factor.
PROMOTIONS = [
    ("Almond croissant", "2023-05-12", 3, 2.6, 0.8),
    ("Almond croissant", "2024-05-10", 3, 2.8, 0.8),
    ("Almond croissant", "2025-05-09", 3, 3.0, 0.8),
    ("Cardamom knot", "2023-10-04", 5, 2.2, 0.75),
    ("Cardamom knot", "2025-02-12", 5, 2.0, 0.75),
    ("Butter croissant", "2024-03-08", 2, 3.0, 0.5),
    ("Butter croissant", "2025-09-19", 2, 3.2, 0.5),
    ("Lemon curd tart", "2023-05-14", 1, 3.5, 1.0),
    ("Lemon curd tart", "2024-05-12", 1, 3.5, 1.0),
    ("Lemon curd tart", "2025-05-11", 1, 3.8, 1.0),
    ("Oat milk latte", "2024-09-02", 7, 1.8, 0.8),
    ("Seeded rye", "2024-11-15", 3, 2.5, 0.85),
]

# Local days on which every shop is closed (besides New Year's Day, the 4th of
# July, Thanksgiving and Christmas Day, which are computed for each year).
CLOSED_ALL = {"2024-01-16"}  # a snow day
REFIT = ("Quarry Hill", "2024-02-12", "2024-02-25")  # closed two weeks, both ends inclusive
CLOSED_MONDAYS = "Lantern Square"


def holidays(year):
    thanksgiving = dt.date(year, 11, 1)
    thanksgiving += dt.timedelta(days=(3 - thanksgiving.weekday()) % 7 + 21)
    return {dt.date(year, 1, 1), dt.date(year, 7, 4), thanksgiving, dt.date(year, 12, 25)}


def weighted_choices(pairs):
    values = [value for value, _ in pairs]
    cumulative = []
    total = 0
    for _, weight in pairs:
        total += weight
        cumulative.append(total)
    return values, cumulative


def generate(connection, seed, start, end, scale):
    rng = random.Random(seed)
    zone = zoneinfo.ZoneInfo(ZONE)
    qty_tables = {kind: weighted_choices(pairs) for kind, pairs in QTY.items()}
    promotions = {}
    for item, first, days, lift, price_factor in PROMOTIONS:
        day = dt.date.fromisoformat(first)
        for k in range(days):
            promotions[(item, day + dt.timedelta(days=k))] = (lift, price_factor)
    closed_all = {dt.date.fromisoformat(d) for d in CLOSED_ALL}
    refit_shop, refit_first, refit_last = REFIT[0], dt.date.fromisoformat(REFIT[1]), dt.date.fromisoformat(REFIT[2])

    connection.execute("DROP TABLE IF EXISTS sales")
    connection.execute("CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL, shop TEXT,"
                       " segment TEXT AS (shop))")
    insert = "INSERT INTO sales(ts, item, qty, amount, shop) VALUES (?, ?, ?, ?, ?)"
    rows_written = 0
    day = start
    while day <= end:
        years = (day - start).days / 365.25
        doy = day.timetuple().tm_yday
        weekday = day.weekday()
        # Shops close at night, so one UTC offset per local day is exact for
        # every sale (the clocks change at 02:00 local).
        offset = dt.datetime(day.year, day.month, day.day, 12, tzinfo=zone).utcoffset()
        midnight_utc = dt.datetime(day.year, day.month, day.day) - offset
        rows = []
        if day not in closed_all and day not in holidays(day.year):
            for shop, share, weekday_hours, sunday_hours in SHOPS:
                if shop == CLOSED_MONDAYS and weekday == 0:
                    continue
                if shop == refit_shop and refit_first <= day <= refit_last:
                    continue
                open_hour, close_hour = sunday_hours if weekday == 6 else weekday_hours
                for item, spec in ITEMS.items():
                    months = spec.get("months")
                    if months and day.month not in months:
                        continue
                    amplitude, peak_day = spec["season"]
                    level = (spec["base"] * scale * share * (1 + spec["growth"] * years) * spec["week"][weekday]
                             * (1 + amplitude * math.cos(2 * math.pi * (doy - peak_day) / 365.25)))
                    lift, price_factor = promotions.get((item, day), (1.0, 1.0))
                    sigma = spec["noise"]
                    level *= lift * math.exp(rng.gauss(-sigma * sigma / 2, sigma))
                    units = max(0, round(rng.gauss(level, math.sqrt(level)))) if level > 0 else 0
                    values, cumulative = qty_tables[spec["qty"]]
                    mode = min(max(spec["hour"], open_hour), close_hour)
                    unit_price = spec["price"] * price_factor
                    while units > 0:
                        qty = min(units, rng.choices(values, cum_weights=cumulative)[0])
                        units -= qty
                        hour = rng.triangular(open_hour, close_hour, mode)
                        second = int(hour * 3600)
                        ts = midnight_utc + dt.timedelta(seconds=second)
                        rows.append((ts.strftime("%Y-%m-%d %H:%M:%S"), item, qty, round(qty * unit_price, 2), shop))
        rows.sort()
        connection.executemany(insert, rows)
        rows_written += len(rows)
        day += dt.timedelta(days=1)
    connection.commit()
    return rows_written


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--out", default=os.path.join(os.path.dirname(os.path.abspath(__file__)), "out", "shop.db"))
    parser.add_argument("--seed", type=int, default=20230102)
    parser.add_argument("--start", type=dt.date.fromisoformat, default=dt.date(2023, 1, 2),
                        help="first local day (default 2023-01-02, a Monday)")
    parser.add_argument("--end", type=dt.date.fromisoformat, default=dt.date(2025, 12, 28),
                        help="last local day, inclusive (default 2025-12-28, a Sunday)")
    parser.add_argument("--scale", type=float, default=1.0, help="multiplies every item's volume")
    args = parser.parse_args(argv)
    if args.end < args.start:
        parser.error("--end is before --start")
    os.makedirs(os.path.dirname(os.path.abspath(args.out)), exist_ok=True)
    if os.path.exists(args.out):
        os.remove(args.out)
    began = time.monotonic()
    connection = sqlite3.connect(args.out)
    rows = generate(connection, args.seed, args.start, args.end, args.scale)
    connection.close()
    print(f"demo: wrote {rows} sales of Hollow Oak Bakehouse ({args.start} .. {args.end}, {ZONE}, seed {args.seed})"
          f" to {args.out} in {time.monotonic() - began:.1f} s")


if __name__ == "__main__":
    sys.exit(main())
