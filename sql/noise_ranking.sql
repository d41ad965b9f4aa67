-- SPDX-License-Identifier: MIT
-- almanac report: the noise ranking. Per item, how far its weekly amounts
-- scatter around their own least-squares trend line, relative to the item's
-- mean week: the noisiest items first. A noisy item needs more weeks before
-- a change in it means anything; a quiet one shows a change at once.
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
--   Weeks are ISO weeks (Monday start). A week only partly inside the range
--   pulls the line down at that end: choose @start on a Monday and @stop on a
--   Monday to fit whole weeks only.
--
-- Columns, one row per item, noisiest first:
--   rank             1 = noisiest
--   item
--   weeks            weeks in the fit (all weeks of the range, a week without sales as 0)
--   mean_per_week    mean weekly amount
--   resid_sd         spread of the weeks around the item's trend line, resid_sd(total, week serial)
--   noise_pct        100 * resid_sd / mean_per_week: the typical miss of the line, in percent of a mean week
--   sd_pct           100 * stddev_samp / mean_per_week: the same without taking the trend out
--   Seasons count as scatter here (a line has no seasons), so a seasonal item
--   ranks as noisy; compare a season with the same weeks of last year instead
--   (sql/compare.sql).
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/noise_ranking.sql
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone
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
         resid_sd(total, serial) AS resid_sd, stddev_samp(total) AS sd
  FROM weekly
  GROUP BY item
)
SELECT row_number() OVER (ORDER BY resid_sd / mean DESC, item) AS rank,
       item, weeks,
       round(mean, 2) AS mean_per_week,
       round(resid_sd, 2) AS resid_sd,
       round(100.0 * resid_sd / mean, 1) AS noise_pct,
       round(100.0 * sd / mean, 1) AS sd_pct
FROM fit
WHERE mean > 0
ORDER BY rank;
