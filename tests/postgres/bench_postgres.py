# SPDX-License-Identifier: MIT
"""Weekly means per item: PostgreSQL with 0 and 2 workers beside SQLite's period_totals.

    /usr/bin/python3 tests/postgres/bench_postgres.py [rows]     (default 10,000,000)

Run by hand, not a test: it asserts nothing about time. The same rows are
made inside each engine by the same deterministic scramble of the row number
(bench_jobs.py's), so both hold the same sales: five years, 60 items. Timed,
best of ALMANAC_BENCH_REPEAT runs (3), each query with its answer fetched into
Python:
    SQLite      SELECT item, period_start, amount / sales FROM period_totals('sales', 'week')
    PostgreSQL  SELECT item, period_floor(ts, 'week'), moving_mean(amount) ... GROUP BY 1, 2
                with max_parallel_workers_per_gather = 0, then = 2 (parallel plan forced
                by zero parallel costs; EXPLAIN ANALYZE's workers launched are printed)
and, for scale, PostgreSQL's own avg(amount) by date_trunc('week', ts AT TIME ZONE 'UTC') with 0
workers. Statistics on both grouping keys let the planner hash the groups.
Prints the seconds and the ratios. Exits 1 when the ways' means differ: the
exact sum divided by n is the same double in every way, so they must be
bit-identical (PostgreSQL's avg is not compared: it is not exactly rounded).
The build must have ALMANAC_POSTGRES on (pg_servers.py installs it privately).
"""
import os
import pathlib
import sqlite3
import sys
import time

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parent))
from pg_servers import SOURCE, almanac_server, explained_plan, plan_nodes  # noqa: E402

MODULE = os.environ.get("ALMANAC_MODULE", str(SOURCE / "build" / "almanac.so"))
ROWS = int(sys.argv[1]) if len(sys.argv) > 1 else 10_000_000
REPEAT = int(os.environ.get("ALMANAC_BENCH_REPEAT", "3"))
START = 1609459200  # 2021-01-01 00:00 UTC
SECONDS = 5 * 365 * 86400
ITEMS = 60

SQLITE_GENERATE = f"""
CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL);
WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < {ROWS}),
h(i, a, b) AS (SELECT i, (i * 2654435761 + 97) % 4294967291, (i * 40503 + 12345) % 1000003 FROM n)
INSERT INTO sales
SELECT datetime({START} + a % {SECONDS}, 'unixepoch'), printf('item %02d', b % {ITEMS}), 1 + (a / 7) % 5,
       (100 + (a / 13) % 400000 + 100 * (b % {ITEMS})) / 100.0
FROM h;
"""
PG_GENERATE = f"""
CREATE TABLE sales(ts timestamptz, item text, qty bigint, amount float8);
INSERT INTO sales
SELECT to_timestamp({START} + a % {SECONDS}), 'item ' || lpad((b % {ITEMS})::text, 2, '0'), 1 + (a / 7) % 5,
       (100 + (a / 13) % 400000 + 100 * (b % {ITEMS}))::float8 / 100.0
FROM (SELECT (i * 2654435761 + 97) % 4294967291 AS a, (i * 40503 + 12345) % 1000003 AS b
      FROM generate_series(1::bigint, {ROWS}) AS i) AS h;
-- what a warehouse would do for a weekly report: statistics on its keys, so
-- the planner knows there are some 16,000 groups and hashes them
CREATE STATISTICS sales_item_week ON item, period_floor(ts, 'week') FROM sales;
CREATE STATISTICS sales_item_trunc ON item, date_trunc('week', ts AT TIME ZONE 'UTC') FROM sales;
ANALYZE sales;
"""
SQLITE_WEEKLY = ("SELECT item, period_start, amount / sales FROM period_totals('sales', 'week') "
                 "WHERE sales > 0 ORDER BY 1, 2")
PG_WEEKLY = ("SELECT item, to_char(week, 'YYYY-MM-DD'), mean FROM (SELECT item, period_floor(ts, 'week') AS week, "
             "moving_mean(amount) AS mean FROM sales GROUP BY 1, 2) AS w ORDER BY 1, 2")
PG_OWN = ("SELECT item, date_trunc('week', ts AT TIME ZONE 'UTC') AS week, avg(amount) FROM sales "
          "GROUP BY 1, 2 ORDER BY 1, 2")
WORKERS = ("SET max_parallel_workers_per_gather = {n}; SET parallel_setup_cost = 0; SET parallel_tuple_cost = 0; "
           "SET min_parallel_table_scan_size = 0")


def fetch(cursor, sql):
    cursor.execute(sql)
    return cursor.fetchall()


def best(run):
    times, answer = [], None
    for _ in range(REPEAT):
        began = time.perf_counter()
        answer = run()
        times.append(time.perf_counter() - began)
    return min(times), answer


def main():
    print(f"weekly means per item over {ROWS:,} rows, best of {REPEAT}")
    lite = sqlite3.connect(":memory:")
    lite.enable_load_extension(True)
    lite.load_extension(MODULE)
    began = time.perf_counter()
    lite.executescript(SQLITE_GENERATE)
    print(f"  SQLite: {ROWS:,} rows made in {time.perf_counter() - began:.1f} s")
    lite_seconds, lite_answer = best(lambda: lite.execute(SQLITE_WEEKLY).fetchall())
    lite.close()

    settings = {"shared_buffers": "'1GB'", "work_mem": "'256MB'", "max_parallel_workers_per_gather": "2"}
    with almanac_server("bench", settings=settings) as pg:
        cursor = pg.cursor()
        began = time.perf_counter()
        cursor.execute(PG_GENERATE)
        print(f"  PostgreSQL: {ROWS:,} rows made in {time.perf_counter() - began:.1f} s")
        cursor.execute("SELECT count(*) FROM sales")  # a first scan, so every timed scan finds the table cached
        results = {}
        for n in (0, 2):
            plan = explained_plan(pg, WORKERS.format(n=n), PG_WEEKLY, options="ANALYZE")
            nodes = list(plan_nodes(plan))
            launched = sum(node.get("Workers Launched", 0) for node in nodes)
            shape = " > ".join(f"{node.get('Partial Mode', '')} {node['Node Type']}".strip() for node in nodes
                               if node["Node Type"] in ("Aggregate", "Gather", "Gather Merge", "Sort"))
            shape += " (" + ", ".join(node["Strategy"] for node in nodes if "Strategy" in node) + ")"
            results[n] = best(lambda: fetch(cursor, PG_WEEKLY)) + (f"{launched} workers launched; {shape}",)
        cursor.execute(WORKERS.format(n=0))
        own_seconds, _ = best(lambda: fetch(cursor, PG_OWN))

    rows = [("SQLite period_totals", lite_seconds, ""),
            ("PostgreSQL moving_mean, 0 workers", results[0][0], results[0][2]),
            ("PostgreSQL moving_mean, 2 workers", results[2][0], results[2][2]),
            ("PostgreSQL avg, 0 workers (its own)", own_seconds, "")]
    for name, seconds, note in rows:
        print(f"  {name:40s} {seconds:8.3f} s  {seconds / lite_seconds:6.2f} x SQLite  {note}")
    print(f"  2 workers against 0 workers: {results[2][0] / results[0][0]:.2f} x")
    same = lite_answer == results[0][1] == results[2][1]
    print(f"  groups: {len(lite_answer):,}; the three ways' means are {'bit-identical' if same else 'DIFFERENT'}")
    return 0 if same and lite_answer else 1


if __name__ == "__main__":
    sys.exit(main())
