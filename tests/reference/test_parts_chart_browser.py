# SPDX-License-Identifier: MIT
# ctest-labels: heavy browser
"""The chart of the parts (demo/parts_chart.sql) as a real browser shows it.

A generated item with a yearly season (3 whole years of weeks) is drawn
through the demo's query; Debian's chromium renders the SVG headless to PNG
and the pixels are checked where the SVG says each line is, as in
test_chart_browser.py (whose PNG decoder and helpers this reuses):
  - the amounts thin and light, the trend thick, in the same colour (the
    line chart's 'raw' and 'smooth' layers of one series);
  - trend + season as a third line, in a colour of its own, drawn where the
    season takes it away from the trend;
  - the lines' values are the parts of statsmodels.tsa.seasonal.STL (the
    oracle, period 52, non-robust below four cycles): the SVG's y coordinates
    of all three lines lie on one linear map of those values.
"""
import datetime as dt
import math
import random
import sqlite3
import xml.etree.ElementTree as ET

import numpy as np
from statsmodels.tsa.seasonal import STL

from conftest import SOURCE, run_shell
from test_chart_browser import SVG, hex_rgb, nearest, page, points_of, screenshot

FIRST = dt.date(2022, 1, 3)   # Monday of 2022-W01 (date.isocalendar)
WEEKS = 156                   # 2022-W01 .. 2024-W52, three whole ISO years


def make_shop(path):
    rng = random.Random(52)
    amounts = []
    for k in range(WEEKS):
        season = 1 + 0.6 * math.cos(2 * math.pi * k / 52)
        amounts.append(round(1000 * (1 + 0.002 * k) * season * rng.gauss(1, 0.04), 2))
    connection = sqlite3.connect(path)
    connection.execute("CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL)")
    # One sale on each Wednesday, and empty ones on the first Monday and the last Sunday, so
    # the range is every day of the 156 weeks and every week is whole.
    rows = [((FIRST + dt.timedelta(weeks=k, days=2)).isoformat() + " 12:00:00", "Soup", 1, a)
            for k, a in enumerate(amounts)]
    rows.append(((FIRST + dt.timedelta(weeks=WEEKS, days=-1)).isoformat() + " 12:00:00", "Soup", 0, 0.0))
    rows.append((FIRST.isoformat() + " 12:00:00", "Soup", 0, 0.0))
    connection.executemany("INSERT INTO sales VALUES (?, ?, ?, ?)", rows)
    connection.commit()
    connection.close()
    return amounts


def test_the_parts_are_drawn_as_three_lines_in_two_colours(tmp_path):
    amounts = make_shop(tmp_path / "shop.db")
    svg = run_shell(".parameter set @item Soup\n.mode list\n.headers off\n"
                    + (SOURCE / "demo" / "parts_chart.sql").read_text(), database=str(tmp_path / "shop.db"))
    svg = svg[svg.index("<svg"):]
    root = ET.fromstring(svg)
    lines = {(p.get("data-series"), p.get("data-layer")): p for p in root.iter(f"{SVG}path")
             if p.get("data-series")}
    raw, trend, both = lines[("Soup", "raw")], lines[("Soup", "smooth")], lines[("Soup: trend + season", "smooth")]
    assert len(lines) == 3
    assert raw.get("stroke") == trend.get("stroke")                  # one colour for the item
    assert both.get("stroke") != trend.get("stroke")                 # trend + season in its own
    assert float(raw.get("stroke-width")) < float(trend.get("stroke-width"))   # thin amounts, thick trend

    # oracle: statsmodels' STL with period 52 and its defaults, non-robust (three cycles: ext/README.md)
    fit = STL(amounts, period=52, robust=False).fit()
    # The y axis is linear and shared: the amounts' pixel rows fix y = a + b * value, and the
    # other two lines must lie on the same map (their points written to a fraction of a pixel).
    raw_y = [y for _, y in points_of(raw.get("d"))]
    assert len(raw_y) == WEEKS
    b, a = np.polyfit(amounts, raw_y, 1)
    assert b < 0                                                     # larger amounts higher up
    for path, expected in ((raw, amounts), (trend, fit.trend), (both, fit.trend + fit.seasonal)):
        drawn = [y for _, y in points_of(path.get("d"))]
        assert len(drawn) == WEEKS
        assert max(abs(y - (a + b * e)) for y, e in zip(drawn, expected)) <= 0.25, path.get("data-series")

    image = screenshot(page(svg), 800, 300)
    colours = {key: hex_rgb(p.get("stroke")) for key, p in lines.items()}
    checked = 0
    # The thick lines show their full colour at their vertices; where trend + season is far
    # from the trend (the season's peaks and troughs), each shows its own colour.
    trend_points, both_points = points_of(trend.get("d")), points_of(both.get("d"))
    for (x, y_trend), (_, y_both) in zip(trend_points, both_points):
        if abs(y_both - y_trend) > 12:
            assert nearest(image, x, y_trend, colours[("Soup", "smooth")]) <= 40, (x, y_trend)
            assert nearest(image, x, y_both, colours[("Soup: trend + season", "smooth")]) <= 40, (x, y_both)
            # Control: the other colour is not there, so a blank or swapped drawing fails.
            assert nearest(image, x, y_trend, colours[("Soup: trend + season", "smooth")], radius=0) > 60
            checked += 1
    assert checked >= 40
    print(f"checked {checked} vertices")
