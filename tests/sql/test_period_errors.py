# SPDX-License-Identifier: MIT
"""Bad input to every period function: a clear error, or NULL by SQL's rules, never a crash.

Every message has one shape (the common brief, ext/sqlite/arguments.h):
    fn(): argument N (name) = <value>: <what was expected>
so each case first states the facts its message must contain — the function,
the argument by position and name, the value as written, and the words the README
asks for (a Unix time in milliseconds "says so"; an unknown unit says what was
expected) — and then the exact text, pinned once read and judged good.
"""
import sqlite3
import subprocess

import pytest

from conftest import MODULE, connect

NULL = object()  # the case gives SQL NULL (or no rows, for periods())


class Err:
    def __init__(self, function, position, name, value, *words, absent=()):
        self.function, self.position, self.name, self.value = function, position, name, value
        self.words, self.absent = words, absent

    def prefix(self):
        return f"{self.function}(): argument {self.position} ({self.name}) = {self.value}: "


def F(position, name, value, *words, fn="period_floor", absent=()):
    return Err(fn, position, name, value, *words, absent=absent)


NOT_FOR_FROM = ("Julian day", "Unix seconds", "+HH:MM")


T, S, Z = (1, "t"), (2, "spec"), (3, "zone")

CASES = [
    # ---- period_floor: time values (DESIGN "Time values")
    ("period_floor('2026-02-30', 'day')", F(*T, "'2026-02-30'")),                   # impossible date
    ("period_floor('2025-02-29', 'day')", F(*T, "'2025-02-29'")),                   # not a leap year
    ("period_floor('2026-13-01', 'month')", F(*T, "'2026-13-01'")),                 # month 13
    ("period_floor('2026-04-31 10:00', 'hour')", F(*T, "'2026-04-31 10:00'")),      # April has 30 days
    ("period_floor('2026-01-01 25:00', 'hour')", F(*T, "'2026-01-01 25:00'")),      # hour 25
    ("period_floor('2026-01-01 10:60', 'hour')", F(*T, "'2026-01-01 10:60'")),      # minute 60
    ("period_floor('2026-01-01 10:00:61', 'second')", F(*T, "'2026-01-01 10:00:61'")),
    ("period_floor('2026-01-01 10:00+24:00', 'hour')", F(*T, "'2026-01-01 10:00+24:00'")),
    ("period_floor('2026-1-1', 'day')", F(*T, "'2026-1-1'")),                       # digits missing
    ("period_floor('next tuesday', 'day')", F(*T, "'next tuesday'")),               # words
    ("period_floor('', 'day')", F(*T, "''")),                                       # empty TEXT
    ("period_floor(X'0102', 'day')", F(*T, "a BLOB of 2 bytes", "BLOB")),           # BLOB
    ("period_floor(1700000000000, 'day')", F(*T, "1700000000000", "millisecond")),  # Unix ms: says so
    ("period_floor(1.7e12, 'day')", F(*T, "1700000000000", "millisecond")),         # REAL ms
    ("period_floor(-1e13, 'day')", F(*T, "-10000000000000")),                       # year out of range
    ("period_floor(1000000, 'day')", F(*T, "1000000")),                             # Julian day in -1975
    ("period_floor(2025-12-01, 'day')", F(*T, "2012", "quote it")),                 # an unquoted date: 2012
    ("period_floor(45992, 'day')", F(*T, "45992", "excel")),                        # a spreadsheet serial
    ("period_serial(20000.5, 'week')", F(*T, "20000.5", "excel", fn="period_serial")),
    # ---- period_of_serial: the serial must name a period of years 0000-9999
    ("period_of_serial(99999999, 'month')", F(1, "serial", "99999999", "-23640", "96359", fn="period_of_serial")),
    ("period_of_serial(2.5, 'day')", F(1, "serial", "2.5", "whole number", fn="period_of_serial")),
    ("period_of_serial('soon', 'day')", F(1, "serial", "'soon'", fn="period_of_serial")),
    ("period_of_serial(3, 'fortnight')", F(*S, "'fortnight'", "week", fn="period_of_serial")),
    ("period_of_serial(3, 'day', 'Mars/Base')", F(*Z, "'Mars/Base'", fn="period_of_serial")),
    # ---- specs (DESIGN "Spec grammar")
    ("period_floor('2026-01-01', 'fortnight')", F(*S, "'fortnight'", "week")),      # unknown unit
    ("period_floor('2026-01-01', '3 fortnights')", F(*S, "'3 fortnights'", "week")),
    ("period_floor('2026-01-01', '0 days')", F(*S, "'0 days'")),                    # zero count
    ("period_floor('2026-01-01', '-2 weeks')", F(*S, "'-2 weeks'")),                # negative count
    ("period_floor('2026-01-01', '1.5 days')", F(*S, "'1.5 days'")),                # fractional count
    ("period_floor('2026-01-01', '99999999999999999999 days')", F(*S, "'99999999999999999999 days'")),
    ("period_floor('2026-01-01', 'P1M2D')", F(*S, "'P1M2D'")),                      # mixed ISO duration
    ("period_floor('2026-01-01', 'PT1H30M')", F(*S, "'PT1H30M'")),                  # mixed ISO duration
    ("period_floor('2026-01-01', 'P0D')", F(*S, "'P0D'")),                          # zero ISO count
    ("period_floor('2026-01-01', 'P1.5D')", F(*S, "'P1.5D'")),
    ("period_floor('2026-01-01', 'PT')", F(*S, "'PT'")),
    ("period_floor('2026-01-01', 'P1H')", F(*S, "'P1H'")),                          # hours need the T
    ("period_floor('2026-01-01', '2 half-months')", F(*S, "'2 half-months'")),      # half-month: no count
    ("period_floor('2026-01-01', 'week starting funday')", F(*S, "'week starting funday'")),
    ("period_floor('2026-01-01', 'year starting smarch')", F(*S, "'year starting smarch'")),
    ("period_floor('2026-01-01', 'month starting april')", F(*S, "'month starting april'")),  # not for months
    ("period_floor('2026-01-01', 'day starting monday')", F(*S, "'day starting monday'")),
    ("period_floor('2026-01-01', 'month from 2024-02-30')", F(*S, "'month from 2024-02-30'")),  # from: no date
    # `from` takes a wall-clock date[-time] only: the message must not offer numbers or offsets
    ("period_floor('2026-01-01', 'month from yesterday')", F(*S, "'month from yesterday'", "YYYY-MM-DD",
                                                            absent=NOT_FOR_FROM)),
    ("period_floor('2026-01-01', 'week from')", F(*S, "'week from'", "YYYY-MM-DD", absent=NOT_FOR_FROM)),
    ("period_floor('2026-01-01', 'month from 2024-01-15+05:00')",
     F(*S, "'month from 2024-01-15+05:00'", "YYYY-MM-DD", absent=NOT_FOR_FROM)),
    ("period_floor('2026-01-01', 'week starting sunday from 2024-01-03')",
     F(*S, "'week starting sunday from 2024-01-03'", "starting")),                   # Wednesday vs Sunday
    ("period_floor('2026-01-01', 'quarter starting april from 2024-02-01')",
     F(*S, "'quarter starting april from 2024-02-01'", "starting")),                 # Feb vs April quarters
    # retail calendars (DESIGN "Retail calendars"): each refusal says what was expected
    ("period_floor('2026-01-01', '2 retail weeks ending last saturday of january')",
     F(*S, "'2 retail weeks ending last saturday of january'", "no count", "retail year|quarter|month|week")),
    ("period_floor('2026-01-01', 'retail year')", F(*S, "'retail year'", "needs an anchor", "ending last")),
    ("period_floor('2026-01-01', 'retail month 4-4-4 ending last saturday of january')",
     F(*S, "'retail month 4-4-4 ending last saturday of january'", "4-4-5, 4-5-4 or 5-4-4")),
    ("period_floor('2026-01-01', 'retail year 4-4-5 ending last saturday of january')",
     F(*S, "'retail year 4-4-5 ending last saturday of january'", "retail month only")),
    ("period_floor('2026-01-01', 'retail quarter starting march')",
     F(*S, "'retail quarter starting march'", "no 'starting'", "ending")),
    ("period_floor('2026-01-01', 'retail month ending last saturday of january from 2025-01-26')",
     F(*S, "'retail month ending last saturday of january from 2025-01-26'", "no 'from'", "ending")),
    ("period_floor('2026-01-01', 'retail moon ending last saturday of january')",
     F(*S, "'retail moon ending last saturday of january'", "unknown retail unit", "year|quarter|month|week")),
    ("period_floor('2026-01-01', 'retail week ending last caturday of january')",
     F(*S, "'retail week ending last caturday of january'", "not a weekday", "<weekday>")),
    ("period_label('2026-01-01', 'retail week ending saturday nearest end of janvier')",
     F(*S, "'retail week ending saturday nearest end of janvier'", "not a month", "<month>", fn="period_label")),
    ("period_shift('2026-01-01', 1, 'retail week')", F(3, "spec", "'retail week'", "needs an anchor", fn="period_shift")),
    ("period_of_serial(1, 'retail')", F(2, "spec", "'retail'", "needs a unit", fn="period_of_serial")),
    ("SELECT * FROM periods('2026-01-01', '2027-01-01', 'retail year ending last sat of jan now')",
     F(3, "spec", "'retail year ending last sat of jan now'", "unexpected 'now'", fn="periods")),
    ("period_floor('2026-01-01', '')", F(*S, "''")),
    ("period_floor('2026-01-01', 7)", F(*S, "7")),                                   # spec as a number
    ("period_floor('2026-01-01', X'00')", F(*S, "a BLOB of 1 byte", "BLOB")),
    # ---- zones (DESIGN "Zones"): a name not in the database, never a path opened on disk
    ("period_floor('2026-01-01', 'day', 'Mars/Olympus_Mons')", F(*Z, "'Mars/Olympus_Mons'")),
    ("period_floor('2026-01-01', 'day', '../../../etc/passwd')", F(*Z, "'../../../etc/passwd'")),
    ("period_floor('2026-01-01', 'day', '/usr/share/zoneinfo/UTC')", F(*Z, "'/usr/share/zoneinfo/UTC'")),
    ("period_floor('2026-01-01', 'day', '')", F(*Z, "''")),
    ("period_floor('2026-01-01', 'day', 42)", F(*Z, "42")),
    ("period_floor('2026-01-01', 'day', X'41')", F(*Z, "a BLOB of 1 byte", "BLOB")),
    # ---- NULL gives NULL
    ("period_floor(NULL, 'day')", NULL),
    ("period_floor('2026-01-01', NULL)", NULL),
    ("period_floor('2026-01-01', 'day', NULL)", NULL),
    # NULL t gives NULL before the other arguments are read, as SQLite's date(NULL, 'junk') does
    # (DESIGN is silent; the implementation's choice)
    ("period_floor(NULL, 'fortnight')", NULL),
    ("period_shift(NULL, 'one', 'fortnight')", NULL),
    # ---- the other scalar functions
    ("period_end('2026-02-30', 'month')", F(*T, "'2026-02-30'", fn="period_end")),
    ("period_end('2026-01-01', 'weak')", F(*S, "'weak'", "week", fn="period_end")),
    ("period_end('2026-01-01', 'day', 'Nowhere/Town')", F(*Z, "'Nowhere/Town'", fn="period_end")),
    ("period_end(NULL, 'day')", NULL),
    ("period_label(X'FF', 'week')", F(*T, "a BLOB of 1 byte", "BLOB", fn="period_label")),
    ("period_label('2026-01-01', 'P2M1D')", F(*S, "'P2M1D'", fn="period_label")),
    ("period_label('2026-01-01', 'week', 'Nowhere/Town')", F(*Z, "'Nowhere/Town'", fn="period_label")),
    ("period_label(NULL, 'week')", NULL),
    ("period_serial('31/12/2026', 'day')", F(*T, "'31/12/2026'", fn="period_serial")),
    ("period_serial('2026-01-01', '0 months')", F(*S, "'0 months'", fn="period_serial")),
    ("period_serial(1.7e12, 'day')", F(*T, "1700000000000", "millisecond", fn="period_serial")),
    ("period_serial(NULL, 'day')", NULL),
    ("period_shift('2026-02-30', 1, 'month')", F(1, "t", "'2026-02-30'", fn="period_shift")),
    ("period_shift('2026-01-31', 1.5, 'month')", F(2, "n", "1.5", fn="period_shift")),
    ("period_shift('2026-01-31', 'one', 'month')", F(2, "n", "'one'", fn="period_shift")),
    ("period_shift('2026-01-31', X'01', 'month')", F(2, "n", "a BLOB of 1 byte", "BLOB", fn="period_shift")),
    ("period_shift('2026-01-31', 1, 'P1M2D')", F(3, "spec", "'P1M2D'", fn="period_shift")),
    ("period_shift('2026-01-31', 1, 'month', 'Nowhere/Town')", F(4, "zone", "'Nowhere/Town'", fn="period_shift")),
    ("period_shift('2026-01-31', NULL, 'month')", NULL),
    ("period_shift(NULL, 1, 'month')", NULL),
    ("period_shift('2026-01-31', 1, NULL)", NULL),
    # ---- periods(): errors name the argument too; NULL arguments give no rows
    ("SELECT * FROM periods('2026-02-30', '2027-01-01', 'month')", F(1, "start", "'2026-02-30'", fn="periods")),
    ("SELECT * FROM periods('2026-01-01', 'soon', 'month')", F(2, "stop", "'soon'", fn="periods")),
    ("SELECT * FROM periods('2026-01-01', '2027-01-01', 'fortnight')", F(3, "spec", "'fortnight'", "week", fn="periods")),
    ("SELECT * FROM periods('2026-01-01', '2027-01-01', '0 weeks')", F(3, "spec", "'0 weeks'", fn="periods")),
    ("SELECT * FROM periods('2026-01-01', '2027-01-01', 'month', 'Bad/Zone')", F(4, "zone", "'Bad/Zone'", fn="periods")),
    ("SELECT * FROM periods(X'00', '2027-01-01', 'month')", F(1, "start", "a BLOB of 1 byte", "BLOB", fn="periods")),
    ("SELECT * FROM periods(1700000000000, 1800000000000, 'month')",
     F(1, "start", "1700000000000", "millisecond", fn="periods")),
    ("SELECT * FROM periods(NULL, '2027-01-01', 'month')", NULL),
    ("SELECT * FROM periods('2026-01-01', NULL, 'month')", NULL),
    ("SELECT * FROM periods('2026-01-01', '2027-01-01', NULL)", NULL),
]

