# SPDX-License-Identifier: MIT
"""svg_line_chart() and sparkline() through real SQLite, checked against the
contract (README "Reports: sparklines and line charts") with Python's own tools as the oracle:
xml.etree parses every document, sorted() orders the series names,
datetime places calendar ticks, and the sparkline scaling rule is computed
here in plain Python from the data the test generated.
"""
import datetime
import math
import random
import re
import sqlite3
import xml.etree.ElementTree as ET

import pytest

from conftest import connect

SVG = "{http://www.w3.org/2000/svg}"


def chart(db, rows, *extra, columns="x, y, s"):
    """svg_line_chart over rows given as tuples; extra are further SQL arguments."""
    db.execute("DROP TABLE IF EXISTS t")
    width = len(rows[0]) if rows else 3
    names = ["x", "y", "s", "layer", "options"][:width]
    db.execute(f"CREATE TABLE t({', '.join(names)})")
    db.executemany(f"INSERT INTO t VALUES ({', '.join('?' * width)})", rows)
    args = ", ".join([columns] + list(extra))
    return db.execute(f"SELECT svg_line_chart({args}) FROM t").fetchone()[0]


def paths(root):
    return root.findall(f".//{SVG}path")


def legend(root):
    entries = [g for g in root.iter(f"{SVG}g") if g.get("class") == "legend-entry"]
    return [(g.get("data-series"), g.find(f"{SVG}line").get("stroke"), g.find(f"{SVG}text").text)
            for g in entries]


def subpaths(d):
    """[[(x, y), ...], ...] from a path's d attribute (M starts a run, L continues it)."""
    runs = []
    for command, x, y in re.findall(r"([ML])(-?[\d.]+) (-?[\d.]+)", d):
        if command == "M":
            runs.append([])
        runs[-1].append((float(x), float(y)))
    return runs


def daily_rows(items, days, layer=None, seed=7):
    rng = random.Random(seed)
    rows = []
    start = datetime.date(2024, 1, 1)
    for item in items:
        for k in range(days):
            row = ((start + datetime.timedelta(days=k)).isoformat(), rng.uniform(10, 100), item)
            rows.append(row + ((layer,) if layer else ()))
    rng.shuffle(rows)  # arrival order must not matter
    return rows


# ---------------------------------------------------------------------------
# Structure


def test_document_parses_and_has_one_line_per_series_and_layer(db):
    items = ["oat milk", "espresso", "chai", "cocoa"]
    rows = daily_rows(items, 30, "raw") + [(x, y, s, "smooth") for x, y, s, _ in daily_rows(items, 30, "raw", seed=8)]
    svg = chart(db, rows, "layer", columns="x, y, s")
    root = ET.fromstring(svg)  # oracle: xml.etree parses the whole document
    assert root.tag == f"{SVG}svg"  # contract: a complete SVG document (W3C SVG namespace)
    lines = paths(root)
    assert len(lines) == len(items) * 2  # contract: one line per (series, layer)
    assert sorted((p.get("data-series"), p.get("data-layer")) for p in lines) == sorted(
        (i, layer) for i in items for layer in ("raw", "smooth"))
    entries = legend(root)
    assert len(entries) == len(items)  # contract: one legend entry per series
    # oracle: Python's sorted() on the names (byte order of UTF-8, SQLite's BINARY collation)
    assert [name for name, _, _ in entries] == sorted(items, key=lambda s: s.encode())
    print(f"compared {len(lines)} lines and {len(entries)} legend entries")


