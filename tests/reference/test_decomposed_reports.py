# SPDX-License-Identifier: MIT
"""The reports that read period_decomposition's parts, on a generated shop with known truth.

sql/noise_ranking.sql, sql/trend.sql, sql/seasonal_profile.sql and
sql/anomalies.sql. The shop is generated here: two segments (North, South),
one row per item, segment and day at 12:00 UTC, for the 156 ISO weeks
2021-W01 .. 2023-W52 (datetime), a multiplicative noise per day:
  Regular season  strongly seasonal (winter peak, 3 to 1) but regular: noise 3 %
  Noisy plain     no season, no growth, noise 45 %
  Growing plain   no season, grows 60 % of its first level a year, noise 5 %
South is closed (no rows at all) from 2022-03-07 to 2022-03-20, both included:
a two-week closure of one segment, while North sells every day. One spike
(x5) of Regular season is planted on 2022-06-15.

The truth the reports must find (oracle: the generator above): the noisy item
ranks noisier than the seasonal one, and the seasonal one is not called noisy;
the growing item has no peak month; the closure is listed with its first and
last day; the spike is an unusual day and the noisy item's ordinary days are
not. The strengths are checked against the formula of Hyndman &
Athanasopoulos, Forecasting: Principles and Practice (3rd ed.), section 4.3,
computed here from the parts of statsmodels.tsa.seasonal.STL.
"""
import datetime as dt
import json
import math
import random
import statistics

import pytest
from statsmodels.tsa.seasonal import STL

from conftest import SOURCE, run_shell
from test_season_reports import result_sets
from test_segment_reports import write   # a sales table with or without a segment column

FIRST = dt.date(2021, 1, 4)   # Monday of 2021-W01 (date.isocalendar)
LAST = dt.date(2023, 12, 31)  # Sunday of 2023-W52
ITEMS = ("Regular season", "Noisy plain", "Growing plain")
CLOSED = ("South", dt.date(2022, 3, 7), dt.date(2022, 3, 20))
SPIKE = ("Regular season", dt.date(2022, 6, 15))


def amount(item, day, rng):
    t = (day - FIRST).days / 365.2425
    phase = 2 * math.pi * (day.timetuple().tm_yday - 1) / 365.2425
    if item == "Regular season":
        level, noise = 100 * (1 + 0.5 * math.cos(phase)), 0.03
    elif item == "Noisy plain":
        level, noise = 100, 0.45
    else:
        level, noise = 100 * (1 + 0.6 * t), 0.05
    value = level * max(0.05, rng.gauss(1, noise))
    if (item, day) == SPIKE:
        value *= 5
    return round(value, 2)


@pytest.fixture(scope="module")
def shop(tmp_path_factory):
    rng = random.Random(20210104)
    rows = []
    day = FIRST
    while day <= LAST:
        for segment in ("North", "South"):
            if segment == CLOSED[0] and CLOSED[1] <= day <= CLOSED[2]:
                continue
            for item in ITEMS:
                rows.append((f"{day.isoformat()} 12:00:00", item, 1, amount(item, day, rng), segment))
        day += dt.timedelta(days=1)
    return write(tmp_path_factory.mktemp("decomposed") / "shop.db", rows, True), rows


def report(path, name, **params):
    lines = "".join(f".parameter set @{k} \"'{v}'\"\n" if isinstance(v, str) else f".parameter set @{k} {v}\n"
                    for k, v in params.items())
    output = run_shell(lines + ".mode json\n" + (SOURCE / "sql" / f"{name}.sql").read_text(), database=str(path))
    return result_sets(output)   # one list per result set; the last one is the range note


def series(rows):
    """Per item, every day's amount summed over the segments (math.fsum), and every whole week's."""
    days = [FIRST + dt.timedelta(days=k) for k in range((LAST - FIRST).days + 1)]
    sums = {}
    for ts, item, _, value, _ in rows:
        sums.setdefault((item, dt.date.fromisoformat(ts[:10])), []).append(value)
    daily = {item: [math.fsum(sums.get((item, day), [])) for day in days] for item in ITEMS}
    weekly = {item: [math.fsum(ys[k:k + 7]) for k in range(0, len(ys), 7)] for item, ys in daily.items()}
    return days, daily, weekly