VALID_TIME = [
    # valid_time never raises (DESIGN); NULL gives NULL
    ("valid_time('2026-02-30')", 0), ("valid_time(X'00')", 0), ("valid_time(1700000000000)", 0),
    ("valid_time('next tuesday')", 0), ("valid_time('')", 0), ("valid_time('2026-01-01 10:00+24:00')", 0),
    ("valid_time('2026-01-01')", 1), ("valid_time('2026-01-01T10:00:00.123Z')", 1), ("valid_time(2451545.0)", 1),
    ("valid_time(-1)", 1), ("valid_time(NULL)", None),
]


# The exact texts, pinned after reading each one (see the final report for the ones left unpinned:
# "a BLOB of 1 byte", "Julian day 1000000.000000", and the `from` messages above).
EXACT = {
    "period_floor('2026-02-30', 'day')":
        "period_floor(): argument 1 (t) = '2026-02-30': no such date: 2026-02 has 28 days",
    "period_floor('2025-02-29', 'day')":
        "period_floor(): argument 1 (t) = '2025-02-29': no such date: 2025-02 has 28 days",
    "period_floor('2026-13-01', 'month')":
        "period_floor(): argument 1 (t) = '2026-13-01': month 13 does not exist; expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, or a number (a Julian day below 5373484.5, Unix seconds otherwise)",
    "period_floor('2026-04-31 10:00', 'hour')":
        "period_floor(): argument 1 (t) = '2026-04-31 10:00': no such date: 2026-04 has 30 days",
    "period_floor('2026-01-01 25:00', 'hour')":
        "period_floor(): argument 1 (t) = '2026-01-01 25:00': hour 25 does not exist; hours run 00 to 23",
    "period_floor('2026-01-01 10:60', 'hour')":
        "period_floor(): argument 1 (t) = '2026-01-01 10:60': minute 60 does not exist; minutes run 00 to 59",
    "period_floor('2026-01-01 10:00:61', 'second')":
        "period_floor(): argument 1 (t) = '2026-01-01 10:00:61': second 61 does not exist; seconds run 00 to 59",
    "period_floor('2026-01-01 10:00+24:00', 'hour')":
        "period_floor(): argument 1 (t) = '2026-01-01 10:00+24:00': zone offset out of range; offsets run -14:00 to +14:00",
    "period_floor('2026-1-1', 'day')":
        "period_floor(): argument 1 (t) = '2026-1-1': expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, or a number (a Julian day below 5373484.5, Unix seconds otherwise)",
    "period_floor('next tuesday', 'day')":
        "period_floor(): argument 1 (t) = 'next tuesday': expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, or a number (a Julian day below 5373484.5, Unix seconds otherwise)",
    "period_floor('', 'day')":
        "period_floor(): argument 1 (t) = '': expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, or a number (a Julian day below 5373484.5, Unix seconds otherwise)",
    "period_floor(1700000000000, 'day')":
        'period_floor(): argument 1 (t) = 1700000000000: Unix seconds past year 9999 (is it in milliseconds? divide by 1000)',
    "period_floor(1.7e12, 'day')":
        'period_floor(): argument 1 (t) = 1700000000000: Unix seconds past year 9999 (is it in milliseconds? divide by 1000)',
    # The shell computed 2025-12-01 = 2012 (SQL arithmetic); the hint shows the quoting.
    "period_floor(2025-12-01, 'day')":
        "period_floor(): argument 1 (t) = 2012: Julian day 2012 is before year 0000; years 0000 through 9999 are supported; if this was a date, quote it: '2025-12-01'",
    # 45992 is 2025-12-01 as a spreadsheet serial (from memory: date(1899, 12, 30) + 45992 days).
    "period_floor(45992, 'day')":
        "period_floor(): argument 1 (t) = 45992: Julian day 45992 is before year 0000; years 0000 through 9999 are supported; for a spreadsheet serial use to_time(x, 'excel')",
    "period_floor(1000000, 'day')":
        "period_floor(): argument 1 (t) = 1000000: Julian day 1000000 is before year 0000; years 0000 through 9999 are supported; if this was a date, quote it: '2025-12-01'",
    # Months 0000-01 .. 9999-12 counted from 1970-01: -1970 * 12 and 8029 * 12 + 11 (plain arithmetic).
    "period_of_serial(99999999, 'month')":
        "period_of_serial(): argument 1 (serial) = 99999999: expected a whole number from -23640 to 96359",
    "period_floor(-1e13, 'day')":
        'period_floor(): argument 1 (t) = -10000000000000: the Unix time is before year 0000; years 0000 through 9999 are supported',
    "period_floor('2026-01-01', 'fortnight')":
        "period_floor(): argument 2 (spec) = 'fortnight': unknown unit 'fortnight'; expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one of second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration such as P1W or PT15M",
    "period_floor('2026-01-01', '3 fortnights')":
        "period_floor(): argument 2 (spec) = '3 fortnights': unknown unit 'fortnights'; expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one of second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration such as P1W or PT15M",
    "period_floor('2026-01-01', '0 days')":
        "period_floor(): argument 2 (spec) = '0 days': count 0: the count must be a positive whole number",
    "period_floor('2026-01-01', '-2 weeks')":
        "period_floor(): argument 2 (spec) = '-2 weeks': the count must be a positive whole number",
    "period_floor('2026-01-01', '1.5 days')":
        "period_floor(): argument 2 (spec) = '1.5 days': unexpected character '.'; expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one of second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration such as P1W or PT15M",
    "period_floor('2026-01-01', '99999999999999999999 days')":
        "period_floor(): argument 2 (spec) = '99999999999999999999 days': count 99999999999999999999 is too large; counts run 1 to 1000000",
    "period_floor('2026-01-01', 'P1M2D')":
        "period_floor(): argument 2 (spec) = 'P1M2D': 'P1M2D' is a mixed or malformed duration; expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS",
    "period_floor('2026-01-01', 'PT1H30M')":
        "period_floor(): argument 2 (spec) = 'PT1H30M': 'PT1H30M' is a mixed or malformed duration; expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS",
    "period_floor('2026-01-01', 'P0D')":
        "period_floor(): argument 2 (spec) = 'P0D': count 0: the count must be a positive whole number",
    "period_floor('2026-01-01', 'P1.5D')":
        "period_floor(): argument 2 (spec) = 'P1.5D': 'P1.5D' is a mixed or malformed duration; expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS",
    "period_floor('2026-01-01', 'PT')":
        "period_floor(): argument 2 (spec) = 'PT': expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS",
    "period_floor('2026-01-01', 'P1H')":
        "period_floor(): argument 2 (spec) = 'P1H': expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS",
    "period_floor('2026-01-01', '2 half-months')":
        "period_floor(): argument 2 (spec) = '2 half-months': half-month takes no count: its periods are the 1st-15th and the 16th-last day",
    "period_floor('2026-01-01', 'week starting funday')":
        "period_floor(): argument 2 (spec) = 'week starting funday': 'starting funday': weeks start on a weekday, monday to sunday",
    "period_floor('2026-01-01', 'year starting smarch')":
        "period_floor(): argument 2 (spec) = 'year starting smarch': 'starting smarch': quarters and years start in a month, january to december",
    "period_floor('2026-01-01', 'month starting april')":
        "period_floor(): argument 2 (spec) = 'month starting april': 'starting' applies to week, quarter and year, not month",
    "period_floor('2026-01-01', 'day starting monday')":
        "period_floor(): argument 2 (spec) = 'day starting monday': 'starting' applies to week, quarter and year, not day",
    "period_floor('2026-01-01', 'month from 2024-02-30')":
        "period_floor(): argument 2 (spec) = 'month from 2024-02-30': 'from' takes a moment YYYY-MM-DD[ HH:MM[:SS]] on the wall clock (no such date: 2024-02 has 29 days)",
    "period_floor('2026-01-01', 'week starting sunday from 2024-01-03')":
        "period_floor(): argument 2 (spec) = 'week starting sunday from 2024-01-03': 'from 2024-01-03' is a wednesday, which contradicts 'starting sunday'",
    "period_floor('2026-01-01', 'quarter starting april from 2024-02-01')":
        "period_floor(): argument 2 (spec) = 'quarter starting april from 2024-02-01': 'from 2024-02-01' contradicts 'starting april': a period must start in april or a month a whole number of quarters away",
    "period_floor('2026-01-01', '')":
        "period_floor(): argument 2 (spec) = '': the spec is empty; expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one of second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration such as P1W or PT15M",
    "period_floor('2026-01-01', 7)":
        'period_floor(): argument 2 (spec) = 7: expected TEXT, not a number',
    "period_floor('2026-01-01', 'day', 'Mars/Olympus_Mons')":
        "period_floor(): argument 3 (zone) = 'Mars/Olympus_Mons': not in the tz database; expected an IANA time zone name such as 'America/Denver' or 'UTC'",
    "period_floor('2026-01-01', 'day', '../../../etc/passwd')":
        "period_floor(): argument 3 (zone) = '../../../etc/passwd': expected an IANA time zone name such as 'America/Denver' or 'UTC'",
    "period_floor('2026-01-01', 'day', '/usr/share/zoneinfo/UTC')":
        "period_floor(): argument 3 (zone) = '/usr/share/zoneinfo/UTC': expected an IANA time zone name such as 'America/Denver' or 'UTC'",
    "period_floor('2026-01-01', 'day', '')":
        "period_floor(): argument 3 (zone) = '': expected an IANA time zone name such as 'America/Denver' or 'UTC'",
    "period_floor('2026-01-01', 'day', 42)":
        'period_floor(): argument 3 (zone) = 42: expected TEXT, not a number',
    "period_end('2026-02-30', 'month')":
        "period_end(): argument 1 (t) = '2026-02-30': no such date: 2026-02 has 28 days",
    "period_end('2026-01-01', 'weak')":
        "period_end(): argument 2 (spec) = 'weak': unknown unit 'weak'; expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one of second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration such as P1W or PT15M",
    "period_end('2026-01-01', 'day', 'Nowhere/Town')":
        "period_end(): argument 3 (zone) = 'Nowhere/Town': not in the tz database; expected an IANA time zone name such as 'America/Denver' or 'UTC'",
    "period_label('2026-01-01', 'P2M1D')":
        "period_label(): argument 2 (spec) = 'P2M1D': 'P2M1D' is a mixed or malformed duration; expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS",
    "period_label('2026-01-01', 'week', 'Nowhere/Town')":
        "period_label(): argument 3 (zone) = 'Nowhere/Town': not in the tz database; expected an IANA time zone name such as 'America/Denver' or 'UTC'",
    "period_serial('31/12/2026', 'day')":
        "period_serial(): argument 1 (t) = '31/12/2026': expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, or a number (a Julian day below 5373484.5, Unix seconds otherwise)",
    "period_serial('2026-01-01', '0 months')":
        "period_serial(): argument 2 (spec) = '0 months': count 0: the count must be a positive whole number",
    "period_serial(1.7e12, 'day')":
        'period_serial(): argument 1 (t) = 1700000000000: Unix seconds past year 9999 (is it in milliseconds? divide by 1000)',
    "period_shift('2026-02-30', 1, 'month')":
        "period_shift(): argument 1 (t) = '2026-02-30': no such date: 2026-02 has 28 days",
    "period_shift('2026-01-31', 1.5, 'month')":
        'period_shift(): argument 2 (n) = 1.5: expected a whole number from -100000000 to 100000000',
    "period_shift('2026-01-31', 'one', 'month')":
        "period_shift(): argument 2 (n) = 'one': expected a number",
    "period_shift('2026-01-31', 1, 'P1M2D')":
        "period_shift(): argument 3 (spec) = 'P1M2D': 'P1M2D' is a mixed or malformed duration; expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS",
    "period_shift('2026-01-31', 1, 'month', 'Nowhere/Town')":
        "period_shift(): argument 4 (zone) = 'Nowhere/Town': not in the tz database; expected an IANA time zone name such as 'America/Denver' or 'UTC'",
    "SELECT * FROM periods('2026-02-30', '2027-01-01', 'month')":
        "periods(): argument 1 (start) = '2026-02-30': no such date: 2026-02 has 28 days",
    "SELECT * FROM periods('2026-01-01', 'soon', 'month')":
        "periods(): argument 2 (stop) = 'soon': expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, or a number (a Julian day below 5373484.5, Unix seconds otherwise)",
    "SELECT * FROM periods('2026-01-01', '2027-01-01', 'fortnight')":
        "periods(): argument 3 (spec) = 'fortnight': unknown unit 'fortnight'; expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one of second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration such as P1W or PT15M",
    "SELECT * FROM periods('2026-01-01', '2027-01-01', '0 weeks')":
        "periods(): argument 3 (spec) = '0 weeks': count 0: the count must be a positive whole number",
    "SELECT * FROM periods('2026-01-01', '2027-01-01', 'month', 'Bad/Zone')":
        "periods(): argument 4 (zone) = 'Bad/Zone': not in the tz database; expected an IANA time zone name such as 'America/Denver' or 'UTC'",
    "SELECT * FROM periods(1700000000000, 1800000000000, 'month')":
        'periods(): argument 1 (start) = 1700000000000: Unix seconds past year 9999 (is it in milliseconds? divide by 1000)',
}


