# SPDX-License-Identifier: MIT
"""TEXT seasons in theil_sen_slope(y, x, season) and mann_kendall_p(y, x, season).

DESIGN ("Trend, season and noise, apart"): any non-NULL value is a season,
numbers by value and TEXT by its bytes, and the per-season sums run in
SQLite's order of the seasons, so seasons coded as text give the same bits
as the same seasons coded as numbers in that order. Checked bit for bit
against the integer-coded form (struct.pack of the doubles), as plain
aggregates and as sliding windows, and against the outside reference for
the p-value: the published seasonal Kendall sums (report_oracle, Hirsch,
Slack & Smith 1982) and numpy.median of the within-season slopes.
"""
import random
import struct

import numpy as np
import pytest

from conftest import connect
from report_oracle import seasonal_kendall_p  # the published sums, written out O(n^2)

# Labels whose byte order is the order of their codes 1..7 ('Fri' < 'Mon' < ...).
LABELS = sorted(["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"])


def bits(value):
    return None if value is None else struct.pack("<d", value)


def table(db, rng, n, seasons):
    db.execute("DROP TABLE IF EXISTS t")
    db.execute("CREATE TABLE t(i INTEGER, x REAL, y REAL, code INTEGER, label TEXT)")
    rows = []
    for i in range(n):
        code = rng.randrange(seasons) + 1
        y = round(rng.gauss(100, 15) + 0.3 * i + 5 * code, 2)
        if rng.random() < 0.1:
            y = round(y)  # ties in y
        rows.append((i, i // seasons, y, code, LABELS[code - 1]))
    db.executemany("INSERT INTO t VALUES (?, ?, ?, ?, ?)", rows)
    return rows


def test_text_seasons_give_the_bits_of_integer_seasons_as_aggregates():
    db = connect()
    rng = random.Random(2026)
    compared = 0
    for case in range(40):
        rows = table(db, rng, rng.randrange(5, 400), rng.randrange(1, 8))
        for fn in ("theil_sen_slope", "mann_kendall_p"):
            by_code, by_label = db.execute(f"SELECT {fn}(y, x, code), {fn}(y, x, label) FROM t").fetchone()
            assert bits(by_code) == bits(by_label), (case, fn)  # DESIGN: the same bits
            compared += 1
        # and the value itself against the outside references
        expected_p = seasonal_kendall_p([(r[1], r[2], r[4]) for r in rows])  # published: Hirsch et al. 1982
        got_p = db.execute("SELECT mann_kendall_p(y, x, label) FROM t").fetchone()[0]
        if expected_p is None:
            assert got_p is None
        else:
            assert got_p == pytest.approx(expected_p, rel=1e-9)
        slopes = [(b[2] - a[2]) / (b[1] - a[1]) for a in rows for b in rows if a[4] == b[4] and b[1] > a[1]]
        got_slope = db.execute("SELECT theil_sen_slope(y, x, label) FROM t").fetchone()[0]
        assert got_slope == (float(np.median(slopes)) if slopes else None)  # oracle: numpy.median
    print(f"{compared} aggregates compared bit for bit")
    assert compared == 80


def test_text_seasons_give_the_bits_of_integer_seasons_in_sliding_windows():
    db = connect()
    rng = random.Random(7)
    table(db, rng, 300, 7)
    compared = 0
    for fn in ("theil_sen_slope", "mann_kendall_p"):
        got = db.execute(f"SELECT {fn}(y, x, code) OVER w, {fn}(y, x, label) OVER w FROM t "
                         f"WINDOW w AS (ORDER BY i ROWS BETWEEN 40 PRECEDING AND CURRENT ROW)").fetchall()
        for by_code, by_label in got:
            assert bits(by_code) == bits(by_label)  # DESIGN: the same bits
            compared += 1
    print(f"{compared} window frames compared bit for bit")
    assert compared == 600


def test_numbers_come_before_text_as_sqlite_orders_them():
    # SQLite's order (its documentation on datatypes, from memory): numbers, then TEXT.
    # 3 and '3' are two seasons; the number sorts first, as ORDER BY puts it.
    db = connect()
    order = [r[0] for r in db.execute("SELECT s FROM (SELECT '3' AS s UNION ALL SELECT 3 UNION ALL SELECT 'a') ORDER BY s")]
    assert order == [3, "3", "a"]
    got = db.execute("WITH t(y, x, s) AS (VALUES (1, 1, 3), (3, 2, 3), (10, 1, '3'), (11, 2, '3')) "
                     "SELECT theil_sen_slope(y, x, s) FROM t").fetchone()[0]
    assert got == 1.5  # by hand: slopes 2 (season 3) and 1 (season '3'), median 1.5
