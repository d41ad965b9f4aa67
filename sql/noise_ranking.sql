-- SPDX-License-Identifier: MIT
-- almanac report: the noise ranking. Per item, how much of its daily amounts
-- neither its weekly rhythm nor its slow level explains, relative to its
-- mean day: the noisiest items first. A noisy item needs more days before a
-- change in it means anything; a quiet one shows a change at once.
--
-- How noise is measured: each item's daily amounts (every whole day of the
-- range, a day without sales as 0) are split by period_decomposition with
-- cycle week (STL) into trend + season + noise. With hundreds of weeks the
-- fit is well-conditioned and robust: the trend part follows the slow level,
-- the yearly season included, the season part is the weekday rhythm, and the
-- noise part is what is left. noise_pct = 100 * stddev of the noise part /
-- mean day. A seasonal item is not noisy because it has a season: its
-- season sits in the trend and season parts, not in the noise. Days on
-- which the segment sold nothing at all (closures, listed by
-- sql/anomalies.sql) are left out of the spread: five holidays a year
-- would otherwise make up most of a steady item's "noise". The fit is the
-- non-robust one ({"robust": false}): the robust fit sets its scale from
-- the median residual, which is 0 for an item sold on fewer than half of
-- the days (an autumn item), and then leaves such an item no noise at all;
-- and it puts a promotion wholly into the noise, where the non-robust fit
-- spreads a little of it over the neighbouring days.
--
-- Beside it, whether an item's swings over the year are season or noise:
-- the strengths of Wang, Smith & Hyndman (2006) from the weekly amounts
-- decomposed with cycle year,
--     trend_strength  = max(0, 1 - var(noise) / var(trend + noise))
--     season_strength = max(0, 1 - var(noise) / var(season + noise))
-- (sample variances; 0 = none, near 1 = the part dominates the noise). They
-- need at least two whole years of whole ISO weeks (104): with less they
-- are NULL, because a yearly season cannot be told from a trend in one year.
-- With few years, read them with care: each week of the year then has only
-- a few values, and the season part takes up part of the noise too (on
-- three years an item without a season shows a season strength near 0.7;
-- sql/trend.sql calls an item strongly seasonal from 0.9 on).
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
--   @day_start    'HH:MM': business days (and their weeks) that begin at that hour
--   Whole periods only: only the whole days and whole ISO weeks of the range
--   are decomposed (period_decomposition lists no partial period): a period
--   cut by either end would look like a drop. The range is chosen as in
--   sql/trend.sql (stray and future rows left out and named on the last line
--   of the output); within it, each item's days run from the first to the
--   last day with sales of its segment. @unit and @last make no sense here
--   and are refused.
--
-- Columns, one row per item, noisiest first:
--   rank             1 = noisiest
--   item
--   days             whole days decomposed (a day without sales as 0)
--   mean_per_day     mean daily amount over those days
--   noise_sd         stddev_samp of the noise part of the days (cycle week)
--   noise_pct        100 * noise_sd / mean_per_day: the typical unexplained
--                    part of a day, in percent of a mean day
--   trend_strength   of the weekly amounts with cycle year (see above; NULL
--                    with less than two whole years), 2 places
--   season_strength  the same for the yearly season: near 1, the item's swings
--                    over the year are its season, not noise
--   An item whose days hold fewer than two whole weeks has NULL parts and
--   ranks last.
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/noise_ranking.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
DROP TABLE IF EXISTS temp.almanac_noise_settings;
CREATE TEMP TABLE almanac_noise_settings AS
SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment,
       'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
       coalesce(@start, json_extract(r, '$.start_if_cut')) AS start, coalesce(@stop, json_extract(r, '$.stop_if_cut')) AS stop
FROM temp.almanac_range
-- One look at sales as period_totals reads it, so that money written as text
-- stops the report naming sales itself (the decomposition reads a copy).
WHERE (SELECT count(*) FROM period_totals('sales', 'year', coalesce(@zone, 'UTC'))) >= 0
  AND refuse_parameter('@unit', @unit, 'noise_ranking.sql decomposes whole days and weeks; it takes no @unit') IS NULL
  AND refuse_parameter('@last', @last, 'noise_ranking.sql decomposes every whole day of the range') IS NULL;
