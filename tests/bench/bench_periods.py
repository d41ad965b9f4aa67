"""Per-row cost of period keys beside SQLite's own date functions.

Run by hand (not a test):  /usr/bin/python3 tests/bench/bench_periods.py [rows]
Builds a table of sale rows with TEXT timestamps, then times full scans that
compute each key, all in one run, and prints each against date(ts).
"""
import os
import pathlib
import random
import sqlite3
import sys
import time

ROOT = pathlib.Path(__file__).resolve().parents[2]
MODULE = os.environ.get("ALMANAC_MODULE", str(ROOT / "build" / "almanac.so"))
ROWS = int(sys.argv[1]) if len(sys.argv) > 1 else 2_000_000

QUERIES = [
    ("count(*) scan", "SELECT count(*) FROM sales"),
    ("max(ts) scan", "SELECT max(ts) FROM sales"),
    ("date(ts)", "SELECT max(date(ts)) FROM sales"),
    ("strftime('%Y-%m', ts)", "SELECT max(strftime('%Y-%m', ts)) FROM sales"),
    ("period_floor(ts,'week')", "SELECT max(period_floor(ts, 'week')) FROM sales"),
    ("period_floor(ts,'month')", "SELECT max(period_floor(ts, 'month')) FROM sales"),
    ("period_floor(ts,'day','America/Denver')",
     "SELECT max(period_floor(ts, 'day', 'America/Denver')) FROM sales"),
]


def main():
    db = sqlite3.connect(":memory:")
    db.enable_load_extension(True)
    db.load_extension(MODULE)
    rng = random.Random(7)
    start = 1_600_000_000
    db.execute("CREATE TABLE sales(ts TEXT, item TEXT, amount REAL)")
    db.executemany(
        "INSERT INTO sales VALUES (datetime(?, 'unixepoch'), ?, ?)",
        ((start + rng.randrange(0, 3 * 365 * 86400), f"item{rng.randrange(20)}", rng.random() * 50)
         for _ in range(ROWS)))
    db.commit()
    timings = {}
    for label, sql in QUERIES:
        best = None
        for _ in range(3):  # best of three, to damp noise from the other core
            began = time.perf_counter()
            db.execute(sql).fetchall()
            elapsed = time.perf_counter() - began
            best = elapsed if best is None else min(best, elapsed)
        timings[label] = best
    scan = timings["max(ts) scan"]
    base = timings["date(ts)"] - scan
    print(f"{ROWS} rows, TEXT timestamps, best of 3, same run")
    print(f"{'expression':42} {'ns/row':>8} {'ns/row over scan':>17} {'vs date(ts)':>12}")
    for label, _ in QUERIES:
        total = timings[label]
        over = total - scan
        ratio = over / base if not label.endswith("scan") else float("nan")
        print(f"{label:42} {total / ROWS * 1e9:8.1f} {over / ROWS * 1e9:17.1f} {ratio:12.2f}")


if __name__ == "__main__":
    main()
