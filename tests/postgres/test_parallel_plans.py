# SPDX-License-Identifier: MIT
# ctest-labels: postgres
"""Every almanac aggregate runs in parallel worker processes, with the serial plan's answers.

With parallel plans forced (max_parallel_workers_per_gather = 2,
parallel_setup_cost = parallel_tuple_cost = 0, min_parallel_table_scan_size = 0),
EXPLAIN (ANALYZE, VERBOSE) of each aggregate, plain and grouped by week, must
show a Finalize Aggregate above a Gather with workers launched and a Partial
Aggregate computing that aggregate; the answers must be bit-identical to those
of the same query with max_parallel_workers_per_gather = 0.
Sources: the plan shapes are PostgreSQL's own answers (EXPLAIN's JSON:
"Partial Mode", "Workers Launched", "Output"); the serial plan's answers are
the reference for the parallel plan's; that each aggregate is PARALLEL SAFE
with a combine function (and serial/deserial functions when its state is
internal) is read from PostgreSQL's catalogs pg_proc and pg_aggregate.
"""
import json

import pytest

import engine_answers
import seeded_sales
from pg_servers import almanac_server, explained_plan, plan_nodes, run

ROWS = 100_000
FORCE_PARALLEL = ("SET max_parallel_workers_per_gather = 2; SET parallel_setup_cost = 0; "
                  "SET parallel_tuple_cost = 0; SET min_parallel_table_scan_size = 0; "
                  "SET parallel_leader_participation = off")
SERIAL = "SET max_parallel_workers_per_gather = 0"
AGGREGATES = {  # name: a call over the seeded table
    "exact_sum": "exact_sum(amount)",
    "exact_sum(bigint)": "exact_sum(qty)",
    "moving_mean": "moving_mean(amount)",
    "moving_mean(min_values)": "moving_mean(amount, 50)",
    "median": "median(amount)",
    "mad": "mad(amount)",
    "resid_sd": "resid_sd(amount, x)",
    "slope_stderr": "slope_stderr(amount, x)",
    "ewma": "ewma(amount, x, 604800.0)",
    "ewma(timestamptz)": "ewma(amount, ts, '2 weeks')",
    "theil_sen_slope": "theil_sen_slope(amount, x)",
    "theil_sen_slope(season)": "theil_sen_slope(amount, x, dow)",
    "mann_kendall_p": "mann_kendall_p(amount, x)",
    "mann_kendall_p(season)": "mann_kendall_p(amount, x, dow)",
    "sparkline": "sparkline(amount, x)",
    "svg_line_chart": "svg_line_chart(x, amount, shop)",
    "svg_bar_chart": "svg_bar_chart(x, amount, shop)",
}
# Charts and Theil-Sen over every row would test size, not plans: they read
# sales_sample, every 20th row (a table of its own with its own statistics: a
# WHERE filter would make the planner guess its rows and skip partial aggregation).
SAMPLE = {"svg_line_chart", "svg_bar_chart", "theil_sen_slope", "theil_sen_slope(season)", "sparkline"}


@pytest.fixture(scope="module")
def pg():
    with almanac_server("parallel", seeded_sales.generate(ROWS, seed=5)) as connection:
        # Statistics on the weekly key, so the planner knows there are about 160 weeks,
        # not a group per row, and aggregates partially in the workers.
        connection.cursor().execute(
            "CREATE TABLE sales_sample AS SELECT * FROM sales WHERE id % 20 = 0; "
            "CREATE STATISTICS sales_week ON (period_floor(ts, 'week')) FROM sales; "
            "CREATE STATISTICS sales_sample_week ON (period_floor(ts, 'week')) FROM sales_sample; "
            "ANALYZE sales; ANALYZE sales_sample")
        yield connection


def test_every_aggregate_is_parallel_safe_with_a_combine_function(pg):
    rows = run(pg, "SELECT 1", """
        SELECT p.proname, pg_get_function_identity_arguments(p.oid), p.proparallel,
               a.aggcombinefn::oid <> 0, a.aggtranstype = 'internal'::regtype,
               a.aggserialfn::oid <> 0, a.aggdeserialfn::oid <> 0
        FROM pg_aggregate a JOIN pg_proc p ON p.oid = a.aggfnoid
        JOIN pg_depend d ON d.classid = 'pg_proc'::regclass AND d.objid = p.oid AND d.deptype = 'e'
        JOIN pg_extension e ON e.oid = d.refobjid AND e.extname = 'almanac'""")
    # source: PostgreSQL's catalogs; DESIGN: every aggregate PARALLEL SAFE with a combine function
    names = {row[0] for row in rows}
    assert {name.split("(")[0] for name in AGGREGATES} <= names, f"aggregates found: {sorted(names)}"
    for name, arguments, parallel, combine, internal, serial, deserial in rows:
        assert parallel == "s", f"{name}({arguments}) is not PARALLEL SAFE"
        assert combine, f"{name}({arguments}) has no combine function"
        if internal:
            assert serial and deserial, f"{name}({arguments}) has an internal state without serial/deserial functions"


@pytest.mark.parametrize("grouped", [False, True], ids=["whole table", "by week"])
@pytest.mark.parametrize("name", AGGREGATES)
def test_parallel_plan(pg, name, grouped):
    call = AGGREGATES[name]
    table = "sales_sample" if name in SAMPLE else "sales"
    if grouped:
        sql = f"SELECT period_floor(ts, 'week'), {call} FROM {table} GROUP BY 1 ORDER BY 1"
    else:
        sql = f"SELECT {call} FROM {table}"
    plan = explained_plan(pg, FORCE_PARALLEL, sql, options="ANALYZE, VERBOSE")
    every = list(plan_nodes(plan))
    # source: PostgreSQL's EXPLAIN; a parallel aggregate is Finalize above Gather above Partial
    finalize = [n for n in every if n.get("Partial Mode") == "Finalize"]
    partial = [n for n in every if n.get("Partial Mode") == "Partial"]
    gathers = [n for n in every if n["Node Type"] in ("Gather", "Gather Merge")]
    assert finalize and partial and gathers, f"{name}: no parallel aggregation in\n{json.dumps(plan, indent=1)}"
    function = name.split("(")[0]
    assert any(f"PARTIAL {function}(" in out for n in partial for out in n.get("Output", [])), \
        f"{name}: the Partial Aggregate does not compute it: {[n.get('Output') for n in partial]}"
    launched = sum(n.get("Workers Launched", 0) for n in gathers)
    assert launched >= 1, f"{name}: {launched} workers launched"
    parallel = run(pg, FORCE_PARALLEL, sql)
    serial = run(pg, SERIAL, sql)
    # oracle: the same query in a serial plan (max_parallel_workers_per_gather = 0)
    assert parallel and len(parallel) == len(serial)
    engine_answers.compare(f"{name} parallel against serial", serial, parallel)
