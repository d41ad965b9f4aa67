# SPDX-License-Identifier: MIT
# ctest-labels: heavy root
"""The report command for cron: demo/run.sh --db, run by a user who is not root,
on a machine where almanac is already built.

The test creates that user with useradd (and fails if it cannot: it skips
nothing), gives it a small database of its own, and runs the real demo/run.sh
as that user with runuser. The run must not rebuild (the user cannot write
build/) and must not ask for any test package.
"""
import os
import pathlib
import pwd
import shutil
import subprocess
import tempfile

from conftest import SOURCE

USER = "almanac-cron"
TEST_PACKAGES = {"catch2", "python3-numpy", "python3-pandas", "python3-scipy", "python3-pytest",
                 "chromium", "poppler-utils"}


def test_runtime_packages_are_only_what_the_report_needs():
    listed = subprocess.run([str(SOURCE / "tests" / "setup.sh"), "--list"], capture_output=True, text=True,
                            check=True).stdout.split()
    # The list: compiler, CMake, SQLite, the date library; tzdata for the zones and python3
    # (standard library only) for demo/generate.py (common practice: Debian package names).
    assert set(listed) == {"g++", "cmake", "make", "libsqlite3-dev", "sqlite3", "libhowardhinnant-date-dev",
                           "tzdata", "python3"}
    assert not set(listed) & TEST_PACKAGES


def test_report_for_cron_runs_as_a_non_root_user_without_rebuilding():
    assert os.geteuid() == 0, "this test creates a user with useradd and must run as root"
    try:
        pwd.getpwnam(USER)
    except KeyError:
        subprocess.run(["/usr/sbin/useradd", "--no-create-home", "--shell", "/bin/sh", USER], check=True)
    user = pwd.getpwnam(USER)
    # Not under pytest's tmp_path: that sits in a folder only root may enter.
    home = pathlib.Path(tempfile.mkdtemp(prefix="almanac-cron-"))
    try:
        run_as_user(user, home)
    finally:
        shutil.rmtree(home)


def run_as_user(user, home):
    database = home / "sales.db"
    subprocess.run(["/usr/bin/python3", str(SOURCE / "demo" / "generate.py"), "--out", str(database),
                    "--start", "2025-11-03", "--end", "2025-12-17", "--scale", "0.1"],
                   check=True, capture_output=True)
    for path in (home, database):
        os.chown(path, user.pw_uid, user.pw_gid)
    module = SOURCE / "build" / "almanac.so"
    before = module.stat().st_mtime_ns
    result = subprocess.run(["/usr/sbin/runuser", "-u", USER, "--", str(SOURCE / "demo" / "run.sh"), "--db", str(database),
                             "--out", str(home / "out")], capture_output=True, text=True, timeout=600,
                            env={"PATH": "/usr/bin:/bin", "HOME": str(home), "LANG": "C.UTF-8"})
    assert result.returncode == 0, result.stderr + result.stdout
    assert "is current" in result.stdout
    assert module.stat().st_mtime_ns == before
    report = home / "out" / "report.html"
    assert report.stat().st_uid == user.pw_uid
    assert "</html>" in report.read_text(encoding="utf-8")
