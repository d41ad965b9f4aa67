# SPDX-License-Identifier: MIT
"""The Python package: the wheel the build makes (target python_wheel), installed
with pip into a fresh virtual environment without the network, used there as an
analyst would: almanac.load on a sqlite3 connection, a weekly query, a report of
sql/ read with pandas.read_sql, and the examples of ext/python/README.md.

Expected values come from plain Python (zoneinfo, date.isocalendar, math.fsum)
and from tests/reference/report_oracle.py, named beside each assertion. The
virtual environment sees Debian's site packages (pandas) but not the source
tree: the test checks that almanac is imported from the installed wheel.
"""
import hashlib
import json
import math
import os
import pathlib
import re
import shutil
import sqlite3
import subprocess
import sys
import sysconfig
import zipfile

import pytest

from conftest import MODULE, SOURCE, connect, run_shell

sys.path.insert(0, str(SOURCE / "tests" / "reference"))
import report_oracle as oracle  # noqa: E402  (plain-Python reports, see its docstring)

ZONE = "America/Denver"
WHEEL_DIR = pathlib.Path(os.environ.get("ALMANAC_WHEEL_DIR", SOURCE / "build" / "wheel"))
README = SOURCE / "ext" / "python" / "README.md"
# The project version, as the module itself reports it.
VERSION = connect().execute("SELECT almanac_version()").fetchone()[0]
WEEKLY = ("SELECT period_label(ts, 'week', 'America/Denver') AS week, count(*) AS sales, "
          "exact_sum(amount) AS amount FROM sales GROUP BY week ORDER BY week")


@pytest.fixture(scope="module")
def wheel():
    wheels = sorted(WHEEL_DIR.glob("almanac-*.whl"))
    assert len(wheels) == 1, f"expected one wheel in {WHEEL_DIR} (cmake --build build --target python_wheel): {wheels}"
    return wheels[0]


@pytest.fixture(scope="module")
def shop(tmp_path_factory):
    """A small demo database and the report library beside it, as a user's folder."""
    folder = tmp_path_factory.mktemp("shop")
    subprocess.run([sys.executable, str(SOURCE / "demo" / "generate.py"), "--out", str(folder / "shop.db"),
                    "--start", "2025-09-29", "--end", "2025-12-28", "--scale", "0.2"],
                   check=True, capture_output=True)
    shutil.copytree(SOURCE / "sql", folder / "sql")
    return folder


@pytest.fixture(scope="module")
def venv(tmp_path_factory, wheel):
    """A fresh virtual environment with the wheel installed by pip from the file alone."""
    folder = tmp_path_factory.mktemp("venv")
    subprocess.run([sys.executable, "-m", "venv", "--system-site-packages", str(folder)], check=True)
    python = folder / "bin" / "python"
    installed = subprocess.run([str(python), "-m", "pip", "install", "--no-index", "--no-deps",
                                "--disable-pip-version-check", str(wheel)], capture_output=True, text=True)
    assert installed.returncode == 0, installed.stdout + installed.stderr
    return python


def run_in(python, script, cwd, env=None):
    """Runs a Python script in a clean process (no PYTHONPATH towards the source tree)."""
    environment = {"PATH": "/usr/bin:/bin", "LANG": "C.UTF-8", **(env or {})}
    result = subprocess.run([str(python), "-c", script], cwd=cwd, capture_output=True, text=True,
                            env=environment, timeout=300)
    assert result.returncode == 0, result.stdout + result.stderr
    return result.stdout


def sale_rows(database):
    """The sales rows read with Python's sqlite3 alone, nothing of almanac loaded."""
    with sqlite3.connect(database) as connection:
        return connection.execute("SELECT ts, item, qty, amount FROM sales").fetchall()


