# SPDX-License-Identifier: MIT
"""One catalogue of bad input to every almanac SQL function: each case with its
exact error text or its result.

Where the expected values come from:
- Error texts follow the one form the README documents ("Errors"):
      fn(): argument N (name) = <value>: <what was expected>
  and, for a problem with the rows as a whole (a limit, a result past year 9999),
      fn(): <what went wrong and what is allowed>
  The <value> part is the README's rule for showing a value: TEXT quoted and cut
  at 60 characters with "...", bytes that are not UTF-8 as U+FFFD, a NUL as
  U+2400, REAL in its shortest round-trip form (inf for infinity), "a BLOB of N
  bytes". The <what was expected> parts are the readers' documented wordings
  (ext/sqlite/arguments.h and the README reference), written out once below.
- Results: SQL's NULL conventions and the SQL standard (ISO/IEC 9075) for the
  statistics of too few rows, as each case says.

tests/hardening/stages.sh replays every case in one sqlite3 shell under valgrind.
"""
import datetime
import os
import re
import subprocess

import pytest

from conftest import MODULE

TIME = ("expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, or a number "
        "(a Julian day below 5373484.5, Unix seconds otherwise)")
GRAMMAR = ("expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one "
           "of second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration "
           "such as P1W or PT15M")
ISO = "expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS"
ZONE = "expected an IANA time zone name such as 'America/Denver' or 'UTC'"
MS = "Unix seconds past year 9999 (is it in milliseconds? divide by 1000)"
X_HINT = "; x orders the rows, so for periods give period_floor() or period_serial(), not period_label()"
MONEY = ("; money or quantities written as text must be read with to_amount() in the view that maps "
         "your table (README: \"Your data\")")
FFFD, NUL = "\ufffd", "\u2400"

CASES = []  # (sql expression or SELECT, expected) — expected: Error(text) or Result(value)


class Error(str):
    pass


class Result:
    def __init__(self, value, source):
        self.value, self.source = value, source


def arg(fn, n, name, value, expected):
    return Error(f"{fn}(): argument {n} ({name}) = {value}: {expected}")


def add(sql, expected):
    CASES.append((sql, expected))


# ---- numbers: every numeric argument of every function ----------------------------------
UNIVARIATE = ["var_samp", "var_pop", "stddev_samp", "stddev_pop"]
BIVARIATE = ["covar_samp", "covar_pop", "corr", "regr_count", "regr_avgx", "regr_avgy", "regr_sxx",
             "regr_syy", "regr_sxy", "regr_slope", "regr_intercept", "regr_r2", "resid_sd", "slope_stderr"]
NUMBER_SLOTS = (
    [(f + "({v})", f, 1, "x") for f in UNIVARIATE]
    + [(f + "({v}, 1)", f, 1, "y") for f in BIVARIATE]
    + [(f + "(1, {v})", f, 2, "x") for f in BIVARIATE]
    + [("moving_mean({v})", "moving_mean", 1, "x"), ("median({v})", "median", 1, "x"),
       ("percentile_cont({v}, 0.5)", "percentile_cont", 1, "x"),
       ("theil_sen_slope({v}, 1)", "theil_sen_slope", 1, "y"), ("theil_sen_slope(1, {v})", "theil_sen_slope", 2, "x"),
       ("mann_kendall_p({v}, 1)", "mann_kendall_p", 1, "y"), ("mann_kendall_p(1, {v})", "mann_kendall_p", 2, "x"),
       ("mad({v})", "mad", 1, "x"), ("ewma({v}, 1, 1)", "ewma", 1, "x"), ("sparkline({v}, 1)", "sparkline", 1, "y"),
       ("svg_line_chart(1, {v}, 'a')", "svg_line_chart", 2, "y"),
       ("svg_bar_chart(1, {v}, 'a')", "svg_bar_chart", 2, "y"),
       ("percentile_cont(1, {v})", "percentile_cont", 2, "p")]
)
BAD_NUMBERS = [  # (SQL, as the message shows it, what was expected)
    ("'abc'", "'abc'", "expected a number"),
    ("''", "''", "expected a number"),
    ("'1,234.50'", "'1,234.50'", "expected a number"),  # ext/README.md: '1,234.50' is not a number
    ("X'0102'", "a BLOB of 2 bytes", "expected a number, not a BLOB"),
    ("9e999", "inf", "expected a finite number"),
    ("-9e999", "-inf", "expected a finite number"),
    ("CAST(X'310032' AS TEXT)", f"'1{NUL}2'", "expected a number"),  # embedded NUL: not the number 1
    ("CAST(X'FF41' AS TEXT)", f"'{FFFD}A'", "expected a number"),    # invalid UTF-8
]
for template, fn, n, name in NUMBER_SLOTS:
    for sql, shown, expected in BAD_NUMBERS:
        add(template.format(v=sql), arg(fn, n, name, shown, expected))
# exact_sum says more about TEXT, because text money is the usual cause (README "Your data")
for sql, shown, expected in BAD_NUMBERS:
    add(f"exact_sum({sql})", arg("exact_sum", 1, "x", shown,
                                 expected + MONEY if expected == "expected a number" else expected))

