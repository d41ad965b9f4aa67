# SPDX-License-Identifier: MIT
# ctest-labels: postgres
"""Sliding window frames in PostgreSQL give the SQLite module's answers, row by row.

The seeded table (seeded_sales.py, 30,000 rows) in both engines; each query
slides frames of ROWS and of RANGE over every shop's and item's rows in x
order. Sources: every expected value is the SQLite module's answer to the same
query (`# oracle: almanac.so in sqlite3`); exact functions compare bit for bit,
resid_sd, slope_stderr and ewma within 1e-12 relative. That the sliding
aggregates have inverse transitions (MSFUNC/MINVFUNC) is read from
PostgreSQL's own catalog (pg_aggregate.aggminvtransfn).
"""
import pytest

import engine_answers
import seeded_sales
from pg_servers import almanac_server

ROWS = 30_000
SLIDING = ("exact_sum", "moving_mean", "median", "resid_sd", "slope_stderr", "ewma")
EXACT = ("exact_sum(amount) OVER w, exact_sum(qty) OVER w, moving_mean(amount) OVER w, moving_mean(amount, 5) OVER w, "
         "median(amount) OVER w")
# DESIGN lets these recompute their frame, so they slide over short frames only.
RECOMPUTING = "mad(amount) OVER w, theil_sen_slope(amount, x) OVER w, mann_kendall_p(amount, x) OVER w, " \
              "theil_sen_slope(amount, x, dow) OVER w"
CLOSE = "resid_sd(amount, x) OVER w, slope_stderr(amount, x) OVER w, ewma(amount, x, 86400.0) OVER w, ewma(amount, {t}, '3 days') OVER w"
FRAMES = {  # name: (frame, short enough to recompute)
    "20 preceding": ("ROWS BETWEEN 20 PRECEDING AND CURRENT ROW", True),
    "5 around": ("ROWS BETWEEN 5 PRECEDING AND 5 FOLLOWING", True),
    "ahead": ("ROWS BETWEEN 1 FOLLOWING AND 12 FOLLOWING", True),
    "a week of x": ("RANGE BETWEEN 604800 PRECEDING AND CURRENT ROW", True),
    "growing": ("ROWS BETWEEN UNBOUNDED PRECEDING AND CURRENT ROW", False),
    "a thousand": ("ROWS BETWEEN 1000 PRECEDING AND 10 PRECEDING", False),
}


@pytest.fixture(scope="module")
def rows():
    return seeded_sales.generate(ROWS, seed=77)


@pytest.fixture(scope="module")
def lite(rows):
    with seeded_sales.sqlite_sales(rows) as connection:
        yield connection


@pytest.fixture(scope="module")
def pg(rows):
    with almanac_server("windows", rows) as connection:
        yield connection


def test_sliding_aggregates_have_inverse_transitions(pg):
    with pg.cursor() as cursor:
        cursor.execute("SELECT p.proname, a.aggmtransfn::oid <> 0, a.aggminvtransfn::oid <> 0 FROM pg_aggregate a "
                       "JOIN pg_proc p ON p.oid = a.aggfnoid WHERE p.proname = ANY(%s)", (list(SLIDING),))
        found = cursor.fetchall()
    # source: PostgreSQL's catalog pg_aggregate (aggmtransfn, aggminvtransfn: the moving-aggregate mode)
    assert {name for name, _, _ in found} == set(SLIDING)
    lacking = sorted({name for name, moving, inverse in found if not (moving and inverse)})
    assert not lacking, f"aggregates without a moving-aggregate inverse: {lacking}"


@pytest.mark.parametrize("frame", FRAMES)
def test_frames(lite, pg, frame):
    clause, short = FRAMES[frame]
    window = f"WINDOW w AS (PARTITION BY shop, item ORDER BY x {clause})"
    exact = f"{EXACT}, {RECOMPUTING}" if short else EXACT
    first_close = 1 + exact.count(" OVER w")
    query = f"SELECT id, {exact}, {CLOSE} FROM sales {window} ORDER BY id"
    expected = lite.execute(query.format(t="ts_text")).fetchall()
    with pg.cursor() as cursor:
        cursor.execute(query.format(t="ts"))
        got = cursor.fetchall()
    # oracle: almanac.so in sqlite3, the same window query
    assert len(expected) == ROWS
    compared = engine_answers.compare(f"frame {frame}", expected, got, inexact=range(first_close, first_close + 4))
    print(f"frame {frame}: {compared} values compared")
