# SPDX-License-Identifier: MIT
# ctest-labels: gui
"""A desktop client: DB Browser for SQLite (Debian's sqlitebrowser) loads almanac
through its own extension setting and runs a weekly query on the demo database,
under Xvfb, driven with xdotool as a user would drive it.

The setting is the one its Preferences dialog writes ([extensions] list= in
~/.config/sqlitebrowser/sqlitebrowser.conf, keys read from the program's own
configuration file, which it writes with -O). The test opens the database,
clicks the Execute SQL tab, pastes the query into its editor and runs it
with Ctrl+Return.
The result grid is then copied to the clipboard with the program's own Copy
(Ctrl+A, Ctrl+C), read with xclip and compared with the same query in the real
sqlite3 shell and with plain Python; a screenshot shows the grid blank before
and filled after. The screenshot is kept in build/desktop/ to look at.
"""
import os
import pathlib
import shutil
import signal
import sqlite3
import subprocess
import sys
import time

import pytest

from conftest import MODULE, SOURCE, run_shell

sys.path.insert(0, str(SOURCE / "tests" / "reference"))
import report_oracle as oracle  # noqa: E402  (plain-Python local days)

ZONE = "America/Denver"
WEEKLY = ("SELECT period_label(ts, 'week', 'America/Denver') AS week, count(*) AS sales, "
          "exact_sum(amount) AS amount FROM sales GROUP BY week ORDER BY week;")
SCREEN = (1280, 800)
# Where things are in the program's first-run layout on this screen (no window
# manager: the window is at 0,0): the Execute SQL tab, its editor, the first
# cell of its result grid.
EXECUTE_SQL_TAB = (427, 80)
EDITOR = (250, 250)
GRID_CELL = (75, 386)
GRID_ROWS = (40, 378, 190, 150)  # x, y, width, height: the cells of the first rows
TOOLS = {"Xvfb": "xvfb", "sqlitebrowser": "sqlitebrowser", "xdotool": "xdotool", "xclip": "xclip",
         "import": "imagemagick"}