# ---- time values: every time argument -------------------------------------------------
TIME_SLOTS = (
    [(f + "({v}, 'day')", f, 1, "t") for f in ("period_floor", "period_end", "period_label", "period_serial")]
    + [("period_shift({v}, 1, 'day')", "period_shift", 1, "t"),
       ("period_position({v}, 'day', 'week')", "period_position", 1, "t"),
       ("ewma(1, {v}, '1 day')", "ewma", 2, "t"),
       ("SELECT * FROM periods({v}, '2027-01-01', 'month')", "periods", 1, "start"),
       ("SELECT * FROM periods('2026-01-01', {v}, 'month')", "periods", 2, "stop"),
       # the range of period_totals: its bounds are read before the source
       ("SELECT * FROM period_totals('no_such_table', 'day', 'UTC', {v})", "period_totals", 4, "start"),
       ("SELECT * FROM period_totals('no_such_table', 'day', 'UTC', NULL, {v})", "period_totals", 5, "stop")]
)
BAD_TIMES = [
    ("'2026-02-30'", "'2026-02-30'", "no such date: 2026-02 has 28 days"),
    ("'next tuesday'", "'next tuesday'", TIME),
    ("''", "''", TIME),
    ("'2026-01-01 25:00'", "'2026-01-01 25:00'", "hour 25 does not exist; hours run 00 to 23"),
    ("1700000000000", "1700000000000", MS),
    ("X'0102'", "a BLOB of 2 bytes", "expected a time value, not a BLOB"),
    ("9e999", "inf", "expected a finite number"),
    ("CAST(X'FF41' AS TEXT)", f"'{FFFD}A'", TIME),
    ("CAST(X'323032362D30312D3031002031303A3030' AS TEXT)", f"'2026-01-01{NUL} 10:00'", TIME),
]
for template, fn, n, name in TIME_SLOTS:
    for sql, shown, expected in BAD_TIMES:
        add(template.format(v=sql), arg(fn, n, name, shown, expected))
# chart and sparkline x: a number or a time value, with a hint for labels
for template, fn in (("sparkline(1, {v})", "sparkline"), ("svg_line_chart({v}, 1, 'a')", "svg_line_chart"),
                     ("svg_bar_chart({v}, 1, 'a')", "svg_bar_chart")):
    n = 2 if fn == "sparkline" else 1
    if fn != "svg_bar_chart":  # ext/README.md: a bar chart's TEXT x that is no time is a category
        add(template.format(v="'next tuesday'"), arg(fn, n, "x", "'next tuesday'", TIME + X_HINT))
        add(template.format(v="'2026-W05'"), arg(fn, n, "x", "'2026-W05'", TIME + X_HINT))
    add(template.format(v="X'00'"), arg(fn, n, "x", "a BLOB of 1 byte", "expected a number or a time value, not a BLOB"))
    add(template.format(v="9e999"), arg(fn, n, "x", "inf", "expected a finite number"))

# ---- specs: every spec argument, and the longest spec text --------------------------------
SPEC_SLOTS = (
    [(f + "('2026-01-01', {v})", f, 2, "spec") for f in ("period_floor", "period_end", "period_label", "period_serial")]
    + [("period_shift('2026-01-01', 1, {v})", "period_shift", 3, "spec"),
       ("SELECT * FROM periods('2026-01-01', '2027-01-01', {v})", "periods", 3, "spec"),
       ("period_of_serial(1, {v})", "period_of_serial", 2, "spec"),
       ("period_position('2026-01-01', {v}, 'year')", "period_position", 2, "spec")]
)
LONG = "d" * 60 + "..."
BAD_SPECS = [
    ("'fortnight'", "'fortnight'", "unknown unit 'fortnight'; " + GRAMMAR),
    ("'0 days'", "'0 days'", "count 0: the count must be a positive whole number"),
    ("'P1M2D'", "'P1M2D'", "'P1M2D' is a mixed or malformed duration; " + ISO),
    ("''", "''", "the spec is empty; " + GRAMMAR),
    ("7", "7", "expected TEXT, not a number"),
    ("X'00'", "a BLOB of 1 byte", "expected TEXT, not a BLOB"),
    ("CAST(X'FF' AS TEXT)", f"'{FFFD}'", f"unexpected character '{FFFD}'; " + GRAMMAR),
    # README "Limits": a spec is at most 200 bytes; the message never quotes more than 60 characters
    ("printf('%.201c', 'd')", f"'{LONG}'", "a spec is at most 200 bytes long; this one has 201"),
    ("printf('%.10000c', 'd')", f"'{LONG}'", "a spec is at most 200 bytes long; this one has 10000"),
]
for template, fn, n, name in SPEC_SLOTS:
    for sql, shown, expected in BAD_SPECS:
        add(template.format(v=sql), arg(fn, n, name, shown, expected))
add("ewma(1, '2026-01-01', '1 month')",
    arg("ewma", 3, "half_life", "'1 month'", "'month' has no fixed length; expected seconds, minutes, hours, days or weeks"))
add("ewma(1, '2026-01-01', 'fortnight')", arg("ewma", 3, "half_life", "'fortnight'", "unknown unit 'fortnight'; " + GRAMMAR))
add("ewma(1, '2026-01-01', printf('%.201c', 'd'))",
    arg("ewma", 3, "half_life", f"'{LONG}'", "a spec is at most 200 bytes long; this one has 201"))
add("ewma(1, 1, 0)", arg("ewma", 3, "half_life", "0", "expected a positive number or a period such as '7 days'"))
add("ewma(1, 1, -1)", arg("ewma", 3, "half_life", "-1", "expected a positive number or a period such as '7 days'"))
add("ewma(1, 1, X'00')", arg("ewma", 3, "half_life", "a BLOB of 1 byte",
                            "expected a period such as '7 days' or a positive number, not a BLOB"))

