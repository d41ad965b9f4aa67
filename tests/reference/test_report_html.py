# SPDX-License-Identifier: MIT
"""demo/run.sh's report.html as a reader gets it: one self-contained file
whose first section answers "how did the latest week do against the week
before and the same week last year, per shop", with partial periods marked;
readable in Debian's chromium at 1,200 and 390 px (the page itself never
scrolls sideways: document.documentElement.scrollWidth, read in the browser,
is at most the window's width), and printable: chromium prints it to PDF,
pdftoppm (poppler-utils) turns each page into an image, and no page has ink
in its right margin, where a table cut off at the page edge would show.

The data: demo/generate.py over 2024-11-04 .. 2025-12-17, a Wednesday in the
middle of a month, so the latest week and month are partial.
tests/run.sh installs chromium and poppler-utils; this test never skips.
"""
import datetime as dt
import pathlib
import re
import subprocess
import tempfile

import numpy as np
import pytest

from conftest import SOURCE
from test_chart_browser import CHROMIUM, decode_png

LAST_DAY = dt.date(2025, 12, 17)


@pytest.fixture(scope="module")
def report(tmp_path_factory):
    work = tmp_path_factory.mktemp("report")
    database = work / "shop.db"
    subprocess.run(["/usr/bin/python3", str(SOURCE / "demo" / "generate.py"), "--out", str(database),
                    "--start", "2024-11-04", "--end", LAST_DAY.isoformat(), "--scale", "0.05"],
                   check=True, capture_output=True)
    result = subprocess.run([str(SOURCE / "demo" / "run.sh"), "--db", str(database), "--out", str(work / "out")],
                            capture_output=True, text=True, timeout=900)
    assert result.returncode == 0, result.stderr[-3000:]
    return work / "out" / "report.html"


def run_chromium(args, page, timeout=180):
    with tempfile.TemporaryDirectory() as profile:
        return subprocess.run([CHROMIUM, "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run",
                               "--disable-background-networking", "--disable-component-update",
                               f"--user-data-dir={profile}", "--hide-scrollbars", "--force-device-scale-factor=1",
                               *args, pathlib.Path(page).as_uri()], capture_output=True, timeout=timeout)


def test_the_file_is_self_contained(report):
    html = report.read_text(encoding="utf-8")
    # common practice: no script, no stylesheet or image fetched from elsewhere
    assert "<script" not in html.lower() and "<link" not in html.lower() and "<img" not in html.lower()
    assert not re.search(r"""(src|href)\s*=\s*["']?(https?:|//)""", html)
    assert "url(" not in html
    assert html.count("<svg") >= 14  # weekly bars, the overlay, twelve items: inline


def test_the_summary_comes_first_per_shop_with_the_partial_week_marked(report):
    html = report.read_text(encoding="utf-8")
    first_table = html[html.index("<table"):html.index("</table>")]
    assert html.index("<table") < html.index("<svg")  # the summary before any chart
    iso_year, week, weekday = LAST_DAY.isocalendar()  # oracle: date.isocalendar()
    assert f"Week {iso_year}-W{week:02d}" in first_table
    assert f"partial: {weekday} of 7 days" in first_table  # Wednesday: 3 days of the ISO week
    for shop in ("All shops", "Millrace", "Quarry Hill", "Lantern Square"):
        assert f">{shop}</th>" in first_table  # demo/generate.py's three shops, and all of them
    previous = LAST_DAY - dt.timedelta(weeks=1)
    assert f"against {previous.isocalendar()[0]}-W{previous.isocalendar()[1]:02d}" in first_table
    assert f"against {iso_year - 1}-W{week:02d}" in first_table  # the same ISO week a year earlier
    month_table = html[html.index("<table", html.index("</table>")):]
    assert f"partial: {LAST_DAY.day} of 31 days" in month_table[:month_table.index("</table>")]  # December


