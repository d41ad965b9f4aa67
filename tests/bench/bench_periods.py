# SPDX-License-Identifier: MIT
"""Per-row cost of period keys beside SQLite's own date functions.

Run by hand (not a test):
    /usr/bin/python3 tests/bench/bench_periods.py [rows] [--instructions]

Builds a table of sale rows with TEXT timestamps in random order, then runs
full scans that compute each key, all in one run, interleaved over several
rounds so that a slow moment of the machine hits every query alike; prints the
best round of each, per row, minus a scan that reads ts but computes nothing,
and its ratio to SQLite's date(ts). With --instructions it also counts
instructions with valgrind's callgrind (repeatable whatever else the machine
is doing) on a 200,000-row copy.
"""
import os
import pathlib
import random
import shutil
import sqlite3
import subprocess
import sys
import tempfile
import time

ROOT = pathlib.Path(__file__).resolve().parents[2]
MODULE = os.environ.get("ALMANAC_MODULE", str(ROOT / "build" / "almanac.so"))
ARGS = [a for a in sys.argv[1:] if not a.startswith("--")]
ROWS = int(ARGS[0]) if ARGS else 2_000_000
ROUNDS = 7

BASELINE = "date(ts)"
SCAN = "max(ts) scan"
QUERIES = [
    (SCAN, "SELECT max(ts) FROM sales"),
    (BASELINE, "SELECT max(date(ts)) FROM sales"),
    ("strftime('%Y-%m', ts)", "SELECT max(strftime('%Y-%m', ts)) FROM sales"),
    ("period_floor(ts,'week')", "SELECT max(period_floor(ts, 'week')) FROM sales"),
    ("period_floor(ts,'month')", "SELECT max(period_floor(ts, 'month')) FROM sales"),
    ("period_floor(ts,'day','America/Denver')",
     "SELECT max(period_floor(ts, 'day', 'America/Denver')) FROM sales"),
]


def make_table(db, rows):
    rng = random.Random(7)
    start = 1_600_000_000
    db.execute("CREATE TABLE sales(ts TEXT, item TEXT, amount REAL)")
    db.executemany(
        "INSERT INTO sales VALUES (datetime(?, 'unixepoch'), ?, ?)",
        ((start + rng.randrange(0, 3 * 365 * 86400), f"item{rng.randrange(20)}", rng.random() * 50)
         for _ in range(rows)))
    db.commit()


def print_table(title, unit, totals, rows):
    scan = totals[SCAN]
    base = totals[BASELINE] - scan
    print(title)
    print(f"{'expression':42} {unit + '/row':>12} {unit + '/row over scan':>20} {'vs ' + BASELINE:>12}")
    for label, _ in QUERIES:
        total = totals[label]
        over = total - scan
        ratio = f"{over / base:12.2f}" if label != SCAN else f"{'':12}"
        print(f"{label:42} {total / rows:12.1f} {over / rows:20.1f} {ratio}")


def wall_clock():
    db = sqlite3.connect(":memory:")
    db.enable_load_extension(True)
    db.load_extension(MODULE)
    make_table(db, ROWS)
    best = {label: float("inf") for label, _ in QUERIES}
    for _ in range(ROUNDS):
        for label, sql in QUERIES:
            began = time.perf_counter()
            db.execute(sql).fetchall()
            best[label] = min(best[label], time.perf_counter() - began)
    print_table(f"{ROWS} rows, TEXT timestamps, best of {ROUNDS} interleaved rounds, same run",
                "ns", {k: v * 1e9 for k, v in best.items()}, ROWS)


def instructions(rows=200_000):
    if not shutil.which("valgrind"):
        print("valgrind is not installed; skipping instruction counts")
        return
    with tempfile.TemporaryDirectory() as folder:
        path = os.path.join(folder, "bench.db")
        db = sqlite3.connect(path)
        make_table(db, rows)
        db.close()
        counts = {}
        for label, sql in QUERIES:
            out = os.path.join(folder, "callgrind.out")
            result = subprocess.run(
                ["valgrind", "--tool=callgrind", f"--callgrind-out-file={out}", "sqlite3",
                 "-cmd", f".load {MODULE[:-3]}", path, sql], capture_output=True, text=True)
            line = [l for l in result.stderr.splitlines() if "refs:" in l][0]
            counts[label] = int(line.split()[-1].replace(",", ""))
        print()
        print_table(f"{rows} rows, instructions counted by callgrind (each includes loading the module)",
                    "instr", counts, rows)


if __name__ == "__main__":
    wall_clock()
    if "--instructions" in sys.argv:
        instructions()