# ---- zones: every zone argument; names are never paths -----------------------------------
ZONE_SLOTS = (
    [(f + "('2026-01-01', 'day', {v})", f, 3, "zone") for f in ("period_floor", "period_end", "period_label", "period_serial")]
    + [("period_shift('2026-01-01', 1, 'day', {v})", "period_shift", 4, "zone"),
       ("SELECT * FROM periods('2026-01-01', '2026-02-01', 'day', {v})", "periods", 4, "zone"),
       ("period_of_serial(1, 'day', {v})", "period_of_serial", 3, "zone"),
       ("period_position('2026-01-01', 'day', 'week', {v})", "period_position", 4, "zone"),
       ("to_time('2026-01-01 10:00', '%Y-%m-%d %H:%M', {v})", "to_time", 3, "zone")]
)
BAD_ZONES = [
    ("'../../etc/passwd'", "'../../etc/passwd'", ZONE),
    ("'/etc/localtime'", "'/etc/localtime'", ZONE),
    ("'America/../../x'", "'America/../../x'", ZONE),
    ("''", "''", ZONE),
    ("'Mars/Olympus_Mons'", "'Mars/Olympus_Mons'", "not in the tz database; " + ZONE),
    ("'america/denver'", "'america/denver'", "not in the tz database; " + ZONE),  # IANA names are case-sensitive
    ("printf('%.10000c', 'a')", "'" + "a" * 60 + "...'", ZONE),
    ("42", "42", "expected TEXT, not a number"),
    ("X'41'", "a BLOB of 1 byte", "expected TEXT, not a BLOB"),
]
for template, fn, n, name in ZONE_SLOTS:
    for sql, shown, expected in BAD_ZONES:
        add(template.format(v=sql), arg(fn, n, name, shown, expected))

# ---- arguments of one function each -------------------------------------------------------
for p, shown in (("-0.0001", "-0.0001"), ("1.5", "1.5"), ("2", "2"), ("-1", "-1")):
    add(f"percentile_cont(1, {p})", arg("percentile_cont", 2, "p", shown, "expected a number from 0 to 1"))
add("(SELECT percentile_cont(v, p) FROM (SELECT 1 AS v, 0.5 AS p UNION ALL SELECT 2, 0.9))",
    arg("percentile_cont", 2, "p", "0.9", "expected the same p on every row of the group (the first row's was 0.5)"))
for mv, shown in (("0", "0"), ("-1", "-1"), ("1.5", "1.5"), ("1e10", "10000000000")):
    add(f"moving_mean(1, {mv})", arg("moving_mean", 2, "min_values", shown, "expected a whole number from 1 to 1000000000"))
for n, shown, expected in (("1.5", "1.5", "expected a whole number from -100000000 to 100000000"),
                           ("1e9", "1000000000", "expected a whole number from -100000000 to 100000000"),
                           ("'one'", "'one'", "expected a number"),
                           ("9e999", "inf", "expected a finite number")):
    add(f"period_shift('2026-01-31', {n}, 'month')", arg("period_shift", 2, "n", shown, expected))
for s, shown, expected in (("1.5", "1.5", "expected a whole number from -719528 to 2932896"),
                           ("9e15", "9e+15", "expected a whole number from -719528 to 2932896"),
                           ("'a'", "'a'", "expected a number")):
    add(f"period_of_serial({s}, 'day')", arg("period_of_serial", 1, "serial", shown, expected))
add("period_position('2026-01-01', 'day', 'day')", arg(
    "period_position", 3, "cycle", "'day'",
    "'day' periods do not nest in 'day' cycles; expected a pair that nests: second, minute or hour periods "
    "in a longer cycle whose length they divide (in a day or longer when they divide 24 hours); day in N days, "
    "week, half-month, month, quarter or year; week in year; half-month in month, quarter or year; month, "
    "quarter or year periods in a longer month-based cycle that is a whole number of them and begins where "
    "one of them begins"))
# ---- retail calendars (ext/README.md "Retail calendars"): every spec slot, each error saying what was expected
RETAIL = ("expected retail year|quarter|month|week [4-4-5|4-5-4|5-4-4 for months] ending last <weekday> of "
          "<month>, or ending <weekday> nearest end of <month>")
BAD_RETAIL_SPECS = [
    ("2 retail weeks ending last saturday of january",
     "a retail unit takes no count: its periods are the retail calendar's own; " + RETAIL),
    ("retail year", "retail year needs an anchor; " + RETAIL),
    ("retail month 4-4-4 ending last saturday of january",
     "'4-4-4' is not a month pattern; expected 4-4-5, 4-5-4 or 5-4-4 (the weeks of the three months of a "
     "13-week quarter)"),
    ("retail quarter 5-4-4 ending last saturday of january",
     "a month pattern (5-4-4) applies to retail month only, not retail quarter"),
    ("retail year starting february",
     "a retail unit takes no 'starting': its anchor says where every retail year ends; " + RETAIL),
    ("retail week ending last saturday of january from 2025-01-26",
     "a retail unit takes no 'from': its anchor says where every retail year ends; " + RETAIL),
    ("retail fortnight ending last saturday of january", "unknown retail unit 'fortnight'; " + RETAIL),
    ("retail year ending last funday of january", "'funday' is not a weekday; " + RETAIL),
    ("retail year ending saturday nearest end of smarch", "'smarch' is not a month; " + RETAIL),
    ("retail year ending saturday closest end of january",
     "unexpected 'closest' where the anchor has 'nearest'; " + RETAIL),
    ("retail year ending last saturday of january please", "unexpected 'please'; " + RETAIL),
]
for template, fn, n, name in SPEC_SLOTS:
    for spec, expected in BAD_RETAIL_SPECS:
        add(template.format(v=f"'{spec}'"), arg(fn, n, name, f"'{spec}'", expected))
