# SPDX-License-Identifier: MIT
"""The reports of sql/ computed a second time, in plain Python.

Each function takes the rows of a sales table, (ts, item, qty, amount) with
ts UTC text, and works with local calendar dates from `zoneinfo` and
`datetime` (ISO weeks from `date.isocalendar()`), sums with `math.fsum`, and
the regression with `statistics.linear_regression`. Nothing is read from the
extension: these are the expected values of tests/reference/test_sql_reports.py,
which names the function it compares against beside each assertion.
"""
import calendar
import datetime as dt
import math
import statistics
from collections import defaultdict
from zoneinfo import ZoneInfo

UTC = dt.timezone.utc
MONTH_NAMES = {name.lower(): number for number, name in enumerate(calendar.month_name) if name}
WEEKDAYS = ["Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday", "Sunday"]
BLOCKS = [chr(0x2581 + level) for level in range(8)]  # U+2581..U+2588 (README, sparkline)


def local_day(ts, zone):
    """The local calendar date of a UTC 'YYYY-MM-DD HH:MM:SS' text."""
    instant = dt.datetime.strptime(ts, "%Y-%m-%d %H:%M:%S").replace(tzinfo=UTC)
    return instant.astimezone(ZoneInfo(zone)).date()


class Sale:
    __slots__ = ("day", "item", "qty", "amount", "segment")

    def __init__(self, row, zone):
        self.day = local_day(row[0], zone)
        self.item, self.qty, self.amount = row[1], row[2], row[3]
        # The optional fifth column; a row without one, or a NULL, is in segment '(none)'.
        self.segment = row[4] if len(row) > 4 and row[4] is not None else "(none)"


def sales_of(rows, zone):
    return [Sale(row, zone) for row in rows]


def day_range(sales, start=None, stop=None):
    """[first, stop) local dates: the first sale's day to the day after the last one."""
    first = start or min(s.day for s in sales)
    after = stop or max(s.day for s in sales) + dt.timedelta(days=1)
    return first, after


# --- periods as (key, label) of a local date -------------------------------------------------

def week_of(day):
    monday = day - dt.timedelta(days=day.weekday())
    year, week, _ = monday.isocalendar()
    return monday, f"{year:04d}-W{week:02d}"


def half_month_of(day):
    last = calendar.monthrange(day.year, day.month)[1]
    if day.day <= 15:
        return dt.date(day.year, day.month, 1), f"{day.year:04d}-{day.month:02d} (1-15)"
    return dt.date(day.year, day.month, 16), f"{day.year:04d}-{day.month:02d} (16-{last})"


def month_of(day):
    return dt.date(day.year, day.month, 1), f"{day.year:04d}-{day.month:02d}"


def fiscal_quarter_of(first_month):
    """Quarters of a fiscal year starting in first_month, labelled FYyyyy-Qn with
    yyyy the year in which that fiscal year ends (README "Labels")."""
    def of(day):
        offset = (day.month - first_month) % 12
        quarter = offset // 3
        start_month = (first_month - 1 + 3 * quarter) % 12 + 1
        start_year = day.year if start_month <= day.month else day.year - 1
        fiscal_start_year = start_year if start_month >= first_month else start_year - 1
        ends = fiscal_start_year + (1 if first_month != 1 else 0)
        return dt.date(start_year, start_month, 1), f"FY{ends:04d}-Q{quarter + 1}"
    return of


def enumerate_periods(period_of, first, after):
    """Every period holding a day of [first, after), in order: (start, label)."""
    seen = []
    day = first
    while day < after:
        key = period_of(day)
        if not seen or seen[-1] != key:
            seen.append(key)
        day += dt.timedelta(days=1)
    return seen


def item_key(sale, choice):
    return "all items" if choice is None else sale.item


def chosen(sales, choice):
    return [s for s in sales if choice is None or choice == "*" or s.item == choice]