def run(db, sql):
    statement = sql if sql.startswith("SELECT *") else f"SELECT {sql}"
    return db.execute(statement).fetchall()


@pytest.mark.parametrize("sql,expected", CASES, ids=[case[0] for case in CASES])
def test_bad_input(db, sql, expected):
    if expected is NULL:
        rows = run(db, sql)
        # SQL's rules: NULL in, NULL out; a table-valued function gives no rows
        assert rows == ([] if sql.startswith("SELECT *") else [(None,)]), rows
        return
    with pytest.raises(Exception) as caught:
        run(db, sql)
    message = str(caught.value)
    # the common brief's one shape: fn(): argument N (name) = <value>: <what was expected>
    assert message.startswith(expected.prefix()), f"{message!r} should start {expected.prefix()!r}"
    said = message[len(expected.prefix()):]
    assert len(said) >= 8, f"{message!r}: too little said about what was expected"
    for word in expected.words:
        assert word.lower() in said.lower(), f"{message!r} should mention {word!r}"
    for word in expected.absent:
        assert word not in said, f"{message!r} should not offer {word!r}"
    if sql in EXACT:
        assert message == EXACT[sql]


def test_at_least_forty_error_cases():
    assert sum(1 for _, e in CASES if e is not NULL) >= 40


@pytest.mark.parametrize("sql,expected", VALID_TIME, ids=[case[0] for case in VALID_TIME])
def test_valid_time_never_raises(db, sql, expected):
    assert run(db, sql) == [(expected,)]


