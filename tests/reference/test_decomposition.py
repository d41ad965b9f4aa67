# SPDX-License-Identifier: MIT
"""period_decomposition against statsmodels' STL, through SQL.

Oracle: statsmodels.tsa.seasonal.STL(amounts, period=n_p, robust=...) of
Debian's python3-statsmodels with its default parameters (its .config names
them: seasonal 7, trend and low-pass from the period, degree 1, no jumps),
run on the very amounts period_decomposition lists for each item. The
method: Cleveland, Cleveland, McRae & Terpenning (1990), "STL: A
Seasonal-Trend Decomposition Procedure Based on Loess", Journal of Official
Statistics 6(1).

Seeded series of four kinds — weekly with cycle year (n_p 52), daily with
cycle week (7), monthly with cycle year (12), hourly with cycle day (24) —
and six shapes (a linear trend alone, a wave, noise, a promotion spike,
closure zeros, a constant), over exactly two cycles, one period short of two
(NULL parts), three, four and more cycles. trend, season, noise and weight
agree within 1e-9 x (max |amount| + 1); robust fits are compared from four
whole cycles on (DESIGN: robust by default there). Below four cycles the
default must be the non-robust fit, and an explicit robust fit must add up
with weights in [0, 1] (its weights come from rounding noise there, and
statsmodels' own answers move by orders of magnitude for inputs a few ulp
apart, so it is not compared).
"""
import datetime
import math
import random

import numpy as np
import pytest
from statsmodels.tsa.seasonal import STL

from conftest import connect

KINDS = [  # spec, cycle, n_p (DESIGN's table), how the n-th period is written
    ("week", "year", 52),
    ("day", "week", 7),
    ("month", "year", 12),
    ("hour", "day", 24),
]
SHAPES = ["line", "wave", "noise", "spike", "closure", "constant"]
COLUMNS = "item, label, amount, trend, season, noise, weight"


def tolerance(amounts):
    return 1e-9 * (max(abs(a) for a in amounts) + 1)  # DESIGN / issue: the stated tolerance


