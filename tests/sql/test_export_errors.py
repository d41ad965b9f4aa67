# SPDX-License-Identifier: MIT
"""Bad input to exact_sum, to_amount and to_time: a clear error, or NULL by SQL's rules, never a crash.

Every message has one shape (ext/sqlite/arguments.h):
    fn(): argument N (name) = <value>: <what was expected>
README ("Reading shop exports") is the source of what is an error; each
full text was read, judged clear, and pinned.
"""
import sqlite3

import pytest

from conftest import connect


def prefix(function, position, name, value):
    return f"{function}(): argument {position} ({name}) = {value}: "


TEXT_MONEY = ("expected a number; money or quantities written as text must be read with "
              "to_amount() in the view that maps your table (README: \"Your data\")")

# (SQL, function, position, name, value as shown, what was expected)
CASES = [
    ("SELECT exact_sum('1,050.00')", "exact_sum", 1, "x", "'1,050.00'", TEXT_MONEY),
    ("SELECT exact_sum('$4.20')", "exact_sum", 1, "x", "'$4.20'", TEXT_MONEY),
    ("SELECT exact_sum('')", "exact_sum", 1, "x", "''", TEXT_MONEY),
    ("SELECT exact_sum('12 apples')", "exact_sum", 1, "x", "'12 apples'", TEXT_MONEY),
    ("SELECT exact_sum(X'00')", "exact_sum", 1, "x", "a BLOB of 1 byte", "expected a number, not a BLOB"),
    ("SELECT exact_sum(1e999)", "exact_sum", 1, "x", "inf", "expected a finite number"),
    ("SELECT exact_sum('-1e999')", "exact_sum", 1, "x", "'-1e999'", "expected a finite number"),
    ("SELECT exact_sum(x) OVER (ORDER BY n ROWS 1 PRECEDING) FROM (SELECT 1 AS n, 2 AS x UNION ALL SELECT 2, 'two')",
     "exact_sum", 1, "x", "'two'", TEXT_MONEY),
    # to_amount's own arguments (its text cases are in test_to_amount.py)
    ("SELECT to_amount('1', ';')", "to_amount", 2, "decimal_mark", "';'", "expected '.' or ','"),
    ("SELECT to_amount('1', '..')", "to_amount", 2, "decimal_mark", "'..'", "expected '.' or ','"),
    ("SELECT to_amount('1', 46)", "to_amount", 2, "decimal_mark", "46", "expected '.' or ','"),
    ("SELECT to_amount(X'00')", "to_amount", 1, "text", "a BLOB of 1 byte", "expected TEXT or a number, not a BLOB"),
    # to_time: the text
    ("SELECT to_time('2026-02-30', '%Y-%m-%d')", "to_time", 1, "text", "'2026-02-30'",
     "no such date: 2026-02 has 28 days"),
    ("SELECT to_time('2026-13-01', '%Y-%m-%d')", "to_time", 1, "text", "'2026-13-01'",
     "at character 6 ('13'): expected %m (a month number 1-12)"),
    ("SELECT to_time('03/05/2026 2:20 XM', '%m/%d/%Y %I:%M %p')", "to_time", 1, "text",
     "'03/05/2026 2:20 XM'", "at character 17 ('X'): expected %p (AM or PM)"),
    ("SELECT to_time('05.03.2026', '%d/%m/%Y')", "to_time", 1, "text", "'05.03.2026'",
     "at character 3 ('.'): expected '/'"),
    ("SELECT to_time('05.03.2026 14', '%d.%m.%Y %H:%M')", "to_time", 1, "text", "'05.03.2026 14'",
     "the text ends where ':' was expected"),
    ("SELECT to_time('05.03.2026 14:', '%d.%m.%Y %H:%M')", "to_time", 1, "text", "'05.03.2026 14:'",
     "the text ends where %M (minutes 0-59) was expected"),
    ("SELECT to_time('2026-03-05x', '%Y-%m-%d')", "to_time", 1, "text", "'2026-03-05x'",
     "at character 11 ('x'): expected the end of the text"),
    ("SELECT to_time('Mon 2026-03-05', '%a %Y-%m-%d')", "to_time", 1, "text", "'Mon 2026-03-05'",
     "at character 1 ('Mon'): 2026-03-05 is a Thursday"),  # Thursday: datetime.date(2026, 3, 5).isoweekday() == 4
    ("SELECT to_time('2025-366', '%Y-%j')", "to_time", 1, "text", "'2025-366'", "no such date: 2025 has 365 days"),
    ("SELECT to_time('5 Mrz 2026', '%d %b %Y')", "to_time", 1, "text", "'5 Mrz 2026'",
     "at character 3 ('M'): expected %b (a month name such as Mar or March)"),
    ("SELECT to_time('2026-03-05 24:00', '%Y-%m-%d %H:%M')", "to_time", 1, "text", "'2026-03-05 24:00'",
     "at character 12 ('24'): expected %H (an hour 0-23)"),
    ("SELECT to_time('2026-03-05T10:00+25:00', '%Y-%m-%dT%H:%M%z')", "to_time", 1, "text",
     "'2026-03-05T10:00+25:00'", "at character 17 ('+25:00'): expected %z (an offset such as +01:00, +0100 or Z)"),
    ("SELECT to_time('9999-12-31 23:00-05:00', '%Y-%m-%d %H:%M%z')", "to_time", 1, "text",
     "'9999-12-31 23:00-05:00'", "the time falls outside years 0000 through 9999"),
    ("SELECT to_time(X'01', '%Y-%m-%d')", "to_time", 1, "text", "a BLOB of 1 byte", "expected TEXT, not a BLOB"),
    ("SELECT to_time(1.5, '%Y-%m-%d')", "to_time", 1, "text", "1.5",
     "expected TEXT (a REAL is read only with the format excel)"),
    ("SELECT to_time('abc', 'excel')", "to_time", 1, "text", "'abc'",
     "expected a serial day number such as 46086.6, because the format is excel"),
    ("SELECT to_time(0, 'excel')", "to_time", 1, "text", "0",
     "expected a serial day number from 1 (1900-01-01) to 2958465 (9999-12-31)"),
    ("SELECT to_time(2958466, 'excel')", "to_time", 1, "text", "2958466",
     "expected a serial day number from 1 (1900-01-01) to 2958465 (9999-12-31)"),
    ("SELECT to_time(60, 'excel')", "to_time", 1, "text", "60",
     "serial 60 is 29 February 1900, a day spreadsheets count but that never was"),
    # to_time: the format
    ("SELECT to_time('x', '%Q')", "to_time", 2, "format", "'%Q'",
     "unknown directive at character 1 ('%Q'); expected one of %Y %y %m %d %e %H %I %M %S %f %p %b %B %a %A %j %z %%, or the word excel"),
    ("SELECT to_time('x', '')", "to_time", 2, "format", "''", "expected a format such as '%d.%m.%Y %H:%M', or excel"),
    ("SELECT to_time('x', '%Y')", "to_time", 2, "format", "'%Y'", "the format has no day; expected %m (or %b) with %d, or %j"),
    ("SELECT to_time('x', '%m/%d')", "to_time", 2, "format", "'%m/%d'", "the format has no year; expected %Y or %y"),
    ("SELECT to_time('x', '%Y-%m')", "to_time", 2, "format", "'%Y-%m'", "the format has a month without a day (%d)"),
    ("SELECT to_time('x', '%Y-%m-%d %I:%M')", "to_time", 2, "format", "'%Y-%m-%d %I:%M'",
     "%I (a 12-hour clock) and %p (AM or PM) need each other"),
    ("SELECT to_time('x', '%Y-%m-%d %H:%M %p')", "to_time", 2, "format", "'%Y-%m-%d %H:%M %p'",
     "%I (a 12-hour clock) and %p (AM or PM) need each other"),
    ("SELECT to_time('x', '%Y-%m-%d %M')", "to_time", 2, "format", "'%Y-%m-%d %M'",
     "the format has %M without an hour (%H or %I)"),
    ("SELECT to_time('x', '%Y-%m-%d %')", "to_time", 2, "format", "'%Y-%m-%d %'",
     "the format ends with a lone %; write %% for a percent sign"),
    ("SELECT to_time('x', '%Y-%m-%d %e')", "to_time", 2, "format", "'%Y-%m-%d %e'",
     "%e at character 10 ('%e') reads a field the format already reads"),
    ("SELECT to_time('x', 5)", "to_time", 2, "format", "5", "expected TEXT, not a number"),
    # to_time: the zone
    ("SELECT to_time('2026-03-05', '%Y-%m-%d', 'Mars/Olympus')", "to_time", 3, "zone", "'Mars/Olympus'",
     "not in the tz database; expected an IANA time zone name such as 'America/Denver' or 'UTC'"),
    ("SELECT to_time('2026-03-05+01:00', '%Y-%m-%d%z', 'UTC')", "to_time", 3, "zone", "'UTC'",
     "expected no zone, because the format reads an offset (%z) and each reading is already an instant"),
]


