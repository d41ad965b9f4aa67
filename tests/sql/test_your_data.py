# SPDX-License-Identifier: MIT
"""README "Your data": the worked CSV import and the --local-time demonstration, run as written.

1. The five commands of the README's ```sqlite3 block run in the real shell
   from the repository's folder and print exactly the ```text block under
   them; the weekly figures also match an oracle computed here from the CSV
   with datetime.strptime, zoneinfo and decimal.Decimal.
2. The README's ```sh block (demo database, converted copy, demo/run.sh with
   and without --local-time) runs with bash and prints exactly its ```text
   block.
3. The conversion that block relies on agrees with zoneinfo for every row,
   and the rule is real: the same local data read without the view gives
   other weekly totals.
"""
import csv
import datetime as dt
import re
import shutil
import sqlite3
import subprocess
from decimal import Decimal
from zoneinfo import ZoneInfo

from conftest import MODULE, SOURCE, connect

README = (SOURCE / "README.md").read_text()
SECTION = README[README.index("## Your data"):README.index("## The demo")]
IMPORT = re.search(r"```sqlite3\n(.*?)```\n```text\n(.*?)```", SECTION, re.S)
LOCAL = re.search(r"```sh\n(dir=.*?)```\n```text\n(.*?)```", SECTION, re.S)
ZONE = ZoneInfo("America/Denver")


def shell(script, *flags):
    result = subprocess.run(["sqlite3", *flags], input=script, capture_output=True, text=True,
                            cwd=SOURCE, timeout=300)
    assert result.returncode == 0 and not result.stderr, result.stderr
    return result.stdout


def test_the_five_commands_print_what_the_readme_shows():
    commands, shown = IMPORT.group(1), IMPORT.group(2)
    assert len(commands.strip().splitlines()) == 5  # the issue: five commands
    # oracle: the README text itself, as a user reads it
    assert shell(commands, "-column", "-header") == shown


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
    script = IMPORT.group(1).replace(".read sql/totals.sql", ".mode json\n.read sql/totals.sql")
    import json
    got = {r["period"]: (r["sales"], r["qty"], Decimal(str(r["amount"])))
           for r in json.loads(shell(script))}
    assert got == expected


def test_the_local_time_demonstration_prints_what_the_readme_shows():
    block, shown = LOCAL.group(1), LOCAL.group(2)
    result = subprocess.run(["bash", "-e", "-c", block], capture_output=True, text=True, cwd=SOURCE,
                            timeout=900)
    assert result.returncode == 0, result.stderr
    assert result.stdout == shown  # oracle: the README text itself


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