# --- the reports ----------------------------------------------------------------------------

def period_days(period_of, start):
    """Local calendar days of the period that begins on `start`."""
    day = start
    while period_of(day)[0] == start:
        day += dt.timedelta(days=1)
    return (day - start).days


def segments_of(sales, by_segment):
    """'all segments' first, then each segment in sorted order when asked for."""
    return ["all segments"] + (sorted({s.segment for s in sales}) if by_segment else [])


def in_segment(sale, segment):
    return segment == "all segments" or sale.segment == segment


def period_totals(rows, zone, period_of, item=None, start=None, stop=None, by_segment=False):
    """sql/totals.sql: one row per period, segment and item, empty periods as 0 / NULL
    means, and how many of the period's days lie inside [first, after)."""
    sales = sales_of(rows, zone)
    first, after = day_range(sales, start, stop)
    picked = chosen(sales, item)
    keys = sorted({item_key(s, item) for s in picked})
    segments = segments_of(sales, by_segment)
    cells = defaultdict(list)
    for s in picked:
        if first <= s.day < after:
            for segment in segments:
                if in_segment(s, segment):
                    cells[(period_of(s.day)[0], segment, item_key(s, item))].append(s)
    result = []
    for start_day, label in enumerate_periods(period_of, first, after):
        length = period_days(period_of, start_day)
        end_day = start_day + dt.timedelta(days=length)
        covered = (min(end_day, after) - max(start_day, first)).days
        for segment in segments:
            for key in keys:
                group = cells.get((start_day, segment, key), [])
                amount = math.fsum(s.amount for s in group)
                days = len({s.day for s in group})
                result.append(dict(label=label, segment=segment, item=key, days_in_period=length,
                                   days_covered=covered, complete=int(covered == length),
                                   sales=len(group), qty=sum(s.qty for s in group),
                                   amount=amount, days_with_sales=days,
                                   amount_per_day=amount / days if days else None,
                                   mean_sale=amount / len(group) if group else None))
    return result


def compare(rows, zone, period_of, year_back, item=None, by_segment=False, stop=None):
    """sql/compare.sql: the period holding the last day, to date, against the previous
    period and the period a year earlier (year_back(start) gives its start, or None),
    each over the same number of days from its start, cut at the end of the base period.
    Trading days: the days of a span with any sale of the segment."""
    sales = sales_of(rows, zone)
    first, after = day_range(sales, None, stop)
    last = after - dt.timedelta(days=1)
    start, label = period_of(last)
    length = period_days(period_of, start)
    elapsed = (after - start).days
    picked = chosen(sales, item)
    keys = sorted({item_key(s, item) for s in picked})
    bases = [("previous", period_of(start - dt.timedelta(days=1))[0]), ("year", year_back(start))]

    def span_figures(segment, key, begin, days):
        end = begin + dt.timedelta(days=days)
        inside = [s for s in sales if begin <= s.day < end and in_segment(s, segment)]
        trading = len({s.day for s in inside})
        amount = math.fsum(s.amount for s in inside
                           if (item is None or item == "*" or s.item == item) and item_key(s, item) == key)
        return amount, trading

    result = []
    for segment in segments_of(sales, by_segment):
        for key in keys:
            amount, trading = span_figures(segment, key, start, elapsed)
            for against, base_start in bases:
                row = dict(segment=segment, item=key, period=label, days_in_period=length, days_covered=elapsed,
                           complete=int(elapsed == length),
                           span=f"{start.isoformat()}..{(start + dt.timedelta(days=elapsed - 1)).isoformat()}",
                           trading_days=trading, amount=amount,
                           per_trading_day=amount / trading if trading else None, against=against,
                           base_period=None, base_span=None, base_trading_days=None, base_amount=None,
                           base_per_trading_day=None, change_pct=None, change_per_day_pct=None)
                if base_start is not None:
                    base_days = min(elapsed, period_days(period_of, base_start))
                    row["base_period"] = period_of(base_start)[1]
                    row["base_span"] = (f"{base_start.isoformat()}.."
                                        f"{(base_start + dt.timedelta(days=base_days - 1)).isoformat()}")
                    if base_start >= first and base_start + dt.timedelta(days=base_days) <= after:
                        base_amount, base_trading = span_figures(segment, key, base_start, base_days)
                        row.update(base_trading_days=base_trading, base_amount=base_amount,
                                   base_per_trading_day=base_amount / base_trading if base_trading else None)
                        if base_amount:
                            row["change_pct"] = 100 * (amount - base_amount) / base_amount
                        if row["per_trading_day"] is not None and row["base_per_trading_day"]:
                            row["change_per_day_pct"] = (100 * (row["per_trading_day"] - row["base_per_trading_day"])
                                                         / row["base_per_trading_day"])
                result.append(row)
    return result