def test_same_colour_in_every_layer_and_raw_is_thin_and_light(db):
    items = ["b", "a", "c"]
    rows = [(x, y, s, "raw") for x, y, s in daily_rows(items, 20)] + \
           [(x, y, s, "smooth") for x, y, s in daily_rows(items, 20, seed=9)]
    root = ET.fromstring(chart(db, rows, "layer"))
    by_key = {(p.get("data-series"), p.get("data-layer")): p for p in paths(root)}
    legend_colour = {name: colour for name, colour, _ in legend(root)}
    for item in items:
        raw, smooth = by_key[(item, "raw")], by_key[(item, "smooth")]
        assert raw.get("stroke") == smooth.get("stroke") == legend_colour[item]  # contract
        assert float(raw.get("stroke-width")) < float(smooth.get("stroke-width"))  # contract: thin under thick
        assert float(raw.get("stroke-opacity")) < 1.0  # contract: raw is light
        assert smooth.get("stroke-opacity") is None  # contract: smooth is full strength
    assert len(set(legend_colour.values())) == len(items)  # contract: one colour per series
    # Raw lines are drawn first, so the smooth ones lie on top (contract: thin under thick).
    order = [p.get("data-layer") for p in paths(root)]
    assert order == sorted(order, key=["raw", "smooth"].index)


def test_colours_follow_sorted_names_not_row_order(db):
    rows = daily_rows(["zeta", "alpha", "mid"], 10)
    first = chart(db, rows)
    second = chart(db, list(reversed(rows)))
    assert first == second  # contract: the same data always gets the same colours
    colours = {name: colour for name, colour, _ in legend(ET.fromstring(first))}
    # A chart with one more series that sorts first shifts the others' colours (by rank),
    # and the same set of names in any order gives the same assignment.
    only_two = {name: colour for name, colour, _ in legend(ET.fromstring(chart(db, daily_rows(["mid", "zeta"], 5))))}
    assert only_two["mid"] == colours["alpha"]  # rank 0 in both charts
    assert only_two["zeta"] == colours["mid"]   # rank 1 in both charts


def test_default_layer_is_smooth(db):
    root = ET.fromstring(chart(db, daily_rows(["a"], 5)))
    (line,) = paths(root)
    assert line.get("data-layer") == "smooth"  # documented default
    root = ET.fromstring(chart(db, [(x, y, s, None) for x, y, s in daily_rows(["a"], 5)], "layer"))
    assert paths(root)[0].get("data-layer") == "smooth"  # NULL layer: the default


def test_points_are_in_x_order_and_null_breaks_the_line(db):
    rng = random.Random(42)
    xs = list(range(60))
    ys = [None if rng.random() < 0.2 else rng.uniform(-5, 5) for _ in xs]
    rows = list(zip(xs, ys, ["s"] * len(xs)))
    rng.shuffle(rows)
    (line,) = paths(ET.fromstring(chart(db, rows)))
    runs = subpaths(line.get("d"))
    # oracle: the runs of consecutive non-NULL values, counted in Python
    expected_runs = []
    for y in ys:
        if y is None:
            if expected_runs and expected_runs[-1]:
                expected_runs.append([])
            continue
        if not expected_runs:
            expected_runs.append([])
        expected_runs[-1].append(y)
    expected_runs = [r for r in expected_runs if r]
    assert len(runs) == len(expected_runs)  # contract: a NULL y breaks the line
    for run, values in zip(runs, expected_runs):
        # A lone value is drawn as a zero-length segment (a dot): two equal points.
        assert len(run) == (2 if len(values) == 1 else len(values))
        # SVG y grows downwards: higher values have smaller y.
        if len(values) > 1:
            for (_, py1), (_, py2), v1, v2 in zip(run, run[1:], values, values[1:]):
                assert (py1 > py2) == (v2 > v1) or v1 == v2
    all_x = [x for run in runs for x, _ in run]
    assert all_x == sorted(all_x)  # contract: points in x order
    print(f"compared {len(runs)} runs")


def test_rows_with_null_x_or_series_are_skipped_and_no_rows_give_null(db):
    # documented: rows with NULL x or NULL series are skipped; nothing left gives NULL (SQL convention)
    assert chart(db, [(None, 1, "a"), (1, 2, None)]) is None
    assert db.execute("SELECT svg_line_chart(1, 2, 'a') WHERE 0").fetchone()[0] is None  # SQL: empty aggregate
    svg = chart(db, [(None, 1, "a"), (1, 2, "a"), (2, 3, "a"), (3, 4, None)])
    assert len(subpaths(paths(ET.fromstring(svg))[0].get("d"))[0]) == 2  # the two placeable rows


