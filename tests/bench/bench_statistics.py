#!/usr/bin/python3
# SPDX-License-Identifier: MIT
"""Sliding-window statistics against SQLite's own sliding avg(), in one run.

Run with Debian's interpreter, after a build:
    /usr/bin/python3 tests/bench/bench_statistics.py [path/to/almanac.so]

Prints, for 2,000,000 rows in a file database, the seconds each query takes
over the same frame (ROWS 6 PRECEDING) and the ratio to SQLite's avg(x); then
the peak resident memory of a process that runs moving_mean over 200,000 and
over 2,000,000 rows, to show that memory does not grow with the rows.
Not a test: timings are printed, never asserted.
"""
import os
import pathlib
import resource
import sqlite3
import subprocess
import sys
import tempfile
import time

ROOT = pathlib.Path(__file__).resolve().parent.parent.parent
MODULE = sys.argv[1] if len(sys.argv) > 1 and not sys.argv[1].startswith("--") else os.environ.get(
    "ALMANAC_MODULE", str(ROOT / "build" / "almanac.so"))
FRAME = "OVER (ORDER BY t ROWS 6 PRECEDING)"


def connect(path):
    connection = sqlite3.connect(path)
    connection.enable_load_extension(True)
    connection.load_extension(MODULE)
    return connection


def make_data(path, rows):
    """Values near 1e9 with cents, a 1e15 spike every 100,000 rows."""
    connection = sqlite3.connect(path)
    connection.executescript(f"""
        DROP TABLE IF EXISTS data;
        CREATE TABLE data(t INTEGER PRIMARY KEY, x REAL);
        WITH RECURSIVE s(t) AS (SELECT 1 UNION ALL SELECT t + 1 FROM s WHERE t < {rows})
        INSERT INTO data
        SELECT t, CASE WHEN t % 100000 = 0 THEN 1e15
                       ELSE 1e9 + (abs(random()) % 100000000) / 100.0 END FROM s;
    """)
    connection.commit()
    connection.close()


def timed(connection, expression):
    """(wall seconds, CPU seconds of this process) for one run over the whole table."""
    sql = f"SELECT count(v), sum(v) FROM (SELECT {expression} {FRAME} AS v FROM data)"
    wall, cpu = time.perf_counter(), time.process_time()
    connection.execute(sql).fetchall()
    return time.perf_counter() - wall, time.process_time() - cpu


def peak_memory_child(path):
    connection = connect(path)
    connection.execute(f"SELECT sum(v) FROM (SELECT moving_mean(x) {FRAME} AS v FROM data)").fetchall()
    print(resource.getrusage(resource.RUSAGE_SELF).ru_maxrss)


def main():
    if "--peak-memory" in sys.argv:
        return peak_memory_child(sys.argv[-1])
    with tempfile.TemporaryDirectory() as folder:
        path = os.path.join(folder, "bench.db")
        rows = 2_000_000
        make_data(path, rows)
        connection = connect(path)
        timed(connection, "avg(x)")  # warm the page cache
        cases = [("SQLite avg(x)", "avg(x)"), ("moving_mean(x)", "moving_mean(x)"),
                 ("stddev_samp(x)", "stddev_samp(x)"), ("regr_slope(x, t)", "regr_slope(x, t)")]
        runs = {label: [] for label, _ in cases}
        # Interleaved rounds, so a busy moment of the machine hits every query
        # alike; the best of five rounds counts. CPU time (this process only)
        # is the steadier measure on a shared machine; wall time is beside it.
        for _ in range(5):
            for label, expression in cases:
                runs[label].append(timed(connection, expression))
        wall = {label: min(r[0] for r in runs[label]) for label in runs}
        cpu = {label: min(r[1] for r in runs[label]) for label in runs}
        base = "SQLite avg(x)"
        print(f"{rows:,} rows, frame ROWS 6 PRECEDING, best of 5 interleaved rounds")
        print(f"{'query':<20} {'wall s':>8} {'ratio':>6} {'CPU s':>8} {'ratio':>6}")
        for label, _ in cases:
            print(f"{label:<20} {wall[label]:8.3f} {wall[label] / wall[base]:6.2f} "
                  f"{cpu[label]:8.3f} {cpu[label] / cpu[base]:6.2f}")
        connection.close()

        print("\npeak RSS of a process running moving_mean over the rows")
        for count in (200_000, 2_000_000):
            small = os.path.join(folder, f"rss{count}.db")
            make_data(small, count)
            out = subprocess.run([sys.executable, __file__, MODULE, "--peak-memory", small],
                                 capture_output=True, text=True, check=True).stdout
            print(f"{count:>10,} rows  {int(out) / 1024:8.1f} MiB")


if __name__ == "__main__":
    main()
