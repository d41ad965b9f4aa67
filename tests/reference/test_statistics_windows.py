# SPDX-License-Identifier: MIT
"""Sliding-window statistics against numpy, scipy, pandas and math.fsum, at test time.

Seeded random series in three partitions — values near 1e9 with cents and
1e15 spikes; values near 1e12 with cents in long runs of equal values; mixed
magnitudes with negative spikes — with NULLs, repeated days and gaps. Every
function runs over ROWS frames of widths 1, 2, 7, 31 and 365, centred ROWS
frames, RANGE frames over julianday(day), all with PARTITION BY, and the
result of every row is compared with the oracle computed on that row's frame:

- moving_mean: bit for bit against math.fsum(values) / n;
- var/stddev: numpy.var / numpy.std of the values minus the frame's first
  value (variance is shift-invariant, and the shift is exact by Sterbenz's
  lemma for values within a factor of two, which keeps numpy's own rounding
  out of the comparison);
- covariance, correlation, regression: numpy.cov, numpy.corrcoef,
  scipy.stats.linregress on shifted data, with the SQL standard's special
  cases (ISO/IEC 9075: NULL when Sxx = 0, regr_r2 = 1 when Syy = 0);
- regr_avgx / regr_avgy: bit for bit against math.fsum / n;
- ewma: the definition Σw·x/Σw, w = 0.5**((t_max − t)/h) in numpy, and
  pandas ewm(halflife=..., times=...).mean() over the expanding frame.

numpy's results carry their own rounding, so those comparisons allow 1e-12
of each statistic's natural size (relative for var/stddev); a sample of frames is
also checked against exact rational arithmetic (fractions.Fraction), where
almanac must agree to 1e-15.
"""
import datetime
import math
import random
import warnings
from fractions import Fraction

import numpy as np
import pandas as pd
import pytest
from scipy import stats

from conftest import connect

UNIVARIATE = ["var_samp", "var_pop", "stddev_samp", "stddev_pop"]
BIVARIATE = ["covar_samp", "covar_pop", "corr", "regr_count", "regr_avgx", "regr_avgy",
             "regr_sxx", "regr_syy", "regr_sxy", "regr_slope", "regr_intercept", "regr_r2",
             "resid_sd", "slope_stderr"]
OTHERS = ["moving_mean(v)", "moving_mean(v, 3)", "ewma(v, day, '3 days')", "ewma(v, x, 2.5)"]

# (kind, preceding, following)
FRAMES = [("ROWS", 0, 0), ("ROWS", 1, 0), ("ROWS", 6, 0), ("ROWS", 30, 0), ("ROWS", 364, 0),
          ("ROWS", 3, 3), ("ROWS", 15, 15), ("RANGE", 6, 0), ("RANGE", 3, 3)]

EPOCH_JD = 2440587.5  # Julian day of 1970-01-01 00:00 UTC (from memory; J2000.0 = 2451545.0)


def make_rows(seed=20240611, per_partition=700):
    rng = random.Random(seed)
    rows = []
    start = datetime.date(2023, 1, 1)
    for part in ("a", "b", "c"):
        day = start
        run_value, run_left = None, 0
        for i in range(per_partition):
            day += datetime.timedelta(days=rng.choices([0, 1, 2], [0.2, 0.6, 0.2])[0])
            if part == "a":
                v = round(1e9 + rng.gauss(0, 5e4), 2)
                if rng.random() < 0.01:
                    v = 1e15
            elif part == "b":
                if run_left == 0:
                    run_value, run_left = round(1e12 + rng.gauss(0, 100), 2), rng.randint(1, 60)
                run_left -= 1
                v = run_value
            else:
                v = rng.choice([-1, 1]) * 10 ** rng.uniform(-5, 5)
                if rng.random() < 0.01:
                    v = -1e15
            if rng.random() < 0.05:
                v = None
            jd = (day - datetime.date(1970, 1, 1)).days + EPOCH_JD
            x = None if rng.random() < 0.03 else jd
            rows.append({"part": part, "day": day.isoformat(), "v": v, "x": x, "jd": jd})
    for i, row in enumerate(rows):
        row["id"] = i + 1
    return rows