# ---------------------------------------------------------------------------
# Axes


def tick_labels(root, axis):
    group = next(g for g in root.iter(f"{SVG}g") if g.get("class") == axis)
    return [t.text for t in group.findall(f"{SVG}text") if t.get("fill") is None and t.get("class") is None]


def test_y_axis_ticks_are_round_numbers_covering_the_data(db):
    rng = random.Random(3)
    for case in range(40):
        scale = 10 ** rng.uniform(-3, 6)
        ys = [rng.uniform(-1, 1) * scale + rng.uniform(-2, 2) * scale for _ in range(30)]
        root = ET.fromstring(chart(db, [(i, y, "s") for i, y in enumerate(ys)]))
        values = [float(label) for label in tick_labels(root, "y-axis")]
        assert len(values) >= 3
        step = values[1] - values[0]
        mantissa = step / 10 ** math.floor(math.log10(step))
        # common practice: steps of 1, 2 or 5 times a power of ten
        assert min(abs(mantissa - m) for m in (1, 2, 5, 10)) < 1e-6 * mantissa
        assert all(math.isclose(b - a, step, rel_tol=1e-6) for a, b in zip(values, values[1:]))
        assert values[0] <= min(ys) and values[-1] >= max(ys)  # the axis covers the data
    print("compared 40 y axes")


def test_numeric_x_gets_a_numeric_axis(db):
    root = ET.fromstring(chart(db, [(x, x * x, "s") for x in range(0, 101)]))
    labels = tick_labels(root, "x-axis")
    assert labels[0] == "0" and labels[-1] == "100"  # hand computed: round steps inside [0, 100]
    assert all(re.fullmatch(r"-?\d+", label) for label in labels)


def test_time_x_gets_calendar_ticks_on_period_boundaries(db):
    cases = [
        # (first day, days, what each tick must be; oracle: datetime)
        ("2024-01-03", 5, lambda d: True),                        # days
        ("2024-01-03", 40, lambda d: d.weekday() == 0),           # ISO weeks start on Monday
        ("2023-11-20", 200, lambda d: d.day == 1),                # month starts
        ("2021-03-10", 700, lambda d: d.day == 1 and d.month in (1, 4, 7, 10)),  # quarter starts
        ("2009-06-01", 4000, lambda d: d.month == 1 and d.day == 1),            # year starts
    ]
    for start, days, rule in cases:
        first = datetime.date.fromisoformat(start)
        rows = [((first + datetime.timedelta(days=k)).isoformat(), k % 7, "s") for k in range(days)]
        svg = chart(db, rows)
        root = ET.fromstring(svg)
        group = next(g for g in root.iter(f"{SVG}g") if g.get("class") == "x-axis")
        texts = group.findall(f"{SVG}text")
        primary = [t for t in texts if t.get("fill") is None]
        assert 2 <= len(primary) <= 12, (start, days)
        # Rebuild each tick's date from its label and the year given on the line below.
        year = None
        by_x = {t.get("x"): t.text for t in texts if t.get("fill") is not None}
        for t in primary:
            if t.get("x") in by_x:
                year = int(by_x[t.get("x")][-4:])
            label = t.text
            if re.fullmatch(r"\d{4}", label):
                date = datetime.date(int(label), 1, 1)
            elif re.fullmatch(r"Q[1-4]", label):
                date = datetime.date(year, 3 * int(label[1]) - 2, 1)
            elif re.fullmatch(r"[A-Z][a-z]{2}", label):
                date = datetime.datetime.strptime(f"1 {label} {year}", "%d %b %Y").date()
            else:
                date = datetime.datetime.strptime(f"{label} {year}", "%d %b %Y").date()
            assert first <= date <= first + datetime.timedelta(days=days - 1), (label, start)
            assert rule(date), (label, start, days)
    print(f"compared {len(cases)} calendar axes")


