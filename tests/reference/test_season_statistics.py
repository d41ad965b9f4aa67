# SPDX-License-Identifier: MIT
"""mann_kendall_p, the seasonal theil_sen_slope and mad against outside references.

- mann_kendall_p(y, x): scipy.stats.kendalltau(x, y, method='asymptotic').pvalue
  on 2,000 seeded groups, n from 3 to 5,000 (log-uniform), with ties in y,
  ties in x, both, and none.
- mann_kendall_p(y, x, season): a brute-force O(n^2) S and Var(S) written here
  from the published formulas — Kendall's S per season, Var(S) with the tau-b
  tie corrections (Kendall 1975, the formula scipy.stats.kendalltau cites),
  summed over seasons (Hirsch, Slack & Smith 1982) — then p = 2(1 - Phi(|z|))
  with scipy.stats.norm.sf.
- As window functions: every frame of several frame shapes, against the same.
- theil_sen_slope(y, x, season): numpy.median of every within-season slope
  with distinct x (the definition, brute force).
- mad(x): scipy.stats.median_abs_deviation(x) (scale 1.0), aggregate and
  every frame of sliding windows.
"""
import math
import random

import numpy as np
import pytest
import scipy.stats

from conftest import connect
from report_oracle import seasonal_kendall_p

REL = 1e-9  # p-values: the same formula in a different order of operations


def close(got, expected, rel=REL):
    if expected is None or (isinstance(expected, float) and math.isnan(expected)):
        return got is None
    return got is not None and math.isclose(got, expected, rel_tol=rel, abs_tol=1e-300)