-- The rows of the range for period_decomposition, each sale's ts moved to
-- the start of its (business) day: the decomposition's days are calendar
-- days, and a business day that begins at @day_start is the calendar day of
-- its start.
DROP TABLE IF EXISTS temp.almanac_parts_sales;
CREATE TEMP TABLE almanac_parts_sales AS
SELECT s.* FROM sales AS s, temp.almanac_noise_settings AS c, temp.almanac_range AS g
WHERE period_label(s.ts, c.day, c.zone) BETWEEN coalesce(c.start, json_extract(g.r, '$.start'))
      AND date(coalesce(c.stop, json_extract(g.r, '$.stop')), '-1 day');
UPDATE temp.almanac_parts_sales SET ts = period_floor(ts, 'day from 2000-01-01 ' || @day_start, coalesce(@zone, 'UTC'))
WHERE @day_start IS NOT NULL;
DROP TABLE IF EXISTS temp.almanac_noise_rows;
CREATE TEMP TABLE almanac_noise_rows AS
WITH
settings AS (SELECT * FROM temp.almanac_noise_settings),
-- Each segment is decomposed on its own rows.
daily AS MATERIALIZED (
  SELECT CASE WHEN d.all_segments THEN 'all segments' ELSE coalesce(d.segment, '(none)') END AS segment,
         d.item, d.serial, d.amount, d.noise
  FROM settings, period_decomposition('almanac_parts_sales', 'day', 'week', settings.zone, '{"robust": false}') AS d
  WHERE d.all_segments = 1 OR settings.by_segment = 1
),
-- A day on which the segment sold nothing at all is a closure, not noise
-- (sql/anomalies.sql lists them): it is left out of the noise's spread.
open_days AS (SELECT segment, serial FROM daily GROUP BY segment, serial HAVING sum(amount <> 0) > 0),
weekly AS MATERIALIZED (
  SELECT CASE WHEN d.all_segments THEN 'all segments' ELSE coalesce(d.segment, '(none)') END AS segment,
         d.item, d.trend, d.season, d.noise
  FROM settings, period_decomposition('almanac_parts_sales', 'week', 'year', settings.zone) AS d
  WHERE d.all_segments = 1 OR settings.by_segment = 1
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM daily WHERE segment = 'all segments'),
noise AS (
  SELECT segment, d.item, count(*) AS days, avg(amount) AS mean,
         stddev_samp(CASE WHEN o.serial IS NOT NULL THEN noise END) AS noise_sd
  FROM daily AS d LEFT JOIN open_days AS o USING (segment, serial), chosen
  WHERE chosen.item IS NULL OR chosen.item = '*' OR d.item = chosen.item GROUP BY segment, d.item
  HAVING sum(amount <> 0) > 0
),
-- Wang, Smith & Hyndman (2006): the share of the detrended (deseasonalised)
-- variance that is not noise. NULL parts (fewer than two whole years) give NULL.
strength AS (
  SELECT segment, item,
         max(0, 1 - power(stddev_samp(noise), 2) / power(stddev_samp(trend + noise), 2)) AS trend_strength,
         max(0, 1 - power(stddev_samp(noise), 2) / power(stddev_samp(season + noise), 2)) AS season_strength
  FROM weekly GROUP BY segment, item HAVING count(noise) > 0
)
SELECT n.segment, row_number() OVER (PARTITION BY n.segment ORDER BY n.noise_sd / n.mean DESC NULLS LAST, n.item) AS rank,
       n.item, n.days, round(n.mean, 2) AS mean_per_day, round(n.noise_sd, 2) AS noise_sd,
       round(100.0 * n.noise_sd / n.mean, 1) AS noise_pct,
       round(s.trend_strength, 2) AS trend_strength, round(s.season_strength, 2) AS season_strength
FROM noise AS n LEFT JOIN strength AS s USING (segment, item)
WHERE n.mean > 0;
DROP TABLE temp.almanac_parts_sales;
DROP TABLE temp.almanac_noise_settings;
-- Without @by_segment the columns are those of the report before segments.
SELECT rank, item, days, mean_per_day, noise_sd, noise_pct, trend_strength, season_strength
FROM temp.almanac_noise_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY rank;
SELECT * FROM temp.almanac_noise_rows WHERE @by_segment = 1 ORDER BY segment <> 'all segments', segment, rank;
DROP TABLE temp.almanac_noise_rows;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