RETAIL_PAIRS = ("expected a retail pair that shares its anchor: day, retail week, retail month or retail "
                "quarter in a retail year; day, retail week or retail month in a retail quarter; day or "
                "retail week in a retail month; day in a retail week")
for spec, cycle in (("retail week ending last saturday of january", "retail year ending last friday of january"),
                    ("retail week ending last saturday of january", "retail year ending saturday nearest end of january"),
                    ("retail year ending last saturday of january", "retail month 4-4-5 ending last saturday of january"),
                    ("week", "retail year ending last saturday of january"),
                    ("month", "retail year ending last saturday of january"),
                    ("retail month 4-4-5 ending last saturday of january", "year")):
    add(f"period_position('2026-01-01', '{spec}', '{cycle}')", arg(
        "period_position", 3, "cycle", f"'{cycle}'",
        f"'{spec}' periods do not nest in '{cycle}' cycles; " + RETAIL_PAIRS))
# charts: layer and options
for layer, shown, expected in (("'medium'", "'medium'", "expected 'raw' (thin, light) or 'smooth' (thick)"),
                               ("X'00'", "a BLOB of 1 byte", "expected TEXT, not a BLOB")):
    add(f"svg_line_chart(1, 1, 'a', {layer})", arg("svg_line_chart", 4, "layer", shown, expected))
for options, shown, expected in (
        ("'{'", "'{'", "invalid JSON at byte 2: expected a key in double quotes"),
        ("'[1]'", "'[1]'", 'expected a JSON object such as {"title": "Sales"}, not an array'),
        ("'{\"x\":1}'", "'{\"x\":1}'", 'unknown key "x": expected title, width, height, y_caption, series_order, period or zone'),
        ("'{\"width\": 5}'", "'{\"width\": 5}'", 'key "width" = 5: expected a whole number of pixels from 200 to 10000'),
        ("X'00'", "a BLOB of 1 byte", "expected TEXT, not a BLOB"),
        ("printf('%.100001c', ' ')", "'" + " " * 60 + "...'", "options are at most 100000 bytes of JSON; these have 100001")):
    add(f"svg_line_chart(1, 1, 'a', 'raw', {options})", arg("svg_line_chart", 5, "options", shown, expected))
add("svg_line_chart(1, 1, X'00')", arg("svg_line_chart", 3, "series", "a BLOB of 1 byte",
                                      "expected TEXT or a number as the series name, not a BLOB"))
add("svg_bar_chart(1, 1, X'00')", arg("svg_bar_chart", 3, "series", "a BLOB of 1 byte",
                                     "expected TEXT or a number as the series name, not a BLOB"))
for options, shown, expected in (
        ("'{'", "'{'", "invalid JSON at byte 2: expected a key in double quotes"),
        ("printf('%.100001c', ' ')", "'" + " " * 60 + "...'", "options are at most 100000 bytes of JSON; these have 100001")):
    add(f"svg_bar_chart(1, 1, 'a', {options})", arg("svg_bar_chart", 4, "options", shown, expected))
# to_time and to_amount
add("to_time('2026-01-01', '%Q')", arg("to_time", 2, "format", "'%Q'",
    "unknown directive at character 1 ('%Q'); expected one of %Y %y %m %d %e %H %I %M %S %f %p %b %B %a %A %j %z %%, or the word excel"))
add("to_time('2026-01-01', printf('%.201c', 'Y'))", arg("to_time", 2, "format", "'" + "Y" * 60 + "...'",
                                                       "a format is at most 200 bytes long; this one has 201"))
add("to_time('2026-01-01', printf('%.10000c', 'Y'))", arg("to_time", 2, "format", "'" + "Y" * 60 + "...'",
                                                         "a format is at most 200 bytes long; this one has 10000"))
add("to_time('2026', 5)", arg("to_time", 2, "format", "5", "expected TEXT, not a number"))
add("to_time(X'00', '%Y-%m-%d')", arg("to_time", 1, "text", "a BLOB of 1 byte", "expected TEXT, not a BLOB"))
add("to_time('2026-13-01', '%Y-%m-%d')", arg("to_time", 1, "text", "'2026-13-01'",
                                             "at character 6 ('13'): expected %m (a month number 1-12)"))
add("to_amount('12.3.4')", arg("to_amount", 1, "text", "'12.3.4'", "at character 5 ('.'): expected one decimal mark '.', found a second"))
add("to_amount('1,05.00')", arg("to_amount", 1, "text", "'1,05.00'",
                                "at character 2 (','): expected groups of three digits between grouping separators (1,234,567.89)"))
add("to_amount('-(12)')", arg("to_amount", 1, "text", "'-(12)'", "expected at most one sign (a minus, or parentheses), found 2"))
add("to_amount('twelve')", arg("to_amount", 1, "text", "'twelve'",
                               "at character 1 ('t'): expected digits, a grouping separator or the decimal mark '.'"))
add("to_amount(X'00')", arg("to_amount", 1, "text", "a BLOB of 1 byte", "expected TEXT or a number, not a BLOB"))
add("to_amount('12', ';')", arg("to_amount", 2, "decimal_mark", "';'", "expected '.' or ','"))
add("to_amount('12', CAST(X'00' AS TEXT))", arg("to_amount", 2, "decimal_mark", f"'{NUL}'", "expected '.' or ','"))