def test_mixed_x_kinds_are_an_error(db):
    with pytest.raises(sqlite3.OperationalError) as error:
        chart(db, [("2024-01-01", 1, "a"), (5, 2, "a")])
    # The rows arrive in rowid order; the second x is the number 5.
    assert str(error.value) == (
        "svg_line_chart(): argument 1 (x) = 5: expected a time value like the earlier x values of this "
        "group; one axis cannot mix numbers, time values and categories")  # common brief: one message shape
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute("SELECT sparkline(y, x) FROM (SELECT 1 AS x, 1 AS y UNION ALL SELECT '2024-01-01', 2)")
    assert "sparkline(): argument 2 (x) = '2024-01-01': expected a number like the earlier" in str(error.value)


# ---------------------------------------------------------------------------
# Escaping


def test_text_from_data_is_escaped(db):
    hostile = "<script>alert(1)</script>"
    options = '{"title": "</title><script>alert(2)</script>", "y_caption": "a & b < c"}'
    svg = chart(db, [(1, 1, hostile), (2, 2, hostile), (1, 3, 'quote " and \' amp &')], f"'smooth'",
                "'" + options.replace("'", "''") + "'")
    assert "<script" not in svg
    assert "&lt;script&gt;alert(1)&lt;/script&gt;" in svg
    root = ET.fromstring(svg)
    assert not list(root.iter(f"{SVG}script")) and not list(root.iter("script"))
    names = [name for name, _, text in legend(root)]
    texts = [text for _, _, text in legend(root)]
    assert hostile in names and hostile in texts  # the text reads back exactly
    assert 'quote " and \' amp &' in texts
    assert root.find(f"{SVG}title").text == "</title><script>alert(2)</script>"
    caption = next(t for t in root.iter(f"{SVG}text") if t.get("class") == "y-caption")
    assert caption.text == "a & b < c"


def test_invalid_utf8_and_control_characters_do_not_break_the_document(db):
    db.execute("CREATE TABLE bad AS SELECT 1 AS x, 1 AS y, CAST(X'41FF0142' AS TEXT) AS s")
    svg = db.execute("SELECT svg_line_chart(x, y, s) FROM bad").fetchone()[0]
    root = ET.fromstring(svg)  # Python's sqlite3 would refuse to decode invalid UTF-8
    assert legend(root)[0][2] == "A\ufffd\ufffdB"  # XML 1.0 section 2.2: no U+0001, no byte FF


# ---------------------------------------------------------------------------
# Options and limits: exact messages


BAD_OPTIONS = [
    ("{title: 1}", "invalid JSON at byte 2: expected a key in double quotes"),
    ('{"title": "a",}', "invalid JSON at byte 15: expected a key in double quotes"),
    ('{"colour": "red"}', 'unknown key "colour": expected title, width, height, y_caption, series_order, period or zone'),
    ('{"width": "wide"}', 'key "width" = "wide": expected a whole number of pixels from 200 to 10000'),
    ('{"height": 20}', 'key "height" = 20: expected a whole number of pixels from 150 to 10000'),
    ('{"title": 7}', 'key "title" = 7: expected a string'),
    ('[1]', 'expected a JSON object such as {"title": "Sales"}, not an array'),
    ('{"series_order": "Espresso"}',
     'key "series_order" = "Espresso": expected an array of series names such as ["Espresso", "Rye"]'),
    ('{"series_order": ["a", 2]}',
     'key "series_order" holds 2: expected an array of series names such as ["Espresso", "Rye"]'),
    ('{"period": "fortnight"}',
     'key "period" = "fortnight": unknown unit \'fortnight\'; expected [count] unit [starting weekday|month] '
     '[from YYYY-MM-DD[ HH:MM[:SS]]] with unit one of second, minute, hour, day, week, half-month, month, '
     'quarter, year, or an ISO 8601 duration such as P1W or PT15M'),
    ('{"zone": "Mars/Base"}',
     'key "zone" = "Mars/Base": not in the tz database; expected an IANA time zone name such as '
     '\'America/Denver\' or \'UTC\''),
]


