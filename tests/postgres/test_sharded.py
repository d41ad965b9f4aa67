# SPDX-License-Identifier: MIT
# ctest-labels: postgres
"""A weekly report over sales sharded with postgres_fdw runs on the shards, with the single server's answers.

Three servers of our own (pg_servers.py): a coordinator and two shards, each
with its own cluster and Unix socket. The shards hold the seeded sales of
their shops (seeded_sales.py), with almanac installed, extended statistics on
(shop, period_floor(ts, 'week')) and ANALYZE. On the coordinator, `sales` is
partitioned by shop into postgres_fdw foreign tables on the two foreign
servers, whose options list `extensions 'almanac'` and use_remote_estimate;
`sales_single` holds all the same rows in one local table.
With enable_partitionwise_aggregate, a weekly query grouped by shop must
aggregate on the shards: EXPLAIN VERBOSE shows no aggregation on the
coordinator, and each Foreign Scan's Remote SQL holds almanac's period
function and every aggregate of the query. Its answers must be the answers
of the same query over sales_single.
Sources: the plans and the statistics are PostgreSQL's own answers (EXPLAIN's
JSON, pg_stats_ext_exprs); the expected answers are the single server's
(`# oracle: the same query over one local table`).
"""
import json

import pytest

import engine_answers
import seeded_sales
from pg_servers import PrivateInstallation, Server, explained_plan, plan_nodes, run

ROWS = 30_000
SHARDS = {"shard_a": ("denver", "adelaide"), "shard_b": ("kolkata",)}
AGGREGATES = ("exact_sum", "moving_mean", "median", "mad", "theil_sen_slope", "mann_kendall_p", "ewma",
              "resid_sd", "slope_stderr")
# Labels are made from the grouped period start, so the groups are exactly the
# keys the shards have statistics on.
WEEKLY = """SELECT shop, period_floor(ts, 'week') AS week, period_label(period_floor(ts, 'week'), 'week'), count(*),
       exact_sum(amount), exact_sum(qty), moving_mean(amount), median(amount), mad(amount),
       theil_sen_slope(amount, x), mann_kendall_p(amount, x), ewma(amount, ts, '3 days'),
       resid_sd(amount, x), slope_stderr(amount, x)
FROM {table} GROUP BY shop, period_floor(ts, 'week') ORDER BY shop, week"""
ZONED = """SELECT shop, period_serial(period_floor(ts, 'month', zone), 'month', zone) AS serial,
       period_label(period_floor(ts, 'month', zone), 'month', zone),
       exact_sum(amount), median(amount), theil_sen_slope(amount, x, dow)
FROM {table} GROUP BY shop, zone, period_floor(ts, 'month', zone) ORDER BY shop, serial"""


@pytest.fixture(scope="module")
def coordinator():
    rows = seeded_sales.generate(ROWS, seed=11)
    with PrivateInstallation() as installation, \
            Server(installation, "shard_a", port=5441) as shard_a, \
            Server(installation, "shard_b", port=5442) as shard_b, \
            Server(installation, "coordinator", port=5440) as coordinator:
        for name, shard in (("shard_a", shard_a), ("shard_b", shard_b)):
            connection = shard.connect()
            with connection.cursor() as cursor:
                cursor.execute("CREATE EXTENSION almanac")
                seeded_sales.load_postgres(connection, [r for r in rows if r[1] in SHARDS[name]])
                cursor.execute("CREATE STATISTICS sales_by_shop_week ON shop, period_floor(ts, 'week') FROM sales")
                cursor.execute("CREATE STATISTICS sales_by_shop_month ON shop, zone, period_floor(ts, 'month', zone) "
                               "FROM sales")
                cursor.execute("ANALYZE sales")
            connection.close()
        connection = coordinator.connect()
        with connection.cursor() as cursor:
            cursor.execute("CREATE EXTENSION almanac")
            cursor.execute("CREATE EXTENSION postgres_fdw")
            cursor.execute(seeded_sales.PG_TABLE.format(name="sales").replace("id integer PRIMARY KEY", "id integer")
                           + " PARTITION BY LIST (shop)")
            for name, shard in (("shard_a", shard_a), ("shard_b", shard_b)):
                dsn = shard.dsn()
                cursor.execute(f"CREATE SERVER {name} FOREIGN DATA WRAPPER postgres_fdw OPTIONS (host '{dsn['host']}', "
                               f"port '{dsn['port']}', dbname '{dsn['dbname']}', extensions 'almanac', "
                               f"use_remote_estimate 'true')")
                cursor.execute(f"CREATE USER MAPPING FOR CURRENT_USER SERVER {name} OPTIONS (user '{dsn['user']}')")
                shops = ", ".join(f"'{shop}'" for shop in SHARDS[name])
                cursor.execute(f"CREATE FOREIGN TABLE sales_{name} PARTITION OF sales FOR VALUES IN ({shops}) "
                               f"SERVER {name} OPTIONS (table_name 'sales')")
            seeded_sales.load_postgres(connection, rows, name="sales_single")
            cursor.execute("ANALYZE sales")
        yield connection, (shard_a, shard_b)
        connection.close()


PARTITIONWISE = "SET enable_partitionwise_aggregate = on"


def test_shards_have_the_weekly_statistics(coordinator):
    _, shards = coordinator
    for shard in shards:
        connection = shard.connect()
        rows = run(connection, "SELECT 1", "SELECT expr, n_distinct FROM pg_stats_ext_exprs "
                                           "WHERE statistics_name = 'sales_by_shop_week'")
        connection.close()
        # source: PostgreSQL's pg_stats_ext_exprs, filled by ANALYZE for the expression statistics
        assert len(rows) == 1 and "period_floor" in rows[0][0] and rows[0][1] != 0, rows


@pytest.mark.parametrize("report", ["weekly", "zoned monthly"])
def test_report_runs_on_the_shards(coordinator, report):
    connection, _ = coordinator
    sql = WEEKLY if report == "weekly" else ZONED
    plan = explained_plan(connection, PARTITIONWISE, sql.format(table="sales"))
    every = list(plan_nodes(plan))
    # source: PostgreSQL's EXPLAIN VERBOSE
    local = [n["Node Type"] for n in every if n["Node Type"] == "Aggregate"]
    assert not local, f"{report}: the coordinator aggregates:\n{json.dumps(plan, indent=1)}"
    scans = [n for n in every if n["Node Type"] == "Foreign Scan"]
    assert len(scans) == 2, f"{report}: {len(scans)} foreign scans:\n{json.dumps(plan, indent=1)}"
    wanted = ["period_floor(", "period_label("] + [f"{a}(" for a in AGGREGATES] if report == "weekly" else \
        ["period_floor(", "period_serial(", "period_label(", "exact_sum(", "median(", "theil_sen_slope("]
    for scan in scans:
        remote = scan.get("Remote SQL", "")
        missing = [w for w in wanted if w not in remote]
        assert not missing, f"{report}: {missing} not shipped in {scan.get('Relations')}: {remote}"
        assert "GROUP BY" in remote, remote


@pytest.mark.parametrize("report", ["weekly", "zoned monthly"])
def test_report_gives_the_single_server_answers(coordinator, report):
    connection, _ = coordinator
    sql = WEEKLY if report == "weekly" else ZONED
    sharded = run(connection, PARTITIONWISE, sql.format(table="sales"))
    single = run(connection, PARTITIONWISE, sql.format(table="sales_single"))  # oracle: the same query over one local table
    assert single
    inexact = range(11, 14) if report == "weekly" else ()
    compared = engine_answers.compare(report, single, sharded, inexact=inexact)
    print(f"{report}: {compared} values compared")
