# SPDX-License-Identifier: MIT
"""The report library sql/ run in the real sqlite3 shell, against answers computed in Python.

Two databases: a small fixture built here with a known shape (a rising, a
falling, a flat noisy and a winter-only item; a whole closed month, so weeks,
half-months and a month with no sales at all; ISO year 2020 with its week 53),
and a small demo database written by demo/generate.py with a fixed seed.
Every expected value comes from tests/reference/report_oracle.py, plain
Python arithmetic (math.fsum, statistics, datetime, zoneinfo), named beside
each assertion.
"""
import datetime as dt
import hashlib
import json
import math
import pathlib
import random
import sqlite3
import subprocess
import xml.etree.ElementTree as ET
from zoneinfo import ZoneInfo

import pytest

from conftest import SOURCE, run_shell
import report_oracle as oracle

SQL = SOURCE / "sql"
GENERATOR = SOURCE / "demo" / "generate.py"
ZONE = "America/Denver"
compared = {}


def count(what, n=1):
    compared[what] = compared.get(what, 0) + n


def teardown_module():
    print(f"\ncompared: {compared}")


# --- running a report ------------------------------------------------------------------------

def parameter_lines(params):
    lines = []
    for name, value in params.items():
        if isinstance(value, str):
            # Quoted twice so the shell stores TEXT, never evaluates 2020-01-06 as arithmetic.
            value = '"' + "'" + value.replace("'", "''") + "'" + '"'
        lines.append(f".parameter set @{name} {value}\n")
    return "".join(lines)


def report(database, name, **params):
    """Rows of sql/<name>.sql as dicts, through the sqlite3 shell's JSON mode."""
    script = parameter_lines(params) + ".mode json\n" + (SQL / f"{name}.sql").read_text()
    return json_rows(run_shell(script, database=str(database)))


def json_rows(output):
    """The rows of the shell's JSON output; the range line ([{"note": ...}]) left out."""
    # Each result set is one JSON array; the last, [{"note": "range ..."}, ...], says which range was used.
    decoder, sets, at = json.JSONDecoder(), [], 0
    while output[at:].strip():
        value, end = decoder.raw_decode(output[at:].lstrip())
        at = len(output) - len(output[at:].lstrip()) + end
        sets.append(value)
    return [row for rows in sets if not all(list(row) == ["note"] for row in rows) for row in rows]


def close(got, expected, digits):
    """A value the report rounds to `digits` decimals, against the unrounded oracle."""
    if expected is None or got is None:
        return got is None and expected is None
    return abs(got - expected) <= 0.5 * 10 ** -digits + 1e-9 * max(1.0, abs(expected))


# --- the databases ---------------------------------------------------------------------------

FIXTURE_ITEMS = {"Rising bun": 2.5, "Falling loaf": 3.75, "Flat tea": 1.25, "Winter soup": 4.5}
FIXTURE_FIRST = dt.date(2019, 12, 30)   # Monday of 2020-W01 (date.isocalendar)
FIXTURE_LAST = dt.date(2021, 2, 28)     # Sunday of 2021-W08
CLOSED_FROM, CLOSED_TO = dt.date(2020, 6, 1), dt.date(2020, 6, 30)  # a whole month without sales