def test_the_wheel_is_tagged_for_this_platform_and_carries_the_built_module(wheel):
    # The file name tag (PEP 427): any Python 3, no Python ABI, this platform as
    # sysconfig names it (common practice: pip derives linux_x86_64 this way).
    platform = sysconfig.get_platform().replace("-", "_").replace(".", "_")
    assert wheel.name == f"almanac-{VERSION}-py3-none-{platform}.whl"
    from wheel.wheelfile import WheelFile  # the wheel project's reader checks every RECORD hash
    with WheelFile(wheel) as archive:
        names = set(archive.namelist())
        for name in names:
            archive.read(name)
        carried = archive.read("almanac/almanac.so")
        wheel_metadata = archive.read(f"almanac-{VERSION}.dist-info/WHEEL").decode()
    assert {"almanac/__init__.py", "almanac/_version.py", "almanac/almanac.so",
            f"almanac-{VERSION}.dist-info/RECORD", f"almanac-{VERSION}.dist-info/METADATA"} <= names
    assert "Root-Is-Purelib: false" in wheel_metadata
    assert f"Tag: py3-none-{platform}" in wheel_metadata
    # The module inside is the one the build made: a stale wheel fails here.
    assert hashlib.sha256(carried).hexdigest() == hashlib.sha256(pathlib.Path(MODULE).read_bytes()).hexdigest(), \
        "the wheel carries another module than build/almanac.so: cmake --build build --target python_wheel"


def test_the_same_inputs_give_the_same_wheel_bytes(wheel, tmp_path):
    subprocess.run([sys.executable, str(SOURCE / "ext" / "python" / "build_wheel.py"), "--module", MODULE,
                    "--version", VERSION, "--out", str(tmp_path)], check=True, capture_output=True)
    (again,) = tmp_path.glob("*.whl")
    assert again.read_bytes() == wheel.read_bytes(), \
        f"{wheel} is not what build_wheel.py makes from the sources now: cmake --build build --target python_wheel"


def test_a_weekly_query_through_almanac_load_in_a_fresh_venv(venv, shop):
    output = run_in(venv, f"""
import json, sqlite3, almanac
connection = sqlite3.connect("shop.db")
assert almanac.load(connection) is connection
rows = connection.execute({WEEKLY!r}).fetchall()
try:
    connection.execute("SELECT load_extension('nothing')")
    switched_off = False
except sqlite3.OperationalError as error:
    switched_off = "not authorized" in str(error)
print(json.dumps(dict(rows=rows, package=almanac.__file__, module=almanac.module_path(),
                      version=almanac.__version__, sql_version=connection.execute(
                          "SELECT almanac_version()").fetchone()[0], switched_off=switched_off)))
""", cwd=shop)
    result = json.loads(output)
    venv_root = venv.parent.parent
    assert pathlib.Path(result["package"]).is_relative_to(venv_root), "almanac came from outside the venv"
    assert pathlib.Path(result["module"]).is_relative_to(venv_root)
    assert result["version"] == result["sql_version"] == VERSION
    # Extension loading is off again once almanac.load returns (SQLite answers "not authorized").
    assert result["switched_off"]
    # oracle: zoneinfo local days, date.isocalendar() weeks, math.fsum sums.
    weeks = {}
    for ts, _item, _qty, amount in sale_rows(shop / "shop.db"):
        year, week, _ = oracle.local_day(ts, ZONE).isocalendar()
        weeks.setdefault(f"{year}-W{week:02d}", []).append(amount)
    expected = [[label, len(amounts), math.fsum(amounts)] for label, amounts in sorted(weeks.items())]
    assert result["rows"] == expected
    assert len(expected) == 13


