# SPDX-License-Identifier: MIT
# ctest-labels: heavy root
"""The report command for cron: demo/run.sh --db, run by a user who is not root,
on a machine where almanac is already built.

The test creates that user with useradd (and fails if it cannot: it skips
nothing), gives it a small database of its own, and runs the real demo/run.sh
as that user with runuser. The run must not rebuild (the user cannot write
build/) and must not ask for any test package.

The checkout itself may sit where that user cannot enter (a home folder of
mode 0700, as root's usually is), so the user runs an installed copy: what
demo/run.sh needs, copied with its file times to a folder everyone may read,
as root would install it for a cron job.
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
    installed = pathlib.Path(tempfile.mkdtemp(prefix="almanac-installed-"))
    try:
        install_for_everyone(installed)
        run_as_user(user, home, installed)
    finally:
        shutil.rmtree(home)
        shutil.rmtree(installed)


# What demo/run.sh --db reads: itself and its SQL, the report library, tests/setup.sh
# and what setup.sh compares the build's time with (ext/, CMakeLists.txt).
RUN_NEEDS = ["demo", "sql", "ext", "tests/setup.sh", "CMakeLists.txt", "build/almanac.so", "build/built.stamp"]


def install_for_everyone(target):
    """Copies what the report needs from the checkout to `target`, readable by every user
    and owned by root. File times are kept (shutil.copy2), so setup.sh still sees the
    build as current and does not try to rebuild."""
    for name in RUN_NEEDS:
        source = SOURCE / name
        assert source.exists(), f"{source} is missing: build with tests/setup.sh first"
        (target / name).parent.mkdir(parents=True, exist_ok=True)
        if source.is_dir():
            shutil.copytree(source, target / name)
        else:
            shutil.copy2(source, target / name)
    for path in [target, *target.rglob("*")]:
        mode = path.stat().st_mode
        # Readable by all, and executable by all where the owner may execute (and folders).
        # (chmod leaves the modification times alone, which setup.sh compares.)
        wanted = mode | 0o444 | (0o111 if path.is_dir() or mode & 0o100 else 0)
        os.chmod(path, wanted & ~0o022)


def run_as_user(user, home, installed):
    database = home / "sales.db"
    subprocess.run(["/usr/bin/python3", str(installed / "demo" / "generate.py"), "--out", str(database),
                    "--start", "2025-11-03", "--end", "2025-12-17", "--scale", "0.1"],
                   check=True, capture_output=True)
    for path in (home, database):
        os.chown(path, user.pw_uid, user.pw_gid)
    module = installed / "build" / "almanac.so"
    before = module.stat().st_mtime_ns
    # cwd=home: the test's own working folder may be inside the checkout, where the user cannot enter.
    result = subprocess.run(["/usr/sbin/runuser", "-u", USER, "--", str(installed / "demo" / "run.sh"),
                             "--db", str(database), "--out", str(home / "out")], capture_output=True, text=True,
                            timeout=600, cwd=home, env={"PATH": "/usr/bin:/bin", "HOME": str(home), "LANG": "C.UTF-8"})
    assert result.returncode == 0, result.stderr + result.stdout
    assert "is current" in result.stdout
    assert module.stat().st_mtime_ns == before
    report = home / "out" / "report.html"
    assert report.stat().st_uid == user.pw_uid
    assert "</html>" in report.read_text(encoding="utf-8")