@pytest.mark.parametrize("sql,function,position,name,value,expected", CASES,
                         ids=[case[0] for case in CASES])
def test_bad_input_gives_the_exact_error(sql, function, position, name, value, expected):
    db = connect()
    with pytest.raises(sqlite3.OperationalError) as error:
        db.execute(sql).fetchall()
    # oracle: the contract's message shape, with the text pinned above
    assert str(error.value) == prefix(function, position, name, value) + expected


def test_null_follows_sql_conventions():
    db = connect()
    # SQL's rules (common practice): a sum of no rows or only NULLs is NULL.
    assert db.execute("SELECT exact_sum(x) FROM (SELECT NULL AS x)").fetchone() == (None,)
    assert db.execute("SELECT exact_sum(x) FROM (SELECT 1 AS x) WHERE 0").fetchone() == (None,)


def test_null_in_any_argument_gives_null():
    db = connect()
    # SQL's rules (common practice): NULL in, NULL out
    row = db.execute("SELECT to_time(NULL, '%Y'), to_time('2026', NULL), "
                     "to_time('2026-03-05', '%Y-%m-%d', NULL), to_amount(NULL), to_amount('1', NULL)").fetchone()
    assert row == (None, None, None, None, None)


def test_no_crash_on_long_formats_invalid_utf8_and_nul_bytes():
    """Hostile input: each call ends in a result or an error message, never a crash."""
    import random
    rng = random.Random(10000)
    db = connect()
    pieces = ["%Y", "%m", "%d", "%H", "%M", "%S", "%f", "%p", "%b", "%a", "%j", "%z", "%%", "-", " ",
              "\x00", "\xff", "\u00e9", "%", "%\x00", "x"]
    outcomes = {"result": 0, "error": 0}
    for _ in range(60):
        fmt = "".join(rng.choice(pieces) for _ in range(rng.randint(3000, 5000)))[:10000]
        fmt = fmt.encode().decode("unicode_escape").encode("latin-1", "replace")
        text = bytes(rng.randrange(256) for _ in range(rng.randint(0, 200)))
        for sql, args in [
            ("SELECT to_time(CAST(? AS TEXT), CAST(? AS TEXT))", (text, fmt)),
            ("SELECT to_time(CAST(? AS TEXT), '%Y-%m-%d %H:%M:%S')", (text,)),
            ("SELECT to_time(CAST(? AS TEXT), CAST(? AS TEXT), 'Europe/Paris')", (text, fmt)),
            ("SELECT to_amount(CAST(? AS TEXT))", (text,)),
            ("SELECT to_amount(CAST(? AS TEXT), ',')", (text,)),
            ("SELECT exact_sum(CAST(? AS TEXT))", (text,)),
        ]:
            try:
                db.execute(sql, args).fetchone()
                outcomes["result"] += 1
            except sqlite3.OperationalError as error:
                # The message is the one shape, whatever the bytes were.
                assert "(): argument " in str(error)
                outcomes["error"] += 1
    # NUL bytes inside otherwise good text are refused, not cut off.
    with pytest.raises(sqlite3.OperationalError, match=r"at character 11 \(byte 0x00\): expected the end of the text"):
        db.execute("SELECT to_time(?, '%Y-%m-%d')", ("2026-03-05\x00junk",)).fetchone()
    with pytest.raises(sqlite3.OperationalError, match=r"at character 2 \(byte 0x00\)"):
        db.execute("SELECT to_amount(?)", ("1\x00000",)).fetchone()
    print(f"\nhostile calls: {outcomes}")
    assert outcomes["error"] > 0


