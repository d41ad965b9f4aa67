# SPDX-License-Identifier: MIT
"""NIST StRD certified values against almanac's exact statistics.

Sources: NIST StRD linear regression dataset Norris and analysis
of variance datasets SmLs01-SmLs09, read at test time from the copies Debian's
python3-scipy ships; NIST StRD univariate NumAcc1/3/4 from memory. Each check
prints its number of correct digits, LRE = -log10(|value - certified| / |certified|).
"""
import math
import os
import pathlib
from fractions import Fraction

import pytest
import scipy

from conftest import connect

DATA = pathlib.Path(os.path.dirname(scipy.__file__)) / "stats" / "tests" / "data"


def lre(value, certified):
    """Log relative error (correct significant digits); exact agreement is reported as 17."""
    certified = Fraction(certified)
    error = abs(Fraction(value) - certified)
    if error == 0:
        return 17.0
    return -math.log10(float(error / abs(certified)))


def certified_number(lines, label):
    """The first number after `label` on the line that contains it."""
    for line in lines:
        if label in line:
            return line.split(label, 1)[1].split()[0]
    raise AssertionError(f"{label} not found")


def read_norris():
    lines = (DATA / "nist_linregress" / "Norris.dat").read_text().splitlines()
    start = [i for i, line in enumerate(lines) if line.startswith("Data:")][-1] + 1  # the table, not the header
    rows = [tuple(float(v) for v in line.split()) for line in lines[start:] if line.strip()]
    b0_line = next(line for line in lines if line.strip().startswith("B0"))
    b1_line = next(line for line in lines if line.strip().startswith("B1"))
    certified = {
        "regr_intercept": b0_line.split()[1],
        "regr_slope": b1_line.split()[1],
        "slope_stderr": b1_line.split()[2],
        "regr_r2": certified_number(lines, "R-Squared"),
    }
    # The residual SD is on the line after "Residual".
    residual_index = next(i for i, line in enumerate(lines) if line.strip() == "Residual")
    certified["resid_sd"] = lines[residual_index + 1].split()[-1]
    return rows, certified


NORRIS_FUNCTIONS = ["regr_intercept", "regr_slope", "resid_sd", "slope_stderr", "regr_r2"]


def test_norris_plain_aggregates():
    rows, certified = read_norris()
    assert len(rows) == 36  # NIST StRD Norris: 36 observations
    db = connect()
    db.execute("CREATE TABLE norris(y REAL, x REAL)")
    db.executemany("INSERT INTO norris VALUES (?, ?)", rows)
    select = ", ".join(f"{f}(y, x)" for f in NORRIS_FUNCTIONS)
    values = db.execute(f"SELECT {select} FROM norris").fetchone()
    for name, value in zip(NORRIS_FUNCTIONS, values):
        digits = lre(value, certified[name])  # NIST StRD Norris, certified value
        print(f"Norris {name:15} {value!r:24} certified {certified[name]:22} LRE {digits:5.2f}")
        assert digits >= 12, name


def test_norris_through_a_sliding_frame_that_removed_other_rows():
    rows, certified = read_norris()
    db = connect()
    db.execute("CREATE TABLE series(id INTEGER PRIMARY KEY, y REAL, x REAL)")
    # Rows that pass through the frame and leave it before the last Norris row:
    # spikes, huge and tiny magnitudes, repeated values.
    before = [(1e15, 3.0), (-7.5e12, 1e9), (0.1, 1e-300), (2.5e8, 2.5e8), (1e15, -1e15)] * 12
    before += [(400.0, 400.0)] * 20
    db.executemany("INSERT INTO series(y, x) VALUES (?, ?)", before + rows)
    select = ", ".join(f"{f}(y, x) OVER w" for f in NORRIS_FUNCTIONS)
    result = db.execute(
        f"SELECT count(*) OVER w, {select} FROM series "
        "WINDOW w AS (ORDER BY id ROWS BETWEEN 35 PRECEDING AND CURRENT ROW) "
        "ORDER BY id DESC LIMIT 1").fetchone()
    assert result[0] == 36  # the frame holds exactly the Norris rows
    for name, value in zip(NORRIS_FUNCTIONS, result[1:]):
        digits = lre(value, certified[name])  # NIST StRD Norris, certified value
        print(f"Norris (slid) {name:15} {value!r:24} LRE {digits:5.2f}")
        assert digits >= 12, name