def weekly_series(rows, zone, start=None, stop=None):
    """Per item, the weekly amounts of every week of the range (0 for a week without
    sales), with x the number of the week: days since 1969-12-29 (the Monday of the
    week holding 1970-01-01) over 7."""
    sales = sales_of(rows, zone)
    first, after = day_range(sales, start, stop)
    weeks = enumerate_periods(week_of, first, after)
    sums = defaultdict(list)
    for s in sales:
        if first <= s.day < after:
            sums[(week_of(s.day)[0], s.item)].append(s.amount)
    items = sorted({item for _, item in sums})
    series = {}
    for item in items:
        xs = [(monday - dt.date(1969, 12, 29)).days // 7 for monday, _ in weeks]
        ys = [math.fsum(sums.get((monday, item), [])) for monday, _ in weeks]
        series[item] = (xs, ys)
    return series


def line_fit(xs, ys):
    """Least-squares line and its spread, from statistics.linear_regression and the
    textbook formulas: resid_sd = sqrt(SSE / (n - 2)), stderr = resid_sd / sqrt(Sxx)."""
    n = len(xs)
    slope, intercept = statistics.linear_regression(xs, ys)
    mean_x = statistics.fmean(xs)
    sxx = math.fsum((x - mean_x) ** 2 for x in xs)
    sse = math.fsum((y - (intercept + slope * x)) ** 2 for x, y in zip(xs, ys))
    resid_sd = math.sqrt(sse / (n - 2))
    mean_y = statistics.fmean(ys)
    syy = math.fsum((y - mean_y) ** 2 for y in ys)
    r2 = 1.0 if syy == 0 else statistics.correlation(xs, ys) ** 2
    return dict(slope=slope, stderr=resid_sd / math.sqrt(sxx), resid_sd=resid_sd, r2=r2, mean=mean_y,
                sd=statistics.stdev(ys))


def sparkline_levels(values):
    """README: level = round(7 (y - min) / (max - min)); a constant series is all
    U+2584. Returns, per value, the set of acceptable levels (both neighbours at an
    exact half, where the rounding direction is the implementation's choice)."""
    low, high = min(values), max(values)
    if high == low:
        return [{3} for _ in values]
    levels = []
    for y in values:
        scaled = 7 * (y - low) / (high - low)
        below = math.floor(scaled)
        levels.append({below, below + 1} if scaled - below == 0.5 else {math.floor(scaled + 0.5)})
    return levels


def kendall_score_by_pairs(points):
    """Kendall's S and Var(S) of (x, y) points, pair by pair, from the published
    formulas: S = sum of sgn(dx) sgn(dy); Var(S) with the tau-b tie corrections for
    x and y (Kendall 1975, the formula scipy.stats.kendalltau cites)."""
    n = len(points)
    s = 0
    for i in range(n):
        for j in range(i + 1, n):
            dx = points[j][0] - points[i][0]
            dy = points[j][1] - points[i][1]
            s += ((dx > 0) - (dx < 0)) * ((dy > 0) - (dy < 0))
    if n < 2:
        return s, 0.0

    def ties(values):
        counts = defaultdict(int)
        for v in values:
            counts[v] += 1
        t = [c for c in counts.values() if c > 1]
        return (sum(c * (c - 1) // 2 for c in t), sum(c * (c - 1) * (c - 2) for c in t),
                sum(c * (c - 1) * (2 * c + 5) for c in t))

    xt, x0, x1 = ties([p[0] for p in points])
    yt, y0, y1 = ties([p[1] for p in points])
    pairs = n * (n - 1) // 2
    if xt == pairs or yt == pairs:
        return s, 0.0
    m = n * (n - 1)
    var = (m * (2 * n + 5) - x1 - y1) / 18 + 2 * xt * yt / m
    if n > 2:
        var += x0 * y0 / (9 * m * (n - 2))
    return s, var


def seasonal_kendall_p(rows):
    """rows: (x, y, season). The seasonal Kendall test (Hirsch, Slack & Smith 1982):
    S and Var(S) summed over seasons; p = 2(1 - Phi(|z|)), written as math.erfc(|z|/sqrt 2)
    because 1 - Phi loses every digit in the far tail. None when Var(S) is 0."""
    seasons = defaultdict(list)
    for x, y, season in rows:
        seasons[season].append((x, y))
    s, var = 0, 0.0
    for points in seasons.values():
        part_s, part_var = kendall_score_by_pairs(points)
        s += part_s
        var += part_var
    if var <= 0:
        return None
    return math.erfc(abs(s / math.sqrt(var)) / math.sqrt(2))


def median_of_slopes(rows):
    """rows: (x, y, season): the median (statistics.median) of the slopes of the pairs
    that share a season and have distinct x — the (seasonal) Sen slope by definition."""
    slopes = [(b[1] - a[1]) / (b[0] - a[0]) for a in rows for b in rows if a[2] == b[2] and b[0] > a[0]]
    return statistics.median(slopes) if slopes else None


def stl_parts(values, period, robust):
    """(trend, season, noise) of statsmodels.tsa.seasonal.STL with its defaults (seasonal 7)."""
    from statsmodels.tsa.seasonal import STL   # imported here: only the decomposed reports need it
    fit = STL(values, period=period, robust=robust).fit()
    return list(fit.trend), list(fit.seasonal), list(fit.resid)


def strengths(trend_part, season_part, noise_part):
    """Trend and season strength as Hyndman & Athanasopoulos, Forecasting: Principles and
    Practice (3rd ed.), section 4.3 give them (after Wang, Smith & Hyndman 2006):
    F_T = max(0, 1 - Var(R) / Var(T + R)), F_S = max(0, 1 - Var(R) / Var(S + R))."""
    var = statistics.variance
    return (max(0.0, 1 - var(noise_part) / var([t + r for t, r in zip(trend_part, noise_part)])),
            max(0.0, 1 - var(noise_part) / var([s + r for s, r in zip(season_part, noise_part)])))


def weekly_strengths(ys):
    """The strengths of a weekly series with cycle year (52 weeks): None below two whole
    cycles; statsmodels' robust fit from four whole cycles on (ext/README.md's default), else not."""
    if len(ys) < 104:
        return None, None
    return strengths(*stl_parts(ys, 52, robust=len(ys) >= 208))


def trend(rows, zone, spark_weeks=4, start=None, stop=None):
    """sql/trend.sql: whole ISO weeks of the range; seasonal (ISO week number) Kendall
    test and Sen slope from 104 weeks on, without the week numbers in which the item
    never sold; plain ones below; the verdict rule of the file's header."""
    sales = sales_of(rows, zone)
    first, after = day_range(sales, start, stop)
    first = first + dt.timedelta(days=(7 - first.weekday()) % 7)   # first Monday on or after
    after = after - dt.timedelta(days=after.weekday())              # last Monday on or before
    series = weekly_series(rows, zone, first, after)
    result = {}
    for item, (xs, ys) in series.items():
        weeks = len(xs)
        seasonal = weeks >= 104
        week_numbers = [(dt.date(1969, 12, 29) + dt.timedelta(weeks=x)).isocalendar()[1] for x in xs]
        traded = {w for w, y in zip(week_numbers, ys) if y != 0}
        if seasonal:
            used = [(x, y, w) for x, y, w in zip(xs, ys, week_numbers) if w in traded]
            p = seasonal_kendall_p(used)
        else:
            used = [(x, y, 0) for x, y in zip(xs, ys)]
            p = seasonal_kendall_p(used) if len(xs) >= 3 else None
        sen = median_of_slopes(used)
        traded_mean = statistics.fmean(y for _, y, _ in used)   # the weeks the slope used
        mean = statistics.fmean(ys)                              # every whole week, as `weeks` counts
        ls = statistics.linear_regression(xs, ys)[0]
        direction = sen if sen else ls
        if weeks < 10:
            verdict = "too few periods"
        elif p is None or p >= 0.05:
            verdict = "no clear trend"
        else:
            verdict = "rising" if direction > 0 else "falling" if direction < 0 else "no clear trend"
        blocks = defaultdict(list)
        for x, y in zip(xs, ys):
            blocks[(x - xs[0]) // spark_weeks].append(y)
        block_means = [statistics.fmean(blocks[b]) for b in sorted(blocks)]
        season_strength = weekly_strengths(ys)[1]
        if weeks >= 10 and season_strength is not None and season_strength >= 0.9:
            verdict += ", strongly seasonal"    # the header's threshold
        result[item] = dict(weeks=weeks, seasonal=seasonal, p=p, sen=sen, mean=mean, traded_mean=traded_mean,
                            season_strength=season_strength,
                            ls=ls, verdict=verdict, pct_per_year=100 * (365.2425 / 7) * sen / traded_mean,
                            shape_levels=sparkline_levels(block_means))
    return result


def daily_series(rows, zone):
    """Per item, the amounts of every local day from the first sale's day to the last
    (0 for a day without sales of the item), and the days on which anything sold."""
    sales = sales_of(rows, zone)
    first, after = day_range(sales)
    days = [first + dt.timedelta(days=k) for k in range((after - first).days)]
    sums = defaultdict(list)
    for s in sales:
        sums[(s.day, s.item)].append(s.amount)
    open_days = {s.day for s in sales}
    items = sorted({s.item for s in sales})
    return days, open_days, {item: [math.fsum(sums.get((day, item), [])) for day in days] for item in items}


def noise_ranking(rows, zone):
    """sql/noise_ranking.sql: the daily amounts split by statsmodels' STL with period 7,
    non-robust (the header's choice); noise_sd = statistics.stdev of the noise over the
    days on which anything sold; noise_pct = 100 noise_sd / mean of every day; the
    strengths of the whole weeks with period 52; largest noise_pct first."""
    days, open_days, series = daily_series(rows, zone)
    weekly = trend_weeks(rows, zone)
    result = []
    for item, ys in series.items():
        mean = statistics.fmean(ys)
        if mean <= 0:
            continue
        _, _, noise = stl_parts(ys, 7, robust=False)
        noise_sd = statistics.stdev(r for day, r in zip(days, noise) if day in open_days)
        trend_strength, season_strength = weekly_strengths(weekly[item][1])
        result.append(dict(item=item, days=len(ys), mean=mean, noise_sd=noise_sd, noise_pct=100 * noise_sd / mean,
                           trend_strength=trend_strength, season_strength=season_strength))
    return sorted(result, key=lambda e: (-e["noise_pct"], e["item"]))


def trend_weeks(rows, zone):
    """The whole ISO weeks of the data's range, per item (as sql/trend.sql fits them)."""
    sales = sales_of(rows, zone)
    first, after = day_range(sales)
    first = first + dt.timedelta(days=(7 - first.weekday()) % 7)   # first Monday on or after
    after = after - dt.timedelta(days=after.weekday())              # last Monday on or before
    return weekly_series(rows, zone, first, after)


def weekday_profile(rows, zone, item=None):
    """sql/weekday_profile.sql: per weekday, over every local day of the range."""
    sales = sales_of(rows, zone)
    first, after = day_range(sales)
    picked = chosen(sales, item)
    keys = sorted({item_key(s, item) for s in picked})
    daily = defaultdict(list)
    for s in picked:
        daily[(s.day, item_key(s, item))].append(s)
    result = []
    for key in keys:
        per_weekday = defaultdict(lambda: dict(days=0, sold=[], qty=0))
        day = first
        while day < after:
            cell = per_weekday[day.weekday()]
            cell["days"] += 1
            group = daily.get((day, key))
            if group:
                cell["sold"].append(math.fsum(s.amount for s in group))
                cell["qty"] += sum(s.qty for s in group)
            day += dt.timedelta(days=1)
        total = math.fsum(a for c in per_weekday.values() for a in c["sold"])
        days_with_sales = sum(len(c["sold"]) for c in per_weekday.values())
        mean_day = total / days_with_sales
        for weekday in range(7):
            cell = per_weekday[weekday]
            amount = math.fsum(cell["sold"])
            mean = statistics.fmean(cell["sold"]) if cell["sold"] else None
            result.append(dict(weekday=WEEKDAYS[weekday], item=key, days=cell["days"],
                               days_with_sales=len(cell["sold"]), qty=cell["qty"], amount=amount,
                               share_pct=100 * amount / total, mean_per_day=mean,
                               median_per_day=statistics.median(cell["sold"]) if cell["sold"] else None,
                               index=100 * mean / mean_day if mean is not None else None))
    return result


def last_year_of_week(monday):
    """The same ISO week number in the previous ISO year, or None when that year has
    no such week (date.fromisocalendar raises for week 53 of a 52-week year)."""
    year, week, _ = monday.isocalendar()
    try:
        return dt.date.fromisocalendar(year - 1, week, 1)
    except ValueError:
        return None


def last_year_of_start(start):
    """Any other unit: the period start twelve months earlier (period starts are on
    the 1st or the 16th, so no clamping arises)."""
    return start.replace(year=start.year - 1)


def chart_points(rows, zone, top=3, item=None, weeks=13):
    """sql/daily_chart.sql: the chosen items' daily amounts in cents (0 on a day
    without sales; round(math.fsum, 2)) and the 7-day centred moving mean of
    those, math.fsum(frame) / 7 where the frame is whole, None elsewhere; over
    the last `weeks` weeks of the data (0: all of it), top items by amount there."""
    sales = sales_of(rows, zone)
    first, after = day_range(sales)
    if weeks:
        first = max(first, after - dt.timedelta(weeks=weeks))
    totals = defaultdict(float)
    daily = defaultdict(list)
    for s in sales:
        if (item is None or s.item == item) and first <= s.day < after:
            daily[(s.day, s.item)].append(s.amount)
    for (day, name), amounts in daily.items():
        totals[name] += round(math.fsum(amounts), 2)
    items = sorted(totals, key=lambda name: (-totals[name], name))[:top]
    points = {}
    days = [first + dt.timedelta(days=k) for k in range((after - first).days)]
    for name in items:
        raw = [round(math.fsum(daily.get((day, name), [])), 2) for day in days]
        for k, day in enumerate(days):
            frame = raw[k - 3:k + 4] if k >= 3 else []
            points[(name, day.isoformat(), "raw")] = raw[k]
            points[(name, day.isoformat(), "smooth")] = math.fsum(frame) / 7 if len(frame) == 7 else None
    return items, points