def fpp3_strengths(values, period, robust):
    """Hyndman & Athanasopoulos, FPP3 section 4.3: F_T = max(0, 1 - Var(R)/Var(T + R)),
    F_S = max(0, 1 - Var(R)/Var(S + R)), from statsmodels' STL parts."""
    fit = STL(values, period=period, robust=robust).fit()
    r, t, s = list(fit.resid), list(fit.trend), list(fit.seasonal)
    var = statistics.variance
    return (max(0.0, 1 - var(r) / var([a + b for a, b in zip(t, r)])),
            max(0.0, 1 - var(r) / var([a + b for a, b in zip(s, r)])))


def test_the_noisy_item_ranks_noisier_and_the_seasonal_one_is_not_noisy(shop):
    path, rows = shop
    ranking, note = report(path, "noise_ranking")
    by_item = {r["item"]: r for r in ranking}
    order = [r["item"] for r in ranking]
    assert order.index("Noisy plain") < order.index("Regular season")   # oracle: the generator's 45 % and 3 %
    assert order[0] == "Noisy plain"
    # The seasonal item's noise is its 3 % day noise, not its 3-to-1 season: a line through
    # its days would miss them by about 35 % (generator: 0.5 cos of the year / sqrt 2).
    assert by_item["Regular season"]["noise_pct"] < 6
    # Two segments' independent 45 % add up to 45 / sqrt 2 = 32 % of the day; the trend and
    # season parts take up a share of it (about a quarter on this series).
    assert by_item["Noisy plain"]["noise_pct"] > 20
    # oracle: statsmodels' STL with period 7, non-robust (the report's stated choice), on the
    # daily sums; noise_sd = statistics.stdev of the noise on the days anything sold (all of them).
    days, daily, weekly = series(rows)
    for item in ITEMS:
        noise = list(STL(daily[item], period=7, robust=False).fit().resid)
        noise_sd = statistics.stdev(noise)
        mean = statistics.fmean(daily[item])
        assert abs(by_item[item]["noise_sd"] - noise_sd) <= 0.005 + 1e-9 * noise_sd
        assert abs(by_item[item]["noise_pct"] - 100 * noise_sd / mean) <= 0.05 + 1e-9
        # Three whole years of weeks: non-robust below four cycles (ext/README.md), period 52.
        trend_strength, season_strength = fpp3_strengths(weekly[item], 52, robust=False)
        assert abs(by_item[item]["trend_strength"] - trend_strength) <= 0.005 + 1e-9, item
        assert abs(by_item[item]["season_strength"] - season_strength) <= 0.005 + 1e-9, item
    assert by_item["Regular season"]["season_strength"] >= 0.9   # its swings are season
    assert by_item["Noisy plain"]["season_strength"] < 0.9
    assert by_item["Growing plain"]["trend_strength"] >= 0.9    # its swings are trend
    print({r["item"]: (r["noise_pct"], r["trend_strength"], r["season_strength"]) for r in ranking})


def test_with_less_than_two_years_the_strengths_are_null(shop):
    path, _ = shop
    ranking, _ = report(path, "noise_ranking", start="2022-01-03", stop="2023-01-02")
    assert {r["days"] for r in ranking} == {364}                  # datetime: 52 weeks
    assert {(r["trend_strength"], r["season_strength"]) for r in ranking} == {(None, None)}


def test_the_trend_verdict_says_when_the_season_dominates(shop):
    path, _ = shop
    rows, _ = report(path, "trend")
    verdicts = {r["item"]: r["verdict"] for r in rows}
    # oracle: the generator (no growth / no growth / growth) and the header's 0.9 threshold
    assert verdicts["Regular season"] == "no clear trend, strongly seasonal"
    assert verdicts["Noisy plain"] == "no clear trend"
    assert verdicts["Growing plain"] == "rising"


