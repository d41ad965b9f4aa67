# SPDX-License-Identifier: MIT
# ctest-labels: heavy browser
"""Charts as a real browser shows them: Debian's chromium, headless, renders a
page with an inline chart to PNG; the test decodes the PNG itself (zlib from
the standard library, following the PNG specification, ISO/IEC 15948 / W3C
PNG 2nd ed.) and checks pixels where the SVG says each line is. A second page
proves that a series named like a script stays text: chromium's own DOM
(--dump-dom) and its pixels show that no script ran, while a control page
with the same name left unescaped does run it (so the check can fail).

tests/run.sh installs chromium. If it is missing this test fails: it never skips.
"""
import os
import pathlib
import random
import re
import struct
import subprocess
import tempfile
import xml.etree.ElementTree as ET
import zlib

import numpy as np

from conftest import connect

CHROMIUM = "/usr/bin/chromium"
SVG = "{http://www.w3.org/2000/svg}"


# ---------------------------------------------------------------------------
# A small PNG decoder: 8-bit RGB or RGBA, not interlaced (what chromium writes).


def decode_png(data):
    assert data[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG file"  # PNG spec 5.2, signature
    pos, idat, header = 8, [], None
    while pos < len(data):
        (length,) = struct.unpack(">I", data[pos:pos + 4])
        kind = data[pos + 4:pos + 8]
        body = data[pos + 8:pos + 8 + length]
        (crc,) = struct.unpack(">I", data[pos + 8 + length:pos + 12 + length])
        assert zlib.crc32(kind + body) == crc, f"bad CRC in {kind!r}"  # PNG spec 5.3
        if kind == b"IHDR":
            header = struct.unpack(">IIBBBBB", body)
        elif kind == b"IDAT":
            idat.append(body)
        elif kind == b"IEND":
            break
        pos += 12 + length
    width, height, depth, colour_type, _, _, interlace = header
    assert depth == 8 and colour_type in (2, 6) and interlace == 0, header
    channels = 3 if colour_type == 2 else 4
    raw = zlib.decompress(b"".join(idat))
    stride = width * channels
    out = np.zeros((height, stride), dtype=np.uint8)
    previous = np.zeros(stride, dtype=np.int32)
    for row in range(height):
        start = row * (stride + 1)
        kind = raw[start]
        line = np.frombuffer(raw, dtype=np.uint8, count=stride, offset=start + 1).astype(np.int32)
        # PNG spec 9.2, filter types 0-4.
        if kind == 0:
            recon = line
        elif kind == 1:  # Sub: a running sum per channel
            recon = np.cumsum(line.reshape(width, channels), axis=0).reshape(-1) % 256
        elif kind == 2:  # Up
            recon = (line + previous) % 256
        else:
            recon = np.zeros(stride, dtype=np.int32)
            up = previous.tolist()
            filt = line.tolist()
            cur = [0] * stride
            for i in range(stride):
                a = cur[i - channels] if i >= channels else 0
                b = up[i]
                if kind == 3:  # Average
                    cur[i] = (filt[i] + (a + b) // 2) % 256
                else:  # Paeth
                    c = up[i - channels] if i >= channels else 0
                    p = a + b - c
                    pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
                    predictor = a if pa <= pb and pa <= pc else (b if pb <= pc else c)
                    cur[i] = (filt[i] + predictor) % 256
            recon = np.array(cur, dtype=np.int32)
        out[row] = recon
        previous = recon
    return out.reshape(height, width, channels)[:, :, :3]


def test_the_png_decoder_reads_a_png_made_here():
    # A 3x2 image written by hand with filter types 0, 1 and 4 (PNG spec 9.2).
    pixels = [[(255, 0, 0), (0, 255, 0), (0, 0, 255)], [(10, 20, 30), (40, 50, 60), (70, 80, 90)]]
    rows = b"\x00" + bytes(v for p in pixels[0] for v in p)
    second = bytes(v for p in pixels[1] for v in p)
    sub = bytes((second[i] - (second[i - 3] if i >= 3 else 0)) % 256 for i in range(9))
    rows += b"\x01" + sub

    def chunk(kind, body):
        return struct.pack(">I", len(body)) + kind + body + struct.pack(">I", zlib.crc32(kind + body))
    png = (b"\x89PNG\r\n\x1a\n" + chunk(b"IHDR", struct.pack(">IIBBBBB", 3, 2, 8, 2, 0, 0, 0)) +
           chunk(b"IDAT", zlib.compress(rows)) + chunk(b"IEND", b""))
    assert decode_png(png).tolist() == [[list(p) for p in row] for row in pixels]


# ---------------------------------------------------------------------------
# Running the browser


def chromium(args, page_html):
    assert os.path.exists(CHROMIUM), (
        f"{CHROMIUM} is missing: tests/run.sh installs Debian's chromium package; this test does not skip")
    with tempfile.TemporaryDirectory() as work:
        page = pathlib.Path(work) / "page.html"
        page.write_text(page_html, encoding="utf-8")
        profile = pathlib.Path(work) / "profile"
        command = [CHROMIUM, "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                   "--disable-background-networking", "--disable-component-update", "--disable-sync",
                   f"--user-data-dir={profile}", "--hide-scrollbars", "--force-device-scale-factor=1",
                   *[a.replace("{work}", work) for a in args], page.as_uri()]
        result = subprocess.run(command, capture_output=True, timeout=180)
        shot = pathlib.Path(work) / "shot.png"
        return result, (shot.read_bytes() if shot.exists() else None)


def screenshot(page_html, width, height):
    result, png = chromium(["--screenshot={work}/shot.png", f"--window-size={width},{height}"], page_html)
    assert png, f"chromium wrote no screenshot: {result.stderr.decode(errors='replace')[-2000:]}"
    image = decode_png(png)
    assert image.shape[:2] == (height, width)
    return image


def dump_dom(page_html):
    result, _ = chromium(["--dump-dom", "--window-size=900,700"], page_html)
    assert result.returncode == 0, result.stderr.decode(errors="replace")[-2000:]
    return result.stdout.decode("utf-8")


def page(svg, title="chart", before=""):
    return (f"<!doctype html><html><head><meta charset=\"utf-8\"><title>{title}</title>"
            "<style>html,body{margin:0;padding:0;background:#fff}svg{display:block}</style></head>"
            f"<body>{before}{svg}</body></html>")


# ---------------------------------------------------------------------------
# Colours where the lines are


def hex_rgb(colour):
    return np.array([int(colour[i:i + 2], 16) for i in (1, 3, 5)], dtype=float)


def points_of(d):
    return [(float(x), float(y)) for x, y in re.findall(r"[ML](-?[\d.]+) (-?[\d.]+)", d)]


def nearest(image, x, y, colour, radius=2):
    """The smallest RGB distance to `colour` among pixels within `radius` of (x, y)."""
    h, w, _ = image.shape
    x0, x1 = max(0, int(x) - radius), min(w, int(x) + radius + 1)
    y0, y1 = max(0, int(y) - radius), min(h, int(y) + radius + 1)
    patch = image[y0:y1, x0:x1].astype(float)
    return float(np.sqrt(((patch - colour) ** 2).sum(axis=2)).min())


def test_each_series_colour_is_where_its_line_is():
    db = connect()
    rng = random.Random(11)
    db.execute("CREATE TABLE t(x, y, s, layer)")
    rows = []
    levels = {"north": 20, "south": 60, "east": 100, "west": 140}
    for name, level in levels.items():
        for k in range(40):
            day = f"2024-03-{k + 1:02d}" if k < 31 else f"2024-04-{k - 30:02d}"
            smooth = level + 0.2 * k
            rows.append((day, smooth, name, "smooth"))
            # The raw line zigzags 12 units either side of the smooth one.
            rows.append((day, smooth + (12 if k % 2 else -12) + rng.uniform(-1, 1), name, "raw"))
    db.executemany("INSERT INTO t VALUES (?, ?, ?, ?)", rows)
    svg = db.execute("SELECT svg_line_chart(x, y, s, layer, '{\"width\": 900, \"height\": 600}') FROM t"
                     ).fetchone()[0]
    image = screenshot(page(svg), 900, 600)
    root = ET.fromstring(svg)
    lines = root.findall(f".//{SVG}path")
    assert len(lines) == 8

    expected = {}  # (series, layer) -> the colour a fully covered pixel shows
    for line in lines:
        colour = hex_rgb(line.get("stroke"))
        alpha = float(line.get("stroke-opacity") or 1)
        # Source-over compositing on white (Porter-Duff; SVG 1.1 section 14.2).
        expected[(line.get("data-series"), line.get("data-layer"))] = alpha * colour + (1 - alpha) * 255

    checked = 0
    for line in lines:
        key = (line.get("data-series"), line.get("data-layer"))
        points = points_of(line.get("d"))
        if key[1] == "smooth":
            # Vertices and segment midpoints of a 2.75 px line: fully covered pixels exist.
            samples = points + [((a[0] + b[0]) / 2, (a[1] + b[1]) / 2) for a, b in zip(points, points[1:])]
            tolerance = 30
        else:
            # Raw zigzag: its vertices lie away from the smooth line; 1.25 px wide, 45 % opaque.
            samples = points[1:-1]
            tolerance = 45
        for x, y in samples:
            mine = nearest(image, x, y, expected[key])
            others = min(nearest(image, x, y, colour) for other, colour in expected.items() if other != key)
            assert mine <= tolerance, (key, x, y, mine)
            assert mine < others, (key, x, y, mine, others)
            checked += 1
    # The legend swatches show the full colour of each series.
    for entry in (g for g in root.iter(f"{SVG}g") if g.get("class") == "legend-entry"):
        swatch = entry.find(f"{SVG}line")
        x = (float(swatch.get("x1")) + float(swatch.get("x2"))) / 2
        assert nearest(image, x, float(swatch.get("y1")), hex_rgb(swatch.get("stroke"))) <= 30
        checked += 1
    # Control: midway between neighbouring series no smooth colour is present, so a
    # blank or misplaced rendering would fail the checks above.
    smooth = sorted((l for l in lines if l.get("data-layer") == "smooth"),
                    key=lambda l: np.mean([y for _, y in points_of(l.get("d"))]))
    xs = [x for x, _ in points_of(smooth[0].get("d"))]
    for upper, lower in zip(smooth, smooth[1:]):
        gap_y = (np.mean([y for _, y in points_of(upper.get("d"))]) +
                 np.mean([y for _, y in points_of(lower.get("d"))])) / 2
        for x in np.linspace(xs[2], xs[-3], 7):
            assert min(nearest(image, x, gap_y, expected[(l.get("data-series"), "smooth")])
                       for l in smooth) > 80
    print(f"checked {checked} pixel neighbourhoods")


# ---------------------------------------------------------------------------
# A series named like a script stays text


PAYLOAD = ("<script>document.getElementById('probe').textContent='SCRIPT RAN';"
           "document.getElementById('probe').style.background='#ff0000';document.title='SCRIPT RAN'</script>")
IMG_PAYLOAD = "<img src=x onerror=\"document.title='IMG RAN'\">"


def hostile_chart():
    db = connect()
    db.execute("CREATE TABLE t(x, y, s)")
    db.executemany("INSERT INTO t VALUES (?, ?, ?)", [(k, k % 5, PAYLOAD) for k in range(10)] +
                   [(k, k % 3, IMG_PAYLOAD) for k in range(10)])
    options = '{"title": "</title><script>document.title=\'TITLE RAN\'</script>", "width": 600, "height": 300}'
    return db.execute("SELECT svg_line_chart(x, y, s, 'smooth', ?) FROM t", (options,)).fetchone()[0]


PROBE = ("<div id=\"probe\" style=\"height:40px;background:#ffffff\">no script ran</div>")


def test_a_script_in_a_series_name_does_not_run():
    svg = hostile_chart()
    dom = dump_dom(page(svg, title="untouched", before=PROBE))
    assert "<title>untouched</title>" in dom          # no script changed the title
    assert ">no script ran</div>" in dom              # nor the probe
    # The name is on the page as text, and no script or img element came from it.
    assert "&lt;script&gt;document.getElementById" in dom
    assert "<script" not in dom and "<img" not in dom

    image = screenshot(page(svg, before=PROBE), 600, 340)
    probe = image[5:35, 5:200].reshape(-1, 3)
    red = ((probe[:, 0] > 200) & (probe[:, 1] < 60) & (probe[:, 2] < 60)).mean()
    assert red < 0.01  # the probe block was not painted red


def test_the_same_name_unescaped_would_run_so_the_check_can_fail():
    svg = hostile_chart()
    escaped = PAYLOAD.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("'", "&#39;")
    assert escaped in svg
    # What a chart without escaping would contain: the name as markup wherever it is
    # text (the legend shows it shortened; its <title> holds it whole).
    control = svg.replace(f">{escaped}<", f">{PAYLOAD}<")
    assert control != svg
    dom = dump_dom(page(control, title="untouched", before=PROBE))
    assert "<title>SCRIPT RAN</title>" in dom  # the script ran: the detector above sees a real run
    assert ">SCRIPT RAN</div>" in dom
    image = screenshot(page(control, before=PROBE), 600, 340)
    probe = image[5:35, 5:200].reshape(-1, 3)
    assert ((probe[:, 0] > 200) & (probe[:, 1] < 60) & (probe[:, 2] < 60)).mean() > 0.5
