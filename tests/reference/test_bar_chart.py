# SPDX-License-Identifier: MIT
# ctest-labels: heavy browser
"""svg_bar_chart() through real SQLite, checked against the contract (the README
"Reports"): xml.etree parses every document; datetime gives each period's
first and last day, and the calendar axis's own tick labels (read back as
dates) give the pixel scale, so "each bar inside its period" is checked
against the axis a reader sees; headless chromium renders the chart and the
pixels at each bar show its colour (tests/reference/test_chart_browser.py has
the PNG decoder and the browser runner).
"""
import datetime
import re
import sqlite3
import xml.etree.ElementTree as ET

import pytest

from conftest import connect
from test_chart_browser import hex_rgb, nearest, page, screenshot

SVG = "{http://www.w3.org/2000/svg}"


def bar_chart(db, rows, options=None):
    db.execute("DROP TABLE IF EXISTS t")
    db.execute("CREATE TABLE t(x, y, s)")
    db.executemany("INSERT INTO t VALUES (?, ?, ?)", rows)
    if options is None:
        return db.execute("SELECT svg_bar_chart(x, y, s) FROM t").fetchone()[0]
    return db.execute("SELECT svg_bar_chart(x, y, s, ?) FROM t", (options,)).fetchone()[0]


def bars(root):
    return [r for r in root.iter(f"{SVG}rect") if r.get("class") == "bar"]


def box(bar):
    x, y, w, h = (float(bar.get(k)) for k in ("x", "y", "width", "height"))
    return x, y, x + w, y + h


def baseline_y(root):
    line = next(l for l in root.iter(f"{SVG}line") if l.get("class") == "baseline")
    return float(line.get("y1"))


def axis_dates(root):
    """(pixel x, date) of every labelled tick of a calendar x axis with day or month
    ticks; the year comes from the second line under the first tick and every change."""
    group = next(g for g in root.iter(f"{SVG}g") if g.get("class") == "x-axis")
    texts = group.findall(f"{SVG}text")
    years = {t.get("x"): int(t.text[-4:]) for t in texts if t.get("fill") is not None}
    year, found = None, []
    for t in (t for t in texts if t.get("fill") is None):
        year = years.get(t.get("x"), year)
        label = t.text if " " in t.text else f"1 {t.text}"
        found.append((float(t.get("x")), datetime.datetime.strptime(f"{label} {year}", "%d %b %Y").date()))
    return found


def pixel_of(ticks):
    """The axis's own scale, from its first and last labelled tick: date -> pixel x."""
    (x0, d0), (x1, d1) = ticks[0], ticks[-1]
    per_day = (x1 - x0) / (d1 - d0).days
    return lambda day: x0 + (day - d0).days * per_day


def test_one_bar_per_row_with_a_value_and_none_for_null(db):
    rows = [(f"2025-03-{d:02d}", (d * 7) % 11 if d % 5 else None, s) for d in range(1, 21) for s in ("a", "b", "c")]
    root = ET.fromstring(bar_chart(db, rows, '{"period": "day"}'))  # oracle: xml.etree parses it
    for series in ("a", "b", "c"):
        want = sum(1 for _, y, s in rows if s == series and y is not None)  # plain count of the rows
        assert sum(1 for b in bars(root) if b.get("data-series") == series) == want
    assert [e.get("data-series") for e in root.iter(f"{SVG}g") if e.get("class") == "legend-entry"] == ["a", "b", "c"]


