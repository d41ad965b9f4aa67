#!/usr/bin/python3
# SPDX-License-Identifier: MIT
"""Reading shop exports: to_time with a fixed format beside SQLite's datetime(), in one run.

Run with Debian's interpreter, after a build:
    /usr/bin/python3 tests/bench/bench_exports.py [path/to/almanac.so]

Writes 1,000,000 rows, each one instant written three ways (ISO text, a
German day-first text, a US 12-hour text) plus a money text and a REAL, into a
file database; then times each query over all rows, in interleaved rounds,
and prints the best round's CPU and wall seconds, the cost per row, and the
ratio to SQLite's own function doing the nearest job on the same rows:
to_time against datetime(), to_amount against CAST(... AS REAL), exact_sum
against sum(). A plain scan (count of the column) is printed too, so the
per-row cost of the function itself can be read off.
Not a test: timings are printed, never asserted.
"""
import os
import pathlib
import sqlite3
import sys
import tempfile
import time

ROOT = pathlib.Path(__file__).resolve().parent.parent.parent
MODULE = sys.argv[1] if len(sys.argv) > 1 else os.environ.get(
    "ALMANAC_MODULE", str(ROOT / "build" / "almanac.so"))
ROWS = 1_000_000


def connect(path):
    connection = sqlite3.connect(path)
    connection.enable_load_extension(True)
    connection.load_extension(MODULE)
    return connection


def make_data(path):
    """Instants spread over 2020-2029, with seconds; amounts with cents and grouping."""
    connection = sqlite3.connect(path)
    connection.executescript(f"""
        CREATE TABLE data(n INTEGER PRIMARY KEY, iso TEXT, eu TEXT, us TEXT, money TEXT, x REAL);
        WITH RECURSIVE s(n) AS (SELECT 1 UNION ALL SELECT n + 1 FROM s WHERE n < {ROWS}),
        t(n, u) AS MATERIALIZED (SELECT n, 1577836800 + (abs(random()) % 315532800) FROM s)
        INSERT INTO data
        SELECT n, datetime(u, 'unixepoch'), strftime('%d.%m.%Y %H:%M:%S', u, 'unixepoch'),
               strftime('%m/%d/%Y ', u, 'unixepoch')
                 || ((CAST(strftime('%H', u, 'unixepoch') AS INTEGER) + 11) % 12 + 1)
                 || strftime(':%M:%S ', u, 'unixepoch')
                 || CASE WHEN CAST(strftime('%H', u, 'unixepoch') AS INTEGER) < 12 THEN 'AM' ELSE 'PM' END,
               printf('%,.2f', (u % 500000) / 100.0), (u % 500000) / 100.0
        FROM t;
    """)
    connection.commit()
    connection.close()


CASES = [
    # (label, expression, baseline label or None)
    ("scan: count(iso)", "count(iso)", None),
    ("SQLite datetime(iso)", "count(datetime(iso))", None),
    ("to_time(iso, '%Y-%m-%d %H:%M:%S')", "count(to_time(iso, '%Y-%m-%d %H:%M:%S'))", "SQLite datetime(iso)"),
    ("to_time(eu, '%d.%m.%Y %H:%M:%S')", "count(to_time(eu, '%d.%m.%Y %H:%M:%S'))", "SQLite datetime(iso)"),
    ("to_time(us, '%m/%d/%Y %I:%M:%S %p')", "count(to_time(us, '%m/%d/%Y %I:%M:%S %p'))", "SQLite datetime(iso)"),
    ("to_time(eu, ..., 'America/Denver')", "count(to_time(eu, '%d.%m.%Y %H:%M:%S', 'America/Denver'))",
     "SQLite datetime(iso)"),
    ("SQLite CAST(money AS REAL)", "count(CAST(money AS REAL))", None),
    ("to_amount(money)", "count(to_amount(money))", "SQLite CAST(money AS REAL)"),
    ("SQLite sum(x)", "sum(x)", None),
    ("exact_sum(x)", "exact_sum(x)", "SQLite sum(x)"),
]


def timed(connection, expression):
    wall, cpu = time.perf_counter(), time.process_time()
    connection.execute(f"SELECT {expression} FROM data").fetchall()
    return time.perf_counter() - wall, time.process_time() - cpu


def main():
    with tempfile.TemporaryDirectory() as folder:
        path = os.path.join(folder, "bench.db")
        make_data(path)
        connection = connect(path)
        # The rows agree before they are timed: to_time of each layout is datetime().
        differ = connection.execute(
            "SELECT count(*) FROM data WHERE to_time(eu, '%d.%m.%Y %H:%M:%S') <> datetime(iso) "
            "OR to_time(us, '%m/%d/%Y %I:%M:%S %p') <> datetime(iso) "
            "OR to_amount(money) <> x").fetchone()[0]
        print(f"{ROWS:,} rows; rows where the readings disagree with datetime()/the REAL: {differ}")
        timed(connection, "count(iso)")  # warm the page cache
        runs = {label: [] for label, _, _ in CASES}
        # Interleaved rounds, so a busy moment of the shared machine hits every
        # query alike; the best of five rounds counts.
        for _ in range(5):
            for label, expression, _ in CASES:
                runs[label].append(timed(connection, expression))
        best = {label: (min(w for w, _ in r), min(c for _, c in r)) for label, r in runs.items()}
        scan = best["scan: count(iso)"][1]
        print(f"{'query':40} {'cpu s':>7} {'wall s':>7} {'ns/row':>7} {'ns/row - scan':>13} {'ratio (cpu)':>12}")
        for label, _, baseline in CASES:
            wall, cpu = best[label]
            ratio = f"{cpu / best[baseline][1]:.2f}x" if baseline else ""
            print(f"{label:40} {cpu:7.3f} {wall:7.3f} {cpu / ROWS * 1e9:7.0f} "
                  f"{(cpu - scan) / ROWS * 1e9:13.0f} {ratio:>12}")


if __name__ == "__main__":
    main()