@pytest.mark.parametrize("options,expected", BAD_OPTIONS)
def test_bad_options_are_errors_naming_the_argument(db, options, expected):
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute("SELECT svg_line_chart(1, 2, 'a', 'raw', ?)", (options,)).fetchone()
    quoted = "'" + options.replace("'", "''") + "'"
    # common brief: fn(): argument N (name) = <value>: <what was expected>
    assert str(error.value) == f"svg_line_chart(): argument 5 (options) = {quoted}: {expected}"


def test_a_long_option_value_is_cut_at_a_character_boundary_in_the_message(db):
    # Regression: the JSON value was cut at byte 40 in the middle of an "é",
    # the message was not UTF-8 and Python raised UnicodeDecodeError instead.
    # Bytes: '{"width":  "' is 12, so the argument's own 60-byte cut also
    # falls inside an "é" (bytes 59-60).
    value = "a" * 39 + "\u00e9" * 20
    options = '{"width":  "' + value + '"}'
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute("SELECT svg_line_chart(1, 2, 'a', 'raw', ?)", (options,)).fetchone()
    # common brief: fn(): argument N (name) = <value>: <what was expected>; a shown
    # value is shortened to whole characters followed by "..." (ext/sqlite/arguments.h,
    # 60 bytes for an argument, 40 for a JSON string).
    shown_argument = options.encode()[:59].decode()
    assert options.encode()[:60].decode(errors="replace") != shown_argument  # the cut is mid-"é"
    assert str(error.value) == (
        f"svg_line_chart(): argument 5 (options) = '{shown_argument}...': "
        f'key "width" = "{"a" * 39}...": expected a whole number of pixels from 200 to 10000')


def test_options_must_be_the_same_on_every_row(db):
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute("SELECT svg_line_chart(x, 1, 'a', 'raw', o) FROM (SELECT 1 AS x, '{}' AS o "
                   "UNION ALL SELECT 2, '{\"width\": 900}')").fetchone()
    # documented: options are the same on every row; common brief message shape
    assert str(error.value) == ("svg_line_chart(): argument 5 (options) = '{\"width\": 900}': expected the "
                                "same options on every row of one chart (the first row had '{}')")


def test_options_set_size_title_and_caption(db):
    svg = db.execute("SELECT svg_line_chart(1, 2, 'a', 'raw', '{\"width\": 640, \"height\": 300, "
                     "\"title\": \"T\", \"y_caption\": \"EUR\"}')").fetchone()[0]
    root = ET.fromstring(svg)
    assert (root.get("width"), root.get("height")) == ("640", "300")  # the options given
    assert next(t for t in root.iter(f"{SVG}text") if t.get("class") == "chart-title").text == "T"


def test_a_period_label_as_x_is_an_error_that_says_what_to_use(db):
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute("SELECT sparkline(3, '2024-W05')").fetchone()
    message = str(error.value)  # common brief: fn(): argument N (name) = <value>: <what was expected>
    assert message.startswith("sparkline(): argument 2 (x) = '2024-W05': expected YYYY-MM-DD")
    assert message.endswith("; x orders the rows, so for periods give period_floor() or period_serial(), "
                            "not period_label()")


def test_numeric_text_x_is_a_number(db):
    # README: TEXT that SQLite reads as a number is a number; numbers get a numeric axis.
    root = ET.fromstring(chart(db, [("1", 5, "a"), ("2", 6, "a"), (3, 7, "a")]))
    assert all(re.fullmatch(r"[\d.]+", label) for label in tick_labels(root, "x-axis"))
    assert db.execute("SELECT sparkline(y, x) FROM (SELECT ' 2' AS x, 9 AS y UNION ALL SELECT 1.5, 0)"
                      ).fetchone()[0] == BLOCKS[0] + BLOCKS[7]