def fixture_rows():
    """Invented, deterministic sales; prices are binary fractions so sums are exact."""
    rng = random.Random(41)
    zone = ZoneInfo(ZONE)
    rows = []
    day = FIXTURE_FIRST
    while day <= FIXTURE_LAST:
        k = (day - FIXTURE_FIRST).days
        if not (CLOSED_FROM <= day <= CLOSED_TO or day == dt.date(2020, 12, 25)):
            counts = {
                "Rising bun": 2 + k // 14 + (2 if day.weekday() == 5 else 0),
                "Falling loaf": max(1, 14 - k // 30),
                "Flat tea": rng.choice([1, 2, 3, 5, 8, 9, 12]),
                "Winter soup": 3 if day.month in (11, 12, 1, 2) else 0,
            }
            for item, n in counts.items():
                for _ in range(n):
                    qty = rng.choice([1, 1, 1, 2, 3])
                    # Local opening hours 7:00..22:59, so evening sales fall on the next UTC date.
                    local = dt.datetime(day.year, day.month, day.day, rng.randrange(7, 23), rng.randrange(60),
                                        rng.randrange(60), tzinfo=zone)
                    ts = local.astimezone(dt.timezone.utc).strftime("%Y-%m-%d %H:%M:%S")
                    rows.append((ts, item, qty, qty * FIXTURE_ITEMS[item]))
        day += dt.timedelta(days=1)
    return rows


def write_db(path, rows):
    connection = sqlite3.connect(path)
    connection.execute("CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL)")
    connection.executemany("INSERT INTO sales VALUES (?, ?, ?, ?)", rows)
    connection.commit()
    connection.close()


def read_rows(path):
    connection = sqlite3.connect(path)
    rows = connection.execute("SELECT ts, item, qty, amount FROM sales ORDER BY rowid").fetchall()
    connection.close()
    return rows


def generate_demo(path, seed, scale="0.04"):
    subprocess.run(["/usr/bin/python3", str(GENERATOR), "--out", str(path), "--seed", str(seed), "--scale", scale],
                   check=True, capture_output=True, text=True, timeout=600)


@pytest.fixture(scope="module")
def fixture_db(tmp_path_factory):
    path = tmp_path_factory.mktemp("fixture") / "fixture.db"
    rows = fixture_rows()
    write_db(path, rows)
    return path, rows


@pytest.fixture(scope="module")
def demo_db(tmp_path_factory):
    path = tmp_path_factory.mktemp("demo") / "shop.db"
    generate_demo(path, seed=7)
    return path, read_rows(path)


@pytest.fixture(params=["fixture", "demo"])
def database(request, fixture_db, demo_db):
    return fixture_db if request.param == "fixture" else demo_db


# --- the generator ---------------------------------------------------------------------------

def rows_hash(path):
    connection = sqlite3.connect(path)
    digest = hashlib.sha256()
    for row in connection.execute("SELECT ts, item, qty, amount, shop FROM sales ORDER BY rowid"):
        digest.update(repr(row).encode())
    connection.close()
    return digest.hexdigest()


def test_generator_is_deterministic_and_has_the_promised_shape(tmp_path):
    generate_demo(tmp_path / "a.db", seed=11)
    generate_demo(tmp_path / "b.db", seed=11)
    generate_demo(tmp_path / "c.db", seed=12)
    # oracle: hashlib.sha256 over the rows in rowid order — same seed, same rows
    assert rows_hash(tmp_path / "a.db") == rows_hash(tmp_path / "b.db")
    assert rows_hash(tmp_path / "a.db") != rows_hash(tmp_path / "c.db")
    rows = read_rows(tmp_path / "a.db")
    days = {oracle.local_day(ts, ZONE) for ts, *_ in rows}
    # oracle: datetime arithmetic on the local days of the rows (zoneinfo)
    assert (max(days) - min(days)).days >= 2 * 365
    assert dt.date(2024, 12, 25) not in days and dt.date(2023, 11, 23) not in days  # closed: Christmas, Thanksgiving
    assert len({item for _, item, *_ in rows}) == 12
    assert all(ts[4] == "-" and len(ts) == 19 for ts, *_ in rows)  # UTC text 'YYYY-MM-DD HH:MM:SS'
    count("generator runs", 3)


# --- period totals ---------------------------------------------------------------------------

TOTALS = {
    "week": oracle.week_of,
    "half-month": oracle.half_month_of,
    "month": oracle.month_of,
    "quarter starting october": oracle.fiscal_quarter_of(10),
}


def check_totals(got, expected):
    assert len(got) == len(expected)  # oracle: report_oracle.enumerate_periods (datetime days)
    for g, e in zip(got, expected):
        assert (g["period"], g["segment"], g["item"]) == (e["label"], e["segment"], e["item"])  # oracle: date.isocalendar / calendar labels
        assert (g["days_in_period"], g["days_covered"], g["complete"]) == (
            e["days_in_period"], e["days_covered"], e["complete"])  # oracle: datetime day counts (report_oracle.period_days)
        assert (g["sales"], g["qty"], g["days_with_sales"]) == (e["sales"], e["qty"], e["days_with_sales"])  # oracle: plain Python counts
        assert close(g["amount"], e["amount"], 2)                   # oracle: math.fsum over the period's rows
        assert close(g["amount_per_day"], e["amount_per_day"], 2)   # oracle: fsum / distinct local days, None when 0
        assert close(g["mean_sale"], e["mean_sale"], 2)             # oracle: fsum / row count, None when 0
    count("period total rows", len(got))


@pytest.mark.parametrize("unit", sorted(TOTALS))
def test_period_totals_match_plain_python_sums(database, unit):
    path, rows = database
    check_totals(report(path, "totals", zone=ZONE, unit=unit), oracle.period_totals(rows, ZONE, TOTALS[unit]))


@pytest.mark.parametrize("unit", sorted(TOTALS))
def test_period_totals_per_item_and_for_one_item(fixture_db, unit):
    path, rows = fixture_db
    period_of = TOTALS[unit]
    check_totals(report(path, "totals", zone=ZONE, unit=unit, item="*"),
                 oracle.period_totals(rows, ZONE, period_of, "*"))
    check_totals(report(path, "totals", zone=ZONE, unit=unit, item="Winter soup"),
                 oracle.period_totals(rows, ZONE, period_of, "Winter soup"))


def test_the_unit_defaults_to_the_iso_week(fixture_db):
    path, rows = fixture_db
    check_totals(report(path, "totals", zone=ZONE), oracle.period_totals(rows, ZONE, oracle.week_of))


def test_empty_periods_are_zero_for_sums_and_null_for_means(fixture_db):
    path, _ = fixture_db
    weeks = {row["period"]: row for row in report(path, "totals", zone=ZONE)}
    months = {row["period"]: row for row in report(path, "totals", zone=ZONE, unit="month")}
    halves = {row["period"]: row for row in report(path, "totals", zone=ZONE, unit="half-month")}
    # The fixture is closed 2020-06-01..30: ISO weeks 23-26 of 2020 lie wholly inside
    # (oracle: date(2020,6,1).isocalendar() is (2020, 23, 1), date(2020,6,28) is (2020, 26, 7)).
    for empty in [weeks[f"2020-W{w}"] for w in (23, 24, 25, 26)] + [months["2020-06"], halves["2020-06 (1-15)"],
                                                                     halves["2020-06 (16-30)"]]:
        assert (empty["sales"], empty["qty"], empty["amount"], empty["days_with_sales"]) == (0, 0, 0, 0)  # common practice: an empty period sums to 0
        assert empty["amount_per_day"] is None and empty["mean_sale"] is None  # common practice: a mean of nothing is NULL
        assert empty["complete"] == 1  # a closed month is covered by the data, only empty
    # ISO year 2020 has 53 weeks (oracle: date(2020, 12, 31).isocalendar()[1] == 53).
    assert "2020-W53" in weeks and dt.date(2020, 12, 31).isocalendar()[1] == 53
    count("empty periods", 7)


def test_a_range_from_parameters_and_a_view_over_another_table(fixture_db, tmp_path):
    path, rows = fixture_db
    got = report(path, "totals", zone=ZONE, unit="month", start="2020-03-01", stop="2020-09-01")
    expected = oracle.period_totals(rows, ZONE, oracle.month_of, start=dt.date(2020, 3, 1), stop=dt.date(2020, 9, 1))
    check_totals(got, expected)
    assert [row["period"] for row in got] == ["2020-03", "2020-04", "2020-05", "2020-06", "2020-07", "2020-08"]  # oracle: calendar months Mar..Aug
    # A table of another shape, reached through the temp view the report headers describe.
    other = tmp_path / "other.db"
    connection = sqlite3.connect(other)
    connection.execute("CREATE TABLE pos_export(sold_at TEXT, product TEXT, units INTEGER, total REAL)")
    connection.executemany("INSERT INTO pos_export VALUES (?, ?, ?, ?)", rows)
    connection.commit()
    connection.close()
    script = (".parameter set @zone America/Denver\n.parameter set @unit month\n.mode json\n"
              "CREATE TEMP VIEW sales AS SELECT sold_at AS ts, product AS item, units AS qty, total AS amount"
              " FROM pos_export;\n" + (SQL / "totals.sql").read_text())
    check_totals(json_rows(run_shell(script, database=str(other))),
                 oracle.period_totals(rows, ZONE, oracle.month_of))


# --- data that ends mid-week and mid-month, in three segments ---------------------------------

PARTIAL_LAST = dt.date(2021, 2, 17)  # a Wednesday (date(2021, 2, 17).isoweekday() == 3), mid-February
SEGMENTS = ["North", "South", "West"]


@pytest.fixture(scope="module")
def partial_db(tmp_path_factory):
    """The fixture's rows up to PARTIAL_LAST, each in one of three segments (seeded)."""
    rng = random.Random(5)
    rows = [row + (rng.choice(SEGMENTS),) for row in fixture_rows()
            if oracle.local_day(row[0], ZONE) <= PARTIAL_LAST]
    path = tmp_path_factory.mktemp("partial") / "partial.db"
    connection = sqlite3.connect(path)
    connection.execute("CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL, segment TEXT)")
    connection.executemany("INSERT INTO sales VALUES (?, ?, ?, ?, ?)", rows)
    connection.commit()
    connection.close()
    return path, rows


@pytest.mark.parametrize("unit", sorted(TOTALS))
def test_totals_flag_the_partial_last_period_and_break_down_by_segment(partial_db, unit):
    path, rows = partial_db
    got = report(path, "totals", zone=ZONE, unit=unit, item="*", by_segment=1)
    check_totals(got, oracle.period_totals(rows, ZONE, TOTALS[unit], "*", by_segment=True))
    last = got[-1]
    assert last["complete"] == 0 and last["days_covered"] < last["days_in_period"]  # oracle: 2021-02-17 is a Wednesday, mid-month
    assert all(row["complete"] == 1 for row in got if row["period"] != last["period"] and row["period"] != got[0]["period"])


@pytest.mark.parametrize("unit", ["week", "month"])
def test_segments_add_up_exactly_to_the_all_segments_row(partial_db, unit):
    path, _ = partial_db
    got = report(path, "totals", zone=ZONE, unit=unit, item="*", by_segment=1)
    whole = {(row["period"], row["item"]): row for row in got if row["segment"] == "all segments"}
    parts = {}
    for row in got:
        if row["segment"] != "all segments":
            part = parts.setdefault((row["period"], row["item"]), dict(sales=0, qty=0, amount=[]))
            part["sales"] += row["sales"]
            part["qty"] += row["qty"]
            part["amount"].append(row["amount"])
    assert {row["segment"] for row in got} == {"all segments", *SEGMENTS}
    assert parts.keys() == whole.keys()
    for key, part in parts.items():
        # oracle: math.fsum of the three segments' amounts; the fixture's prices are binary
        # fractions, so every sum is exact and the parts equal the whole bit for bit
        assert math.fsum(part["amount"]) == whole[key]["amount"]
        assert (part["sales"], part["qty"]) == (whole[key]["sales"], whole[key]["qty"])
    count("segment sums", len(parts))


def test_a_table_without_a_segment_column_is_one_segment(fixture_db):
    path, rows = fixture_db
    got = report(path, "totals", zone=ZONE, unit="month", by_segment=1)
    # A source without a segment column has only the rollup (ext/README.md: "only all_segments = 1 rows").
    check_totals(got, oracle.period_totals(rows, ZONE, oracle.month_of))
    assert {row["segment"] for row in got} == {"all segments"}


# --- trend and noise -------------------------------------------------------------------------

def check_trend(got, expected):
    assert sorted(row["item"] for row in got) == sorted(expected)  # oracle: the items of the rows
    for row in got:
        e = expected[row["item"]]
        assert row["weeks"] == e["weeks"]                            # oracle: whole ISO weeks by datetime
        assert row["test"] == ("seasonal (ISO week)" if e["seasonal"] else "plain")  # oracle: 104 whole weeks
        assert close(row["mean_per_week"], e["mean"], 2)            # oracle: statistics.fmean of every whole week
        assert close(row["sen_slope"], e["sen"], 2)                 # oracle: statistics.median of pairwise slopes
        assert close(row["ls_slope"], e["ls"], 2)                   # oracle: statistics.linear_regression
        assert close(row["p_value"], e["p"], 4)                     # oracle: brute-force (seasonal) Kendall S, Var(S)
        assert close(row["pct_per_year"], e["pct_per_year"], 1)     # oracle: 100 * 365.2425/7 * sen / mean of the weeks used
        assert row["verdict"] == e["verdict"]                       # oracle: the header's rule on the values above
        if e["season_strength"] is None:
            assert row["season_strength"] is None                   # fewer than two whole years
        else:  # oracle: statsmodels STL (period 52) and the strength of FPP3 section 4.3
            assert close(row["season_strength"], e["season_strength"], 2)
        shape = row["shape"]
        assert len(shape) == len(e["shape_levels"])                 # oracle: one block per 4 weeks
        for char, levels in zip(shape, e["shape_levels"]):
            assert ord(char) - 0x2581 in levels                     # oracle: the README sparkline rule on fmean of blocks
    # The report lists rising items first: by Sen slope relative to the mean, descending.
    assert [row["item"] for row in got] == sorted(
        expected, key=lambda i: (-expected[i]["sen"] / expected[i]["traded_mean"], i))
    count("trend rows", len(got))


def test_trend_table_matches_the_kendall_test_and_sen_slope_by_definition(database):
    path, rows = database
    check_trend(report(path, "trend", zone=ZONE), oracle.trend(rows, ZONE))


def test_trend_verdicts_on_the_fixture(fixture_db):
    path, rows = fixture_db
    got = {row["item"]: row for row in report(path, "trend", zone=ZONE)}
    expected = oracle.trend(rows, ZONE)
    # The fixture was built rising / falling / flat; the oracle's verdicts agree.
    assert [expected[i]["verdict"] for i in ("Rising bun", "Falling loaf", "Flat tea")] == \
        ["rising", "falling", "no clear trend"]                       # oracle: report_oracle.trend
    assert {i: got[i]["verdict"] for i in got} == {i: expected[i]["verdict"] for i in expected}
    count("verdicts", len(got))


def test_trend_over_a_chosen_range_of_whole_weeks(fixture_db):
    path, rows = fixture_db
    got = report(path, "trend", zone=ZONE, start="2020-07-06", stop="2021-01-04", spark_weeks=2)
    check_trend_sub = oracle.trend(rows, ZONE, spark_weeks=2, start=dt.date(2020, 7, 6), stop=dt.date(2021, 1, 4))
    assert {row["weeks"] for row in got} == {26}   # oracle: (2021-01-04 - 2020-07-06).days / 7
    check_trend(got, check_trend_sub)


def test_a_range_of_fewer_than_ten_whole_weeks_has_too_few_periods(fixture_db):
    path, rows = fixture_db
    # 2020-07-08 (a Wednesday) to 2020-09-14: whole weeks 2020-07-13 .. 2020-09-13, nine (datetime).
    got = report(path, "trend", zone=ZONE, start="2020-07-08", stop="2020-09-14")
    assert {row["weeks"] for row in got} == {9}
    assert {row["verdict"] for row in got} == {"too few periods"}  # oracle: the header's rule, 9 < 10


def test_noise_ranking_order_and_values(database):
    path, rows = database
    got = report(path, "noise_ranking", zone=ZONE)
    expected = oracle.noise_ranking(rows, ZONE)
    assert [row["item"] for row in got] == [e["item"] for e in expected]  # oracle: sorted by noise_sd / mean
    assert [row["rank"] for row in got] == list(range(1, len(expected) + 1))
    for g, e in zip(got, expected):
        assert g["days"] == e["days"]                         # oracle: datetime days of the range
        assert close(g["mean_per_day"], e["mean"], 2)         # oracle: statistics.fmean
        assert close(g["noise_sd"], e["noise_sd"], 2)         # oracle: statsmodels STL (period 7), statistics.stdev
        assert close(g["noise_pct"], e["noise_pct"], 1)       # oracle: 100 * noise_sd / mean
        for key in ("trend_strength", "season_strength"):     # oracle: statsmodels STL (52), FPP3 section 4.3
            assert (g[key] is None) == (e[key] is None)
            if e[key] is not None:
                assert close(g[key], e[key], 2)
    count("noise rows", len(got))


def test_noise_ranking_of_the_fixture_puts_the_noisy_item_first(fixture_db):
    path, rows = fixture_db
    got = [row["item"] for row in report(path, "noise_ranking", zone=ZONE)]
    # Flat tea's daily counts jump 1..12: the oracle (report_oracle.noise_ranking, on
    # statsmodels' STL parts) ranks it first; Winter soup, sold four months a year, is
    # seasonal, and its season is not noise.
    assert got[0] == "Flat tea"
    assert got == [e["item"] for e in oracle.noise_ranking(rows, ZONE)]


# --- weekday profile -------------------------------------------------------------------------

def check_weekdays(got, expected):
    assert len(got) == len(expected)
    for g, e in zip(got, expected):
        assert (g["weekday"], g["item"], g["days"], g["days_with_sales"], g["qty"]) == \
            (e["weekday"], e["item"], e["days"], e["days_with_sales"], e["qty"])  # oracle: date.weekday() counts
        assert close(g["amount"], e["amount"], 2)                  # oracle: math.fsum
        assert close(g["share_pct"], e["share_pct"], 1)            # oracle: 100 * weekday fsum / total fsum
        assert close(g["mean_per_day"], e["mean_per_day"], 2)      # oracle: statistics.fmean of daily totals
        assert close(g["median_per_day"], e["median_per_day"], 2)  # oracle: statistics.median of daily totals
        assert close(g["index"], e["index"], 1)                    # oracle: 100 * mean / mean of all sold days
    count("weekday rows", len(got))


def test_weekday_profile(database):
    path, rows = database
    check_weekdays(report(path, "weekday_profile", zone=ZONE), oracle.weekday_profile(rows, ZONE))


def test_weekday_profile_per_item(fixture_db):
    path, rows = fixture_db
    check_weekdays(report(path, "weekday_profile", zone=ZONE, item="*"), oracle.weekday_profile(rows, ZONE, "*"))
    profile = {row["weekday"]: row for row in report(path, "weekday_profile", zone=ZONE, item="Rising bun")}
    # The fixture sells two more buns every Saturday: Saturday is the bun's busiest day.
    assert max(profile, key=lambda d: profile[d]["mean_per_day"]) == "Saturday"


# --- like-for-like comparison ----------------------------------------------------------------

def year_back(period_of):
    """The start of the period a year earlier: the same ISO week of the previous ISO year
    for weeks (date.fromisocalendar), else the period holding the start 12 months back."""
    if period_of is oracle.week_of:
        return oracle.last_year_of_week
    return lambda start: period_of(oracle.last_year_of_start(start))[0]


def check_compare(got, expected):
    assert len(got) == len(expected)
    for g, e in zip(got, expected):
        for column in ("segment", "item", "period", "days_in_period", "days_covered", "complete", "span",
                       "trading_days", "against", "base_period", "base_span", "base_trading_days"):
            assert g[column] == e[column], column  # oracle: datetime day arithmetic and labels, report_oracle.compare
        for column in ("amount", "per_trading_day", "base_amount", "base_per_trading_day"):
            assert close(g[column], e[column], 2), column  # oracle: math.fsum over the span's rows
        for column in ("change_pct", "change_per_day_pct"):
            assert close(g[column], e[column], 1), column  # oracle: 100 * (now - base) / base on the fsum values
    count("comparison rows", len(got))


@pytest.mark.parametrize("unit", sorted(TOTALS))
def test_the_latest_period_to_date_against_matched_spans(partial_db, unit):
    path, rows = partial_db
    period_of = TOTALS[unit]
    got = report(path, "compare", zone=ZONE, unit=unit, by_segment=1)
    check_compare(got, oracle.compare(rows, ZONE, period_of, year_back(period_of), by_segment=True))
    assert got[0]["complete"] == 0  # oracle: the data ends on Wednesday 2021-02-17, inside every unit's period


def test_a_comparison_per_item_and_against_one_base(partial_db):
    path, rows = partial_db
    got = report(path, "compare", zone=ZONE, unit="month", item="*")
    check_compare(got, oracle.compare(rows, ZONE, oracle.month_of, year_back(oracle.month_of), item="*"))
    only_year = report(path, "compare", zone=ZONE, unit="month", item="*", against="year")
    assert only_year == [row for row in got if row["against"] == "year"]


def test_matched_spans_on_the_demo_data(demo_db):
    path, rows = demo_db
    got = report(path, "compare", zone=ZONE, unit="half-month", stop="2025-12-29")
    check_compare(got, oracle.compare(rows, ZONE, oracle.half_month_of, year_back(oracle.half_month_of),
                                      stop=dt.date(2025, 12, 29)))
    # 2025-12-16..28 against 2024-12-16..28: the same 13 days, Christmas closed in both
    # (oracle: datetime; demo/generate.py closes every shop on 25 December).
    year = next(row for row in got if row["against"] == "year")
    assert (year["span"], year["base_span"]) == ("2025-12-16..2025-12-28", "2024-12-16..2024-12-28")
    assert year["trading_days"] == year["base_trading_days"] == 12


def test_iso_week_bases_across_a_53_week_year(partial_db):
    path, rows = partial_db
    # ISO 2020 has 53 weeks, so 2021-W01 compares with 2020-W01, 53 weeks back, not with
    # 2020-W02, 52 weeks back (oracle: date.fromisocalendar(2020, 1, 1) == date(2019, 12, 30)).
    got = report(path, "compare", zone=ZONE, stop="2021-01-06")
    check_compare(got, oracle.compare(rows, ZONE, oracle.week_of, oracle.last_year_of_week,
                                      stop=dt.date(2021, 1, 6)))
    year = next(row for row in got if row["against"] == "year")
    assert (year["period"], year["base_period"], year["base_span"]) == ("2021-W01", "2020-W01",
                                                                        "2019-12-30..2019-12-31")
    # 2019 has no week 53 (date.fromisocalendar(2019, 53, 1) raises): no base at all.
    got = report(path, "compare", zone=ZONE, stop="2021-01-01")
    year = next(row for row in got if row["against"] == "year")
    assert year["period"] == "2020-W53" and year["base_period"] is None and year["change_pct"] is None
    with pytest.raises(ValueError):
        dt.date.fromisocalendar(2019, 53, 1)


def test_a_base_before_the_data_is_not_compared(partial_db):
    path, rows = partial_db
    got = report(path, "compare", zone=ZONE, unit="month", stop="2020-05-10")
    year = next(row for row in got if row["against"] == "year")
    # The data begins 2019-12-30, so May 2019 is not covered: NULL, not 0 (common practice).
    assert year["base_period"] == "2019-05" and year["base_amount"] is None and year["change_pct"] is None
    check_compare(got, oracle.compare(rows, ZONE, oracle.month_of, year_back(oracle.month_of),
                                      stop=dt.date(2020, 5, 10)))


def reports_taking_an_item():
    """Every report in sql/ that reads @item, so a report added later is covered too."""
    return sorted(path.stem for path in SQL.glob("*.sql") if "@item" in path.read_text())


def dice_closest(wanted, names):
    """The name sharing the most letter pairs with wanted, ignoring (ASCII) case; ties by name."""
    def pairs(text):
        low = text.translate(str.maketrans("ABCDEFGHIJKLMNOPQRSTUVWXYZ", "abcdefghijklmnopqrstuvwxyz"))
        return {low[i:i + 2] for i in range(len(low) - 1)}
    target = pairs(wanted)
    scored = [(-2.0 * len(pairs(n) & target) / (len(pairs(n)) + len(target)), n) for n in names if pairs(n)]
    return min(scored)[1]


@pytest.mark.parametrize("name", reports_taking_an_item())
@pytest.mark.parametrize("wanted", ["flat te", "Winter Sop", "Zzz"])
def test_an_item_that_matches_nothing_names_the_closest_item(partial_db, name, wanted):
    path, rows = partial_db
    names = sorted({row[1] for row in rows})
    # The report stops with known_name's message; the closest name by Dice's coefficient of the
    # sets of letter pairs, ignoring case, ties by name (from memory: Dice 1945, "Measures of the
    # amount of ecologic association between species"), computed here in Python.
    expected = (f"known_name(): argument 2 (wanted) = '{wanted}': expected one of the items; "
                f"the closest is '{dice_closest(wanted, names)}'")
    with pytest.raises(RuntimeError) as stopped:
        run_shell(parameter_lines({"zone": ZONE, "item": wanted}) + ".mode json\n"
                  + (SQL / f"{name}.sql").read_text(), database=str(path))
    assert expected in str(stopped.value)


def test_the_closest_item_of_the_fixture_by_hand(partial_db):
    path, _ = partial_db
    # worked by hand (from memory: Dice's coefficient): 'flat te' shares fl la at t- -t te with 'Flat tea' (Dice 12/13), more than any other name.
    for name, wanted, closest in [("totals", "flat te", "Flat tea"), ("compare", "Winter Sop", "Winter soup")]:
        with pytest.raises(RuntimeError) as stopped:
            report(path, name, zone=ZONE, item=wanted)
        assert f"= '{wanted}': expected one of the items; the closest is '{closest}'" in str(stopped.value)


# --- the chart -------------------------------------------------------------------------------

def chart(database, **params):
    """The SVG the chart report prints, and the points it leaves in temp.chart_points."""
    script = (parameter_lines(params) + ".mode list\n" + (SQL / "daily_chart.sql").read_text()
              + "\n.print ---points---\n.mode json\n"
              "SELECT item, day, layer, CASE WHEN value IS NOT NULL THEN printf('%!.17g', value) END AS value"
              " FROM temp.chart_points;\n")
    output = run_shell(script, database=str(database))
    svg, points = output.split("---points---\n")
    return svg, json.loads(points)


def check_chart(path, rows, **params):
    svg, points = chart(path, zone=ZONE, **params)
    items, expected = oracle.chart_points(rows, ZONE, top=params.get("top", 3), item=params.get("item"),
                                          weeks=params.get("weeks", 13))
    root = ET.fromstring(svg.strip())  # oracle: xml.etree parses the document
    assert root.tag.endswith("svg")
    texts = {"".join(node.itertext()).strip() for node in root.iter() if node.tag.endswith("text")}
    for item in items:
        assert item in texts  # oracle: the legend names each chosen item (report_oracle.chart_points top items)
    assert len(points) == len(expected)
    for point in points:
        value = None if point["value"] is None else float(point["value"])
        want = expected[(point["item"], point["day"], point["layer"])]
        if point["layer"] == "raw":
            assert value == want           # oracle: round(math.fsum(the day's amounts), 2)
        else:
            assert value == want           # oracle: math.fsum(7-day frame) / 7, bit for bit (the README moving_mean)
    count("chart points", len(points))


def test_overlay_chart_of_the_top_items(database):
    path, rows = database
    check_chart(path, rows)


def test_overlay_chart_of_the_whole_range_and_its_colours_follow_the_item_list(fixture_db):
    path, rows = fixture_db
    check_chart(path, rows, weeks=0)
    # series_order is every item, largest first, so one item has one colour in every chart
    # (oracle: xml.etree; ext/README.md "Charts", series_order)
    colours = {}
    for item in ("Flat tea", "Rising bun", None):
        svg, _ = chart(path, zone=ZONE, **({"item": item} if item else {}))
        for p in ET.fromstring(svg.strip()).iter("{http://www.w3.org/2000/svg}path"):
            colours.setdefault(p.get("data-series"), set()).add(p.get("stroke"))
    assert all(len(strokes) == 1 for strokes in colours.values()) and len(colours) >= 3


def test_overlay_chart_of_one_item(fixture_db):
    path, rows = fixture_db
    check_chart(path, rows, item="Flat tea", title="Flat tea <daily>")
