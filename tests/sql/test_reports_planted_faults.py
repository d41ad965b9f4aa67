# SPDX-License-Identifier: MIT
"""Faults planted in a generated export, each caught by the reports and by sql/data_check.sql.

- a stray row twenty years early and one in the future: every report names
  them on its range line and gives what it gives without them;
- a partial last day past midnight (a shop open late): with @day_start
  '04:00' compare.sql counts the whole business days, as a Python
  computation of those days (zoneinfo, math.fsum) does;
- an empty amount: data_check.sql names its rowid, the reports' range line
  counts it;
- a time that does not read and money written as text: data_check.sql names
  their rowids (the reports stop on them).
The export is written by demo/generate.py; its data ends on a Wednesday.
"""
import csv
import datetime as dt
import math
import shutil
import sqlite3
import subprocess
from zoneinfo import ZoneInfo

import pytest

from conftest import MODULE, SOURCE
from report_shell import generate_export, run_report

ZONE = "America/Denver"
TABLES = ["totals", "compare", "trend", "noise_ranking", "weekday_profile", "seasonal_profile", "anomalies"]
CHARTS = ["period_bars", "daily_chart"]
LAST_DAY = dt.date(2025, 6, 25)  # a Wednesday (date.weekday() == 2)


@pytest.fixture(scope="module")
def clean(tmp_path_factory):
    path = tmp_path_factory.mktemp("faults") / "clean.db"
    generate_export(path, "2023-06-05", LAST_DAY.isoformat(), 0.05)
    return path


def planted(clean, tmp_path, rows):
    path = tmp_path / "planted.db"
    shutil.copy(clean, path)
    connection = sqlite3.connect(path)
    connection.executemany("INSERT INTO sales(ts, item, qty, amount, shop) VALUES (?, ?, ?, ?, ?)", rows)
    connection.commit()
    connection.close()
    return path


def run(database, report, **params):
    result = run_report(database, report, ZONE, **params)
    assert result.returncode == 0, result.stderr
    return result.stdout


def is_note(line):
    """A line of the note under every report (data_range's notes), in .mode quote."""
    return line.startswith(("'range ", "'left out: ")) or "without an amount (sql/data_check.sql" in line


def without_range_line(output):
    return [line for line in output.splitlines() if not is_note(line)]


def range_line(output):
    """The note's lines joined as data_range's one-line note joins them."""
    return ["'" + "; ".join(line.strip("'") for line in output.splitlines() if is_note(line)) + "'"]


STRAY = ("2005-06-07 18:00:00", "Espresso", 1, 3.25, "Millrace")     # twenty years early
FUTURE = ("2031-05-01 18:00:00", "Espresso", 1, 3.25, "Millrace")    # later than now


@pytest.mark.parametrize("report", TABLES)
@pytest.mark.parametrize("by_segment", [0, 1])
def test_stray_and_future_rows_are_named_and_change_nothing_else(clean, tmp_path, report, by_segment):
    faulty = planted(clean, tmp_path, [STRAY, FUTURE])
    before = run(clean, report, by_segment=by_segment)
    after = run(faulty, report, by_segment=by_segment)
    # oracle: the same report on the export without the planted rows. With rows left out every
    # segment is reported over the kept range of the whole table (sql/README.md), so a segment
    # that starts later than the table (a shop closed on the first Monday) may count one more
    # day or week there: the rows of all segments are compared.
    keep = lambda lines: [line for line in lines if not by_segment or line.startswith("'all segments'")
                          or report in ("totals", "compare")]
    assert keep(without_range_line(after)) == keep(without_range_line(before))
    rows = sqlite3.connect(clean).execute("SELECT count(*) FROM sales").fetchone()[0]
    # oracle: the generator's range (--start, --end) and the table's row count
    assert range_line(before) == [f"'range 2023-06-05..2025-06-25: 752 days, {rows} rows; left out: nothing'"]
    assert range_line(after) == [f"'range 2023-06-05..2025-06-25: 752 days, {rows} rows; "
                                 "left out: 1 stray row on 2005-06-07; left out: 1 future row on 2031-05-01'"]


@pytest.mark.parametrize("report", CHARTS)
def test_the_charts_say_what_they_left_out(clean, tmp_path, report):
    faulty = planted(clean, tmp_path, [STRAY, FUTURE])
    before, after = run(clean, report), run(faulty, report)
    assert "left out" not in before
    assert "left out: 1 stray row on 2005-06-07; left out: 1 future row on 2031-05-01" in after
    # the same bars and lines otherwise: only the title differs
    strip = lambda svg: [line for line in svg.splitlines() if "Amount per" not in line]
    assert strip(after) == strip(before)


def business_day(ts, zone, start_hour=4):
    local = dt.datetime.fromisoformat(ts).replace(tzinfo=dt.timezone.utc).astimezone(zone)
    return (local - dt.timedelta(hours=start_hour)).date()


