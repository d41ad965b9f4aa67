# SPDX-License-Identifier: MIT
"""Order statistics against numpy and scipy, computed at test time.

Seeded random series in three partitions — values near 1e9 with cents and
1e12 spikes; values near 1e12 with cents in long runs of equal values; small
integers with many ties, negatives and -1e15 spikes — with NULLs, repeated
days and gaps. median and percentile_cont run as plain aggregates and over
ROWS frames of widths 1, 2, 7, 31 and 365, centred ROWS frames, RANGE frames
over julianday(day), with and without PARTITION BY. Every row's result is
compared with numpy.percentile(frame, 100·p, method="linear") on that row's
frame, for exact equality: almanac does numpy's own arithmetic, so the
doubles must be identical, not merely close.

theil_sen_slope runs as a plain aggregate (including collinear points, ties
in x, constant y) and as a window function, against
scipy.stats.theilslopes(y, x).slope, also for exact equality: both take the
median of the same double-precision slopes. A 10,000-row case prints its time.
"""
import datetime
import time
import warnings

import numpy as np
import pytest
from scipy import stats

from conftest import connect

SEED = 20260301
PER_PARTITION = 800

# (name in SQL, p, numpy.percentile's q); q = 100·p exactly, and numpy
# divides q by 100 back to the same double p.
QUANTILES = [("median(x)", 0.5, 50), ("percentile_cont(x, 0.0)", 0.0, 0),
             ("percentile_cont(x, 0.1)", 0.1, 10), ("percentile_cont(x, 0.25)", 0.25, 25),
             ("percentile_cont(x, 0.9)", 0.9, 90), ("percentile_cont(x, 1)", 1.0, 100),
             ("percentile_cont(x, 1.0/3)", 1.0 / 3, None)]

# (kind, preceding, following)
FRAMES = [("ROWS", 0, 0), ("ROWS", 1, 0), ("ROWS", 6, 0), ("ROWS", 30, 0), ("ROWS", 364, 0),
          ("ROWS", 3, 3), ("ROWS", 15, 15), ("RANGE", 6, 0), ("RANGE", 3, 3)]

compared = {"quantile": 0, "theil_sen": 0}


@pytest.fixture(scope="module", autouse=True)
def report_counts(request):
    yield
    capture = request.config.pluginmanager.getplugin("capturemanager")
    with capture.global_and_fixture_disabled():
        print(f"\norder statistics: {compared['quantile']} quantile results and "
              f"{compared['theil_sen']} Theil-Sen slopes compared with numpy/scipy")


def make_rows(seed=SEED, per_partition=PER_PARTITION):
    """(id, grp, day, x) rows; x is a float or None."""
    rng = np.random.default_rng(seed)
    rows = []
    start = datetime.date(2023, 1, 1)
    next_id = 1
    for grp in ("cents9", "runs12", "ties"):
        day = start
        run_value, run_left = None, 0
        for i in range(per_partition):
            day += datetime.timedelta(days=int(rng.choice([0, 1, 1, 1, 2, 5])))
            if grp == "cents9":
                x = 1e9 + int(rng.integers(0, 10**7)) / 100
                if rng.random() < 0.01:
                    x += 1e12
            elif grp == "runs12":
                if run_left == 0:
                    run_value = 1e12 + int(rng.integers(0, 10**6)) / 100
                    run_left = int(rng.integers(1, 60))
                run_left -= 1
                x = run_value
            else:
                x = float(rng.integers(-5, 6))
                if rng.random() < 0.01:
                    x = -1e15
            if rng.random() < 0.05:
                x = None
            rows.append((next_id, grp, day.isoformat(), x))
            next_id += 1
    return rows


@pytest.fixture(scope="module")
def series():
    connection = connect()
    connection.execute("CREATE TABLE s (id INTEGER PRIMARY KEY, grp TEXT, day TEXT, x REAL)")
    connection.executemany("INSERT INTO s VALUES (?, ?, ?, ?)", make_rows())
    # The oracle reads the same inputs back, julianday(day) included.
    fetched = connection.execute(
        "SELECT id, grp, julianday(day), x FROM s ORDER BY grp, id").fetchall()
    yield connection, fetched
    connection.close()