def test_bad_layer_and_values_are_errors(db):
    cases = [
        ("SELECT svg_line_chart(1, 2, 'a', 'thin')",
         "svg_line_chart(): argument 4 (layer) = 'thin': expected 'raw' (thin, light) or 'smooth' (thick)"),
        ("SELECT svg_line_chart(1, 'many', 'a')",
         "svg_line_chart(): argument 2 (y) = 'many': expected a number"),
        ("SELECT svg_line_chart('2024-02-30', 1, 'a')",
         "svg_line_chart(): argument 1 (x) = '2024-02-30': "),
        ("SELECT svg_line_chart(X'0000', 1, 'a')",
         "svg_line_chart(): argument 1 (x) = a BLOB of 2 bytes: expected a number or a time value, not a BLOB"),
        ("SELECT svg_line_chart(1, 1, X'0000')",
         "svg_line_chart(): argument 3 (series) = a BLOB of 2 bytes: expected TEXT or a number as the series "
         "name, not a BLOB"),
        ("SELECT sparkline('high', 1)", "sparkline(): argument 1 (y) = 'high': expected a number"),
        ("SELECT sparkline(1, 'soon')", "sparkline(): argument 2 (x) = 'soon': "),
    ]
    # common brief: fn(): argument N (name) = <value>: <what was expected>
    for sql, expected in cases:
        with pytest.raises(sqlite3.OperationalError) as error:
            db.execute(sql).fetchone()
        assert str(error.value).startswith(expected), sql


def test_more_than_64_series_is_an_error(db):
    ok = db.execute("WITH RECURSIVE n(k) AS (SELECT 0 UNION ALL SELECT k + 1 FROM n WHERE k < 63) "
                    "SELECT svg_line_chart(k, k, 's' || k) FROM n").fetchone()[0]
    assert len(legend(ET.fromstring(ok))) == 64  # contract: 64 series are allowed
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute("WITH RECURSIVE n(k) AS (SELECT 0 UNION ALL SELECT k + 1 FROM n WHERE k < 64) "
                   "SELECT svg_line_chart(k, k, 's' || k) FROM n").fetchone()
    # contract: a clear error past 64 series (README states the text)
    assert str(error.value) == ("svg_line_chart(): more than 64 series; a chart holds at most 64 "
                                "(8 colours x 8 dash patterns): chart the top items only")


def test_more_than_200000_points_is_an_error(db):
    ok = db.execute("WITH RECURSIVE n(k) AS (SELECT 1 UNION ALL SELECT k + 1 FROM n WHERE k < 200000) "
                    "SELECT length(svg_line_chart(k, k % 97, 's' || (k % 3))) FROM n").fetchone()[0]
    assert ok > 0  # contract: 200,000 points are allowed
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute("WITH RECURSIVE n(k) AS (SELECT 1 UNION ALL SELECT k + 1 FROM n WHERE k < 200001) "
                   "SELECT svg_line_chart(k, k % 97, 's') FROM n").fetchone()
    # contract: a clear error past 200,000 points (README states the text)
    assert str(error.value) == ("svg_line_chart(): more than 200000 points; a chart holds at most 200000 "
                                "rows: aggregate first (e.g. one row per series and day)")


def test_beyond_the_palette_series_differ_by_dash_pattern(db):
    rows = [(x, x + k, f"s{k:02d}") for k in range(20) for x in range(3)]
    root = ET.fromstring(chart(db, rows))
    styles = [(p.get("stroke"), p.get("stroke-dasharray")) for p in paths(root)]
    assert len(set(styles)) == 20  # contract: beyond the palette, dash patterns tell series apart
    assert len({colour for colour, _ in styles}) == 8  # the palette has 8 colours


# ---------------------------------------------------------------------------
# sparkline


BLOCKS = "".join(chr(0x2581 + k) for k in range(8))  # Unicode: U+2581 ... U+2588


def sparkline_rule(points):
    """README: level = round(7 (y - min) / (max - min)), halves up as SQLite's round();
    a constant series is all U+2584; NULL y is a space; rows in x order, ties in arrival order."""
    ordered = sorted(points, key=lambda p: p[0])  # sorted() is stable: ties keep arrival order
    values = [y for _, y in ordered if y is not None]
    lo, hi = (min(values), max(values)) if values else (0, 0)
    out = []
    for _, y in ordered:
        if y is None:
            out.append(" ")
        elif hi == lo:
            out.append("\u2584")
        else:
            v = 7 * (y - lo) / (hi - lo)
            level = math.floor(v) + (1 if v - math.floor(v) >= 0.5 else 0)  # exact half-up
            out.append(BLOCKS[level])
    return "".join(out)