# period_totals' own reading step: SQL cannot make the pointer it needs (SQLite's
# pointer-passing interface, sqlite3_bind_pointer), so a direct call is refused.
PASS_ONLY = ("expected the pass of a running period_totals(), whose own reading step this is; "
             "call period_totals() instead")
add("SELECT period_totals_pass(1, '2026-01-01', 1, 'a', 1, 's')", arg("period_totals_pass", 1, "pass", "1", PASS_ONLY))
add("SELECT period_totals_pass(NULL, '2026-01-01', 1, 'a', 1, NULL)",
    arg("period_totals_pass", 1, "pass", "NULL", PASS_ONLY))
add("SELECT period_totals_pass(x'00', ts, 1, 2, 3, 4) FROM (SELECT '2026-01-01' AS ts)",
    arg("period_totals_pass", 1, "pass", "a BLOB of 1 byte", PASS_ONLY))
add("SELECT * FROM period_totals('no_such_table', 'day')", arg(
    "period_totals", 1, "source", "'no_such_table'", "no table or view of that name (expected 'name' or 'schema.name')"))
add("SELECT * FROM period_totals('no_such_table', 'fortnight')",  # the spec is read first
    arg("period_totals", 2, "spec", "'fortnight'", "unknown unit 'fortnight'; " + GRAMMAR))
# almanac_threads(n): 0 (one per core) to 64 threads; NULL sets nothing (ext/README.md "Reading in parallel").
THREADS = "expected a whole number from 0 to 64"
for value, shown, expected in (("65", "65", THREADS), ("-1", "-1", THREADS), ("1.5", "1.5", THREADS),
                               ("'four'", "'four'", "expected a number"), ("9e999", "inf", "expected a finite number"),
                               ("X'01'", "a BLOB of 1 byte", "expected a number, not a BLOB")):
    add(f"almanac_threads({value})", arg("almanac_threads", 1, "n", shown, expected))
add("almanac_threads(NULL)", Result(None, "SQL: NULL gives NULL (and sets nothing)"))
add("almanac_threads('2')", Result(2, "ext/README.md: TEXT SQLite reads as a number is a number"))
add("almanac_last_read_threads() IS NULL OR almanac_last_read_threads() >= 1",
    Result(1, "README: NULL before the first read, else the threads it used"))
# The range (bad times: TIME_SLOTS above); checked before the source is looked up.
add("SELECT * FROM period_totals('no_such_table', 'day', NULL, x'01', NULL)",  # a bad bound even with a NULL zone
    arg("period_totals", 4, "start", "a BLOB of 1 byte", "expected a time value, not a BLOB"))
add("SELECT * FROM period_totals('no_such_table', 'week', 'UTC', '2026-03-01', '2026-02-01')",
    arg("period_totals", 4, "start", "'2026-03-01'", "expected a time not after stop (argument 5 = '2026-02-01')"))
add("SELECT * FROM period_totals()",
    Error("period_totals(): source is missing; expected period_totals(source, spec [, zone [, start [, stop]]])"))

# ---- errors about the rows as a whole ----------------------------------------------------
# The limit is met as rows are read, so each of these reads 10,000,000 rows first: count(*)
# reads them without handing 10,000,000 rows to Python or to the shell's output.
add("SELECT count(*) FROM periods('2026-01-01', '2026-04-26 17:46:41', 'second')",
    Error("periods(): the range holds 10000001 periods; at most 10000000 per call: narrow the range or use a longer spec"))
# oracle: datetime.date arithmetic; Python's dates start at year 1, so year 0000 (a leap year) adds 366 days
MINUTES = ((datetime.date(9999, 12, 31) - datetime.date(1, 1, 1)).days + 366) * 1440
add("SELECT count(*) FROM periods('0000-01-01', '9999-12-31', 'minute')",
    Error(f"periods(): the range holds {MINUTES} periods; at most 10000000 per call: narrow the range or use a longer spec"))
add("period_floor('2026-01-01', CAST(X'3264610079' AS TEXT))",  # '2da' NUL 'y'
    arg("period_floor", 2, "spec", f"'2da{NUL}y'", f"unexpected character '{NUL}'; " + GRAMMAR))
add("SELECT * FROM periods('2026-01-01')", Error("periods(): stop is missing; expected periods(start, stop, spec [, zone])"))
add("SELECT * FROM periods('2026-01-01', '2026-02-01')", Error("periods(): spec is missing; expected periods(start, stop, spec [, zone])"))
add("period_end('9999-12-31', 'day')", Error("period_end(): the result falls outside years 0000 through 9999"))
SERIES_65 = "(WITH RECURSIVE s(n) AS (SELECT 1 UNION ALL SELECT n + 1 FROM s WHERE n < 65) SELECT svg_line_chart(n, n, 'item ' || n) FROM s)"
add(SERIES_65.replace("svg_line_chart", "svg_bar_chart"), Error("svg_bar_chart(): more than 64 series; a chart holds "
                                                              "at most 64 (8 colours x 8 dash patterns): chart the top items only"))
add(SERIES_65, Error("svg_line_chart(): more than 64 series; a chart holds at most 64 (8 colours x 8 dash patterns): chart the top items only"))