@pytest.fixture(scope="module")
def series():
    rows = make_rows()
    db = connect()
    db.execute("CREATE TABLE s(id INTEGER PRIMARY KEY, part TEXT, day TEXT, v REAL, x REAL)")
    db.executemany("INSERT INTO s VALUES (?, ?, ?, ?, ?)",
                   [(r["id"], r["part"], r["day"], r["v"], r["x"]) for r in rows])
    yield db, rows
    db.close()


def partitions(rows):
    """Rows of each partition in the ORDER BY day, id order."""
    parts = {}
    for row in rows:
        parts.setdefault(row["part"], []).append(row)
    return {p: sorted(rs, key=lambda r: (r["day"], r["id"])) for p, rs in parts.items()}


def frame_bounds(ordered, kind, preceding, following):
    """Inclusive [lo, hi] of each row's frame within its ordered partition."""
    n = len(ordered)
    if kind == "ROWS":
        return [(max(0, i - preceding), min(n - 1, i + following)) for i in range(n)]
    keys = np.array([r["jd"] for r in ordered])
    lo = np.searchsorted(keys, keys - preceding, side="left")
    hi = np.searchsorted(keys, keys + following, side="right") - 1
    return list(zip(lo.tolist(), hi.tolist()))


def query(db, kind, preceding, following):
    order = "day, id" if kind == "ROWS" else "julianday(day)"
    exprs = [f"{f}(v) OVER w" for f in UNIVARIATE] + [f"{f}(v, x) OVER w" for f in BIVARIATE]
    exprs += [f"{e} OVER w" for e in OTHERS]
    sql = (f"SELECT id, {', '.join(exprs)} FROM s WINDOW w AS (PARTITION BY part ORDER BY {order} "
           f"{kind} BETWEEN {preceding} PRECEDING AND {following} FOLLOWING)")
    names = UNIVARIATE + BIVARIATE + OTHERS
    return {row[0]: dict(zip(names, row[1:])) for row in db.execute(sql)}


def univariate_oracle(values):
    n = len(values)
    if n == 0:
        return dict.fromkeys(UNIVARIATE)
    shifted = np.array(values) - values[0]
    return {
        "var_samp": float(np.var(shifted, ddof=1)) if n >= 2 else None,  # oracle: numpy.var
        "var_pop": float(np.var(shifted)),
        "stddev_samp": float(np.std(shifted, ddof=1)) if n >= 2 else None,  # oracle: numpy.std
        "stddev_pop": float(np.std(shifted)),
    }


def bivariate_oracle(pairs):
    n = len(pairs)
    out = dict.fromkeys(BIVARIATE)
    out["regr_count"] = n
    if n == 0:
        return out, {}
    y = np.array([p[0] for p in pairs])
    x = np.array([p[1] for p in pairs])
    out["regr_avgx"] = math.fsum(x) / n  # oracle: math.fsum
    out["regr_avgy"] = math.fsum(y) / n
    ys, xs = y - y[0], x - x[0]
    sxx, syy = float(np.var(xs) * n), float(np.var(ys) * n)  # oracle: numpy.var
    cov_pop = float(np.cov(xs, ys, ddof=0)[0, 1])  # oracle: numpy.cov
    out["regr_sxx"], out["regr_syy"], out["regr_sxy"] = sxx, syy, cov_pop * n
    out["covar_pop"] = cov_pop
    if n >= 2:
        out["covar_samp"] = float(np.cov(xs, ys, ddof=1)[0, 1])
    x_constant, y_constant = np.ptp(x) == 0, np.ptp(y) == 0
    if not x_constant and not y_constant:
        out["corr"] = float(np.corrcoef(xs, ys)[0, 1])  # oracle: numpy.corrcoef
    if not x_constant:
        fit = stats.linregress(xs, ys)  # oracle: scipy.stats.linregress
        out["regr_slope"] = float(fit.slope)
        out["regr_intercept"] = float(y[0] + fit.intercept - fit.slope * x[0])
        out["regr_r2"] = 1.0 if y_constant else float(fit.rvalue ** 2)
        if n >= 3:
            residuals = ys - (fit.intercept + fit.slope * xs)
            out["resid_sd"] = float(np.sqrt(np.sum(residuals ** 2) / (n - 2)))
            out["slope_stderr"] = float(fit.stderr)
    scales = {"sxx": sxx, "syy": syy, "n": n, "mean_x": abs(out["regr_avgx"]),
              "mean_y": abs(out["regr_avgy"])}
    return out, scales


