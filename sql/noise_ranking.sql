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
--   @item         unset or '*': every item; a name: that item's row only (a name
--                 that matches no item stops the report naming the closest item)
--   @day_start    'HH:MM': weeks of business days that begin at that hour
--   Whole periods only: weeks are ISO weeks (Monday start), and only those
--   wholly inside the range are fitted (covered_start = period_start and
--   covered_end = period_end in period_totals): a week cut by either end
--   would pull the line down there. The range is chosen as in sql/trend.sql
--   (stray and future rows left out and named on the last line of the
--   output). @unit and @last make no sense here and are refused.
--
-- Columns, one row per item, noisiest first:
--   rank             1 = noisiest
--   item
--   weeks            weeks in the fit (all whole weeks of the range, a week without sales as 0)
--   mean_per_week    mean weekly amount over those weeks (the same number as in sql/trend.sql)
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
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
DROP TABLE IF EXISTS temp.almanac_noise_rows;
CREATE TEMP TABLE almanac_noise_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment,
         'week' || coalesce(' from 2000-01-03 ' || @day_start, '') AS spec,
         coalesce(@start, json_extract(r, '$.start_if_cut')) AS start, coalesce(@stop, json_extract(r, '$.stop_if_cut')) AS stop
  FROM temp.almanac_range
  WHERE refuse_parameter('@unit', @unit, 'noise_ranking.sql fits whole ISO weeks; it takes no @unit') IS NULL
    AND refuse_parameter('@last', @last, 'noise_ranking.sql fits every whole week of the range') IS NULL
),
-- Weekly totals, whole weeks only, an item's week without sales as 0 (period_totals' zero fill);
-- each segment is fitted on its own rows.
weekly AS MATERIALIZED (
  SELECT CASE WHEN t.all_segments THEN 'all segments' ELSE coalesce(t.segment, '(none)') END AS segment,
         t.item, t.serial, t.sales, t.amount AS total
  FROM settings, period_totals('sales', settings.spec, settings.zone, settings.start, settings.stop) AS t
  WHERE (t.all_segments = 1 OR settings.by_segment = 1)
    AND t.covered_start = t.period_start AND t.covered_end = t.period_end
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM weekly WHERE segment = 'all segments'),
fit AS (
  SELECT segment, w.item, count(*) AS weeks, avg(total) AS mean,
         resid_sd(total, serial) AS resid_sd, stddev_samp(total) AS sd
  FROM weekly AS w, chosen
  WHERE chosen.item IS NULL OR chosen.item = '*' OR w.item = chosen.item GROUP BY segment, w.item
  HAVING sum(w.sales) > 0
)
SELECT segment, row_number() OVER (PARTITION BY segment ORDER BY resid_sd / mean DESC, item) AS rank, item, weeks,
       round(mean, 2) AS mean_per_week, round(resid_sd, 2) AS resid_sd,
       round(100.0 * resid_sd / mean, 1) AS noise_pct, round(100.0 * sd / mean, 1) AS sd_pct
FROM fit
WHERE mean > 0;
-- Without @by_segment the columns are those of the report before segments.
SELECT rank, item, weeks, mean_per_week, resid_sd, noise_pct, sd_pct
FROM temp.almanac_noise_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY rank;
SELECT * FROM temp.almanac_noise_rows WHERE @by_segment = 1 ORDER BY segment <> 'all segments', segment, rank;
DROP TABLE temp.almanac_noise_rows;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
