-- SPDX-License-Identifier: MIT
-- almanac report: the trend table. Per item, the weekly amounts (every week of
-- the range, a week without sales counted as 0) fitted with a least-squares
-- line against the week's serial number, so the slope is money per week.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount)
--     ts      when the sale happened: an almanac time value, normally UTC text
--             'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item    TEXT, what was sold
--     qty     number of units sold (not used here)
--     amount  money received for the sale
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
--   Weeks are ISO weeks (Monday start). A week only partly inside the range
--   pulls the line down at that end: choose @start on a Monday and @stop on a
--   Monday to fit whole weeks only.
--
-- Columns, one row per item, rising items first:
--   item
--   weeks            weeks in the fit (all weeks of the range)
--   mean_per_week    mean weekly amount
--   slope_per_week   regr_slope(total, period_serial(week, 'week')): change of
--                    the weekly amount per week (the serial column of periods()
--                    is that period_serial, so consecutive weeks differ by 1)
--   slope_stderr     standard error of that slope
--   pct_per_year     52 * slope / mean, in percent: how much a year of that
--                    slope is next to the typical week
--   r2               regr_r2: share of the week-to-week variation the line explains
--   resid_sd         spread of the weeks around the line
--   verdict          'rising' or 'falling' when |slope| > 2 * slope_stderr,
--                    else 'no clear trend'. A rule of thumb, not a test: the
--                    standard error assumes independent weeks, and seasons
--                    make neighbouring weeks alike, so read it as a guide.
--   shape            sparkline of the weekly amounts, one character per
--                    @spark_weeks weeks (their mean), oldest first
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/trend.sql
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@spark_weeks, 4) AS spark_weeks
),
range AS (
  SELECT coalesce(@start, min(period_floor(s.ts, 'day', settings.zone))) AS start,
         coalesce(@stop, max(period_end(s.ts, 'day', settings.zone))) AS stop
  FROM sales AS s, settings
),
weeks AS (
  SELECT p.serial, p.label
  FROM settings, range, periods(range.start, range.stop, 'week', settings.zone) AS p
),
weekly_sales AS (
  SELECT period_serial(s.ts, 'week', settings.zone) AS serial, s.item, exact_sum(s.amount) AS amount
  FROM sales AS s, settings, range
  WHERE period_serial(s.ts, 'day', settings.zone) >= period_serial(range.start, 'day', settings.zone)
    AND period_serial(s.ts, 'day', settings.zone) < period_serial(range.stop, 'day', settings.zone)
  GROUP BY 1, 2
),
-- Every week for every item: an item's week without sales is 0, not missing,
-- or the line would be fitted to the good weeks only.
weekly AS (
  SELECT i.item, w.serial, coalesce(t.amount, 0) AS total
  FROM weeks AS w
  CROSS JOIN (SELECT DISTINCT item FROM weekly_sales) AS i
  LEFT JOIN weekly_sales AS t ON t.serial = w.serial AND t.item = i.item
),
fit AS (
  SELECT item, count(*) AS weeks, avg(total) AS mean,
         regr_slope(total, serial) AS slope, slope_stderr(total, serial) AS stderr,
         regr_r2(total, serial) AS r2, resid_sd(total, serial) AS resid_sd
  FROM weekly
  GROUP BY item
),
shape AS (
  SELECT item, sparkline(total, block) AS shape
  FROM (SELECT item, (serial - (SELECT min(serial) FROM weeks)) / settings.spark_weeks AS block,
               avg(total) AS total
        FROM weekly, settings
        GROUP BY 1, 2)
  GROUP BY item
)
SELECT f.item, f.weeks,
       round(f.mean, 2) AS mean_per_week,
       round(f.slope, 2) AS slope_per_week,
       round(f.stderr, 2) AS slope_stderr,
       round(100.0 * 52 * f.slope / f.mean, 1) AS pct_per_year,
       round(f.r2, 3) AS r2,
       round(f.resid_sd, 2) AS resid_sd,
       CASE WHEN f.slope IS NULL OR f.stderr IS NULL THEN NULL
            WHEN abs(f.slope) > 2 * f.stderr THEN CASE WHEN f.slope > 0 THEN 'rising' ELSE 'falling' END
            ELSE 'no clear trend' END AS verdict,
       s.shape
FROM fit AS f JOIN shape AS s USING (item)
ORDER BY f.slope / f.mean DESC, f.item;