def test_a_report_of_sql_reads_into_pandas(venv, shop):
    output = run_in(venv, """
import sqlite3, almanac
connection = almanac.load(sqlite3.connect("shop.db"))
weeks, note = almanac.read_report(connection, "sql/totals.sql", zone="America/Denver")
assert list(note.columns) == ["note"] and note["note"][0].startswith("range "), note
print(weeks.to_json(orient="records"))
# The report leaves nothing behind in the connection (its temporary view is dropped).
assert connection.execute("SELECT count(*) FROM temp.sqlite_master").fetchone()[0] == 0
""", cwd=shop)
    got = json.loads(output)
    # oracle: report_oracle.period_totals (plain Python), weeks of the local calendar.
    expected = oracle.period_totals(sale_rows(shop / "shop.db"), ZONE, oracle.week_of)
    assert [row["period"] for row in got] == [row["label"] for row in expected]
    assert [row["sales"] for row in got] == [row["sales"] for row in expected]
    assert [row["amount"] for row in got] == [round(row["amount"], 2) for row in expected]
    assert [row["days_covered"] for row in got] == [row["days_covered"] for row in expected]


def same_rows(got, expected):
    """Row lists equal, REAL values to 14 significant digits (the shell's JSON prints 15)."""
    assert len(got) == len(expected)
    for row, want in zip(got, expected):
        assert row.keys() == want.keys()
        for key, value in row.items():
            if isinstance(value, float) or isinstance(want[key], float):
                assert math.isclose(value, want[key], rel_tol=1e-14), (key, row, want)
            else:
                assert value == want[key], (key, row, want)


def test_a_report_with_a_temporary_table_reads_as_the_shell_prints_it(venv, shop):
    # sql/trend.sql: temporary table and view, parameters, two queries (the second
    # prints rows only per segment), clean-up.
    output = run_in(venv, """
import json, sqlite3, almanac
connection = almanac.load(sqlite3.connect("shop.db"))
tables = almanac.read_report(connection, "sql/trend.sql", zone="America/Denver", spark_weeks=6)
print(json.dumps([table.astype(object).where(table.notna(), None).to_dict("records") for table in tables]))
""", cwd=shop)
    tables = json.loads(output)
    # oracle: the real sqlite3 shell running the same file, unset parameters NULL.
    shell = run_shell(".parameter set @zone \"'America/Denver'\"\n.parameter set @spark_weeks 6\n.mode json\n"
                      + (shop / "sql" / "trend.sql").read_text(), database=str(shop / "shop.db"))
    expected = json.loads("[" + shell.replace("]\n[", "],\n[") + "]") if shell.strip() else []
    # the trend table, then the report's note (its range and what it left out)
    assert len(tables) == len(expected) == 2
    for table, want in zip(tables, expected):
        same_rows(table, want)


def python_blocks(markdown):
    return re.findall(r"```python\n(.*?)```", markdown.read_text(encoding="utf-8"), re.S)


def test_the_readme_examples_run_in_the_venv(venv, shop):
    blocks = python_blocks(README)
    assert len(blocks) >= 2
    # oracle: the README text itself; each block runs as written, in order, in one process.
    output = run_in(venv, "\n".join(blocks), cwd=shop)
    assert output.strip(), "the README examples print what they show"


def test_loading_is_switched_off_again_when_loading_fails(wheel, tmp_path):
    # A damaged install: the package's module file is not a shared object.
    target = tmp_path / "site"
    subprocess.run([sys.executable, "-m", "pip", "install", "--no-index", "--no-deps", "--disable-pip-version-check",
                    "--target", str(target), str(wheel)], check=True, capture_output=True)
    (target / "almanac" / "almanac.so").write_text("not a shared object\n")
    output = run_in(sys.executable, """
import sqlite3, almanac
connection = sqlite3.connect(":memory:")
try:
    almanac.load(connection)
except sqlite3.OperationalError as error:
    print("load:", error)
try:
    connection.execute("SELECT load_extension('nothing')")
except sqlite3.OperationalError as error:
    print("after:", error)
""", cwd=tmp_path, env={"PYTHONPATH": str(target)})
    load_line, after_line = output.splitlines()
    assert load_line.startswith(f"load: almanac.load(): loading {target / 'almanac' / 'almanac.so'} failed: ")
    # SQLite's own refusal once extension loading is off (sqlite3.c, sqlite3LoadExtension).
    assert after_line == "after: not authorized"