@pytest.fixture
def desktop(tmp_path):
    missing = [package for tool, package in TOOLS.items() if shutil.which(tool) is None]
    assert not missing, f"install the Debian packages {' '.join(missing)} (tests/run.sh does)"
    read_end, write_end = os.pipe()
    server = subprocess.Popen(["Xvfb", "-displayfd", str(write_end), "-screen", "0",
                               f"{SCREEN[0]}x{SCREEN[1]}x24", "-nolisten", "tcp"],
                              pass_fds=[write_end], stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    os.close(write_end)
    with os.fdopen(read_end) as display_number:
        display = ":" + display_number.readline().strip()
    home = tmp_path / "home"
    runtime = tmp_path / "runtime"
    runtime.mkdir(mode=0o700)
    environment = {"PATH": "/usr/bin:/bin", "DISPLAY": display, "HOME": str(home), "LANG": "C.UTF-8",
                   "XDG_CONFIG_HOME": str(home / ".config"), "XDG_RUNTIME_DIR": str(runtime)}
    yield environment
    server.send_signal(signal.SIGTERM)
    server.wait(timeout=30)


def write_settings(home, extensions):
    """The program's settings file, as its Preferences dialog leaves it: `extensions`
    (a path, or "" for none) loaded for every database, SQL's load_extension() left off."""
    folder = home / ".config" / "sqlitebrowser"
    folder.mkdir(parents=True)
    # Qt's INI form: [%General] is the group named General; a list of one is written bare.
    listed = f"list={extensions}\n" if extensions else ""
    (folder / "sqlitebrowser.conf").write_text(
        "[%General]\nlanguage=en_US\n\n"
        f"[extensions]\n{listed}enable_load_extension=false\ndisableregex=false\n\n"
        "[checkversion]\nenabled=false\n\n[editor]\nauto_completion=false\n", encoding="utf-8")


def tool(environment, *command, timeout=60):
    return subprocess.run(command, env=environment, capture_output=True, text=True, timeout=timeout)


def main_window(environment):
    """The program's main window, once its title names the database (it is open then)."""
    deadline = time.monotonic() + 60
    while time.monotonic() < deadline:
        found = tool(environment, "xdotool", "search", "--name", r"^DB Browser for SQLite - .*shop\.db")
        if found.returncode == 0:
            return found.stdout.split()[0]
        time.sleep(0.5)
    raise AssertionError("sqlitebrowser showed no window with the database open within 60 s")


def grid_pixels(environment, shot):
    """The grey values of the first rows of the result grid in a screenshot of the screen."""
    assert tool(environment, "import", "-window", "root", str(shot)).returncode == 0
    x, y, width, height = GRID_ROWS
    crop = subprocess.run(["/usr/bin/convert", str(shot), "-crop", f"{width}x{height}+{x}+{y}", "+repage",
                           "-depth", "8", "gray:-"], capture_output=True, check=True)
    assert len(crop.stdout) == width * height
    return crop.stdout


def copied_grid(environment, window):
    """The result grid as the program copies it: one line per row, cells separated by tabs."""
    tool(environment, "xdotool", "mousemove", "--window", window, *map(str, GRID_CELL), "click", "1")
    tool(environment, "xdotool", "key", "ctrl+a")
    time.sleep(0.5)
    # While rows are still coming in, Select All first asks whether to load them all
    # (a message box titled with the program's name alone): Return answers its default, Yes.
    if tool(environment, "xdotool", "search", "--onlyvisible", "--name", "^DB Browser for SQLite$").returncode == 0:
        tool(environment, "xdotool", "key", "Return")
        time.sleep(1)
    tool(environment, "xdotool", "key", "ctrl+c")
    time.sleep(0.3)
    pasted = tool(environment, "xclip", "-o", "-selection", "clipboard", timeout=10)
    return pasted.stdout.splitlines() if pasted.returncode == 0 else []


def run_weekly_query(desktop, tmp_path, extensions, wait=60):
    """Opens the demo database in the program with `extensions` set to load, types the
    weekly query into Execute SQL (pasted, as the editor would otherwise complete words),
    runs it, and returns (database, grid lines, grid pixels before, after, screenshot)."""
    database = tmp_path / "shop.db"
    subprocess.run([sys.executable, str(SOURCE / "demo" / "generate.py"), "--out", str(database)],
                   check=True, capture_output=True)
    expected_rows = len(run_shell(WEEKLY, database=str(database)).splitlines())
    write_settings(pathlib.Path(desktop["HOME"]), extensions)
    log = open(tmp_path / "sqlitebrowser.log", "w")
    program = subprocess.Popen(["sqlitebrowser", str(database)], env=desktop, cwd=tmp_path, stdout=log, stderr=log)
    try:
        window = main_window(desktop)
        tool(desktop, "xdotool", "windowfocus", "--sync", window)
        tool(desktop, "xdotool", "mousemove", "--window", window, *map(str, EXECUTE_SQL_TAB), "click", "1")
        time.sleep(1)
        before = grid_pixels(desktop, tmp_path / "before.png")
        subprocess.run(["xclip", "-i", "-selection", "clipboard"], input=WEEKLY, text=True, env=desktop, check=True,
                       timeout=10)
        tool(desktop, "xdotool", "mousemove", "--window", window, *map(str, EDITOR), "click", "1")
        tool(desktop, "xdotool", "key", "ctrl+v")
        time.sleep(0.5)
        tool(desktop, "xdotool", "key", "ctrl+Return")
        lines, deadline = [], time.monotonic() + wait
        while len(lines) != expected_rows and time.monotonic() < deadline:
            time.sleep(1)
            lines = copied_grid(desktop, window)
        # One cell selected, so the screenshot shows the grid as a user sees it.
        tool(desktop, "xdotool", "mousemove", "--window", window, *map(str, GRID_CELL), "click", "1")
        time.sleep(0.5)
        shot = tmp_path / "weekly.png"
        after = grid_pixels(desktop, shot)
        return database, lines, before, after, shot
    finally:
        program.terminate()
        program.wait(timeout=30)
        log.close()


def keep_for_a_human(shot):
    folder = pathlib.Path(MODULE).parent / "desktop"
    folder.mkdir(exist_ok=True)
    shutil.copy(shot, folder / shot.name)


def test_sqlitebrowser_loads_almanac_from_its_setting_and_fills_the_grid(desktop, tmp_path):
    database, lines, before, after, shot = run_weekly_query(desktop, tmp_path, MODULE)
    keep_for_a_human(shot)
    # oracle: the same query in the real sqlite3 shell, tab-separated as the grid copies it.
    expected = run_shell(".mode tabs\n" + WEEKLY, database=str(database)).splitlines()
    assert lines == expected, f"the grid (screenshot {shot}) holds {len(lines)} rows, not {len(expected)}"
    # oracle: the weeks and their counts from zoneinfo local days and date.isocalendar().
    weeks = {}
    for (ts,) in sqlite3.connect(database).execute("SELECT ts FROM sales"):
        year, week, _ = oracle.local_day(ts, ZONE).isocalendar()
        weeks[f"{year}-W{week:02d}"] = weeks.get(f"{year}-W{week:02d}", 0) + 1
    assert [line.split("\t")[:2] for line in lines] == [[label, str(n)] for label, n in sorted(weeks.items())]
    assert len(lines) == 156  # the demo's three years, 2023-W01 .. 2025-W52 (demo/generate.py)
    # The screenshot: the grid's first rows blank before the query, drawn text after it.
    assert len(set(before)) == 1, "the result grid was not empty before the query"
    assert len(set(after)) > 10, f"the screenshot {shot} shows no filled grid"


def test_without_the_setting_the_query_fails_and_the_grid_stays_empty(desktop, tmp_path):
    # The same run with no extension in the setting: the functions are unknown, so
    # the grid above proves the module came in through the setting.
    _database, lines, _before, after, shot = run_weekly_query(desktop, tmp_path, "", wait=10)
    # Nothing to copy: the clipboard still holds the pasted query, no tab-separated row.
    assert not [line for line in lines if "\t" in line]
    assert len(set(after)) == 1, f"the screenshot {shot} shows a grid without the module"
