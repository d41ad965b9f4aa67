# SPDX-License-Identifier: MIT
"""The same-answers check of the job benchmark (bench_jobs.py).

Every way of a job writes its result rows to a file (the sqlite3 shell in
`.mode quote`, which prints a REAL so that it reads back to the same double;
pandas with to_csv, whose floats are Python's shortest round-trip repr). This
module reads them back and compares every way against the first one, key by
key: the same item/period keys, then each value column by its kind.

Tolerances and why (u = 2**-53, the unit roundoff of a double):
- count: exact, an integer.
- sum, mean, median: relative 2 * (rows + 2) * u. exact_sum (period_totals,
  the almanac GROUP BY) is correctly rounded; SQLite's sum()/avg() (3.40 adds
  in row order) and pandas' sum (its own summation) are not. Summing n terms
  in any order is off by at most (n - 1) * u * sum|x| (Higham, Accuracy and
  Stability of Numerical Algorithms, 2nd ed., section 4.2); every amount is
  positive, so sum|x| is the sum itself, and no group holds more than `rows`
  rows. A job may sum twice (rows into daily or weekly totals, those into a
  mean or a moving mean of fewer than `rows` of them), hence 2 *; the + 2
  covers the rounding of the correct sum and a division. A median is one of
  the totals or the mean of two, so the same bound holds.
- slope (of weekly totals over week numbers): absolute, the sum of two bounds.
  (1) The totals themselves may differ by the relative bound above; the slope
  is sum((x - mean x) * y) / sum((x - mean x)^2) over n consecutive weeks, so
  that moves it by at most 2 * (rows + 2) * u * (n / 2) * n * mean(y) /
  (n * (n^2 - 1) / 12). (2) Plain SQL's one-pass formula
  (n*sum(x*y) - sum(x)*sum(y)) / (n*sum(x^2) - sum(x)^2), x the week number
  since 1970 (about 2,700): its two products are each about n^2 * x_max *
  mean(y) and agree in their leading digits, and each is off by up to
  (n + 1) * u of its size, so their difference carries up to
  8 * n * u * n^2 * x_max * mean(y) (a factor 2 to spare), over the exact
  integer denominator n^2 * (n^2 - 1) / 12.
"""
import csv
import math
import re

U = 2.0 ** -53
DAY = re.compile(r"^(\d{4}-\d{2}-\d{2})(?: 00:00:00)?$")


def normal_key(text):
    """A period start as 'YYYY-MM-DD' whether a way wrote a date or a midnight
    timestamp; any other text stays as it is, so a real difference shows."""
    match = DAY.match(text)
    return match.group(1) if match else text


def value(text):
    if text in ("", "NULL"):
        return None
    return float(text)


def read_rows(path, quote, kinds):
    """{keys: values} of one way's output file; quote is the file's quote
    character ("'" for the sqlite3 shell's quote mode, '"' for pandas' CSV)."""
    rows = {}
    with open(path, newline="", encoding="utf-8") as f:
        for record in csv.reader(f, quotechar=quote):
            if len(record) != len(kinds):
                raise ValueError(f"{path}: {len(record)} columns, expected {len(kinds)}: {record}")
            key = tuple(normal_key(t) for t, k in zip(record, kinds) if k == "key")
            values = tuple(value(t) for t, k in zip(record, kinds) if k != "key")
            if key in rows:
                raise ValueError(f"{path}: key {key} twice")
            rows[key] = values
    return rows


def tolerance(kind, a, b, rows, trend):
    """The largest difference allowed between a and b (see the module text)."""
    if kind == "count":
        return 0.0
    relative = 2 * (rows + 2) * U
    if kind in ("sum", "mean", "median"):
        return relative * max(abs(a), abs(b))
    if kind == "slope":
        n, x_max, mean_y = trend
        denominator = n * n * (n * n - 1) / 12
        totals = relative * (n / 2) * n * abs(mean_y) * n / denominator
        one_pass = 8 * n * U * n * n * x_max * abs(mean_y) / denominator
        return totals + one_pass
    raise ValueError(kind)


def compare(kinds, outputs, rows, weeks=None):
    """Compares every way's output with the first way's; returns (lines, ok).
    outputs: [(way, {keys: values})]; weeks: (n weeks, x_max) for slopes."""
    value_kinds = [k for k in kinds if k != "key"]
    first_way, first = outputs[0]
    lines, ok = [], True
    worst = {k: 0.0 for k in value_kinds}  # largest |difference| / tolerance seen
    for way, other in outputs[1:]:
        missing = sorted(set(first) - set(other))
        extra = sorted(set(other) - set(first))
        if missing or extra:
            ok = False
            lines.append(f"  DIFFERENT keys: {way} lacks {len(missing)} of {first_way}'s {len(first)} "
                         f"(first {missing[:3]}), has {len(extra)} more (first {extra[:3]})")
        bad = []
        for key in sorted(set(first) & set(other)):
            for i, kind in enumerate(value_kinds):
                a, b = first[key][i], other[key][i]
                if a is None or b is None:
                    if (a is None) != (b is None):
                        bad.append((key, kind, a, b, math.inf))
                    continue
                trend = None
                if kind == "slope":
                    mean_y = first[key][value_kinds.index("mean")]
                    trend = (weeks[0], weeks[1], mean_y)
                allowed = tolerance(kind, a, b, rows, trend)
                diff = abs(a - b)
                if diff > allowed:
                    bad.append((key, kind, a, b, diff))
                elif allowed > 0:
                    worst[kind] = max(worst[kind], diff / allowed)
        if bad:
            ok = False
            lines.append(f"  DIFFERENT values: {way} against {first_way}: {len(bad)} "
                         f"(first: {bad[:3]})")
    if ok:
        seen = ", ".join(f"{k} {worst[k]:.2g}" for k in value_kinds if k != "count")
        lines.insert(0, f"  same answers: {' = '.join(w for w, _ in outputs)} on {len(first):,} rows "
                        f"(largest difference / tolerance: {seen or 'counts only'})")
    else:
        lines.insert(0, f"  NOT the same answers across {', '.join(w for w, _ in outputs)}")
    return lines, ok