def test_a_format_that_changes_from_row_to_row_is_read_per_row():
    # The format is cached per statement only while it is a constant; a column of
    # formats must still be honoured row by row. oracle: datetime.strptime.
    import datetime as dt
    rows = [("05.03.2026 14:20", "%d.%m.%Y %H:%M"), ("03/05/2026 2:20 PM", "%m/%d/%Y %I:%M %p"),
            ("2026-064 14:20", "%Y-%j %H:%M")]
    db = connect()
    db.execute("CREATE TABLE t(n INTEGER PRIMARY KEY, text TEXT, format TEXT)")
    db.executemany("INSERT INTO t(text, format) VALUES (?, ?)", rows)
    got = [r[0] for r in db.execute("SELECT to_time(text, format) FROM t ORDER BY n")]
    assert got == [dt.datetime.strptime(t, f).strftime("%Y-%m-%d %H:%M:%S") for t, f in rows]


def test_forms_without_a_zone_can_be_indexed_and_the_zoned_form_cannot():
    # README: deterministic without a zone; with a zone the result depends on the
    # tz database, as SQLite's own 'localtime' does, so SQLite refuses it in an index.
    db = connect()
    db.execute("CREATE TABLE pos(sold TEXT, total TEXT)")
    db.execute("CREATE INDEX by_time ON pos(to_time(sold, '%d.%m.%Y %H:%M'))")
    db.execute("CREATE INDEX by_amount ON pos(to_amount(total, ','))")
    with pytest.raises(sqlite3.OperationalError, match="non-deterministic functions prohibited"):
        db.execute("CREATE INDEX by_local ON pos(to_time(sold, '%d.%m.%Y %H:%M', 'Europe/Berlin'))")