def read_smls(name):
    lines = (DATA / "nist_anova" / f"{name}.dat").read_text().splitlines()
    within_line = next(line for line in lines if line.startswith("Within Treatment"))
    certified_within = within_line.split()[3]
    start = [i for i, line in enumerate(lines) if line.startswith("Data:")][-1] + 1  # the table, not the header
    rows = []
    for line in lines[start:]:
        parts = line.split()
        if len(parts) == 2:
            rows.append((int(parts[0]), float(parts[1])))
    return rows, certified_within


def exact_within_ss(rows):
    """Within-group sum of squares in exact rational arithmetic on the same doubles."""
    groups = {}
    for group, value in rows:
        groups.setdefault(group, []).append(Fraction(value))
    total = Fraction(0)
    for values in groups.values():
        mean = sum(values) / len(values)
        total += sum((v - mean) ** 2 for v in values)
    return total


def one_pass_within_ss(rows):
    """The textbook one-pass formula Σx² − (Σx)²/n in doubles, for contrast only."""
    groups = {}
    for group, value in rows:
        groups.setdefault(group, []).append(value)
    return sum(sum(v * v for v in vs) - sum(vs) ** 2 / len(vs) for vs in groups.values())


@pytest.mark.parametrize("name", [f"SmLs0{i}" for i in range(1, 10)])
def test_smls_pooled_within_group_sum_of_squares(name):
    rows, certified = read_smls(name)
    db = connect()
    db.execute("CREATE TABLE d(g INTEGER, v REAL)")
    db.executemany("INSERT INTO d VALUES (?, ?)", rows)
    per_group = db.execute("SELECT var_samp(v), count(v) FROM d GROUP BY g").fetchall()
    # Pooled: Σ var_samp_g · (n_g − 1), summed exactly (oracle: math.fsum).
    almanac = math.fsum(v * (n - 1) for v, n in per_group)
    # What any method can reach from these doubles (oracle: fractions.Fraction).
    cap = lre(exact_within_ss(rows), certified)
    digits = lre(almanac, certified)  # NIST StRD certified within-treatment SS
    naive = max(lre(one_pass_within_ss(rows), certified), 0.0)
    print(f"{name}: within SS {almanac!r} certified {certified}  LRE almanac {digits:5.2f}  "
          f"cap {cap:5.2f}  one-pass formula {naive:5.2f}")
    assert digits >= cap - 0.3


NUMACC = {
    # NIST StRD univariate (from memory): data, certified mean, certified sd.
    "NumAcc1": ([10000001.0, 10000003.0, 10000002.0], "10000002", "1"),
    "NumAcc3": ([1000000.2] + [1000000.1, 1000000.3] * 500, "1000000.2", "0.1"),
    "NumAcc4": ([10000000.2] + [10000000.1, 10000000.3] * 500, "10000000.2", "0.1"),
}


@pytest.mark.parametrize("name", sorted(NUMACC))
def test_numacc_mean_and_standard_deviation(name):
    values, certified_mean, certified_sd = NUMACC[name]
    db = connect()
    db.execute("CREATE TABLE d(v REAL)")
    db.executemany("INSERT INTO d VALUES (?)", [(v,) for v in values])
    mean, sd = db.execute("SELECT moving_mean(v), stddev_samp(v) FROM d").fetchone()
    # The mean is the exactly rounded sum over n (oracle: math.fsum).
    assert mean == math.fsum(values) / len(values)
    # Exact rational arithmetic on the same doubles gives what any method can reach.
    exact = [Fraction(v) for v in values]
    exact_mean = sum(exact) / len(exact)
    exact_var = sum((v - exact_mean) ** 2 for v in exact) / (len(exact) - 1)  # oracle: fractions.Fraction
    exact_sd = math.sqrt(exact_var)  # one rounding of the exact variance, then sqrt
    assert abs(sd - exact_sd) <= 4 * math.ulp(exact_sd)
    mean_digits = lre(mean, certified_mean)
    sd_digits = lre(sd, certified_sd)
    sd_cap = lre(exact_sd, certified_sd)
    print(f"{name}: mean {mean!r} LRE {mean_digits:5.2f}; sd {sd!r} LRE {sd_digits:5.2f} "
          f"(cap {sd_cap:5.2f})")
    assert mean_digits >= lre(float(exact_mean), certified_mean) - 0.3
    assert sd_digits >= sd_cap - 0.3