# ---- results: NULL by SQL's rules, frames of one row and of all rows, no rows ------------
NULL_SOURCE = "SQL convention: a NULL argument gives NULL"
for sql in ["period_floor(NULL, 'day')", "period_end('2026-01-01', NULL)", "period_label('2026-01-01', 'day', NULL)",
            "period_serial(NULL, 'week')", "period_shift('2026-01-01', NULL, 'day')", "period_of_serial(NULL, 'day')",
            "period_position(NULL, 'day', 'week')", "period_position('2026-01-01', 'day', NULL)", "valid_time(NULL)",
            "to_time(NULL, '%Y')", "to_time('2026', NULL)", "to_amount(NULL)", "to_amount('')"]:
    add(sql, Result(None, NULL_SOURCE + " (to_amount(''): ext/README.md, the empty string gives NULL)"))
for fn in UNIVARIATE + ["moving_mean", "median", "mad", "exact_sum"]:
    add(f"{fn}(NULL)", Result(None, "ISO/IEC 9075: an aggregate over no non-NULL values is NULL"))
for fn in BIVARIATE:
    expected = 0 if fn == "regr_count" else None
    add(f"{fn}(NULL, 1)", Result(expected, "ISO/IEC 9075: REGR_COUNT of no rows is 0, the others NULL"))
add("var_samp(5)", Result(None, "ISO/IEC 9075: VAR_SAMP of one row is NULL"))
add("stddev_pop(5)", Result(0.0, "ISO/IEC 9075: STDDEV_POP of one row is 0"))
add("median(7.5)", Result(7.5, "Hyndman & Fan definition 7: one value is its own median"))
add("percentile_cont(7.5, 1)", Result(7.5, "Hyndman & Fan definition 7: p = 1 is the largest value"))
add("valid_time(X'00')", Result(0, "ext/README.md: valid_time never raises; a BLOB is not a time"))
add("valid_time(CAST(X'FF41' AS TEXT))", Result(0, "ext/README.md: valid_time never raises"))
ROWS = "(SELECT 1 AS i, 2.0 AS x UNION ALL SELECT 2, 4.0 UNION ALL SELECT 3, 9.0)"
add(f"(SELECT group_concat(m, ',') FROM (SELECT median(x) OVER (ORDER BY i ROWS CURRENT ROW) AS m FROM {ROWS}))",
    Result("2.0,4.0,9.0", "a frame of one row: each row's own value (common practice)"))
add(f"(SELECT group_concat(m, ',') FROM (SELECT var_samp(x) OVER (ORDER BY i ROWS CURRENT ROW) AS m FROM {ROWS}))",
    Result(None, "ISO/IEC 9075: VAR_SAMP of one row is NULL, and group_concat of NULLs is NULL"))
add(f"(SELECT group_concat(m, ',') FROM (SELECT moving_mean(x) OVER (ORDER BY i ROWS BETWEEN UNBOUNDED PRECEDING "
    f"AND UNBOUNDED FOLLOWING) AS m FROM {ROWS}))",
    Result("5.0,5.0,5.0", "a frame of all rows: the mean 15/3 on every row (common practice)"))
add(f"(SELECT group_concat(m, ',') FROM (SELECT median(x) OVER (ORDER BY i ROWS BETWEEN UNBOUNDED PRECEDING "
    f"AND UNBOUNDED FOLLOWING EXCLUDE CURRENT ROW) AS m FROM {ROWS}))",
    Result("6.5,5.5,3.0", "numpy.median of the other two rows, by hand: (4+9)/2, (2+9)/2, (2+4)/2"))
add("(SELECT svg_line_chart(x, y, s) FROM (SELECT 1 AS x, 1 AS y, 'a' AS s) WHERE 0)",
    Result(None, "ISO/IEC 9075: an aggregate over no rows is NULL, so a chart of 0 series is NULL"))
add("(SELECT sparkline(1, 1) WHERE 0)", Result(None, "ISO/IEC 9075: an aggregate over no rows is NULL"))
add("(SELECT count(*) FROM periods('2026-01-01', '2026-01-01', 'day'))",
    Result(0, "ext/README.md: one row per period overlapping [start, stop); an empty range overlaps none"))

# ---- the report library's checks: known_name, refuse_parameter, data_range, valid_number ----------
# (issue 17; the reports call these, sql/README.md)
NAMES = "(SELECT 'Rye loaf' AS n UNION ALL SELECT 'Oat bun' UNION ALL SELECT NULL)"
add(f"(SELECT known_name(n, 'Rye lof', 'item') FROM {NAMES})",
    arg("known_name", 2, "wanted", "'Rye lof'", "expected one of the items; the closest is 'Rye loaf'"))
add(f"(SELECT known_name(n, 'oat  bun') FROM {NAMES})",
    arg("known_name", 2, "wanted", "'oat  bun'", "expected one of the names; the closest is 'Oat bun'"))
add("(SELECT known_name(n, 'x', 'item') FROM (SELECT NULL AS n))",
    arg("known_name", 2, "wanted", "'x'", "expected one of the items, but there are none"))
add(f"(SELECT known_name(n, X'01') FROM {NAMES})", arg("known_name", 2, "wanted", "a BLOB of 1 byte",
                                                     "expected a name or '*'"))
add(f"(SELECT known_name(n, 'x', X'01') FROM {NAMES})", arg("known_name", 3, "noun", "a BLOB of 1 byte",
                                                          "expected TEXT, not a BLOB"))
