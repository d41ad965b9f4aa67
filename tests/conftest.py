# SPDX-License-Identifier: MIT
"""Fixtures shared by the SQL-level tests and the reference checks.

Every test talks to the real SQLite library: through Python's sqlite3 module
with the built module loaded, or through the real `sqlite3` shell.
"""
import os
import pathlib
import sqlite3
import subprocess

import pytest

SOURCE = pathlib.Path(os.environ.get("ALMANAC_SOURCE", pathlib.Path(__file__).resolve().parent.parent))
MODULE = os.environ.get("ALMANAC_MODULE", str(SOURCE / "build" / "almanac.so"))


def connect(path=":memory:"):
    """A connection with almanac loaded, as a user's Python would open it."""
    connection = sqlite3.connect(path)
    connection.enable_load_extension(True)
    connection.load_extension(MODULE)
    connection.enable_load_extension(False)
    return connection


@pytest.fixture
def db():
    connection = connect()
    yield connection
    connection.close()


def run_shell(sql, database=":memory:", mode=None):
    """Runs SQL in the real sqlite3 shell with `.load`; returns stdout, raises on error."""
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    script = f".load {module}\n" + (f".mode {mode}\n" if mode else "") + sql
    # tests/hardening/stages.sh runs the shell under valgrind this way.
    prefix = os.environ.get("ALMANAC_SHELL_PREFIX", "").split()
    result = subprocess.run(prefix + ["sqlite3", "-bail", database], input=script, capture_output=True,
                            text=True, timeout=600)
    if result.returncode != 0:
        raise RuntimeError(f"sqlite3 shell failed: {result.stderr}")
    return result.stdout


@pytest.fixture
def shell():
    return run_shell
