# SPDX-License-Identifier: MIT
# ctest-labels: heavy
"""demo/run.sh --db works when sales is a view that calls almanac's functions.

A shop's export keeps local times and money as text; the database maps it with
a view sales(ts, item, qty, amount, segment) built on to_time() and
to_amount(). Every sqlite3 run of demo/run.sh that reads sales must load the
module: SQLite compiles the view even to list its columns, and without the
module that fails with "no such function: to_time".
"""
import sqlite3
import subprocess

from conftest import MODULE, SOURCE
from report_shell import generate_export


def test_the_report_runs_over_a_view_that_uses_almanac(tmp_path):
    generated = tmp_path / "generated.db"
    generate_export(generated, "2025-10-06", "2025-12-17", 0.05)
    database = tmp_path / "shop.db"
    connection = sqlite3.connect(database)
    connection.enable_load_extension(True)
    connection.load_extension(MODULE)
    connection.execute(f"ATTACH '{generated}' AS generated")
    # The export as a till writes it: local wall time (Vienna) and money with a decimal comma.
    connection.executescript("""
        CREATE TABLE export AS
          SELECT strftime('%d.%m.%Y %H:%M:%S', ts) AS sold, item, qty,
                 replace(printf('%.2f', amount), '.', ',') || ' €' AS paid, shop
          FROM generated.sales;
        CREATE VIEW sales AS
          SELECT to_time(sold, '%d.%m.%Y %H:%M:%S', 'Europe/Vienna') AS ts, item, qty,
                 to_amount(paid, ',') AS amount, shop AS segment
          FROM export;""")
    connection.commit()
    connection.close()
    result = subprocess.run([str(SOURCE / "demo" / "run.sh"), "--db", str(database), "--zone", "Europe/Vienna",
                             "--out", str(tmp_path / "out")], capture_output=True, text=True, timeout=900)
    assert result.returncode == 0, result.stderr[-3000:]
    assert "no such function" not in result.stderr
    html = (tmp_path / "out" / "report.html").read_text(encoding="utf-8")
    assert "</html>" in html
    # The shops of the view's segment column are broken down (common practice: the report names them).
    assert all(shop in html for shop in ("Millrace", "Quarry Hill", "Lantern Square"))
