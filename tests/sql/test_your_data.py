# SPDX-License-Identifier: MIT
"""README "Your data": the figures its imports print, against oracles computed here.

The blocks themselves run, and their output is compared with the page, in
test_markdown_examples.py. Here:

1. The weekly figures of the US till's import match an oracle computed from
   the CSV with datetime.strptime, zoneinfo and decimal.Decimal.
2. So do those of the semicolon-separated export (csv with delimiter ';',
   the decimal comma, the repeated header left out, the corrected row), and
   the row the page names as the one the reading error comes from is the one
   Python's own reading refuses.
3. The conversion the --local-time block relies on agrees with zoneinfo for
   every row, and the rule is real: the same local data read without the view
   gives other weekly totals.
"""
import csv
import datetime as dt
import re
import shutil
import sqlite3
import subprocess
from decimal import Decimal, InvalidOperation
from zoneinfo import ZoneInfo

from conftest import MODULE, SOURCE, connect

README = (SOURCE / "README.md").read_text()
SECTION = README[README.index("## Your data"):README.index("## The reports")]
BLOCKS = re.findall(r"```sqlite3\n((?:(?!```).)*?)```\n```text\n((?:(?!```).)*?)```", SECTION, re.S)
IMPORT = next(block for block in BLOCKS if "pos_export.csv" in block[0])
FINDING = next(block for block in BLOCKS if block[0].startswith('SELECT rowid, "Date"'))
CORRECTED = next(block for block in BLOCKS if block[0].startswith("UPDATE till"))
VIENNA = ZoneInfo("Europe/Vienna")
ZONE = ZoneInfo("America/Denver")


def shell(script, *flags):
    result = subprocess.run(["sqlite3", *flags], input=script, capture_output=True, text=True,
                            cwd=SOURCE, timeout=300)
    assert result.returncode == 0 and not result.stderr, result.stderr
    return result.stdout


def test_the_weekly_totals_of_the_import_match_an_oracle():
    rows = list(csv.DictReader((SOURCE / "tests" / "data" / "pos_export.csv").open()))
    expected = {}
    for row in rows:
        # oracle: datetime.strptime for the layout, zoneinfo for the shop's calendar
        local = dt.datetime.strptime(row["Date"], "%m/%d/%Y %I:%M %p").replace(tzinfo=ZONE, fold=0)
        week = "%04d-W%02d" % local.isocalendar()[:2]
        # common practice (US exports): '$' sign, ',' thousands, parentheses for a refund
        text = row["Total"].replace("$", "").replace(",", "")
        amount = -Decimal(text.strip("()")) if text.startswith("(") else Decimal(text)
        sales, qty, total = expected.get(week, (0, 0, Decimal(0)))
        expected[week] = (sales + 1, qty + int(row["Qty"]), total + amount)
    script = IMPORT[0].replace(".read sql/totals.sql", ".mode json\n.read sql/totals.sql")
    import json
    got = {r["period"]: (r["sales"], r["qty"], Decimal(str(r["amount"])))
           for r in json.JSONDecoder().raw_decode(shell(script))[0]}  # the table; the note lines follow
    assert got == expected


def test_the_semicolon_export_matches_an_oracle():
    lines = list(csv.reader((SOURCE / "tests" / "data" / "till_export_semicolons.csv").open(newline=""),
                            delimiter=";"))
    header = lines[0]
    refused, records = [], []
    # rowid as .import numbers the rows: every line after the first, the repeated header included
    for rowid, fields in enumerate(lines[1:], start=1):
        if fields == header:
            continue
        record = dict(zip(header, fields), rowid=rowid)
        # common practice (continental European exports): '.' groups thousands, ',' is the decimal mark
        try:
            record["amount"] = Decimal(record["Total"].replace(".", "").replace(",", "."))
        except InvalidOperation:
            refused.append(record)
        records.append(record)
    assert [(r["rowid"], r["Date"], r["Item"], r["Total"]) for r in refused] == [
        tuple(int(f) if i == 0 else f for i, f in enumerate(line.split("|")))
        for line in FINDING[1].splitlines()]
    # the page's correction, applied to the oracle's rows
    update = re.match(r"""UPDATE till SET "Total" = '([^']*)' WHERE rowid = (\d+);""", CORRECTED[0])
    expected = {}
    for record in records:
        total = update.group(1) if record["rowid"] == int(update.group(2)) else record["Total"]
        amount = Decimal(total.replace(".", "").replace(",", "."))
        # oracle: datetime.strptime for the layout, zoneinfo for the shop's calendar
        local = dt.datetime.strptime(record["Date"], "%d.%m.%Y %H:%M").replace(tzinfo=VIENNA, fold=0)
        week = "%04d-W%02d" % local.isocalendar()[:2]
        sales, summed = expected.get(week, (0, Decimal(0)))
        expected[week] = (sales + 1, summed + amount)
    shown = {}
    for line in CORRECTED[1].splitlines():
        week, sales, amount = line.split("|")
        shown[week] = (int(sales), Decimal(amount))
    assert shown == expected


def test_local_time_data_needs_the_conversion(tmp_path):
    utc_db, local_db = tmp_path / "utc.db", tmp_path / "local.db"
    subprocess.run(["/usr/bin/python3", str(SOURCE / "demo" / "generate.py"), "--out", str(utc_db),
                    "--start", "2025-10-06", "--end", "2025-11-30", "--scale", "0.2"],
                   check=True, capture_output=True)
    shutil.copy(utc_db, local_db)
    db = connect(str(local_db))
    db.execute("UPDATE sales SET ts = substr(period_floor(ts, 'second', 'America/Denver'), 1, 19)")
    db.commit()
    original = dict(sqlite3.connect(utc_db).execute("SELECT rowid, ts FROM sales"))
    converted = dict(db.execute("SELECT rowid, ts FROM sales"))
    for rowid, ts in original.items():
        utc = dt.datetime.strptime(ts, "%Y-%m-%d %H:%M:%S").replace(tzinfo=dt.timezone.utc)
        # oracle: zoneinfo's wall clock for the UTC instant
        assert converted[rowid] == utc.astimezone(ZONE).strftime("%Y-%m-%d %H:%M:%S")
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    view = ("CREATE TEMP VIEW sales AS SELECT to_time(ts, '%Y-%m-%d %H:%M:%S', 'America/Denver') AS ts, "
            "item, qty, amount, shop, segment FROM main.sales;\n")
    report = (SOURCE / "sql" / "totals.sql").read_text()

    def totals(database, prefix=""):
        script = f".load {module}\n.parameter set @zone America/Denver\n" + prefix + report
        return subprocess.run(["sqlite3", "-bail", str(database)], input=script, capture_output=True,
                              text=True, check=True).stdout

    assert totals(local_db, view) == totals(utc_db)
    # Without the view, @zone shifts the local times a second time: other totals.
    assert totals(local_db) != totals(utc_db)
    print(f"\ncompared: {len(original)} converted rows against zoneinfo")
