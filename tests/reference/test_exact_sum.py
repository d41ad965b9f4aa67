# SPDX-License-Identifier: MIT
"""exact_sum against math.fsum and Python's integers, at test time.

- Adversarial doubles (huge terms that cancel, subnormals, ties to even,
  0.1 repeated, values near 1e9 with 1e15 spikes): bit for bit against
  math.fsum(values).
- Sliding frames of several widths (ROWS and centred ROWS, PARTITION BY):
  every row's result bit for bit against a fresh math.fsum of that row's frame.
- INTEGER input: against Python's unbounded integers, INTEGER while the total
  fits in 64 bits, and math.fsum of the values as floats beyond.
"""
import math
import random
from fractions import Fraction

import pytest

from conftest import connect

compared = {}


def count(what, n=1):
    compared[what] = compared.get(what, 0) + n


def teardown_module():
    print(f"\ncompared: {compared}")


def adversarial_series(rng):
    """Lists of doubles that defeat naive and pairwise summation."""
    series = [
        [0.1] * 10,
        [1e308, 1e308, -1e308, -1e308, 1e-300],
        [1e100, 1.0, -1e100, 1e-100],
        [2.0 ** 53, 1.0, 1.0],                     # ties to even twice
        [2.0 ** 53, 1.0, 2.0 ** -60],             # a tie broken by a tiny term
        [5e-324, 5e-324, -1e-320, 1e-310],        # subnormals
        [1.7976931348623157e308, -1.7976931348623157e308, 3.0],
        [1e16, 1.0, -1e16, 1.0, 1e-16],
    ]
    for _ in range(200):
        n = rng.randint(1, 60)
        values = []
        for _ in range(n):
            kind = rng.random()
            if kind < 0.4:
                values.append(round(1e9 + rng.uniform(0, 1000), 2))
            elif kind < 0.5:
                values.append(rng.choice([1e15, -1e15, 1e22, -1e22]))
            elif kind < 0.8:
                values.append(rng.uniform(-1, 1) * 10.0 ** rng.randint(-300, 300))
            else:
                values.append(math.ldexp(rng.getrandbits(53), rng.randint(-1100, 960)))
        # Cancel a random part exactly, so the true sum is small against the terms.
        values += [-v for v in rng.sample(values, rng.randint(0, len(values)))]
        rng.shuffle(values)
        series.append(values)
    return series


def test_adversarial_sums_are_bit_identical_to_fsum():
    db = connect()
    rng = random.Random(8)
    for values in adversarial_series(rng):
        db.execute("DROP TABLE IF EXISTS s")
        db.execute("CREATE TABLE s(x REAL)")
        db.executemany("INSERT INTO s VALUES (?)", [(v,) for v in values])
        got, kind = db.execute("SELECT exact_sum(x), typeof(exact_sum(x)) FROM s").fetchone()
        assert kind == "real"
        try:
            expected = math.fsum(values)  # oracle: math.fsum(values)
            count("adversarial sums against fsum")
        except OverflowError:
            # fsum's own partials overflow near 1e308; oracle: float(sum of
            # fractions.Fraction), Python's correctly rounded exact rational.
            expected = float(sum(Fraction(v) for v in values))
            count("adversarial sums against Fraction")
        assert got == expected, values


@pytest.mark.parametrize("preceding,following", [(0, 0), (1, 0), (6, 0), (30, 0), (3, 3), (15, 15)])
def test_sliding_frames_equal_a_fresh_fsum_of_each_frame(preceding, following):
    db = connect()
    rng = random.Random(1000 + preceding * 37 + following)
    rows = []
    for part in ("a", "b"):
        for i in range(400):
            kind = rng.random()
            if kind < 0.05:
                v = None
            elif kind < 0.1:
                v = rng.choice([1e15, -1e15, 1e300, 2.0 ** -1070])
            else:
                v = round(1e9 + rng.uniform(0, 50), 2)
            rows.append((part, i, v))
    db.execute("CREATE TABLE s(part TEXT, n INTEGER, x REAL)")
    db.executemany("INSERT INTO s VALUES (?, ?, ?)", rows)
    got = db.execute(
        f"SELECT part, n, exact_sum(x) OVER (PARTITION BY part ORDER BY n "
        f"ROWS BETWEEN {preceding} PRECEDING AND {following} FOLLOWING) FROM s ORDER BY part, n"
    ).fetchall()
    by_part = {}
    for part, n, v in rows:
        by_part.setdefault(part, []).append(v)
    for part, n, value in got:
        series = by_part[part]
        frame = [v for v in series[max(0, n - preceding):n + following + 1] if v is not None]
        # oracle: math.fsum(frame), None for a frame without values (SQL's sum of no rows)
        expected = math.fsum(frame) if frame else None
        assert value == expected, (part, n)
        count("window frames")


def test_integer_totals_against_python_integers():
    db = connect()
    rng = random.Random(64)
    limit = 2 ** 63
    for _ in range(300):
        n = rng.randint(1, 40)
        scale = rng.choice([10, 10 ** 6, 2 ** 53, 2 ** 61, 2 ** 63 - 1])
        values = [rng.randint(-scale, scale) for _ in range(n)]
        values = [max(-limit, min(limit - 1, v)) for v in values]
        db.execute("DROP TABLE IF EXISTS s")
        db.execute("CREATE TABLE s(x INTEGER)")
        db.executemany("INSERT INTO s VALUES (?)", [(v,) for v in values])
        got, kind = db.execute("SELECT exact_sum(x), typeof(exact_sum(x)) FROM s").fetchone()
        total = sum(values)  # oracle: Python's unbounded integer sum
        if -limit <= total < limit:
            assert kind == "integer" and got == total, values
            count("integer totals that fit")
        else:
            # oracle: math.fsum, which reads each int as the nearest float
            assert kind == "real" and got == math.fsum(values), values
            count("integer totals beyond 64 bits")


def test_a_sliding_integer_window_is_integer_again_once_the_overflow_left():
    db = connect()
    big = 2 ** 63 - 1
    values = [big, 1, 5, 7, -3]
    db.execute("CREATE TABLE s(n INTEGER, x INTEGER)")
    db.executemany("INSERT INTO s VALUES (?, ?)", list(enumerate(values)))
    got = db.execute("SELECT exact_sum(x) OVER (ORDER BY n ROWS 1 PRECEDING), "
                     "typeof(exact_sum(x) OVER (ORDER BY n ROWS 1 PRECEDING)) FROM s ORDER BY n").fetchall()
    for n, (value, kind) in enumerate(got):
        frame = values[max(0, n - 1):n + 1]
        total = sum(frame)  # oracle: Python's integer sum of the frame
        if total < 2 ** 63:
            assert (value, kind) == (total, "integer")
        else:
            assert (value, kind) == (math.fsum(frame), "real")  # oracle: math.fsum
        count("integer window frames")


def test_text_money_is_refused_where_sum_reads_it_as_one():
    db = connect()
    # SQLite's documented reading of text as a number: the longest numeric prefix, '1' (from memory).
    assert db.execute("SELECT sum(x) FROM (SELECT '1,050.00' AS x)").fetchone()[0] == 1.0
    with pytest.raises(Exception) as error:
        db.execute("SELECT exact_sum(x) FROM (SELECT '1,050.00' AS x)").fetchone()
    assert str(error.value).startswith("exact_sum(): argument 1 (x) = '1,050.00': expected a number;")
    count("refusals")