def test_a_partial_last_day_past_midnight_counts_for_the_day_it_belongs_to(clean, tmp_path):
    zone = ZoneInfo(ZONE)
    # Three sales between 00:05 and 00:15 local on Thursday, after the last whole day (a shop open late).
    late = []
    for k in range(3):
        local = dt.datetime.combine(LAST_DAY + dt.timedelta(days=1), dt.time(0, 5 + 5 * k), tzinfo=zone)
        late.append((local.astimezone(dt.timezone.utc).strftime("%Y-%m-%d %H:%M:%S"), "Espresso", 1, 3.25, "Millrace"))
    faulty = planted(clean, tmp_path, late)
    rows = sqlite3.connect(faulty).execute("SELECT ts, amount FROM sales").fetchall()
    # oracle: business days from 04:00 local (zoneinfo), the week to date Monday..Wednesday and the
    # same three days of the week before, summed with math.fsum; trading days are days with sales
    monday = LAST_DAY - dt.timedelta(days=LAST_DAY.weekday())
    def span(first, days):
        amounts = [a for ts, a in rows if first <= business_day(ts, zone) < first + dt.timedelta(days=days)]
        trading = {business_day(ts, zone) for ts, _ in rows
                   if first <= business_day(ts, zone) < first + dt.timedelta(days=days)}
        return round(math.fsum(amounts), 2), len(trading)
    amount, trading = span(monday, 3)
    base_amount, base_trading = span(monday - dt.timedelta(days=7), 3)
    out = run(faulty, "compare", day_start="04:00", against="previous")
    first = without_range_line(out)[0].split(",")
    assert first[6] == f"'{monday.isoformat()}..{LAST_DAY.isoformat()}'"
    assert (int(first[7]), float(first[8])) == (trading, amount) == (3, amount)
    assert (int(first[13]), float(first[14])) == (base_trading, base_amount)
    assert float(first[16]) == round(100 * (amount - base_amount) / base_amount, 1)
    # Without @day_start the three rows make a fourth, nearly empty trading day: the fault the option fixes.
    plain = without_range_line(run(faulty, "compare", against="previous"))[0].split(",")
    assert int(plain[7]) == 4
    # sql/data_check.sql names that day as short.
    check = run(faulty, "data_check")
    assert sum("'short day'" in line and "2025-06-26" in line for line in check.splitlines()) == 3


def test_an_empty_amount_is_named_by_the_data_check_and_counted_in_the_note(clean, tmp_path):
    path = tmp_path / "export.db"
    shutil.copy(clean, path)
    connection = sqlite3.connect(path)
    # An export whose amounts are text, read with to_amount in a view; one amount is empty.
    connection.executescript("""
        CREATE TABLE export AS SELECT ts, item, qty, printf('%.2f', amount) AS amount, shop AS segment FROM sales;
        DROP TABLE sales;
        UPDATE export SET amount = '' WHERE rowid = 1234;""")
    connection.commit()
    connection.close()
    view = "CREATE TEMP VIEW sales AS SELECT rowid, ts, item, qty, to_amount(amount) AS amount, segment FROM export;\n"
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    def shell(report):
        script = f".load {module}\n.mode quote\n.parameter set @zone {ZONE}\n" + view + (
            SOURCE / "sql" / f"{report}.sql").read_text()
        result = subprocess.run(["sqlite3", "-bail", str(path)], input=script, capture_output=True, text=True,
                                timeout=300)
        assert result.returncode == 0, result.stderr
        return result.stdout
    check = shell("data_check").splitlines()
    # oracle: the one row planted, rowid 1234
    assert [line.split(",")[0] for line in check] == ["1234"]
    assert "'amount','the amount is empty: the sale counts, its money does not'" in check[0]
    assert range_line(shell("totals"))[0].endswith("; 1 row without an amount (sql/data_check.sql lists it)'")


def test_the_data_check_names_rows_that_would_stop_a_report(clean, tmp_path):
    path = planted(clean, tmp_path, [("yesterday", "Espresso", 1, 3.25, "Millrace"),
                                     ("2025-01-08 17:00:00", "Espresso", 1, "1,050.00", "Millrace"),
                                     STRAY, FUTURE])
    rowids = [r[0] for r in sqlite3.connect(path).execute("SELECT rowid FROM sales ORDER BY rowid DESC LIMIT 4")]
    check = list(csv.reader(run(path, "data_check").splitlines(), quotechar="'"))
    # oracle: the four rows planted, newest last, in the order of the checks
    assert [(int(c[0]), c[4]) for c in check] == [(rowids[3], "time"), (rowids[2], "amount"),
                                                  (rowids[1], "stray"), (rowids[0], "future")]