def tolerance(name, expected, scales):
    """Absolute tolerance for numpy's result: 1e-12 of the statistic's natural size."""
    sxx, syy, n = scales.get("sxx", 0.0), scales.get("syy", 0.0), scales.get("n", 1)
    natural = {
        "covar_samp": math.sqrt(sxx * syy) / max(n - 1, 1),
        "covar_pop": math.sqrt(sxx * syy) / max(n, 1),
        "regr_sxy": math.sqrt(sxx * syy),
        "regr_sxx": sxx, "regr_syy": syy,
        "corr": 1.0, "regr_r2": 1.0,
        "regr_slope": math.sqrt(syy / sxx) if sxx else 0.0,
        "regr_intercept": scales.get("mean_y", 0.0) + (
            math.sqrt(syy / sxx) * scales.get("mean_x", 0.0) if sxx else 0.0),
        "resid_sd": math.sqrt(syy / max(n - 2, 1)),
        "slope_stderr": math.sqrt(syy / sxx / max(n - 2, 1)) if sxx else 0.0,
    }.get(name, 0.0)
    return 1e-12 * abs(expected) + 1e-12 * natural


def ewma_oracle(points, half_life):
    """Σw·x/Σw with w = 0.5**((t_max − t)/h): the README's definition, in numpy."""
    if not points:
        return None
    x = np.array([p[0] for p in points])
    t = np.array([p[1] for p in points])
    w = 0.5 ** ((t.max() - t) / half_life)
    return float(np.sum(w * x) / np.sum(w))


def same(ours, expected, tol):
    if ours is None or expected is None:
        return ours is None and expected is None
    return abs(ours - expected) <= tol


def test_every_function_over_every_frame(series):
    db, rows = series
    ordered_parts = partitions(rows)
    compared, failures = 0, []
    for kind, preceding, following in FRAMES:
        results = query(db, kind, preceding, following)
        for part, ordered in ordered_parts.items():
            for i, (lo, hi) in enumerate(frame_bounds(ordered, kind, preceding, following)):
                frame = ordered[lo:hi + 1]
                ours = results[ordered[i]["id"]]
                values = [r["v"] for r in frame if r["v"] is not None]
                pairs = [(r["v"], r["x"]) for r in frame if r["v"] is not None and r["x"] is not None]
                expected = univariate_oracle(values)
                bivariate, scales = bivariate_oracle(pairs)
                expected.update(bivariate)
                uni_scale = {"var_samp": 0, "var_pop": 0, "stddev_samp": 0, "stddev_pop": 0}
                for name in UNIVARIATE + BIVARIATE:
                    if name in ("regr_count", "regr_avgx", "regr_avgy"):
                        ok = ours[name] == expected[name]  # exact: count, math.fsum / n
                    elif name in uni_scale:
                        ok = same(ours[name], expected[name],
                                  1e-12 * abs(expected[name] or 0.0))
                    else:
                        ok = same(ours[name], expected[name],
                                  tolerance(name, expected[name] or 0.0, scales))
                    compared += 1
                    if not ok:
                        failures.append((kind, preceding, following, part, i, name, ours[name],
                                         expected[name]))
                # moving_mean: bit for bit, oracle: math.fsum(values) / n
                mean = math.fsum(values) / len(values) if values else None
                for name, least in (("moving_mean(v)", 1), ("moving_mean(v, 3)", 3)):
                    want = mean if len(values) >= least else None
                    compared += 1
                    if ours[name] != want:
                        failures.append((kind, preceding, following, part, i, name, ours[name], want))
                # ewma over days (t_max − t in whole days) and over plain numbers
                by_day = [(r["v"], r["jd"]) for r in frame if r["v"] is not None]
                for name, points, h in (("ewma(v, day, '3 days')", by_day, 3.0),
                                        ("ewma(v, x, 2.5)", pairs, 2.5)):
                    want = ewma_oracle(points, h)
                    compared += 1
                    spread = max(abs(p[0]) for p in points) if points else 0.0
                    if not same(ours[name], want, 1e-12 * spread):
                        failures.append((kind, preceding, following, part, i, name, ours[name], want))
    print(f"compared {compared} window results against numpy / scipy / math.fsum")
    assert not failures, f"{len(failures)} mismatches, first: {failures[:5]}"