def sample(rng, n, kind):
    """x and y with the ties `kind` asks for."""
    if kind in ("x ties", "both"):
        x = [rng.randint(0, max(2, n // 4)) for _ in range(n)]
    else:
        x = rng.sample(range(10 * n), n)
    trend = rng.choice([0.0, 0.001, 0.01, -0.005])
    if kind in ("y ties", "both"):
        y = [round(trend * xi + rng.gauss(0, 1)) for xi in x]
    else:
        y = [trend * xi + rng.gauss(0, 1) for xi in x]
    return x, y


def test_plain_p_equals_scipy_kendalltau_asymptotic_on_2000_groups():
    rng = random.Random(9001)
    kinds = ["none", "y ties", "x ties", "both"]
    groups = []
    for g in range(2000):
        n = 3 if g == 0 else 5000 if g == 1 else int(math.exp(rng.uniform(math.log(3), math.log(5000))))
        groups.append((g, *sample(rng, n, kinds[g % 4])))
    db = connect()
    db.execute("CREATE TABLE t(g INTEGER, x REAL, y REAL)")
    db.executemany("INSERT INTO t VALUES (?, ?, ?)", ((g, xi, yi) for g, x, y in groups for xi, yi in zip(x, y)))
    got = dict(db.execute("SELECT g, mann_kendall_p(y, x) FROM t GROUP BY g"))
    compared = 0
    for g, x, y in groups:
        expected = scipy.stats.kendalltau(x, y, method="asymptotic").pvalue  # oracle
        assert close(got[g], float(expected)), (g, len(x), got[g], expected)
        compared += 1
    print(f"mann_kendall_p: {compared} groups compared with scipy.stats.kendalltau, "
          f"{sum(len(x) for _, x, _ in groups)} rows")
    assert compared == 2000


def brute_p(rows):
    """rows: (x, y, season); the brute-force seasonal Kendall test of report_oracle,
    written from the published formulas (Hirsch, Slack & Smith 1982)."""
    return seasonal_kendall_p(rows)


def seasonal_rows(rng, n, seasons):
    rows = []
    for i in range(n):
        season = i % seasons + 1
        y = 10 * season + 0.02 * i * rng.choice([0, 1]) + round(rng.gauss(0, 2))
        rows.append((i // seasons + rng.choice([0, 0, 0.5]), y, season))
    return rows


def test_seasonal_p_equals_a_brute_force_sum_over_seasons():
    rng = random.Random(1982)
    db = connect()
    compared = 0
    for g in range(300):
        rows = seasonal_rows(rng, rng.randint(2, 300), rng.choice([1, 2, 4, 12]))
        got = db.execute("WITH t(x, y, s) AS (SELECT value ->> 0, value ->> 1, value ->> 2 FROM json_each(?)) "
                         "SELECT mann_kendall_p(y, x, s) FROM t", (str([list(r) for r in rows]),)).fetchone()[0]
        assert close(got, brute_p(rows)), (g, len(rows))
        compared += 1
    print(f"seasonal mann_kendall_p: {compared} groups compared with the brute-force sum")
    assert compared == 300


FRAMES = [
    "ROWS BETWEEN 11 PRECEDING AND CURRENT ROW",
    "ROWS BETWEEN 5 PRECEDING AND 5 FOLLOWING",
    "ROWS BETWEEN UNBOUNDED PRECEDING AND CURRENT ROW",
    "ROWS BETWEEN CURRENT ROW AND UNBOUNDED FOLLOWING",
    "ROWS BETWEEN 8 PRECEDING AND 1 PRECEDING",
    "RANGE BETWEEN 6 PRECEDING AND CURRENT ROW",
    "GROUPS BETWEEN 2 PRECEDING AND 2 FOLLOWING EXCLUDE CURRENT ROW",
]


def frame_rows(db, frame, order_count):
    """The ids each frame holds, from SQLite itself (json_group_array over the same frame)."""
    return [json_ids for (json_ids,) in db.execute(
        f"SELECT json_group_array(id) OVER (ORDER BY o {frame}) FROM w ORDER BY o, id")]


@pytest.mark.parametrize("frame", FRAMES)
def test_window_forms_equal_their_references_on_every_frame(frame):
    import json
    rng = random.Random(hash(frame) % 1000)
    db = connect()
    db.execute("CREATE TABLE w(id INTEGER PRIMARY KEY, o INTEGER, x REAL, y REAL, s INTEGER)")
    rows = []
    for i in range(160):
        rows.append((i, i // 2, i // 3 + rng.choice([0, 0.5]), round(rng.gauss(0.05 * i, 3)), i % 4 + 1))
    db.executemany("INSERT INTO w VALUES (?, ?, ?, ?, ?)", rows)
    by_id = {r[0]: r for r in rows}
    got = db.execute(f"SELECT mann_kendall_p(y, x) OVER f, mann_kendall_p(y, x, s) OVER f, "
                     f"theil_sen_slope(y, x, s) OVER f, mad(y) OVER f FROM w "
                     f"WINDOW f AS (ORDER BY o {frame}) ORDER BY o, id").fetchall()
    frames = [json.loads(j) for j in frame_rows(db, frame, None)]
    compared = 0
    for (plain, seasonal, slope, mad), ids in zip(got, frames):
        members = [by_id[i] for i in ids]
        xs = [m[2] for m in members]
        ys = [m[3] for m in members]
        if len(members) >= 3 and len(set(xs)) > 1 and len(set(ys)) > 1:
            expected = float(scipy.stats.kendalltau(xs, ys, method="asymptotic").pvalue)  # oracle
        else:
            # Two rows: scipy divides 0 by 0 in its last term and gives NaN;
            # the published formula (brute force above) gives Var(S) = 1.
            expected = brute_p([(m[2], m[3], 0) for m in members])
        assert close(plain, expected), (ids, plain, expected)
        assert close(seasonal, brute_p([(m[2], m[3], m[4]) for m in members])), ids
        slopes = [(b[3] - a[3]) / (b[2] - a[2]) for a in members for b in members
                  if a[4] == b[4] and b[2] > a[2]]
        assert slope == (float(np.median(slopes)) if slopes else None), ids  # oracle: numpy.median
        expected_mad = float(scipy.stats.median_abs_deviation(ys)) if ys else None  # oracle
        assert mad == expected_mad, ids
        compared += 1
    print(f"{frame}: {compared} frames compared")
    assert compared == 160


def test_seasonal_sen_slope_equals_the_brute_force_median_of_within_season_slopes():
    rng = random.Random(68)
    db = connect()
    compared = 0
    for g in range(200):
        n = rng.randint(2, 400)
        seasons = rng.choice([1, 3, 12, 52])
        rows = [(i // seasons + rng.choice([0, 0, 1]), rng.gauss(0.3 * i, 5) + 7 * (i % seasons), i % seasons)
                for i in range(n)]
        got = db.execute("WITH t(x, y, s) AS (SELECT value ->> 0, value ->> 1, value ->> 2 FROM json_each(?)) "
                         "SELECT theil_sen_slope(y, x, s) FROM t", (repr([list(r) for r in rows]),)).fetchone()[0]
        slopes = [(b[1] - a[1]) / (b[0] - a[0]) for a in rows for b in rows if a[2] == b[2] and b[0] > a[0]]
        expected = float(np.median(slopes)) if slopes else None  # oracle: numpy.median of the definition
        assert got == expected, (g, n, seasons)
        compared += 1
    print(f"seasonal theil_sen_slope: {compared} groups compared")
    assert compared == 200


def test_mad_equals_scipy_median_abs_deviation():
    rng = random.Random(1993)
    db = connect()
    compared = 0
    for g in range(500):
        n = rng.randint(1, 2000)
        kind = g % 3
        if kind == 0:
            values = [rng.gauss(100, 15) for _ in range(n)]
        elif kind == 1:
            values = [rng.randint(0, 20) for _ in range(n)]  # many ties, integers
        else:
            values = [rng.lognormvariate(3, 1.5) * rng.choice([1, 1, 1, 1e6]) for _ in range(n)]
        got = db.execute("SELECT mad(value) FROM json_each(?)", (repr(values),)).fetchone()[0]
        expected = float(scipy.stats.median_abs_deviation(values))  # oracle, scale 1.0
        assert got == expected, (g, n)
        compared += 1
    print(f"mad: {compared} groups compared with scipy.stats.median_abs_deviation")
    assert compared == 500
