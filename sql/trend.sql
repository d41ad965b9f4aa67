-- SPDX-License-Identifier: MIT
-- almanac report: the trend table. Which items are rising, which falling,
-- which just noisy — judged so that a season is not taken for a trend.
--
-- Per item, the weekly amounts (every whole ISO week of the range, a week
-- without sales counted as 0) are judged with the Mann-Kendall test
-- (mann_kendall_p) and measured with the Sen slope (theil_sen_slope), both
-- robust: they use the order of the weeks, not the size of their swings, so
-- one promotion week or one closed week cannot make a trend.
--
-- The seasonal test. When the range holds at least two whole years (104
-- whole weeks), the test and the slope are seasonal (Hirsch, Slack & Smith
-- 1982): the season is the ISO week number, period_position(week, 'week',
-- 'year'), so week 40 is compared only with week 40 of the other years.
-- Why the week number and not the month of the week: every pair it compares
-- is a whole year apart, so the season cancels exactly — with months, weeks
-- of the same month and year are compared too, and for an item that starts
-- or stops selling within a month (pumpkin loaf in September) those pairs
-- measure the season's ramp, not growth. The price is few points per
-- season, which is why two whole years are needed. For the Sen slope, the
-- weeks of the year in which the item never sold (in no year of the range)
-- are left out: their pairs are 0 = 0 and would pull the median to 0 for an
-- item sold three months a year; pct_per_year is then growth of the weeks
-- in which the item trades.
-- With less than two whole years the test is the plain one over all weeks:
-- it cannot tell a season from a trend, so for a seasonal item the verdict
-- describes the part of its season the range holds (an autumn item judged
-- on July to November is "rising"). Read such verdicts with the shape column.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount)
--     ts      when the sale happened: an almanac time value, normally UTC text
--             'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item    TEXT, what was sold
--     qty     number of units sold (not used here)
--     amount  money received for the sale (added with exact_sum)
--   Other columns are ignored. A table with other names: put a view in front
--   of it in the same session (a temp view named sales is found before a
--   table main.sales, so it can also narrow one down):
--     CREATE TEMP VIEW sales AS
--       SELECT sold_at AS ts, product AS item, units AS qty, total AS amount FROM pos_export;
--   To measure units instead of money: CREATE TEMP VIEW sales AS
--       SELECT ts, item, qty, qty AS amount FROM main.sales;
--
-- Your data (README, "Your data"): ts holds UTC instants; @zone only chooses the
-- calendar. An export written in local time is converted once, in the view,
-- with to_time(text, format, zone): left as it is, @zone would shift every
-- local time a second time. Money and quantities written as text ('$1,050.00')
-- are read with to_amount() in the view: the report adds with exact_sum() and
-- stops on text it cannot read, where SQLite's sum() would count '1,050.00' as 1.
--
-- Parameters (sqlite3 shell: .parameter set @name value; unset ones take the default;
-- a date needs both kinds of quotes, or the shell computes 2025-01-06 = 2018):
--   @zone         IANA time zone of the shop's calendar     default 'UTC'
--   @start        first local day, "'YYYY-MM-DD'"          default: the day of the first sale
--   @stop         local day after the last one             default: the day after the last sale
--   @spark_weeks  weeks per sparkline character            default 4
--   Only whole ISO weeks (Monday to Sunday) inside [@start, @stop) are used:
--   a week cut by either end would look like a drop.
--
-- The verdict rule:
--   'too few periods'  fewer than 10 whole weeks: the normal approximation
--                      behind the p-value is commonly used from n = 10 on;
--   'rising'/'falling' p_value < 0.05, in the direction of the Sen slope
--                      (of the least-squares slope when the Sen slope is 0);
--   'no clear trend'   otherwise, and when the test has no variance (every
--                      week the same amount).
--
-- Columns, one row per item, rising items first:
--   item
--   verdict          see the rule above
--   pct_per_year     (365.2425/7) * sen_slope / mean_per_week, in percent: a
--                    year of the Sen slope next to the typical week (the mean
--                    of the weeks the slope used)
--   p_value          two-sided p-value of the (seasonal) Mann-Kendall test,
--                    rounded to 4 places (0.0: below 0.00005)
--   test             'seasonal (ISO week)' or 'plain' (less than two whole years)
--   weeks            whole weeks in the range
--   mean_per_week    mean weekly amount (of the weeks the Sen slope used)
--   sen_slope        Sen slope: change of the weekly amount per week
--   ls_slope         least-squares slope, regr_slope, for comparison: a
--                    season or one wild week can pull it far from the Sen slope
--   shape            sparkline of the weekly amounts, one character per
--                    @spark_weeks weeks (their mean), oldest first
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/trend.sql
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@spark_weeks, 4) AS spark_weeks,
         10 AS min_weeks, 104 AS seasonal_weeks
),
bounds AS (
  SELECT coalesce(@start, min(period_floor(s.ts, 'day', settings.zone))) AS start,
         coalesce(@stop, max(period_end(s.ts, 'day', settings.zone))) AS stop
  FROM sales AS s, settings
),
-- Whole weeks: from the first Monday on or after start to the last Monday
-- on or before stop.
range AS (
  SELECT CASE WHEN period_floor(b.start, 'week', s.zone) = period_floor(b.start, 'day', s.zone)
              THEN b.start ELSE period_end(b.start, 'week', s.zone) END AS start,
         period_floor(b.stop, 'week', s.zone) AS stop
  FROM bounds AS b, settings AS s
),
weeks AS (
  SELECT p.serial, period_position(p.period_start, 'week', 'year', settings.zone) AS week_of_year
  FROM settings, range, periods(range.start, range.stop, 'week', settings.zone) AS p
),
span AS (
  SELECT count(*) AS weeks, min(serial) AS first, max(serial) AS last,
         count(*) >= (SELECT seasonal_weeks FROM settings) AS seasonal
  FROM weeks
),
weekly_sales AS (
  SELECT period_serial(s.ts, 'week', settings.zone) AS serial, s.item,
         exact_sum(s.amount) AS amount
  FROM sales AS s, settings
  WHERE period_serial(s.ts, 'week', settings.zone) BETWEEN (SELECT first FROM span)
                                                       AND (SELECT last FROM span)
  GROUP BY 1, 2
),
-- Every week for every item: an item's week without sales is 0, not
-- missing, or the trend would be judged on the good weeks only.
weekly AS (
  SELECT i.item, w.serial, w.week_of_year, coalesce(t.amount, 0) AS total
  FROM weeks AS w
  CROSS JOIN (SELECT DISTINCT item FROM weekly_sales) AS i
  LEFT JOIN weekly_sales AS t ON t.serial = w.serial AND t.item = i.item
),
-- The season of each week for the tests: its ISO week number when the
-- range is seasonal, else NULL; and NULL as well, in a seasonal range,
-- for a week of the year in which the item never sold.
seasons AS (
  SELECT w.item, w.serial, w.total,
         CASE WHEN span.seasonal AND traded.any_sales THEN w.week_of_year END AS season
  FROM weekly AS w, span
  JOIN (SELECT item, week_of_year, max(total <> 0) AS any_sales
        FROM weekly GROUP BY 1, 2) AS traded USING (item, week_of_year)
),
fit AS (
  SELECT s.item, span.seasonal,
         CASE WHEN span.seasonal THEN mann_kendall_p(s.total, s.serial, s.season)
              ELSE mann_kendall_p(s.total, s.serial) END AS p,
         CASE WHEN span.seasonal THEN theil_sen_slope(s.total, s.serial, s.season)
              ELSE theil_sen_slope(s.total, s.serial) END AS sen,
         CASE WHEN span.seasonal THEN avg(CASE WHEN s.season IS NOT NULL THEN s.total END)
              ELSE avg(s.total) END AS mean,
         regr_slope(s.total, s.serial) AS ls
  FROM seasons AS s, span
  GROUP BY s.item
),
shape AS (
  SELECT item, sparkline(total, block) AS shape
  FROM (SELECT item, (serial - (SELECT first FROM span)) / settings.spark_weeks AS block,
               avg(total) AS total
        FROM weekly, settings
        GROUP BY 1, 2)
  GROUP BY item
)
SELECT f.item,
       CASE WHEN span.weeks < settings.min_weeks THEN 'too few periods'
            WHEN f.p IS NULL OR f.p >= 0.05 THEN 'no clear trend'
            WHEN coalesce(nullif(f.sen, 0), f.ls) > 0 THEN 'rising'
            WHEN coalesce(nullif(f.sen, 0), f.ls) < 0 THEN 'falling'
            ELSE 'no clear trend' END AS verdict,
       round(100.0 * (365.2425 / 7) * f.sen / f.mean, 1) AS pct_per_year,
       round(f.p, 4) AS p_value,
       CASE WHEN f.seasonal THEN 'seasonal (ISO week)' ELSE 'plain' END AS test,
       span.weeks,
       round(f.mean, 2) AS mean_per_week,
       round(f.sen, 2) AS sen_slope,
       round(f.ls, 2) AS ls_slope,
       s.shape
FROM fit AS f JOIN shape AS s USING (item), span, settings
ORDER BY f.sen / f.mean DESC, f.item;