def test_expanding_frame_against_pandas_ewm_and_fsum(series):
    db, rows = series
    result = {r[0]: r[1:] for r in db.execute(
        "SELECT id, ewma(v, day, '3 days') OVER w, moving_mean(v) OVER w FROM s "
        "WINDOW w AS (PARTITION BY part ORDER BY day, id ROWS UNBOUNDED PRECEDING)")}
    compared = 0
    for part, ordered in partitions(rows).items():
        values = pd.Series([np.nan if r["v"] is None else r["v"] for r in ordered])
        times = pd.to_datetime([r["day"] for r in ordered])
        # oracle: pandas ewm(halflife=..., times=...).mean()
        expected = values.ewm(halflife="3 days", times=times).mean()
        seen = []
        for i, row in enumerate(ordered):
            ours_ewma, ours_mean = result[row["id"]]
            if row["v"] is not None:
                seen.append(row["v"])
            if not seen:
                assert ours_ewma is None and ours_mean is None
                continue
            scale = max(abs(v) for v in seen)
            assert abs(ours_ewma - expected[i]) <= 1e-11 * scale, (part, i)
            assert ours_mean == math.fsum(seen) / len(seen)  # oracle: math.fsum
            compared += 2
    print(f"compared {compared} expanding-frame results against pandas ewm and math.fsum")


def exact_statistics(values, pairs):
    """Exact rational arithmetic (oracle: fractions.Fraction), rounded once at the end."""
    out = {}
    n = len(values)
    if n >= 2:
        v = [Fraction(a) for a in values]
        mean = sum(v) / n
        ss = sum((a - mean) ** 2 for a in v)
        out["var_samp"] = float(ss / (n - 1))
        out["stddev_samp"] = math.sqrt(ss / (n - 1))
    m = len(pairs)
    if m >= 1:
        y = [Fraction(p[0]) for p in pairs]
        x = [Fraction(p[1]) for p in pairs]
        mx, my = sum(x) / m, sum(y) / m
        sxx = sum((a - mx) ** 2 for a in x)
        syy = sum((b - my) ** 2 for b in y)
        sxy = sum((a - mx) * (b - my) for a, b in zip(x, y))
        out["regr_sxx"], out["covar_pop"] = float(sxx), float(sxy / m)
        if sxx:
            slope = sxy / sxx
            out["regr_slope"] = float(slope)
            out["regr_intercept"] = float(my - slope * mx)
            out["regr_r2"] = 1.0 if syy == 0 else float(sxy * sxy / (sxx * syy))
            if m >= 3:
                sse = syy - sxy * sxy / sxx
                out["resid_sd"] = math.sqrt(sse / (m - 2))
                out["slope_stderr"] = math.sqrt(sse / ((m - 2) * sxx))
    return out


def test_sample_of_frames_against_exact_rational_arithmetic(series):
    db, rows = series
    rng = random.Random(7)
    compared = 0
    for kind, preceding, following in FRAMES[1:7]:
        results = query(db, kind, preceding, following)
        for part, ordered in partitions(rows).items():
            bounds = frame_bounds(ordered, kind, preceding, following)
            for i in rng.sample(range(len(ordered)), 25):
                lo, hi = bounds[i]
                frame = ordered[lo:hi + 1]
                values = [r["v"] for r in frame if r["v"] is not None]
                pairs = [(r["v"], r["x"]) for r in frame if r["v"] is not None and r["x"] is not None]
                ours = results[ordered[i]["id"]]
                for name, exact in exact_statistics(values, pairs).items():
                    compared += 1
                    assert abs(ours[name] - exact) <= 1e-15 * abs(exact), (part, i, name, ours[name], exact)
    print(f"compared {compared} results against exact rational arithmetic")