def test_a_growing_item_gets_no_season_peak(shop):
    path, _ = shop
    rows, _ = report(path, "seasonal_profile")
    by_item = {r["item"]: r for r in rows}
    # oracle: the generator gives Growing plain no season, only growth; the old month index
    # (mean day of the month over the mean day) would put its peak in December, the month
    # of the last year's highest level.
    assert by_item["Growing plain"]["peak_month"] is None
    assert by_item["Noisy plain"]["peak_month"] is None
    assert by_item["Regular season"]["peak_month"] in ("Jan", "Dec")   # winter peak
    assert by_item["Regular season"]["jan"] > 25 and by_item["Regular season"]["jul"] < -25
    # No weekday rhythm was generated: every weekday's season part is within noise.
    assert by_item["Growing plain"]["peak_day"] is None


def test_the_closure_of_one_segment_is_listed_with_its_first_and_last_day(shop):
    path, _ = shop
    days, closures, _ = report(path, "anomalies")
    assert {(c["segment"], c["first_day"], c["last_day"], c["days"]) for c in closures} == {
        ("South", "2022-03-07", "2022-03-20", 14)}                      # oracle: CLOSED above
    listed = {(r["item"], r["day"]): r for r in days}
    assert listed[(SPIKE[0], SPIKE[1].isoformat())]["kind"] == "spike"   # oracle: SPIKE above
    # The noisy item's ordinary days are measured against its own noise: few are listed
    # (a normal tail beyond 3.5 standard deviations is 1 in 2,000 days; stated bound 0.5 %).
    noisy = [key for key in listed if key[0] == "Noisy plain"]
    assert len(noisy) <= 0.005 * ((LAST - FIRST).days + 1), noisy
    print(f"anomalies: {len(days)} days listed, {len(noisy)} of the noisy item")


def test_money_is_compared_at_its_resolution(tmp_path):
    """869.40 in ISO week 10 of two years, one of them summed to 869.4000000000001: a tie."""
    rng = random.Random(8694)
    rows = []
    for k in range(156):   # whole weeks from 2021-W01, one sale on each Monday
        day = FIRST + dt.timedelta(weeks=k)
        value = round(800 + 40 * rng.random(), 2)
        if day.isocalendar()[1] == 10:
            value = 869.4000000000001 if day.year == 2022 else 869.4   # two years alike to the cent
        rows.append((f"{day.isoformat()} 12:00:00", "Loaf", 1, value))
    last = (f"{LAST.isoformat()} 12:00:00", "Loaf", 0, 0.0)   # a row on the last Sunday: the last week is whole
    path = write(tmp_path / "tie.db", rows + [last], False)

    def seasonal_kendall_p(values):
        # oracle: the seasonal Kendall test (Hirsch, Slack & Smith 1982) by its definition,
        # S and Var(S) (with the tie correction) summed over ISO weeks; p = erfc(|z| / sqrt 2).
        s, var = 0, 0.0
        for week in range(52):
            ys = values[week::52]
            n = len(ys)
            s += sum((b > a) - (b < a) for i, a in enumerate(ys) for b in ys[i + 1:])
            ties = [ys.count(y) for y in set(ys)]
            var += (n * (n - 1) * (2 * n + 5) - sum(c * (c - 1) * (2 * c + 5) for c in ties)) / 18
        return math.erfc(abs(s / math.sqrt(var)) / math.sqrt(2))

    values = [r[3] for r in rows]
    cents = [round(v * 100) for v in values]
    (row,), _ = report(path, "trend")
    assert row["p_value"] == round(seasonal_kendall_p(cents), 4)
    # Planted fault: compared as binary fractions, the tie becomes a rise and the p-value moves.
    assert round(seasonal_kendall_p(values), 4) != row["p_value"]
    # @resolution 1 compares whole units instead (oracle: the same test on rounded units).
    (units, ), _ = report(path, "trend", resolution=1)
    assert units["p_value"] == round(seasonal_kendall_p([round(v) for v in values]), 4)