def test_each_bar_lies_inside_its_period_on_the_calendar_axis(db):
    # One row per item and month, x any day inside the month (the 15th): the bar must fill
    # its month, not straddle it (README: "a calendar axis for time x with each bar
    # inside its period").
    rows = [(f"2025-{m:02d}-15", 10 + m * (k + 1), s) for m in range(1, 13) for k, s in enumerate(("rye", "oat"))]
    root = ET.fromstring(bar_chart(db, rows, '{"period": "month", "width": 1000}'))
    to_px = pixel_of(axis_dates(root))
    checked = 0
    for bar in bars(root):
        left, _, right, _ = box(bar)
        # find the bar's month: the one whose pixel span holds the bar's centre
        centre = (left + right) / 2
        month = next(m for m in range(1, 13)
                     if to_px(datetime.date(2025, m, 1)) <= centre < to_px(
                         datetime.date(2025 + m // 12, m % 12 + 1, 1)))
        first = datetime.date(2025, month, 1)
        after = datetime.date(2025 + month // 12, month % 12 + 1, 1)  # oracle: datetime, next month's 1st
        assert to_px(first) - 0.02 <= left and right <= to_px(after) + 0.02, (month, left, right)
        checked += 1
    assert checked == 24
    # two bars per month, side by side in legend order: oat sorts before rye (sorted())
    january = sorted((b for b in bars(root) if box(b)[0] < to_px(datetime.date(2025, 2, 1))), key=lambda b: box(b)[0])
    assert [b.get("data-series") for b in january] == sorted(["rye", "oat"])
    print(f"compared {checked} bars with their months")


def test_negative_values_are_below_the_baseline(db):
    rows = [(1, 5.0, "p"), (2, -3.0, "p"), (3, 2.5, "p"), (4, -7.25, "p")]
    root = ET.fromstring(bar_chart(db, rows))
    zero = baseline_y(root)
    for bar, (_, y, _) in zip(sorted(bars(root), key=lambda b: float(b.get("x"))), rows):
        _, top, _, bottom = box(bar)
        if y > 0:
            assert abs(bottom - zero) < 0.02 and top < zero   # common practice: bars grow up from zero
        else:
            assert abs(top - zero) < 0.02 and bottom > zero   # and negative ones down from it
    heights = {y: box(b)[3] - box(b)[1] for b, (_, y, _) in zip(sorted(bars(root), key=lambda b: float(b.get("x"))), rows)}
    # heights in proportion to the values (the y axis is linear): 5 / 2.5 = 2, 7.25 / 5 = 1.45
    assert abs(heights[5.0] / heights[2.5] - 2) < 0.01 and abs(heights[-7.25] / heights[5.0] - 1.45) < 0.01


def test_series_order_keeps_colours_across_bar_and_line_charts(db):
    order = '{"series_order": ["Rye", "Espresso", "Chai"]}'
    one = ET.fromstring(bar_chart(db, [(1, 1, "Rye"), (1, 2, "Espresso")], order))
    two = ET.fromstring(bar_chart(db, [(1, 1, "Chai"), (1, 2, "Espresso"), (1, 3, "Zest")], order))
    fill = lambda root, s: next(b.get("fill") for b in bars(root) if b.get("data-series") == s)
    assert fill(one, "Espresso") == fill(two, "Espresso")  # contract: the list decides the colour
    line = db.execute("SELECT svg_line_chart(1, 1, 'Espresso', 'smooth', ?)", (order,)).fetchone()[0]
    stroke = next(p.get("stroke") for p in ET.fromstring(line).iter(f"{SVG}path"))
    assert stroke == fill(one, "Espresso")  # contract: the same palette and colour rule as the line chart
    assert len({fill(two, s) for s in ("Chai", "Espresso", "Zest")}) == 3


def test_categories_keep_the_order_they_first_appear_in(db):
    rows = [("Mon", 3, "a"), ("Tue", 4, "a"), ("Wed", 1, "a"), ("Mon", 2, "b"), ("2024-W05", 1, "b")]
    root = ET.fromstring(bar_chart(db, rows))
    group = next(g for g in root.iter(f"{SVG}g") if g.get("class") == "x-axis")
    assert [t.text for t in group.findall(f"{SVG}text")] == ["Mon", "Tue", "Wed", "2024-W05"]
    assert len(bars(root)) == 5


BAD = [
    ("SELECT svg_bar_chart('2025-02-30', 1, 'a')",
     "svg_bar_chart(): argument 1 (x) = '2025-02-30': no such date: 2025-02 has 28 days"),
    ("SELECT svg_bar_chart(x, 1, 'a') FROM (SELECT 'Mon' AS x UNION ALL SELECT 3)",
     "svg_bar_chart(): argument 1 (x) = 3: expected a category (TEXT that is neither a number nor a time value) "
     "like the earlier x values of this group; one axis cannot mix numbers, time values and categories"),
    ("SELECT svg_bar_chart(1, 'lots', 'a')", "svg_bar_chart(): argument 2 (y) = 'lots': "),
    ("SELECT svg_bar_chart(1, 1, 'a', '{\"colour\": 1}')",
     "svg_bar_chart(): argument 4 (options) = '{\"colour\": 1}': unknown key \"colour\": expected title, width, "
     "height, y_caption, series_order, period or zone"),
    ("SELECT svg_bar_chart(1, 1, X'00')", "svg_bar_chart(): argument 3 (series) = a BLOB of 1 byte: "),
]


@pytest.mark.parametrize("sql,expected", BAD)
def test_bad_input_is_an_error_naming_the_argument(db, sql, expected):
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute(sql).fetchone()
    assert str(error.value).startswith(expected)  # common brief: fn(): argument N (name) = <value>: ...


def test_no_rows_give_null(db):
    assert db.execute("SELECT svg_bar_chart(1, 1, 'a') WHERE 0").fetchone()[0] is None


def test_chromium_shows_each_bar_in_its_colour():
    db = connect()
    rows = [(f"2025-{m:02d}-01", (m % 4 + 1) * 10 * (1 if s != "east" else -1), s)
            for m in range(1, 7) for s in ("north", "south", "east")]
    svg = bar_chart(db, rows, '{"period": "month", "width": 900, "height": 500}')
    image = screenshot(page(svg), 900, 500)
    root = ET.fromstring(svg)
    checked = 0
    for bar in bars(root):
        left, top, right, bottom = box(bar)
        colour = hex_rgb(bar.get("fill"))
        # the middle of the bar shows its fill (SVG 1.1 section 11.3, painting the fill)
        assert nearest(image, (left + right) / 2, (top + bottom) / 2, colour, radius=1) < 12
        checked += 1
    # just left of the first group (the slot padding) there is no bar colour
    fills = {tuple(hex_rgb(b.get("fill"))) for b in bars(root)}
    first = min(bars(root), key=lambda b: box(b)[0])
    gap_x = box(first)[0] - 3
    for fill in fills:
        assert nearest(image, gap_x, (box(first)[1] + box(first)[3]) / 2, hex_rgb("#" + "".join(
            f"{int(v):02x}" for v in fill)), radius=0) > 60
    assert checked == 18
    print(f"checked {checked} bars in chromium's pixels")