def test_sparkline_matches_the_scaling_rule_on_seeded_data(db):
    rng = random.Random(20240601)
    db.execute("CREATE TABLE weekly(item, week, total)")
    expected = {}
    for item in range(60):
        n = rng.randint(1, 40)
        kind = rng.choice(["noise", "trend", "constant", "ties", "halves"])
        points = []
        for k in range(n):
            x = k if kind != "ties" else rng.randint(0, n // 3)
            if kind == "constant":
                y = 4.25
            elif kind == "halves":
                # With 0 and 7 present, 7 (y - 0) / 7 is exactly y: every value is a half.
                y = [0, 7][k] if k < 2 else rng.choice([0.5, 1.5, 2.5, 3.5, 4.5, 5.5, 6.5])
            else:
                y = rng.gauss(0, 10 ** rng.randint(-3, 6)) + (k * 3 if kind == "trend" else 0)
            if rng.random() < 0.1:
                y = None
            points.append((x, y))
        rng.shuffle(points)
        db.executemany("INSERT INTO weekly VALUES (?, ?, ?)", [(item, x, y) for x, y in points])
        expected[item] = sparkline_rule(points)  # arrival order = insertion order (rowid)
    got = dict(db.execute(
        "SELECT item, sparkline(total, week) FROM (SELECT * FROM weekly ORDER BY rowid) GROUP BY item"))
    assert got == expected  # oracle: sparkline_rule() above, plain Python
    print(f"compared {len(expected)} sparklines, {sum(map(len, expected.values()))} characters")


def test_sparkline_with_time_x_and_edge_cases(db):
    days = [(datetime.date(2024, 3, 1) + datetime.timedelta(days=k)).isoformat() for k in range(10)]
    ys = [5, 3, None, 9, 1, 1, 7, 2, 8, 4]
    db.execute("CREATE TABLE s(d, y)")
    db.executemany("INSERT INTO s VALUES (?, ?)", list(reversed(list(zip(days, ys)))))
    got = db.execute("SELECT sparkline(y, d) FROM s").fetchone()[0]
    assert got == sparkline_rule(list(zip(days, ys)))  # ISO dates sort as text in time order
    # NULL x rows are skipped; no rows gives NULL; all-NULL y gives spaces (documented)
    assert db.execute("SELECT sparkline(y, x) FROM (SELECT 1 AS y, NULL AS x)").fetchone()[0] is None
    assert db.execute("SELECT sparkline(1, 1) WHERE 0").fetchone()[0] is None
    assert db.execute("SELECT sparkline(NULL, value) FROM (SELECT 1 AS value UNION ALL SELECT 2)"
                      ).fetchone()[0] == "  "
    # Instants with offsets order by the instant, not the text: 10:00+02:00 is 08:00Z.
    got = db.execute("SELECT sparkline(y, t) FROM (SELECT '2024-01-01 09:00Z' AS t, 1 AS y "
                     "UNION ALL SELECT '2024-01-01 10:00+02:00', 0)").fetchone()[0]
    assert got == BLOCKS[0] + BLOCKS[7]


def test_sparkline_in_the_shell(shell):
    out = shell("SELECT sparkline(v, k) FROM (SELECT 1 AS k, 0 AS v UNION ALL SELECT 2, 7 "
                "UNION ALL SELECT 3, 3.5);\n")
    assert out == BLOCKS[0] + BLOCKS[7] + BLOCKS[4] + "\n"  # 3.5 -> 3.5 rounds up to level 4


# ---------------------------------------------------------------------------
# Shared options: series_order, period, zone (README "Reports: sparklines and line charts")


def stroke_of(root, series):
    return next(p.get("stroke") for p in paths(root) if p.get("data-series") == series)


def test_series_order_keeps_an_item_s_colour_across_charts_with_different_items(db):
    order = '{"series_order": ["Rye", "Espresso", "Chai", "Cocoa"]}'
    first = ET.fromstring(chart(db, [(x, x, s, "smooth", order) for s in ("Rye", "Espresso") for x in range(3)],
                                "layer", "options"))
    second = ET.fromstring(chart(db, [(x, x, s, "smooth", order) for s in ("Espresso", "Cocoa", "Zest")
                                      for x in range(3)], "layer", "options"))
    without = ET.fromstring(chart(db, [(x, x, s) for s in ("Espresso", "Cocoa") for x in range(3)]))
    # contract: colours in series_order's order, so Espresso keeps its slot although Rye is absent
    assert stroke_of(first, "Espresso") == stroke_of(second, "Espresso")
    assert stroke_of(first, "Rye") != stroke_of(second, "Espresso")
    # without series_order the sorted rule gives Cocoa the first colour and Espresso the second
    assert stroke_of(without, "Cocoa") == stroke_of(first, "Rye")
    assert stroke_of(without, "Espresso") == stroke_of(first, "Espresso")
    # names not in the list follow it: Zest takes slot 4, after the four listed names
    assert [name for name, _, _ in legend(second)] == ["Espresso", "Cocoa", "Zest"]
    assert len({stroke_of(second, s) for s in ("Espresso", "Cocoa", "Zest")}) == 3


def test_period_breaks_a_line_over_a_missing_week_only(db):
    mondays = [datetime.date(2025, 1, 6) + datetime.timedelta(weeks=k) for k in range(6)]
    present = [m for k, m in enumerate(mondays) if k != 3]  # week 4 has no row (datetime)
    rows = [(m.isoformat(), 10 + k, "a", "smooth", '{"period": "week"}') for k, m in enumerate(present)]
    root = ET.fromstring(chart(db, rows, "layer", "options"))
    runs = subpaths(paths(root)[0].get("d"))
    # contract: consecutive weeks joined, the gap of one week breaks the line: 3 points, then 2
    assert [len(run) for run in runs] == [3, 2]
    plain = ET.fromstring(chart(db, [r[:3] for r in rows]))
    assert [len(run) for run in subpaths(paths(plain)[0].get("d"))] == [5]  # without period: bridged
    months = [(f"2025-{m:02d}-01", m, "a", "smooth", '{"period": "month"}') for m in (1, 2, 3, 4, 5)]
    root = ET.fromstring(chart(db, months, "layer", "options"))
    assert [len(run) for run in subpaths(paths(root)[0].get("d"))] == [5]  # months of 28-31 days: no break


def test_zone_puts_the_calendar_axis_on_local_time(db):
    # Sales at 01:00-05:00 UTC on 2 March are the evening of 1 March in Denver (zoneinfo).
    rows = [(f"2026-03-0{d} 0{h}:00:00", h, "a") for d in (2, 3, 4) for h in (1, 3, 5)]
    denver = '{"zone": "America/Denver"}'
    utc_root = ET.fromstring(chart(db, rows))
    zoned_root = ET.fromstring(chart(db, [r + ("smooth", denver) for r in rows], "layer", "options"))
    def first_label(root):
        group = next(g for g in root.iter(f"{SVG}g") if g.get("class") == "x-axis")
        return [t.text for t in group.findall(f"{SVG}text")]
    from zoneinfo import ZoneInfo
    local = datetime.datetime(2026, 3, 2, 1, tzinfo=datetime.timezone.utc).astimezone(ZoneInfo("America/Denver"))
    assert local.day == 1 and local.hour == 18  # oracle: zoneinfo
    # the UTC axis starts on 2 March; the Denver axis shows 1 March's evening first
    assert any("2 Mar" in label for label in first_label(utc_root))
    assert any("1 Mar" in label for label in first_label(zoned_root))
    assert not any("1 Mar" in label for label in first_label(utc_root))