def test_a_spike_that_left_the_frame_leaves_no_trace():
    # Values near 1e9 with cents; a 1e15 spike at row 10; the frame of 7 rows
    # ending at row 30 has long forgotten it. Property: the window's values
    # equal a fresh plain aggregate over the same 7 rows, bit for bit.
    rng = random.Random(3)
    values = [round(1e9 + rng.uniform(-500, 500), 2) for _ in range(40)]
    values[10] = 1e15
    db = connect()
    db.execute("CREATE TABLE t(i INTEGER PRIMARY KEY, y REAL, x REAL)")
    db.executemany("INSERT INTO t VALUES (?, ?, ?)", [(i, v, i * 0.5 + 1e6) for i, v in enumerate(values)])
    functions = [f"{f}(y)" for f in UNIVARIATE] + [f"{f}(y, x)" for f in BIVARIATE] + [
        "moving_mean(y)", "ewma(y, x, 1.5)"]
    window = db.execute(
        f"SELECT {', '.join(f + ' OVER w' for f in functions)} FROM t "
        "WINDOW w AS (ORDER BY i ROWS 6 PRECEDING) ORDER BY i LIMIT 1 OFFSET 30").fetchone()
    fresh = db.execute(f"SELECT {', '.join(functions)} FROM t WHERE i BETWEEN 24 AND 30").fetchone()
    assert window == fresh
    # The same frame with SQLite's own sliding avg() shows why this matters.
    print("sliding avg:", db.execute("SELECT avg(y) OVER (ORDER BY i ROWS 6 PRECEDING) FROM t "
                                     "ORDER BY i LIMIT 1 OFFSET 30").fetchone()[0],
          "exact mean:", math.fsum(values[24:31]) / 7)


def test_moving_mean_over_adversarial_doubles_is_fsum_bit_for_bit():
    # Random signs and exponents over most of the double range, subnormals,
    # exact ties for round-half-even, and huge terms that cancel.
    rng = random.Random(11)
    values = []
    for _ in range(3000):
        kind = rng.random()
        if kind < 0.6:
            v = rng.choice([-1, 1]) * rng.random() * 10.0 ** rng.randint(-300, 300)
        elif kind < 0.7:
            v = rng.choice([-1, 1]) * rng.randint(1, 1000) * 5e-324  # subnormal
        elif kind < 0.85:
            v = rng.choice([2.0 ** 53, -(2.0 ** 53), 1.0, -1.0, 3.0, 2.0 ** -53, 0.5])  # ties
        else:
            v = rng.choice([1e300, -1e300, 0.0, -0.0])
        values.append(v)
    db = connect()
    db.execute("CREATE TABLE a(i INTEGER PRIMARY KEY, v REAL)")
    db.executemany("INSERT INTO a VALUES (?, ?)", list(enumerate(values)))
    compared = 0
    for width in (1, 2, 3, 5, 17, 64):
        got = [r[0] for r in db.execute(
            f"SELECT moving_mean(v) OVER (ORDER BY i ROWS {width - 1} PRECEDING) FROM a")]
        for i, ours in enumerate(got):
            frame = values[max(0, i - width + 1):i + 1]
            expected = math.fsum(frame) / len(frame)  # oracle: math.fsum
            assert ours == expected, (width, i, frame, ours, expected)
            compared += 1
    # A frame with EXCLUDE, which SQLite recomputes without the inverse.
    got = [r[0] for r in db.execute(
        "SELECT moving_mean(v) OVER (ORDER BY i ROWS BETWEEN 3 PRECEDING AND 3 FOLLOWING "
        "EXCLUDE CURRENT ROW) FROM a")]
    for i, ours in enumerate(got):
        frame = [values[j] for j in range(max(0, i - 3), min(len(values), i + 4)) if j != i]
        assert ours == math.fsum(frame) / len(frame), (i, frame)  # oracle: math.fsum
        compared += 1
    print(f"compared {compared} moving means of adversarial doubles with math.fsum, bit for bit")