def frames_of(rows, kind, preceding, following):
    """For each row (in the given order), the list of rows in its frame."""
    result = []
    for i, row in enumerate(rows):
        if kind == "ROWS":
            result.append(rows[max(0, i - preceding): i + following + 1])
        else:
            jd = row[2]
            result.append([r for r in rows if jd - preceding <= r[2] <= jd + following])
    return result


def frame_clause(kind, preceding, following):
    return (f"{kind} BETWEEN {preceding} PRECEDING AND "
            + (f"{following} FOLLOWING" if following else "CURRENT ROW"))


def expected_quantile(values, p, q):
    if not values:
        return None
    if q is None:
        # oracle: numpy.quantile(..., method="linear") — numpy.percentile's own
        # code path, given p directly (1/3 has no exact q = 100·p).
        return float(np.quantile(np.array(values), p, method="linear"))
    # oracle: numpy.percentile(..., method="linear")
    return float(np.percentile(np.array(values), q, method="linear"))


def check(got, expected, what):
    assert got == expected, f"{what}: almanac {got!r}, oracle {expected!r}"


@pytest.mark.parametrize("kind,preceding,following", FRAMES)
def test_quantiles_over_partitioned_frames(series, kind, preceding, following):
    connection, fetched = series
    order = "id" if kind == "ROWS" else "julianday(day)"
    clause = frame_clause(kind, preceding, following)
    columns = ", ".join(f"{fn} OVER (PARTITION BY grp ORDER BY {order} {clause})"
                        for fn, _, _ in QUANTILES)
    got = {row[0]: row[1:] for row in
           connection.execute(f"SELECT id, {columns} FROM s")}
    for grp in ("cents9", "runs12", "ties"):
        rows = [r for r in fetched if r[1] == grp]
        for row, frame in zip(rows, frames_of(rows, kind, preceding, following)):
            values = [r[3] for r in frame if r[3] is not None]
            for k, (fn, p, q) in enumerate(QUANTILES):
                check(got[row[0]][k], expected_quantile(values, p, q),
                      f"{fn} {clause} row {row[0]}")
                compared["quantile"] += 1


def test_quantiles_with_exclude_and_groups_frames(series):
    # EXCLUDE makes SQLite recompute each frame without the inverse; GROUPS
    # frames slide by whole sets of peers (rows of the same day).
    connection, fetched = series
    got = {row[0]: row[1:] for row in connection.execute(
        "SELECT id, median(x) OVER (PARTITION BY grp ORDER BY id"
        "   ROWS BETWEEN 3 PRECEDING AND 3 FOLLOWING EXCLUDE CURRENT ROW),"
        " percentile_cont(x, 0.9) OVER (PARTITION BY grp ORDER BY julianday(day)"
        "   GROUPS BETWEEN 2 PRECEDING AND CURRENT ROW)"
        " FROM s")}
    for grp in ("cents9", "runs12", "ties"):
        rows = [r for r in fetched if r[1] == grp]
        days = sorted({r[2] for r in rows})
        group_of = {jd: k for k, jd in enumerate(days)}
        for i, row in enumerate(rows):
            values = [r[3] for r in rows[max(0, i - 3): i + 4] if r is not row and r[3] is not None]
            check(got[row[0]][0], expected_quantile(values, 0.5, 50), f"median EXCLUDE row {row[0]}")
            g = group_of[row[2]]
            values = [r[3] for r in rows if g - 2 <= group_of[r[2]] <= g and r[3] is not None]
            check(got[row[0]][1], expected_quantile(values, 0.9, 90), f"p90 GROUPS row {row[0]}")
            compared["quantile"] += 2


def test_quantiles_over_the_whole_table(series):
    connection, fetched = series
    rows = sorted(fetched, key=lambda r: r[0])
    got = connection.execute(
        "SELECT median(x) OVER (ORDER BY id ROWS 6 PRECEDING),"
        " percentile_cont(x, 0.9) OVER (ORDER BY id ROWS BETWEEN 10 PRECEDING AND 5 FOLLOWING)"
        " FROM s ORDER BY id").fetchall()
    for i, (median, p90) in enumerate(got):
        values = [r[3] for r in rows[max(0, i - 6): i + 1] if r[3] is not None]
        check(median, expected_quantile(values, 0.5, 50), f"median row {i}")
        values = [r[3] for r in rows[max(0, i - 10): i + 6] if r[3] is not None]
        check(p90, expected_quantile(values, 0.9, 90), f"p90 row {i}")
        compared["quantile"] += 2


