# SPDX-License-Identifier: MIT
"""Comparing the answers of two engines, value by value.

The SQLite module's answers are the reference for almanac's functions in
PostgreSQL: the same core computes both, so an exact function must give the
same bits and any other the same value within 1e-12 relative.
Values are made comparable first: PostgreSQL's numeric (extract(epoch ...))
becomes a float when it has a fraction, an int otherwise; Decimal and int
compare exactly; floats compare by their bits (so -0.0 is not 0.0).
"""
import decimal
import math
import struct

RELATIVE = 1e-12


def plain(value):
    if isinstance(value, decimal.Decimal):
        return int(value) if value == value.to_integral_value() else float(value)
    if isinstance(value, bool):
        return int(value)
    return value


def bits(value):
    return struct.pack("<d", value)


def same(a, b, exact=True):
    a, b = plain(a), plain(b)
    if a is None or b is None:
        return a is None and b is None
    if isinstance(a, float) or isinstance(b, float):
        if isinstance(a, str) or isinstance(b, str):
            return False
        if exact:
            return bits(float(a)) == bits(float(b)) and type(a) is type(b)
        if a == b:
            return True
        return math.isfinite(a) and math.isfinite(b) and abs(a - b) <= RELATIVE * max(abs(a), abs(b))
    return a == b and type(a) is type(b)


def compare(name, sqlite_rows, pg_rows, inexact=(), numeric_ok=False):
    """Row lists in the same order; columns named in inexact compare within 1e-12 relative.

    Returns the number of values compared; raises AssertionError naming the first
    differences. numeric_ok: an int of one side may equal a float of the other
    (for results whose SQL type differs between the engines, such as an epoch).
    """
    assert len(sqlite_rows) == len(pg_rows), f"{name}: SQLite gave {len(sqlite_rows)} rows, PostgreSQL {len(pg_rows)}"
    differences = []
    compared = 0
    for i, (s, p) in enumerate(zip(sqlite_rows, pg_rows)):
        assert len(s) == len(p), f"{name}: row {i} has {len(s)} columns in SQLite, {len(p)} in PostgreSQL"
        for column, (a, b) in enumerate(zip(s, p)):
            compared += 1
            a_, b_ = plain(a), plain(b)
            if numeric_ok and isinstance(a_, (int, float)) and isinstance(b_, (int, float)) \
                    and not isinstance(a_, bool) and float(a_) == float(b_) and a_ == b_:
                continue
            if not same(a, b, exact=column not in inexact):
                differences.append(f"row {i} column {column}: SQLite {a!r}, PostgreSQL {b!r} (row {s!r} / {p!r})")
    assert not differences, f"{name}: {len(differences)} of {compared} values differ:\n" + "\n".join(differences[:10])
    return compared