def test_wrong_argument_counts_are_sqlite_errors(db):
    # SQLite's own message for a function registered without that many arguments
    for sql, name in (("period_floor('2026-01-01')", "period_floor"),
                      ("period_shift('2026-01-01', 1)", "period_shift"),
                      ("period_label('2026-01-01', 'day', 'UTC', 1)", "period_label")):
        with pytest.raises(Exception) as caught:
            run(db, sql)
        assert str(caught.value) == f"wrong number of arguments to function {name}()"


def test_all_pinned_cases_exist():
    assert set(EXACT) <= {sql for sql, _ in CASES}


def test_results_beyond_9999_are_errors_not_garbage(db):
    # DESIGN: years outside 0000-9999 are an error — a result there too, since YYYY cannot write it
    # (assumption: the message names the function); 9999-12-31 and 0000-01-01 themselves are fine
    assert run(db, "period_floor('9999-12-31 12:00:00', 'day')") == [("9999-12-31",)]
    assert run(db, "period_floor('0000-01-01 12:00:00', 'day')") == [("0000-01-01",)]
    problems = []
    for sql, fn in (("period_end('9999-12-31', 'day')", "period_end"),
                    ("period_end('9999-12-31 23:00:00', 'hour')", "period_end"),
                    ("period_end('9999-06-01', 'year')", "period_end"),
                    ("period_end('9999-12-31', 'day', 'Australia/Sydney')", "period_end"),
                    ("period_floor('9999-12-31 20:00:00', 'day', 'Australia/Sydney')", "period_floor"),
                    ("period_floor('0000-01-01', 'week')", "period_floor"),
                    ("period_label('0000-01-01', 'week')", "period_label"),
                    ("period_floor('0000-01-01', 'quarter starting december')", "period_floor"),
                    ("period_floor('0000-01-01 00:00:00', 'day', 'America/Denver')", "period_floor"),
                    ("SELECT * FROM periods('9999-12-30', '9999-12-31 12:00', 'day')", "periods"),
                    ("period_shift('9999-12-31', 1, 'month')", "period_shift"),
                    ("period_shift('2026-01-31', 99999999, 'month')", "period_shift"),
                    ("period_shift('2026-01-31', 9223372036854775807, 'second')", "period_shift")):
        try:
            problems.append(f"{sql} gave {run(db, sql)!r}")
        except Exception as error:
            if not str(error).startswith(f"{fn}(): "):
                problems.append(f"{sql} raised {str(error)!r}, without the function's name")
    assert not problems, "\n".join(problems)