def test_quantiles_as_plain_aggregates(series):
    connection, fetched = series
    for fn, p, q in QUANTILES:
        for grp, got in connection.execute(f"SELECT grp, {fn} FROM s GROUP BY grp"):
            values = [r[3] for r in fetched if r[1] == grp and r[3] is not None]
            check(got, expected_quantile(values, p, q), f"{fn} group {grp}")
            compared["quantile"] += 1
    # The frame that grows without end is the same thing, row by row.
    got = connection.execute(
        "SELECT median(x) OVER (PARTITION BY grp ORDER BY id) FROM s ORDER BY grp, id").fetchall()
    running = {}
    for row, (median,) in zip(fetched, got):
        values = running.setdefault(row[1], [])
        if row[3] is not None:
            values.append(row[3])
        check(median, expected_quantile(values, 0.5, 50), f"running median row {row[0]}")
        compared["quantile"] += 1


def test_nulls_empty_groups_and_numeric_text(db):
    db.execute("CREATE TABLE t (g TEXT, x)")
    db.executemany("INSERT INTO t VALUES (?, ?)", [
        ("nulls", None), ("nulls", None), ("text", " 12.5"), ("text", "1e3"), ("text", "-7"),
        ("text", "0.125 "), ("text", None)])
    got = dict(db.execute("SELECT g, median(x) FROM t GROUP BY g"))
    # SQL convention for aggregates over no values (common practice).
    assert got["nulls"] is None
    # oracle: numpy.percentile(..., method="linear") on the numbers the TEXT spells
    assert got["text"] == float(np.percentile([12.5, 1e3, -7.0, 0.125], 50, method="linear"))
    assert db.execute("SELECT median(x), percentile_cont(x, 0.3) FROM t WHERE 0").fetchone() == (
        None, None)  # no rows at all: NULL (common practice)
    # A NULL p skips the row, like a NULL x (common practice for aggregates).
    assert db.execute("SELECT percentile_cont(x, NULL) FROM t").fetchone() == (None,)
    # p as numeric TEXT is the number it spells.
    assert (db.execute("SELECT percentile_cont(x, '0.25') FROM t WHERE g = 'text'").fetchone()[0]
            == float(np.percentile([12.5, 1e3, -7.0, 0.125], 25, method="linear")))
    # Frames that hold no values give NULL (common practice).
    got = [r[0] for r in db.execute(
        "SELECT median(x) OVER (ORDER BY rowid ROWS BETWEEN 3 PRECEDING AND 2 PRECEDING) FROM t")]
    assert got[:2] == [None, None] and got[2] is None
    compared["quantile"] += 5


# ---- Theil–Sen ---------------------------------------------------------------

def expected_slope(points):
    """oracle: scipy.stats.theilslopes(y, x).slope; None with < 2 distinct x."""
    if len({x for x, _ in points}) < 2:
        return None
    xs = np.array([x for x, _ in points], dtype=float)
    ys = np.array([y for _, y in points], dtype=float)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        return float(stats.theilslopes(ys, xs).slope)


