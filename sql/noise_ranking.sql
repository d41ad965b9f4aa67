-- SPDX-License-Identifier: MIT
-- almanac report: the noise ranking. Per item, how far its weekly amounts
-- scatter around their own least-squares trend line, relative to the item's
-- mean week: the noisiest items first. A noisy item needs more weeks before
-- a change in it means anything; a quiet one shows a change at once.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount [, segment])
--     ts      when the sale happened: an almanac time value, normally UTC text
--             'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item    TEXT, what was sold
--     qty     number of units sold (not used here)
--     amount  money received for the sale
--     segment optional: a shop, a channel, a category (see @by_segment)
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
--   @by_segment   1: a first column segment, and the ranking of each segment
--                 (computed on that segment's rows alone) after the one of
--                 'all segments' ('(none)' for rows whose segment is NULL)   default 0
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
-- The rows are gathered in a temporary table first, so that the segment column
-- appears only with @by_segment = 1; the table is dropped at the end.
DROP TABLE IF EXISTS temp.almanac_noise_rows;
-- period_totals keys by item only: for @by_segment it reads this view, whose
-- item is [segment, item], so each segment's days are totalled on their own.
DROP VIEW IF EXISTS temp.almanac_noise_segments;
CREATE TEMP VIEW almanac_noise_segments AS
  SELECT s.ts, json_array(coalesce(segment, '(none)'), s.item) AS item, s.amount
  FROM sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment;
CREATE TEMP TABLE almanac_noise_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment
),
-- Day totals per item, read in one pass without sorting the rows (period_totals):
-- 'all segments' from sales, and with @by_segment each segment from the view
-- above (a NULL source reads nothing); everything below is computed per
-- segment, so a segment's figures are those of the report run on that segment
-- alone. Every item has a row for every day from the first sale to the last;
-- sales = 0 on a day without any.
day_totals AS MATERIALIZED (
  SELECT 'all segments' AS segment, t.item, t.serial, t.period_start, t.period_end, t.sales, t.amount
  FROM settings, period_totals('sales', 'day', settings.zone) AS t
  UNION ALL
  SELECT json_extract(t.item, '$[0]'), json_extract(t.item, '$[1]'), t.serial, t.period_start, t.period_end,
         t.sales, t.amount
  FROM settings, period_totals(CASE WHEN settings.by_segment = 1 THEN 'temp.almanac_noise_segments' END,
                               'day', settings.zone) AS t
),
-- The local days of a segment's first and last sale, of any item.
range AS (
  SELECT segment, coalesce(@start, min(period_start)) AS start, coalesce(@stop, max(period_end)) AS stop
  FROM day_totals
  WHERE sales > 0
  GROUP BY segment
),
weeks AS (
  SELECT range.segment, p.serial, p.label
  FROM settings, range, periods(range.start, range.stop, 'week', settings.zone) AS p
),
-- The day totals of the range summed per week; only weeks with sales appear here.
weekly_sales AS (
  SELECT d.segment, period_serial(d.period_start, 'week', settings.zone) AS serial, d.item,
         exact_sum(d.amount) AS amount
  FROM day_totals AS d JOIN range USING (segment), settings
  WHERE d.serial >= period_serial(range.start, 'day', settings.zone)
    AND d.serial < period_serial(range.stop, 'day', settings.zone)
  GROUP BY 1, 2, 3
  HAVING sum(d.sales) > 0
),
-- Every week for every item: an item's week without sales is 0, not missing,
-- or the line would be fitted to the good weeks only.
weekly AS (
  SELECT w.segment, i.item, w.serial, coalesce(t.amount, 0) AS total
  FROM weeks AS w
  JOIN (SELECT DISTINCT segment, item FROM weekly_sales) AS i USING (segment)
  LEFT JOIN weekly_sales AS t ON t.segment = w.segment AND t.serial = w.serial AND t.item = i.item
),
fit AS (
  SELECT segment, item, count(*) AS weeks, avg(total) AS mean,
         resid_sd(total, serial) AS resid_sd, stddev_samp(total) AS sd
  FROM weekly
  GROUP BY segment, item
)
SELECT segment, row_number() OVER (PARTITION BY segment ORDER BY resid_sd / mean DESC, item) AS rank,
       item, weeks,
       round(mean, 2) AS mean_per_week,
       round(resid_sd, 2) AS resid_sd,
       round(100.0 * resid_sd / mean, 1) AS noise_pct,
       round(100.0 * sd / mean, 1) AS sd_pct
FROM fit
WHERE mean > 0;
-- Without @by_segment the columns are those of the report before segments.
SELECT rank, item, weeks, mean_per_week, resid_sd, noise_pct, sd_pct
FROM temp.almanac_noise_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY rank;
SELECT * FROM temp.almanac_noise_rows WHERE @by_segment = 1
ORDER BY segment <> 'all segments', segment, rank;
DROP TABLE temp.almanac_noise_rows;
DROP VIEW temp.almanac_noise_segments;