SHELL_SAMPLE = [case for case in CASES if case[1] is not NULL][::5] + [case for case in CASES if case[1] is NULL][:3]


@pytest.mark.parametrize("sql,expected", SHELL_SAMPLE, ids=[case[0] for case in SHELL_SAMPLE])
def test_fresh_shell_process_does_not_crash(sql, expected):
    # each case alone in a new sqlite3 shell: an error exits 1 with the message, never a signal
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    statement = sql if sql.startswith("SELECT *") else f"SELECT {sql}"
    result = subprocess.run(["sqlite3", "-bail", ":memory:"], input=f".load {module}\n{statement};\nSELECT 'alive';\n",
                            capture_output=True, text=True, timeout=60)
    assert result.returncode >= 0, f"killed by signal {-result.returncode}"
    if expected is NULL:
        assert result.returncode == 0 and result.stderr == "", result.stderr
        assert result.stdout.endswith("alive\n")
    else:
        assert result.returncode == 1, (result.returncode, result.stdout, result.stderr)
        assert expected.prefix() in result.stderr, result.stderr
        assert "alive" not in result.stdout


def test_every_case_in_one_connection_leaves_it_usable(db):
    # errors must not leave state behind (cached specs, cursors): the connection still answers
    for sql, expected in CASES:
        try:
            run(db, sql)
        except Exception:
            pass
    assert run(db, "period_label('2026-01-01', 'week')") == [("2026-W01",)]  # from memory: Thursday, week 1


def test_messages_stay_valid_text_around_non_ascii_input(db):
    # A message quotes the offending character or value; quoting half of a
    # UTF-8 sequence would make the message undecodable (found by fuzzing).
    db.text_factory = bytes
    for sql, params in [
        ("SELECT period_floor('2026-01-01', ?)", ("2 wéeks",)),
        ("SELECT period_floor(?, 'day')", ("x" * 59 + "é" * 10,)),
    ]:
        try:
            db.execute(sql, params).fetchall()
        except sqlite3.OperationalError as error:
            message = str(error)  # raises UnicodeDecodeError if the bytes were cut
            assert message.startswith("period_floor(): argument")
            assert "\ufffd" not in message
        else:
            raise AssertionError(f"{sql} {params!r} should have failed")
