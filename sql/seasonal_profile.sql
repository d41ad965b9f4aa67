-- SPDX-License-Identifier: MIT
-- almanac report: the seasonal profile. Per item, when in the week and when
-- in the year it sells above or below its own level: the season part of its
-- amounts, with the spread of the noise beside it.
--
-- The season part comes from period_decomposition (STL), which splits each
-- item's amounts into trend + season + noise:
--   - the week: the daily amounts with cycle week; mon .. sun is the mean
--     season part of that weekday, in percent of the item's mean day
--     (+30: a Saturday typically sells 30 % of a mean day above the item's
--     level at the time; -40: 40 % below);
--   - the year: the weekly amounts (whole ISO weeks) with cycle year;
--     jan .. dec is the mean season part of the weeks whose Thursday falls
--     in that month (the ISO rule for a week's month), in percent of the
--     item's mean week. It needs two whole years of weeks: NULL below.
-- The daily fit is the non-robust one, as in sql/noise_ranking.sql (the
-- robust fit leaves an item sold on fewer than half of the days no noise).
-- Because the trend is taken out first, an item that simply grows has no
-- month of the year that stands out: its growth is in the trend part, not
-- here. A peak is named only when it stands out of the noise: peak_day and
-- peak_month are the position with the highest season part when that part
-- exceeds three standard errors of a mean of as many noise values as the
-- position holds (3 * stddev of the noise part / sqrt(periods at the
-- position): 156 Saturdays in three years, about 13 weeks of a month), else
-- NULL — a "peak" that chance alone would often give is not one.
-- day_noise_pct and week_noise_pct give that spread, 100 * stddev of the
-- noise part / the mean day (week): a season of +20 beside a noise of 60 is
-- a tendency, not a rule.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount [, segment])  as in sql/trend.sql; amounts added with
--   exact_sum; segment, optional, is a shop, a channel, a category (see @by_segment).
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
--   @zone    IANA time zone of the shop's calendar        default 'UTC'
--   @start   first local day, "'YYYY-MM-DD'"             default: the day of the first sale
--   @stop    local day after the last one                default: the day after the last sale
--   @item    unset or '*': every item; a name: that item only (a name that
--            matches no item stops the report naming the closest item)
--   @day_start  'HH:MM': business days (and their weeks) that begin at that hour   default: midnight
--   Whole periods only: only the whole days and whole ISO weeks of the range
--   are decomposed, chosen as in sql/trend.sql (stray and future rows left
--   out and named on the last line of the output); within it, each item's
--   days run from the first to the last day with sales of its segment.
--   @unit and @last are refused.
--   @by_segment  1: a first column segment, and the profile of each segment
--                (computed on that segment's rows alone, over its own range)
--                after the one of 'all segments' ('(none)' for a NULL segment)   default 0
--
-- Columns, one row per item, in item order:
--   item
--   peak_day         the weekday with the highest season part, when it exceeds the noise (see above)
--   mon .. sun       season part of the weekday, whole percent of the mean day (signed)
--   day_noise_pct    100 * stddev of the daily noise part / mean day, 1 place
--   peak_month       the month with the highest season part, when it exceeds the noise
--   jan .. dec       season part of the month's weeks, whole percent of the mean week (signed)
--   week_noise_pct   100 * stddev of the weekly noise part / mean week, 1 place
--   days             whole days decomposed
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/seasonal_profile.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
DROP TABLE IF EXISTS temp.almanac_seasonal_settings;
CREATE TEMP TABLE almanac_seasonal_settings AS
SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment,
       'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
       coalesce(@start, json_extract(r, '$.start_if_cut')) AS start, coalesce(@stop, json_extract(r, '$.stop_if_cut')) AS stop
FROM temp.almanac_range
-- One look at sales as period_totals reads it, so that money written as text
-- stops the report naming sales itself (the decomposition reads a copy).
WHERE (SELECT count(*) FROM period_totals('sales', 'year', coalesce(@zone, 'UTC'))) >= 0
  AND refuse_parameter('@unit', @unit, 'seasonal_profile.sql profiles weekdays and months; it takes no @unit') IS NULL
  AND refuse_parameter('@last', @last, 'seasonal_profile.sql profiles every day of the range') IS NULL;
-- The rows of the range for period_decomposition, each sale's ts moved to
-- the start of its (business) day: the decomposition's days are calendar
-- days, and a business day that begins at @day_start is the calendar day of
-- its start.
DROP TABLE IF EXISTS temp.almanac_parts_sales;
CREATE TEMP TABLE almanac_parts_sales AS
SELECT s.* FROM sales AS s, temp.almanac_seasonal_settings AS c, temp.almanac_range AS g
WHERE period_label(s.ts, c.day, c.zone) BETWEEN coalesce(c.start, json_extract(g.r, '$.start'))
      AND date(coalesce(c.stop, json_extract(g.r, '$.stop')), '-1 day');
UPDATE temp.almanac_parts_sales SET ts = period_floor(ts, 'day from 2000-01-01 ' || @day_start, coalesce(@zone, 'UTC'))
WHERE @day_start IS NOT NULL;
DROP TABLE IF EXISTS temp.almanac_seasonal_rows;
CREATE TEMP TABLE almanac_seasonal_rows AS
WITH
settings AS (SELECT * FROM temp.almanac_seasonal_settings),
daily AS MATERIALIZED (
  SELECT CASE WHEN d.all_segments THEN 'all segments' ELSE coalesce(d.segment, '(none)') END AS segment,
         d.item, d.amount, d.season, d.noise, period_position(d.period_start, 'day', 'week', settings.zone) AS position
  FROM settings, period_decomposition('almanac_parts_sales', 'day', 'week', settings.zone, '{"robust": false}') AS d
  WHERE d.all_segments = 1 OR settings.by_segment = 1
),
-- A week's month is the month of its Thursday (ISO 8601's rule for a week's year).
weekly AS MATERIALIZED (
  SELECT CASE WHEN d.all_segments THEN 'all segments' ELSE coalesce(d.segment, '(none)') END AS segment,
         d.item, d.amount, d.season, d.noise,
         period_position(period_shift(d.period_start, 3, 'day', settings.zone), 'month', 'year', settings.zone) AS position
  FROM settings, period_decomposition('almanac_parts_sales', 'week', 'year', settings.zone) AS d
  WHERE d.all_segments = 1 OR settings.by_segment = 1
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM daily WHERE segment = 'all segments'),
day_level AS (
  SELECT segment, d.item, avg(amount) AS mean, stddev_samp(noise) AS noise_sd, count(*) AS days
  FROM daily AS d, chosen
  WHERE chosen.item IS NULL OR chosen.item = '*' OR d.item = chosen.item GROUP BY segment, d.item
  HAVING sum(amount <> 0) > 0
),
week_level AS (SELECT segment, item, avg(amount) AS mean, stddev_samp(noise) AS noise_sd FROM weekly GROUP BY segment, item),
-- Each position's mean season part, and its place (1: the highest; ties to the earlier one).
by_weekday AS (
  SELECT d.segment, d.item, d.position, avg(d.season) AS season, count(d.season) AS periods,
         row_number() OVER (PARTITION BY d.segment, d.item ORDER BY avg(d.season) DESC, d.position) AS place
  FROM daily AS d JOIN day_level USING (segment, item) GROUP BY d.segment, d.item, d.position
),
by_month AS (
  SELECT w.segment, w.item, w.position, avg(w.season) AS season, count(w.season) AS periods,
         row_number() OVER (PARTITION BY w.segment, w.item ORDER BY avg(w.season) DESC, w.position) AS place
  FROM weekly AS w JOIN day_level USING (segment, item) GROUP BY w.segment, w.item, w.position
),
weekdays AS (
  SELECT b.segment, b.item, max(CASE WHEN place = 1 AND season > 3 * l.noise_sd / sqrt(periods) THEN position END) AS peak,
         CAST(round(100.0 * max(CASE position WHEN 1 THEN season END) / l.mean) AS INTEGER) AS mon,
         CAST(round(100.0 * max(CASE position WHEN 2 THEN season END) / l.mean) AS INTEGER) AS tue,
         CAST(round(100.0 * max(CASE position WHEN 3 THEN season END) / l.mean) AS INTEGER) AS wed,
         CAST(round(100.0 * max(CASE position WHEN 4 THEN season END) / l.mean) AS INTEGER) AS thu,
         CAST(round(100.0 * max(CASE position WHEN 5 THEN season END) / l.mean) AS INTEGER) AS fri,
         CAST(round(100.0 * max(CASE position WHEN 6 THEN season END) / l.mean) AS INTEGER) AS sat,
         CAST(round(100.0 * max(CASE position WHEN 7 THEN season END) / l.mean) AS INTEGER) AS sun,
         round(100.0 * l.noise_sd / l.mean, 1) AS noise_pct
  FROM by_weekday AS b JOIN day_level AS l USING (segment, item) GROUP BY b.segment, b.item
),
months AS (
  SELECT b.segment, b.item, max(CASE WHEN place = 1 AND season > 3 * l.noise_sd / sqrt(periods) THEN position END) AS peak,
         CAST(round(100.0 * max(CASE position WHEN 1 THEN season END) / l.mean) AS INTEGER) AS jan,
         CAST(round(100.0 * max(CASE position WHEN 2 THEN season END) / l.mean) AS INTEGER) AS feb,
         CAST(round(100.0 * max(CASE position WHEN 3 THEN season END) / l.mean) AS INTEGER) AS mar,
         CAST(round(100.0 * max(CASE position WHEN 4 THEN season END) / l.mean) AS INTEGER) AS apr,
         CAST(round(100.0 * max(CASE position WHEN 5 THEN season END) / l.mean) AS INTEGER) AS may,
         CAST(round(100.0 * max(CASE position WHEN 6 THEN season END) / l.mean) AS INTEGER) AS jun,
         CAST(round(100.0 * max(CASE position WHEN 7 THEN season END) / l.mean) AS INTEGER) AS jul,
         CAST(round(100.0 * max(CASE position WHEN 8 THEN season END) / l.mean) AS INTEGER) AS aug,
         CAST(round(100.0 * max(CASE position WHEN 9 THEN season END) / l.mean) AS INTEGER) AS sep,
         CAST(round(100.0 * max(CASE position WHEN 10 THEN season END) / l.mean) AS INTEGER) AS oct,
         CAST(round(100.0 * max(CASE position WHEN 11 THEN season END) / l.mean) AS INTEGER) AS nov,
         CAST(round(100.0 * max(CASE position WHEN 12 THEN season END) / l.mean) AS INTEGER) AS "dec",
         round(100.0 * l.noise_sd / l.mean, 1) AS noise_pct
  FROM by_month AS b JOIN week_level AS l USING (segment, item) GROUP BY b.segment, b.item
)
SELECT o.segment, o.item, substr('MonTueWedThuFriSatSun', 3 * w.peak - 2, 3) AS peak_day,
       w.mon, w.tue, w.wed, w.thu, w.fri, w.sat, w.sun, w.noise_pct AS day_noise_pct,
       substr('JanFebMarAprMayJunJulAugSepOctNovDec', 3 * m.peak - 2, 3) AS peak_month,
       m.jan, m.feb, m.mar, m.apr, m.may, m.jun, m.jul, m.aug, m.sep, m.oct, m.nov, m."dec",
       m.noise_pct AS week_noise_pct, o.days
FROM day_level AS o JOIN weekdays AS w USING (segment, item) LEFT JOIN months AS m USING (segment, item);
DROP TABLE temp.almanac_parts_sales;
DROP TABLE temp.almanac_seasonal_settings;
-- Without @by_segment the columns are those of the report before segments.
SELECT item, peak_day, mon, tue, wed, thu, fri, sat, sun, day_noise_pct, peak_month, jan, feb, mar, apr, may, jun,
       jul, aug, sep, oct, nov, "dec", week_noise_pct, days
FROM temp.almanac_seasonal_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY item;
SELECT * FROM temp.almanac_seasonal_rows WHERE @by_segment = 1 ORDER BY segment <> 'all segments', segment, item;
DROP TABLE temp.almanac_seasonal_rows;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