add(f"(SELECT known_name(n, 'Oat bun', 'item') FROM {NAMES})", Result("Oat bun", "ext/README.md, report helpers: a known name"))
add(f"(SELECT known_name(n, '*', 'item') FROM {NAMES})", Result("*", "ext/README.md, report helpers: '*' is every item"))
add(f"(SELECT known_name(n, NULL, 'item') FROM {NAMES})", Result(None, "SQL: no choice made is NULL"))
add("(SELECT known_name(n, 'x') FROM (SELECT 1 AS n) WHERE 0)", Result(None, "ISO/IEC 9075: no rows, NULL"))
add("refuse_parameter('@unit', NULL, 'trend.sql takes no @unit')", Result(None, "SQL: a parameter not set is NULL"))
add("refuse_parameter('@unit', 'month', 'trend.sql takes no @unit')",
    Error("refuse_parameter(): @unit = 'month': trend.sql takes no @unit"))
add("(SELECT data_range(t, NULL, 'week') FROM (SELECT '2026-01-01' AS t))",
    arg("data_range", 3, "day", "'week'", "expected a spec of one day: 'day', or 'day from 2000-01-01 04:00' "
        "for days that begin at 04:00"))
add("(SELECT data_range(t, NULL, '2 days') FROM (SELECT '2026-01-01' AS t))",
    arg("data_range", 3, "day", "'2 days'", "expected a spec of one day: 'day', or 'day from 2000-01-01 04:00' "
        "for days that begin at 04:00"))
add("(SELECT data_range(t, NULL, 'fortnight') FROM (SELECT '2026-01-01' AS t))",
    arg("data_range", 3, "day", "'fortnight'", "unknown unit 'fortnight'; " + GRAMMAR))
add("(SELECT data_range(t, NULL, NULL) FROM (SELECT '2026-01-01' AS t))",
    arg("data_range", 3, "day", "NULL", "expected a spec of one day"))
add("(SELECT data_range(t, NULL, 'day', 'Mars/Olympus') FROM (SELECT '2026-01-01' AS t))",
    arg("data_range", 4, "zone", "'Mars/Olympus'", "not in the tz database; " + ZONE))
add("(SELECT data_range(t, 1, 'day') FROM (SELECT 'next tuesday' AS t))",
    arg("data_range", 1, "ts", "'next tuesday'", TIME))
add("(SELECT data_range(t, 1, 'day', 'UTC', 'soon') FROM (SELECT '2026-01-01' AS t))",
    arg("data_range", 5, "now", "'soon'", TIME))
add("(SELECT data_range(t, 1, 'day') FROM (SELECT '2026-01-01' AS t) WHERE 0)",
    Result(None, "ISO/IEC 9075: an aggregate over no rows is NULL"))
add("(SELECT json_extract(data_range(t, a, 'day', 'UTC', '2026-06-01'), '$.note') FROM (SELECT '2026-01-01' AS t, "
    "NULL AS a UNION ALL SELECT '2026-01-03', 2.5 UNION ALL SELECT '2027-01-01', 1))",
    Result("range 2026-01-01..2026-01-03: 3 days, 2 rows; left out: 1 future row on 2027-01-01; 1 row without an "
           "amount (sql/data_check.sql lists it)",
           "by hand: two rows up to now, one after it, one of the three without an amount"))
add("(SELECT json_extract(r, '$.stop') || ' ' || json_extract(r, '$.whole_stop') FROM (SELECT data_range(t, 1, "
    "'day', 'UTC', '2026-01-03 12:00') AS r FROM (SELECT '2026-01-01 09:00' AS t UNION ALL SELECT '2026-01-03 10:00')))",
    Result("2026-01-04 2026-01-03", "by hand: the day that holds now (2026-01-03) is not whole yet"))
add("valid_number('1,050.00')", Result(0, "ext/README.md: '1,234.50' is not a number; valid_number never raises"))
add("valid_number(' 12.5')", Result(1, "ext/README.md: TEXT SQLite reads as a number is a number"))
add("valid_number('')", Result(0, "ext/README.md: the empty string is not a number"))
add("valid_number(X'01')", Result(0, "valid_number never raises; a BLOB is not a number"))
add("valid_number(9e999)", Result(0, "ext/README.md: infinities are not numbers to add"))
add("valid_number(NULL)", Result(None, "SQL: NULL gives NULL"))
add("valid_number(3)", Result(1, "an INTEGER is a number"))

# ---- seasons: any value but NULL names a season (ext/README.md "Trend, season and noise, apart") ----
THREE_POINTS = "(SELECT {fn}(y, x, {v}) FROM (SELECT 1 AS y, 1 AS x UNION ALL SELECT 3, 2 UNION ALL SELECT 2, 3))"
for v in ("'abc'", "''", "'1,234.50'", "X'0102'", "9e999", "-9e999", "CAST(X'310032' AS TEXT)"):
    add(THREE_POINTS.format(fn="theil_sen_slope", v=v), Result(0.5, "by hand: one season, slopes 2, 0.5, -1"))
    add(THREE_POINTS.format(fn="mann_kendall_p", v=v),
        Result(0.6015081344405899, "scipy.stats.kendalltau([1, 2, 3], [1, 3, 2], method='asymptotic').pvalue"))

