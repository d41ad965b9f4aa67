# SPDX-License-Identifier: MIT
"""Numbers to text and back (ext/core/text/number_text.h) against Python.

100,000 seeded doubles (random bit patterns, so every exponent including the
subnormals, plus powers of ten, halves, integers and the edges) go through a
small program built on the core; for each:
- shortest_double(v) equals repr(v) (oracle: Python's repr, David Gay's
  shortest round-trip digits) and parse_decimal reads it back to the same bits;
- readable_double(v) equals the first of '%.15g' % v, '%.16g', '%.17g' that
  reads back as v (oracle: Python's %-formatting, which ignores the locale);
- fixed_double(v, 2) equals '%.2f' % v (oracle: Python's %-formatting).
"""
import math
import os
import random
import struct
import subprocess

import pytest

COUNT = 100_000


def bits_of(value):
    return struct.unpack("<Q", struct.pack("<d", value))[0]


def value_of(bits):
    return struct.unpack("<d", struct.pack("<Q", bits))[0]


def seeded_doubles():
    rng = random.Random(20261202)
    fixed = [0.0, -0.0, 5e-324, -5e-324, 2.2250738585072014e-308, 2.225073858507201e-308,
             1.7976931348623157e308, 0.1, 0.2, 0.3, 0.1 + 0.2, 1e15, 1e16, 1e-4, 1e-5, 100.0,
             123456789012345680.0, 9007199254740993.0, 0.5, 2.5, 1e22, 1e23]
    values = list(fixed)
    while len(values) < COUNT:
        kind = rng.randrange(5)
        if kind == 0:  # any finite bit pattern: every binade, subnormals included
            bits = rng.getrandbits(64)
            if (bits >> 52) & 0x7FF == 0x7FF:
                continue
            values.append(value_of(bits))
        elif kind == 1:  # subnormals on purpose
            values.append(value_of(rng.getrandbits(52) | (rng.getrandbits(1) << 63)))
        elif kind == 2:  # decimal-looking values, as prices are
            values.append(rng.randrange(-10**9, 10**9) / 10 ** rng.randrange(0, 6))
        elif kind == 3:  # powers of ten and their neighbours
            p = 10.0 ** rng.randrange(-320, 308)
            values.append(math.nextafter(p, rng.choice([0.0, math.inf])) if rng.random() < 0.5 else p)
        else:  # integers up to and beyond 2^53
            values.append(float(rng.randrange(-2**60, 2**60)))
    return values[:COUNT]


def readable(value):
    for digits in (15, 16, 17):
        text = "%.*g" % (digits, value)
        if float(text) == value:
            return text
    return text


def test_shortest_readable_and_fixed_forms_match_python_on_100000_doubles():
    tool = os.environ.get("ALMANAC_NUMBER_TEXT_TOOL")
    if not tool:
        pytest.fail("ALMANAC_NUMBER_TEXT_TOOL is not set (run through ctest)")
    values = seeded_doubles()
    given = "".join("%016x\n" % bits_of(v) for v in values)
    result = subprocess.run([tool], input=given, capture_output=True, text=True, check=True)
    rows = result.stdout.split("\n")[:-1]
    assert len(rows) == len(values)
    mismatches = []
    for value, row in zip(values, rows):
        shortest, shown, fixed, back_bits = row.split("\t")
        expected = (repr(value), readable(value), "%.2f" % value, "%016x" % bits_of(value))
        if (shortest, shown, fixed, back_bits) != expected:
            mismatches.append((value, (shortest, shown, fixed, back_bits), expected))
    print(f"compared {len(values)} doubles, 4 forms each; {len(mismatches)} mismatches")
    assert not mismatches[:10]
