# SPDX-License-Identifier: MIT
"""The season statistics beside baselines measured in the same run.

Run by hand (not a test):  /usr/bin/python3 tests/bench/bench_seasons.py [rows]

1. mann_kendall_p(y, x) on 10,000 rows in one group (and the seasonal form
   with 52 seasons), beside SQLite's own count(*) and avg(y) over the same
   rows and beside theil_sen_slope(y, x), and against scipy.stats.kendalltau
   on the same values in this process (the reference's own cost, for scale).
2. mad(x) over a sliding 29-row frame (ROWS BETWEEN 14 PRECEDING AND 14
   FOLLOWING) on ROWS (default 1,000,000) rows, beside median(x) over the same
   frame (O(log w) per row, a real inverse) and SQLite's avg(x) over it.
   mad recomputes each frame (O(w) per row), so the ratio to median is the
   price of that choice.
Each figure is the best of three, the queries taking turns (interleaved), so
load from other work on the machine falls on all of them alike; processor
time is printed beside wall-clock time.
"""
import os
import pathlib
import random
import sqlite3
import sys
import time

ROOT = pathlib.Path(__file__).resolve().parents[2]
MODULE = os.environ.get("ALMANAC_MODULE", str(ROOT / "build" / "almanac.so"))
ROWS = int(sys.argv[1]) if len(sys.argv) > 1 else 1_000_000
GROUP = 10_000


def connect():
    db = sqlite3.connect(":memory:")
    db.enable_load_extension(True)
    db.load_extension(MODULE)
    return db


def best_of(db, queries, repeats=3):
    best = {name: (float("inf"), float("inf")) for name in queries}
    for _ in range(repeats):
        for name, sql in queries.items():
            began, began_cpu = time.perf_counter(), time.process_time()
            db.execute(sql).fetchall()
            wall, cpu = time.perf_counter() - began, time.process_time() - began_cpu
            best[name] = (min(best[name][0], wall), min(best[name][1], cpu))
    return best


def show(best, baseline):
    base_cpu = best[baseline][1]
    for name, (wall, cpu) in best.items():
        print(f"  {name:44s} wall {wall * 1e3:9.1f} ms   cpu {cpu * 1e3:9.1f} ms   "
              f"{cpu / base_cpu:7.1f}x {baseline}")


def main():
    rng = random.Random(2026)
    db = connect()
    db.execute("CREATE TABLE g (t INTEGER PRIMARY KEY, y REAL, season INTEGER)")
    values = [(t, round(100 + 0.01 * t + rng.gauss(0, 20)), t % 52 + 1) for t in range(1, GROUP + 1)]
    db.executemany("INSERT INTO g VALUES (?, ?, ?)", values)
    print(f"1. one group of {GROUP:,} rows (y with ties):")
    best = best_of(db, {
        "count(*)": "SELECT count(*) FROM g",
        "avg(y)": "SELECT avg(y) FROM g",
        "mann_kendall_p(y, t)": "SELECT mann_kendall_p(y, t) FROM g",
        "mann_kendall_p(y, t, season) [52 seasons]": "SELECT mann_kendall_p(y, t, season) FROM g",
        "theil_sen_slope(y, t)": "SELECT theil_sen_slope(y, t) FROM g",
        "theil_sen_slope(y, t, season) [52 seasons]": "SELECT theil_sen_slope(y, t, season) FROM g",
    })
    show(best, "avg(y)")
    try:
        import scipy.stats
        xs = [v[0] for v in values]
        ys = [v[1] for v in values]
        began = time.process_time()
        for _ in range(3):
            scipy.stats.kendalltau(xs, ys, method="asymptotic")
        print(f"  {'scipy.stats.kendalltau (same values, for scale)':44s} cpu {(time.process_time() - began) / 3 * 1e3:9.1f} ms")
    except ImportError:
        pass

    db.execute("CREATE TABLE s (t INTEGER PRIMARY KEY, x REAL)")
    db.executemany("INSERT INTO s VALUES (?, ?)",
                   ((t, round(rng.lognormvariate(5, 0.4), 2)) for t in range(1, ROWS + 1)))
    frame = "ROWS BETWEEN 14 PRECEDING AND 14 FOLLOWING"
    print(f"2. a sliding 29-row frame over {ROWS:,} rows:")
    best = best_of(db, {
        "avg(x) [SQLite]": f"SELECT sum(v) FROM (SELECT avg(x) OVER (ORDER BY t {frame}) AS v FROM s)",
        "median(x)": f"SELECT sum(v) FROM (SELECT median(x) OVER (ORDER BY t {frame}) AS v FROM s)",
        "mad(x)": f"SELECT sum(v) FROM (SELECT mad(x) OVER (ORDER BY t {frame}) AS v FROM s)",
    })
    show(best, "median(x)")
    mad_cpu, median_cpu = best["mad(x)"][1], best["median(x)"][1]
    print(f"  per row: mad {mad_cpu / ROWS * 1e9:.0f} ns, median {median_cpu / ROWS * 1e9:.0f} ns")


if __name__ == "__main__":
    main()