# ---- period_decomposition: spec, cycle, zone and options are checked before the source is read ----
DECOMPOSE = "SELECT * FROM period_decomposition('no_such_table', {args})"
SEASONAL_SPAN = "expected an odd whole number of cycles from 7 to 1000001"
for args, n, name, shown, expected in (
        ("'week', 'month'", 3, "cycle", "'month'", "'week' periods do not nest in 'month' cycles; "),
        ("'day', 'day'", 3, "cycle", "'day'", "'day' periods do not nest in 'day' cycles; "),
        ("'day', 'week', NULL, '{\"seasonal\": 8}'", 5, "options", "'{\"seasonal\": 8}'",
         'key "seasonal" = 8: ' + SEASONAL_SPAN),
        ("'day', 'week', NULL, '{\"seasonal\": 3}'", 5, "options", "'{\"seasonal\": 3}'",
         'key "seasonal" = 3: ' + SEASONAL_SPAN),
        ("'day', 'week', NULL, '{\"trend\": 15}'", 5, "options", "'{\"trend\": 15}'",
         'unknown key "trend": expected "seasonal" or "robust"'),
        ("'day', 'week', NULL, '{\"robust\": 1}'", 5, "options", "'{\"robust\": 1}'",
         'key "robust" = 1: expected true or false'),
        ("'day', 'week', NULL, '[7]'", 5, "options", "'[7]'",
         'expected a JSON object such as {"seasonal": 13, "robust": true}, not an array'),
        ("'day', 'week', NULL, 7", 5, "options", "7", "expected TEXT, not a number"),
        ("'day', 'week', 'Mars/Olympus'", 4, "zone", "'Mars/Olympus'", None),
        ("'day', 'week'", None, None, None, None)):
    if n is None:
        add(DECOMPOSE.format(args=args), Error("period_decomposition(): argument 1 (source) = 'no_such_table': "
                                               "no table or view of that name (expected 'name' or 'schema.name')"))
    elif expected is None:
        add(DECOMPOSE.format(args=args), arg("period_decomposition", n, name, shown, "not in the tz database; " + ZONE))
    elif expected.endswith("cycles; "):
        from test_season_errors import NEST
        add(DECOMPOSE.format(args=args), arg("period_decomposition", n, name, shown, expected + NEST))
    else:
        add(DECOMPOSE.format(args=args), arg("period_decomposition", n, name, shown, expected))
add("SELECT * FROM period_decomposition('no_such_table', 'day')",
    Error("period_decomposition(): cycle is missing; expected period_decomposition(source, spec, cycle [, zone [, options]])"))
add("SELECT count(*) FROM period_decomposition(NULL, 'day', 'week')", Result(0, "as period_totals: a NULL source gives no rows"))

SHAPE = re.compile(r"^(?P<fn>[a-z_0-9]+)\(\): (?:argument (?P<n>[1-9]) \((?P<name>[a-z_]+)\) = (?P<value>.+?): "
                   r"(?P<expected>\S.*)|(?!argument )(?P<message>\S.*))$", re.S)


def statement(sql):
    return sql if sql.startswith("SELECT") else f"SELECT {sql}"


def test_the_catalogue_holds_at_least_250_cases():
    errors = sum(1 for _, expected in CASES if isinstance(expected, Error))
    print(f"{len(CASES)} cases: {errors} errors, {len(CASES) - errors} results")
    assert len(CASES) >= 250
    assert len({sql for sql, _ in CASES}) == len(CASES), "a case is listed twice"


def test_every_almanac_function_has_cases(db):
    # Every SQL function and table-valued function almanac registers is in the catalogue:
    # discovered the way the SQL fuzz harness discovers them (a plain connection's lists subtracted).
    import sqlite3
    plain = sqlite3.connect(":memory:")
    builtin = {row[0] for row in plain.execute("SELECT name FROM pragma_function_list")}
    modules = {row[0] for row in plain.execute("SELECT name FROM pragma_module_list")}
    ours = {row[0] for row in db.execute("SELECT name FROM pragma_function_list")} - builtin
    ours |= {row[0] for row in db.execute("SELECT name FROM pragma_module_list")} - modules
    ours -= {"almanac_version", "almanac_tz_version"}  # no arguments to get wrong
    text = " ".join(sql for sql, _ in CASES)
    missing = sorted(name for name in ours if not re.search(rf"\b{name}\(", text))
    assert not missing, f"functions without a bad-input case: {missing}"


@pytest.mark.parametrize("sql,expected", CASES, ids=[sql[:90] for sql, _ in CASES])
def test_case(db, sql, expected):
    if isinstance(expected, Error):
        with pytest.raises(Exception) as caught:
            db.execute(statement(sql)).fetchall()
        assert str(caught.value) == expected
    else:
        rows = db.execute(statement(sql)).fetchall()
        # source: expected.source
        assert rows == [(expected.value,)], (rows, expected.source)


def test_every_error_has_the_documented_form():
    for _, expected in CASES:
        if isinstance(expected, Error):
            match = SHAPE.match(expected)
            assert match, f"not in the documented form: {expected!r}"
            assert "\n" not in expected


def test_every_case_in_one_shell(tmp_path):
    # The real sqlite3 shell, every case in order in one process; tests/hardening/stages.sh
    # puts valgrind in front of it (ALMANAC_SHELL_PREFIX) and valgrind's exit code 99 fails it.
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    script = f".load {module}\n.bail off\n" + "".join(f"{statement(sql)};\nSELECT 'case {i} done';\n"
                                                      for i, (sql, _) in enumerate(CASES))
    prefix = os.environ.get("ALMANAC_SHELL_PREFIX", "").split()
    result = subprocess.run(prefix + ["sqlite3", ":memory:"], input=script.encode(), capture_output=True,
                            timeout=3000)
    stderr = result.stderr.decode("utf-8", "replace")
    assert result.returncode in (0, 1), f"exit {result.returncode}: {stderr[-3000:]}"
    stdout = result.stdout.decode("utf-8", "replace")
    for i, (_, expected) in enumerate(CASES):
        assert f"case {i} done" in stdout, f"the shell stopped at case {i}"
        if isinstance(expected, Error):
            assert expected in stderr, f"case {i}: {expected!r} not reported by the shell"