def period_start(spec, k):
    """The k-th period from a Monday in January 2021, and the last instant of it."""
    monday = datetime.datetime(2021, 1, 4)
    if spec == "week":
        start = monday + datetime.timedelta(weeks=k)
        return start, start + datetime.timedelta(days=6, hours=12)
    if spec == "day":
        start = monday + datetime.timedelta(days=k)
        return start, start + datetime.timedelta(hours=12)
    if spec == "hour":
        start = monday + datetime.timedelta(hours=k)
        return start, start + datetime.timedelta(minutes=30)
    year, month = 2021 + k // 12, k % 12 + 1
    start = datetime.datetime(year, month, 1)
    following = datetime.datetime(year + month // 12, month % 12 + 1, 1)
    return start, following - datetime.timedelta(hours=12)


def series_values(rng, shape, n, period):
    t = np.arange(n)
    if shape == "constant":
        return [250.0] * n
    if shape == "line":
        return [round(40 + 0.75 * i, 2) for i in t]
    wave = 30 * np.sin(2 * np.pi * t / period) + 10 * np.cos(4 * np.pi * t / period)
    level = 200 + 0.3 * t
    noise = rng.normal(0, 6, n)
    if shape == "wave":
        y = level + wave + 0.5 * noise
    elif shape == "noise":
        y = 120 + 5 * noise
    else:
        y = level + wave + noise
    y = np.round(y, 2)
    if shape == "spike":
        y[n // 2] += 900  # a promotion
    if shape == "closure":
        first = n // 3
        y[first:first + max(2, period // 4)] = 0.0  # the shop closed
    return [float(v) for v in y]


def build_table(db, spec, period, periods, rng, items_per_shape=2):
    """One table, every item over the same `periods` whole periods."""
    db.execute("DROP TABLE IF EXISTS sales")
    db.execute("CREATE TABLE sales(ts TEXT, item TEXT, amount REAL)")
    rows = []
    for shape in SHAPES:
        for copy in range(items_per_shape):
            item = f"{shape}-{copy}"
            for k, v in enumerate(series_values(rng, shape, periods, period)):
                start, _ = period_start(spec, k)
                rows.append((start.strftime("%Y-%m-%d %H:%M:%S"), item, v))
    # The range runs to the end of the local day of the latest row: a last row
    # late in the last period makes it whole (amount 0 changes no total).
    _, last = period_start(spec, periods - 1)
    rows.append((last.strftime("%Y-%m-%d %H:%M:%S"), f"{SHAPES[0]}-0", 0.0))
    db.executemany("INSERT INTO sales VALUES (?, ?, ?)", rows)


def decomposed(db, spec, cycle, options=None):
    args = f"'sales', '{spec}', '{cycle}'" + (f", NULL, '{options}'" if options else "")
    by_item = {}
    for row in db.execute(f"SELECT {COLUMNS} FROM period_decomposition({args}) WHERE all_segments = 1"):
        by_item.setdefault(row[0], []).append(row[1:])
    return by_item


def parts(rows):
    return {name: [r[i] for r in rows] for i, name in enumerate(["label", "amount", "trend", "season", "noise", "weight"])}


def assert_matches(got, reference, tol, what):
    for name, ref in (("trend", reference.trend), ("season", reference.seasonal),
                      ("noise", reference.resid), ("weight", reference.weights)):
        worst = max(abs(a - b) for a, b in zip(got[name], ref))
        assert worst <= tol, (what, name, worst, tol)


def assert_adds_up(got):
    for a, t, s, r in zip(got["amount"], got["trend"], got["season"], got["noise"]):
        # amount = trend + season + noise to rounding (DESIGN)
        assert math.isclose(a, t + s + r, rel_tol=1e-12, abs_tol=1e-9 * (abs(a) + abs(t) + abs(s) + 1))


CYCLE_COUNTS = [2, 3, 4, 6]


@pytest.mark.parametrize("spec,cycle,period", KINDS, ids=[f"{k[0]}-in-{k[1]}" for k in KINDS])
def test_parts_match_statsmodels_stl(spec, cycle, period):
    db = connect()
    rng = np.random.default_rng(period)
    compared = robust_compared = 0
    for cycles in CYCLE_COUNTS + ([10] if period <= 24 else []):
        periods = cycles * period
        build_table(db, spec, period, periods, rng)
        default = decomposed(db, spec, cycle)
        explicit = {flag: decomposed(db, spec, cycle, f'{{"robust": {flag}}}') for flag in ("true", "false")}
        assert len(default) == 2 * len(SHAPES)
        for item, rows in default.items():
            got = parts(rows)
            assert len(got["amount"]) == periods  # every whole period, no partial one
            y = np.array(got["amount"], dtype=float)
            tol = tolerance(got["amount"])
            plain = STL(y, period=period).fit()  # oracle: statsmodels STL, non-robust
            assert_matches(parts(explicit["false"][item]), plain, tol, (item, cycles, "robust false"))
            assert_adds_up(got)
            if cycles >= 4:
                robust = STL(y, period=period, robust=True).fit()  # oracle: statsmodels STL, robust
                assert_matches(got, robust, tol, (item, cycles, "default, robust"))
                assert_matches(parts(explicit["true"][item]), robust, tol, (item, cycles, "robust true"))
                robust_compared += 1
            else:
                # the default below four cycles is the non-robust fit
                assert_matches(got, plain, tol, (item, cycles, "default, non-robust"))
                assert all(w == 1.0 for w in got["weight"])
                forced = parts(explicit["true"][item])
                assert_adds_up(forced)
                assert all(0.0 <= w <= 1.0 for w in forced["weight"])
            compared += 1
    print(f"{spec} in {cycle}: {compared} series compared with statsmodels STL, {robust_compared} robust")
    assert compared >= 48


@pytest.mark.parametrize("spec,cycle,period", KINDS, ids=[f"{k[0]}-in-{k[1]}" for k in KINDS])
def test_one_period_short_of_two_cycles_gives_null_parts(spec, cycle, period):
    db = connect()
    build_table(db, spec, period, 2 * period - 1, np.random.default_rng(1), items_per_shape=1)
    got = decomposed(db, spec, cycle)
    assert len(got) == len(SHAPES)
    for rows in got.values():
        assert len(rows) == 2 * period - 1
        # DESIGN: fewer than two whole cycles: NULL trend, season, noise, weight; amounts come
        assert all(r[2:] == (None, None, None, None) for r in rows)
        assert all(r[1] is not None for r in rows)


def test_a_longer_seasonal_span_changes_the_trend_smoother_as_statsmodels_does():
    db = connect()
    rng = np.random.default_rng(13)
    build_table(db, "day", 7, 7 * 12, rng, items_per_shape=1)
    # statsmodels' config: the trend span follows the seasonal span
    assert STL(np.zeros(84), period=7, seasonal=13).config["trend"] != STL(np.zeros(84), period=7).config["trend"]
    wide = decomposed(db, "day", "week", '{"seasonal": 13}')
    default = decomposed(db, "day", "week")
    compared = 0
    for item, rows in wide.items():
        got = parts(rows)
        y = np.array(got["amount"])
        reference = STL(y, period=7, seasonal=13, robust=True).fit()  # oracle: statsmodels STL
        assert_matches(got, reference, tolerance(got["amount"]), item)
        if not item.startswith(("line", "constant")):
            assert got["trend"] != parts(default[item])["trend"]
        compared += 1
    assert compared == len(SHAPES)


def strengths(trend, season, noise):
    """Hyndman & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., section 4.3
    (from memory; Wang, Smith & Hyndman 2006): F_T = max(0, 1 - Var(R)/Var(T + R)),
    F_S = max(0, 1 - Var(R)/Var(S + R))."""
    t, s, r = (np.array(v) for v in (trend, season, noise))
    var_r = np.var(r)
    return max(0.0, 1 - var_r / np.var(t + r)), max(0.0, 1 - var_r / np.var(s + r))


def test_strengths_from_the_parts_match_those_from_statsmodels_and_tell_season_from_noise():
    db = connect()
    build_table(db, "week", 52, 52 * 4, np.random.default_rng(4))
    got = decomposed(db, "week", "year")
    measured = {}
    for item, rows in got.items():
        p = parts(rows)
        ours = strengths(p["trend"], p["season"], p["noise"])
        reference = STL(np.array(p["amount"]), period=52, robust=True).fit()  # oracle: statsmodels STL
        theirs = strengths(reference.trend, reference.seasonal, reference.resid)
        assert ours == pytest.approx(theirs, abs=1e-9)
        measured[item] = ours
    # planted: the wave items are strongly seasonal, the noise items are not
    for copy in range(2):
        assert measured[f"wave-{copy}"][1] > 0.9
        assert measured[f"noise-{copy}"][1] < measured[f"wave-{copy}"][1]
        assert measured[f"line-{copy}"][0] > 0.99  # a line is all trend


def test_segments_and_the_rollup_are_decomposed_apart():
    db = connect()
    db.execute("CREATE TABLE sales(ts TEXT, item TEXT, segment TEXT, amount REAL)")
    rng = random.Random(5)
    start = datetime.date(2023, 1, 2)
    rows = []
    for day in range(7 * 8):
        for shop in ("north", "south"):
            rows.append(((start + datetime.timedelta(day)).isoformat(), "bread", shop,
                         round(50 + (20 if day % 7 >= 5 else 0) + rng.gauss(0, 3), 2)))
    db.executemany("INSERT INTO sales VALUES (?, ?, ?, ?)", rows)
    got = db.execute("SELECT segment, all_segments, amount, trend, season, noise, weight "
                     "FROM period_decomposition('sales', 'day', 'week')").fetchall()
    assert len(got) == 3 * 7 * 8
    blocks = {}
    for r in got:
        blocks.setdefault((r[0], r[1]), []).append(r[2:])
    assert list(blocks) == [(None, 1), ("north", 0), ("south", 0)]  # rollup first, as period_totals
    for key, rows in blocks.items():
        y = np.array([r[0] for r in rows])
        reference = STL(y, period=7, robust=True).fit()  # oracle: statsmodels STL
        got_parts = {"trend": [r[1] for r in rows], "season": [r[2] for r in rows],
                     "noise": [r[3] for r in rows], "weight": [r[4] for r in rows]}
        assert_matches(got_parts, reference, tolerance(y), key)
