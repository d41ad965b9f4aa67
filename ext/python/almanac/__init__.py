# SPDX-License-Identifier: MIT
"""almanac for Python: the compiled SQLite module, carried in this package,
loaded into a connection of Python's own sqlite3 module.

    import sqlite3, almanac
    connection = sqlite3.connect("sales.db")
    almanac.load(connection)

load(connection)   loads the module into the connection; extension loading is
                   switched on only for that call and off again afterwards,
                   also when loading fails, so SQL that the connection runs
                   later cannot call load_extension() itself.
module_path()      the path of the module file (for tools that load it
                   themselves, e.g. a desktop client's extension setting).
read_report(connection, path, **parameters)
                   runs a report file of sql/ as the sqlite3 shell does and
                   returns the tables it prints as pandas DataFrames, each
                   query read with pandas.read_sql.

Some Python builds leave extension loading out of sqlite3 (their connections
have no enable_load_extension); load() then raises ExtensionLoadingUnavailable,
which says so and what to use instead.
"""
import pathlib
import sqlite3

from ._version import __version__  # written by the wheel build from the project version

__all__ = ["load", "module_path", "read_report", "ExtensionLoadingUnavailable", "__version__"]

# The file keeps the name "almanac.so": SQLite derives the entry point
# sqlite3_almanac_init from it.
_MODULE_FILE = "almanac.so"

_WITHOUT_LOADING = (
    "this Python's sqlite3 module was built without extension loading (its connections have no "
    "enable_load_extension), so it cannot load almanac or any other SQLite extension. Use a Python "
    "whose sqlite3 can: Debian's and Ubuntu's python3 (/usr/bin/python3) can; a Python built from "
    "source (python.org sources, pyenv) needs ./configure --enable-loadable-sqlite-extensions "
    "(with pyenv: PYTHON_CONFIGURE_OPTS=--enable-loadable-sqlite-extensions pyenv install VERSION)")


class ExtensionLoadingUnavailable(sqlite3.NotSupportedError):
    """The connection's sqlite3 module cannot load extensions at all."""


def module_path():
    """The absolute path of the almanac module file inside this package."""
    path = pathlib.Path(__file__).resolve().parent / _MODULE_FILE
    if not path.is_file():
        raise FileNotFoundError(f"almanac.module_path(): the package has no module file {path}: "
                                "reinstall the almanac wheel")
    return str(path)


def load(connection):
    """Loads almanac into `connection` (a sqlite3.Connection) and returns it."""
    enable = getattr(connection, "enable_load_extension", None)
    load_extension = getattr(connection, "load_extension", None)
    if enable is None or load_extension is None:
        if isinstance(connection, sqlite3.Connection):
            raise ExtensionLoadingUnavailable(
                f"almanac.load(): argument 1 (connection) = a sqlite3.Connection: {_WITHOUT_LOADING}")
        raise TypeError(f"almanac.load(): argument 1 (connection) = {_describe(connection)}: "
                        "expected a connection made by sqlite3.connect()")
    path = module_path()
    enable(True)
    try:
        load_extension(path)
    except sqlite3.Error as error:
        raise type(error)(f"almanac.load(): loading {path} failed: {error}") from error
    finally:
        enable(False)
    return connection


def read_report(connection, path, **parameters):
    """Runs the report file `path` (sql/totals.sql, ...) on `connection`, which
    has almanac loaded, and returns a list of pandas DataFrames: one for each
    query of the file that returns rows, in order, as the sqlite3 shell prints
    them. `parameters` are the report's @names without the @ (zone="Europe/Vienna",
    unit="month"); one not given is NULL, as an unset .parameter is in the shell,
    so the report takes its default."""
    import pandas  # only this function needs it

    values = _Parameters(parameters)
    tables = []
    for statement in _statements(pathlib.Path(path).read_text(encoding="utf-8")):
        if _is_query(statement):
            table = pandas.read_sql(statement, connection, params=values)
            if len(table):
                tables.append(table)
        else:
            connection.execute(statement, values)
    return tables


class _Parameters(dict):
    """Named parameters where a name not given binds NULL (sqlite3 looks each
    name up with [], which reaches __missing__ in a dict subclass)."""

    def __missing__(self, name):
        return None


def _statements(text):
    """The file's statements, cut where SQLite itself says one is complete (a
    semicolon inside a string, comment or trigger body does not end one)."""
    start = 0
    for end in range(len(text)):
        if text[end] == ";" and sqlite3.complete_statement(text[start:end + 1]):
            yield text[start:end + 1]
            start = end + 1


def _is_query(statement):
    """Whether a statement reads rows: its first word, after leading comments."""
    code = statement.lstrip()
    while code.startswith(("--", "/*")):
        end = code.find("\n") + 1 if code.startswith("--") else code.find("*/") + 2
        code = code[end:].lstrip() if end > 1 else ""
    return code[:6].upper() in ("SELECT", "VALUES") or code[:4].upper() == "WITH"


def _describe(value):
    """A short, stable description of a wrong argument (no memory address)."""
    if isinstance(value, (str, bytes, int, float)) or value is None:
        text = repr(value)
        return text if len(text) <= 60 else text[:57] + "..."
    return f"a {type(value).__module__}.{type(value).__qualname__}"