def scroll_width(page, width):
    """document.documentElement.scrollWidth and innerWidth of `page` laid out `width` px
    wide: headless chromium's window is at least 500 px, so the page goes into an
    iframe of that width; a line of script in the wrapper writes both numbers into
    the wrapper's title, read back with --dump-dom."""
    wrapper = page.with_name(f"probe_{width}.html")
    wrapper.write_text(
        "<!doctype html><html><head><title>x</title></head><body style='margin:0'>"
        f"<iframe id='f' src='{page.name}' style='width:{width}px;height:900px;border:0'></iframe>"
        "<script>document.getElementById('f').onload = function () { var d = this.contentDocument;"
        " document.title = 'W' + d.documentElement.scrollWidth + 'x' + this.contentWindow.innerWidth; };"
        "</script></body></html>", encoding="utf-8")
    result = run_chromium(["--dump-dom", "--allow-file-access-from-files", "--virtual-time-budget=20000",
                           "--window-size=1200,900"], wrapper)
    assert result.returncode == 0, result.stderr.decode(errors="replace")[-2000:]
    found = re.search(r"<title>W(\d+)x(\d+)</title>", result.stdout.decode("utf-8"))
    assert found, result.stdout.decode("utf-8")[:500]
    return int(found.group(1)), int(found.group(2))


@pytest.mark.parametrize("width", [1200, 390])
def test_the_page_never_scrolls_sideways(report, width):
    page_width, window = scroll_width(report, width)
    assert window == width
    assert page_width <= window, f"the page is {page_width} px wide in a {window} px window"


def test_the_probe_sees_a_page_that_does_overflow(report, tmp_path):
    # The control: a page with a 2,000 px table and no box around it does overflow at 390 px.
    wide = tmp_path / "wide.html"
    wide.write_text("<!doctype html><html><head><meta name='viewport' content='width=device-width'>"
                    "<title>x</title></head><body><table><tr><td style='min-width:2000px'>x</td></tr>"
                    "</table></body></html>")
    page_width, window = scroll_width(wide, 390)
    assert page_width > window


def right_margin_ink(pdf, work):
    """Per page: the darkest pixel of the rightmost 3 % of the page image (255 = white)."""
    subprocess.run(["pdftoppm", "-r", "60", "-png", str(pdf), str(work / "page")], check=True)
    darkest = []
    for png in sorted(work.glob("page*.png")):
        image = decode_png(png.read_bytes())
        strip = image[:, int(image.shape[1] * 0.97):, :]
        darkest.append(int(strip.min()))
    return darkest


def print_to_pdf(page, pdf):
    result = run_chromium([f"--print-to-pdf={pdf}", "--no-pdf-header-footer"], page)
    assert pdf.exists(), result.stderr.decode(errors="replace")[-2000:]


def last_headers(html):
    """The text of the last header cell of every table: the column a cut would lose first.
    A table inside a closed <details> is not on paper by design (it opens on screen)."""
    found = []
    html = re.sub(r"<details.*?</details>", "", html, flags=re.S | re.I)
    for table in re.findall(r"<table.*?</table>", html, re.S | re.I):
        cells = re.findall(r"<th[^>]*>(.*?)</th>", table, re.S | re.I)
        found.append(re.sub(r"<[^>]+>", "", cells[-1]).strip())
    return found


def missing_last_columns(page, work):
    """Prints `page` to PDF; returns the last-column headers whose text the PDF lacks
    (pdftotext), and the darkest pixel of each page's right margin (pdftoppm)."""
    pdf = work / "page.pdf"
    print_to_pdf(page, pdf)
    text = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], capture_output=True, text=True,
                          check=True).stdout
    headers = last_headers(page.read_text(encoding="utf-8"))
    missing = [h for h in set(headers) if text.count(h) < headers.count(h)]
    return missing, right_margin_ink(pdf, work)


def test_printed_pages_cut_no_table_at_the_right_edge(report, tmp_path):
    missing, darkest = missing_last_columns(report, tmp_path)
    assert len(darkest) >= 2
    # every table's last column is on paper (pdftotext finds its header as often as the tables have it)
    assert not missing, missing
    # @page margin 12 mm of 210 mm (A4): the last 3 % of the width is margin, white unless overflowing
    assert all(value >= 250 for value in darkest), darkest
    # The control: the same report without its print rules (the tables' sideways-scrolling boxes
    # stay, and clip) loses last columns, so the check can fail.
    control = report.with_name("control.html")
    html = report.read_text(encoding="utf-8")
    control.write_text(html[:html.index("@media print")] + html[html.index("</style>"):], encoding="utf-8")
    work = tmp_path / "control"
    work.mkdir()
    missing, _ = missing_last_columns(control, work)
    assert missing