WITHOUT_LOADING = ("almanac.load(): argument 1 (connection) = a sqlite3.Connection: this Python's sqlite3 "
                   "module was built without extension loading")


def test_a_connection_without_extension_loading_gets_a_clear_error(venv, tmp_path):
    # Pythons built without --enable-loadable-sqlite-extensions have neither
    # enable_load_extension nor load_extension on sqlite3.Connection (CPython's
    # Modules/_sqlite/connection.c compiles them only with it): hasattr() is
    # False. This subclass looks the same from Python, for this interpreter;
    # the next test runs such a Python itself where one is installed.
    output = run_in(venv, """
import sqlite3, almanac

class WithoutLoading(sqlite3.Connection):
    def __getattribute__(self, name):
        if name in ("enable_load_extension", "load_extension"):
            raise AttributeError(name)
        return super().__getattribute__(name)

connection = sqlite3.connect(":memory:", factory=WithoutLoading)
assert not hasattr(connection, "enable_load_extension")
try:
    almanac.load(connection)
except almanac.ExtensionLoadingUnavailable as error:
    assert isinstance(error, sqlite3.NotSupportedError)
    print(error)
try:
    almanac.load("shop.db")
except TypeError as error:
    print(error)
""", cwd=tmp_path)
    unavailable, wrong_type = output.splitlines()
    assert unavailable.startswith(WITHOUT_LOADING)
    # The README quotes the message in full (wrapped): it must be the one users get.
    quoted = re.search(r"```\n(almanac\.load\(\): argument 1.*?)```", README.read_text(encoding="utf-8"), re.S)
    assert quoted and " ".join(quoted.group(1).split()) == unavailable
    assert "--enable-loadable-sqlite-extensions" in unavailable and "/usr/bin/python3" in unavailable
    assert wrong_type == ("almanac.load(): argument 1 (connection) = 'shop.db': "
                          "expected a connection made by sqlite3.connect()")


def pythons_without_extension_loading():
    """Python 3 interpreters on this machine whose sqlite3 cannot load extensions."""
    named = os.environ.get("ALMANAC_PYTHON_WITHOUT_LOADING")
    candidates = [named] if named else []
    for folder in os.environ.get("PATH", "").split(os.pathsep):
        for path in sorted(pathlib.Path(folder or ".").glob("python3*")):
            if re.fullmatch(r"python3(\.\d+)?", path.name) and os.access(path, os.X_OK):
                candidates.append(str(path))
    found = []
    for candidate in dict.fromkeys(candidates):
        probe = subprocess.run([candidate, "-c", "import sqlite3; print(hasattr(sqlite3.Connection, "
                                "'enable_load_extension'))"], capture_output=True, text=True)
        if probe.returncode == 0 and probe.stdout.strip() == "False":
            found.append(candidate)
    return found


def test_a_python_built_without_extension_loading_gets_the_same_error(wheel, tmp_path):
    found = pythons_without_extension_loading()
    if not found:
        pytest.skip("no Python without extension loading on this machine (PATH or ALMANAC_PYTHON_WITHOUT_LOADING); "
                    "the subclass test above covers the message")
    target = tmp_path / "site"
    with zipfile.ZipFile(wheel) as archive:  # a wheel is a zip; installed as pip would lay it out
        archive.extractall(target)
    output = run_in(found[0], """
import sqlite3, almanac
try:
    almanac.load(sqlite3.connect(":memory:"))
except almanac.ExtensionLoadingUnavailable as error:
    print(error)
""", cwd=tmp_path, env={"PYTHONPATH": str(target), "HOME": str(tmp_path),
                        "PATH": os.environ.get("PATH", "/usr/bin:/bin")})
    assert output.startswith(WITHOUT_LOADING), found[0]