def test_theil_sen_as_plain_aggregate(db):
    rng = np.random.default_rng(SEED + 1)
    groups = {
        "trend": [(float(i), 3.0 * i + float(rng.normal(0, 10))) for i in range(400)],
        "cents9": [(2460000.5 + i // 3, 1e9 + int(rng.integers(0, 10**6)) / 100) for i in range(900)],
        "spikes": [(float(i), (1e12 if i % 17 == 0 else 0.0) + int(rng.integers(0, 1000)) / 100)
                   for i in range(300)],
        "runs": [(float(i), float(i // 40)) for i in range(500)],
        "collinear": [(float(i), 2.5 * i + 7) for i in range(200)],
        "thirds": [(float(i), i / 3.0) for i in range(300)],
        "constant": [(float(i), 4.25) for i in range(120)],
        "x_ties": [(float(i // 5), float(rng.normal())) for i in range(250)],
        "two": [(1.0, 2.0), (3.0, 7.0)],
        "same_x": [(5.0, 1.0), (5.0, 2.0), (5.0, 9.0)],
        "one": [(1.0, 1.0)],
    }
    rows = [(g, x, y) for g, points in groups.items() for x, y in points]
    order = rng.permutation(len(rows))  # arrival order must not matter
    db.execute("CREATE TABLE p (g TEXT, x REAL, y REAL)")
    db.executemany("INSERT INTO p VALUES (?, ?, ?)", [rows[i] for i in order])
    db.executemany("INSERT INTO p VALUES (?, ?, ?)", [("trend", None, 1.0), ("trend", 2.0, None)])
    got = dict(db.execute("SELECT g, theil_sen_slope(y, x) FROM p GROUP BY g"))
    for g, points in groups.items():
        check(got[g], expected_slope(points), f"theil_sen_slope group {g}")
        compared["theil_sen"] += 1


@pytest.mark.parametrize("kind,preceding,following",
                         [("ROWS", 1, 0), ("ROWS", 30, 0), ("ROWS", 15, 15), ("RANGE", 6, 0)])
def test_theil_sen_over_partitioned_frames(series, kind, preceding, following):
    connection, fetched = series
    order = "id" if kind == "ROWS" else "julianday(day)"
    clause = frame_clause(kind, preceding, following)
    got = dict(connection.execute(
        f"SELECT id, theil_sen_slope(x, julianday(day)) OVER (PARTITION BY grp ORDER BY {order}"
        f" {clause}) FROM s"))
    for grp in ("cents9", "runs12", "ties"):
        rows = [r for r in fetched if r[1] == grp]
        for row, frame in zip(rows, frames_of(rows, kind, preceding, following)):
            points = [(r[2], r[3]) for r in frame if r[3] is not None]
            check(got[row[0]], expected_slope(points), f"theil_sen_slope {clause} row {row[0]}")
            compared["theil_sen"] += 1


def test_theil_sen_over_a_year_wide_frame(series):
    connection, fetched = series
    rows = [r for r in fetched if r[1] == "cents9"][:500]
    got = connection.execute(
        "SELECT theil_sen_slope(x, julianday(day)) OVER (ORDER BY id ROWS 364 PRECEDING)"
        " FROM s WHERE grp = 'cents9' ORDER BY id LIMIT 500").fetchall()
    for row, frame, (slope,) in zip(rows, frames_of(rows, "ROWS", 364, 0), got):
        points = [(r[2], r[3]) for r in frame if r[3] is not None]
        check(slope, expected_slope(points), f"theil_sen_slope 365 rows, row {row[0]}")
        compared["theil_sen"] += 1


def test_theil_sen_on_ten_thousand_rows(db, capsys):
    rng = np.random.default_rng(SEED + 2)
    n = 10_000
    xs = [2460000.5 + i // 2 for i in range(n)]  # two rows a day: ties in x
    ys = [1e9 + 25.0 * (i // 2) + int(rng.integers(0, 10**6)) / 100 + (1e12 if i % 500 == 0 else 0)
          for i in range(n)]
    db.execute("CREATE TABLE big (x REAL, y REAL)")
    db.executemany("INSERT INTO big VALUES (?, ?)", zip(xs, ys))
    started = time.perf_counter()
    (got,) = db.execute("SELECT theil_sen_slope(y, x) FROM big").fetchone()
    almanac_seconds = time.perf_counter() - started
    started = time.perf_counter()
    expected = expected_slope(list(zip(xs, ys)))
    scipy_seconds = time.perf_counter() - started
    compared["theil_sen"] += 1
    with capsys.disabled():
        print(f"\ntheil_sen_slope on {n} rows: almanac {almanac_seconds:.3f} s,"
              f" scipy.stats.theilslopes {scipy_seconds:.1f} s")
    check(got, expected, "theil_sen_slope on 10,000 rows")


