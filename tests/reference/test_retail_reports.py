# SPDX-License-Identifier: MIT
"""sql/totals.sql and sql/compare.sql with a retail @unit, against a retail
calendar laid out here from pandas.tseries.offsets.FY5253 year ends (the
4-4-5 months are common practice) and sums taken with math.fsum.

- totals: every retail month's sales count and amount.
- compare, against the year before: the same retail week (month) number of
  the previous retail year over the same elapsed days; a week 53 whose
  previous year has none has no base, its row says so and its change is NULL.
"""
import datetime as dt
import math
import random

import pytest
from pandas import Timestamp
from pandas.tseries.offsets import FY5253

from conftest import SOURCE, run_shell

ANCHOR = "saturday nearest end of january"
DAY = dt.timedelta(days=1)


def year_ends(weekday=5, variation="nearest"):
    # oracle: pandas.tseries.offsets.FY5253(weekday, startingMonth=1, variation)
    offset = FY5253(weekday=weekday, startingMonth=1, variation=variation)
    t = offset.rollforward(Timestamp("2019-01-01"))
    ends = []
    while t.year < 2028:
        ends.append(t.date())
        t = t + offset
    return ends


def calendar(weekday=5, variation="nearest"):
    """(start, end exclusive, label) of every retail week and 4-4-5 month."""
    weeks, months = [], []
    ends = year_ends(weekday, variation)
    for previous, end in zip(ends, ends[1:]):
        start, name, n_weeks = previous + DAY, end.year, (end - previous).days // 7
        for w in range(n_weeks):
            weeks.append((start + dt.timedelta(weeks=w), start + dt.timedelta(weeks=w + 1), f"FY{name}-W{w + 1:02d}"))
        lengths = [4, 4, 5] * 4  # common practice: 4-4-5
        lengths[11] += n_weeks - 52
        m = start
        for p, length in enumerate(lengths):
            months.append((m, m + dt.timedelta(weeks=length), f"FY{name}-P{p + 1:02d}"))
            m += dt.timedelta(weeks=length)
    return weeks, months


@pytest.fixture(scope="module")
def shop(tmp_path_factory):
    rng = random.Random(445)
    rows = []
    day = dt.date(2022, 1, 3)
    while day < dt.date(2025, 3, 1):
        for _ in range(rng.randint(3, 12)):
            rows.append((f"{day.isoformat()} {rng.randint(8, 20):02d}:{rng.randint(0, 59):02d}:00",
                         rng.choice(["bread", "buns"]), rng.randint(1, 4), round(rng.uniform(2, 60), 2)))
        day += DAY
    path = tmp_path_factory.mktemp("retail") / "shop.db"
    values = ",".join(f"('{ts}','{item}',{qty},{amount})" for ts, item, qty, amount in rows)
    run_shell(f"CREATE TABLE sales(ts, item, qty, amount); INSERT INTO sales VALUES {values};", str(path))
    return path, rows


def report(path, name, **parameters):
    settings = "".join(f".parameter set @{key} {value}\n" for key, value in parameters.items())
    script = settings + ".headers on\n" + (SOURCE / "sql" / name).read_text()
    lines = run_shell(script, str(path)).splitlines()
    header = lines[0].split("|")
    return [dict(zip(header, line.split("|"))) for line in lines[1:] if "|" in line and not line.startswith("note")]


def amounts_between(rows, first, after):
    picked = [amount for ts, _, _, amount in rows if first <= dt.date.fromisoformat(ts[:10]) < after]
    return len(picked), math.fsum(picked)  # oracle: math.fsum


def test_totals_sums_every_retail_month(shop):
    path, rows = shop
    _, months = calendar()
    got = report(path, "totals.sql", unit=f"'retail month ending {ANCHOR}'")
    assert len(got) > 30
    by_label = {start_end_label[2]: start_end_label for start_end_label in months}
    for row in got:
        start, after, _ = by_label[row["period"]]
        count, total = amounts_between(rows, start, after)
        assert int(row["sales"]) == count, row["period"]
        assert float(row["amount"]) == round(total, 2), row["period"]
        assert int(row["days_in_period"]) == (after - start).days, row["period"]
    print(f"{len(got)} retail months compared")


def compare_year(path, unit, stop):
    rows = report(path, "compare.sql", unit=f"'{unit}'", against="year", stop=f"\"'{stop.isoformat()}'\"")
    assert len(rows) == 1
    return rows[0]


@pytest.mark.parametrize("stop", [dt.date(2024, 11, 14), dt.date(2024, 12, 1), dt.date(2025, 1, 30),
                                  dt.date(2024, 5, 9)])
@pytest.mark.parametrize("kind", ["week", "month"])
@pytest.mark.parametrize("weekday,anchor", [(5, ANCHOR), (6, "last sunday of january")])
def test_compare_sets_each_retail_period_against_the_same_one_a_retail_year_earlier(shop, stop, kind, weekday,
                                                                                     anchor):
    path, rows = shop
    weeks, months = calendar(weekday, "nearest" if "nearest" in anchor else "last")
    periods = weeks if kind == "week" else months
    latest = next(p for p in periods if p[0] <= stop - DAY < p[1])
    name, number = latest[2][2:6], latest[2][6:]
    wanted = f"FY{int(name) - 1}{number}"  # DESIGN: the same position in the previous retail year
    base = next(p for p in periods if p[2] == wanted)
    elapsed = (stop - latest[0]).days
    got = compare_year(path, f"retail {kind} ending {anchor}", stop)
    assert got["period"] == latest[2] and got["base_period"] == wanted
    assert int(got["days_covered"]) == elapsed
    _, amount = amounts_between(rows, latest[0], stop)
    _, base_amount = amounts_between(rows, base[0], min(base[0] + dt.timedelta(days=elapsed), base[1]))
    assert float(got["amount"]) == round(amount, 2)
    assert float(got["base_amount"]) == round(base_amount, 2)
    assert float(got["change_pct"]) == round(100 * (amount - base_amount) / base_amount, 1)


def test_a_week_53_without_a_week_53_the_year_before_has_no_base(shop):
    path, _ = shop
    weeks, _ = calendar()
    # The first week 53 in the data whose previous year has 52 weeks (pandas FY5253).
    labels = {label for _, _, label in weeks}
    week53 = next(w for w in weeks if w[2].endswith("-W53") and w[0] > dt.date(2022, 6, 1)
                  and f"FY{int(w[2][2:6]) - 1}-W53" not in labels)
    got = compare_year(path, f"retail week ending {ANCHOR}", week53[1])
    assert got["period"] == week53[2]
    assert got["base_period"] == f"none: FY{int(week53[2][2:6]) - 1}-W53 does not exist"
    assert got["base_amount"] == "" and got["change_pct"] == ""  # NULL
