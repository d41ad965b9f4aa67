-- SPDX-License-Identifier: MIT
-- almanac report: the seasonal profile. Per item, when in the week and when
-- in the year it sells: the weekday index and the month-of-year index.
--
-- An index is a period's mean daily amount over the item's overall mean
-- daily amount, in percent: 100 is an ordinary day, 150 half as much again,
-- 0 a period in which the item does not sell. Days count from the first to
-- the last day on which the shop sold anything, a day without sales of the
-- item as 0 (so an item sold three months a year has nine months at 0), and
-- every weekday and month is the mean of its days, so a 31-day month does
-- not outweigh a 28-day one. Months pool the years of the range: with a
-- strong trend the later years weigh more, so read the month index of a
-- fast-growing item with the trend table beside it.
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
--   @day_start  'HH:MM': business days that begin at that hour     default: midnight
--   Whole periods only: the days are the whole days of the range, chosen as
--   in sql/trend.sql (stray and future rows left out and named on the last
--   line of the output). @unit and @last are refused.
--   @by_segment  1: a first column segment, and the profile of each segment
--                (computed on that segment's rows alone, over its own range)
--                after the one of 'all segments' ('(none)' for a NULL segment)   default 0
--
-- Columns, one row per item, in item order:
--   item
--   peak_day         the weekday with the highest index
--   mon .. sun       weekday index (Monday first), whole percent
--   peak_month       the month with the highest index
--   jan .. dec       month-of-year index, whole percent
--   days             days in the range
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/seasonal_profile.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
DROP TABLE IF EXISTS temp.almanac_seasonal_rows;
CREATE TEMP TABLE almanac_seasonal_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment,
         'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
         coalesce(@start, json_extract(r, '$.start_if_cut')) AS start, coalesce(@stop, json_extract(r, '$.stop_if_cut')) AS stop
  FROM temp.almanac_range
  WHERE refuse_parameter('@unit', @unit, 'seasonal_profile.sql profiles weekdays and months; it takes no @unit')
        IS NULL
    AND refuse_parameter('@last', @last, 'seasonal_profile.sql profiles every day of the range') IS NULL
),
-- Day totals per segment and item, every day of the segment's range, a day
-- without sales of the item as 0 (period_totals' zero fill).
daily AS MATERIALIZED (
  SELECT CASE WHEN t.all_segments THEN 'all segments' ELSE coalesce(t.segment, '(none)') END AS segment,
         t.item, t.amount, period_position(t.period_start, 'day', 'week', settings.zone) AS weekday,
         period_position(t.period_start, 'month', 'year', settings.zone) AS month
  FROM settings, period_totals('sales', settings.day, settings.zone, settings.start, settings.stop) AS t
  WHERE (t.all_segments = 1 OR settings.by_segment = 1)
    AND t.covered_start = t.period_start AND t.covered_end = t.period_end
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM daily WHERE segment = 'all segments'),
overall AS (
  SELECT segment, d.item, avg(amount) AS mean, count(*) AS days
  FROM daily AS d, chosen
  WHERE chosen.item IS NULL OR chosen.item = '*' OR d.item = chosen.item GROUP BY segment, d.item
),
-- Each weekday's and month's index, and its place (1: the peak; ties to the earlier one).
by_weekday AS (
  SELECT d.segment, d.item, d.weekday AS position, 100.0 * avg(d.amount) / o.mean AS idx,
         row_number() OVER (PARTITION BY d.segment, d.item ORDER BY 100.0 * avg(d.amount) / o.mean DESC, d.weekday) AS place
  FROM daily AS d JOIN overall AS o USING (segment, item) GROUP BY d.segment, d.item, d.weekday
),
by_month AS (
  SELECT d.segment, d.item, d.month AS position, 100.0 * avg(d.amount) / o.mean AS idx,
         row_number() OVER (PARTITION BY d.segment, d.item ORDER BY 100.0 * avg(d.amount) / o.mean DESC, d.month) AS place
  FROM daily AS d JOIN overall AS o USING (segment, item) GROUP BY d.segment, d.item, d.month
),
weekdays AS (
  SELECT segment, item, max(CASE place WHEN 1 THEN position END) AS peak,
         CAST(round(max(CASE position WHEN 1 THEN idx END)) AS INTEGER) AS mon, CAST(round(max(CASE position WHEN 2 THEN idx END)) AS INTEGER) AS tue,
         CAST(round(max(CASE position WHEN 3 THEN idx END)) AS INTEGER) AS wed, CAST(round(max(CASE position WHEN 4 THEN idx END)) AS INTEGER) AS thu,
         CAST(round(max(CASE position WHEN 5 THEN idx END)) AS INTEGER) AS fri, CAST(round(max(CASE position WHEN 6 THEN idx END)) AS INTEGER) AS sat,
         CAST(round(max(CASE position WHEN 7 THEN idx END)) AS INTEGER) AS sun
  FROM by_weekday GROUP BY segment, item
),
months AS (
  SELECT segment, item, max(CASE place WHEN 1 THEN position END) AS peak,
         CAST(round(max(CASE position WHEN 1 THEN idx END)) AS INTEGER) AS jan, CAST(round(max(CASE position WHEN 2 THEN idx END)) AS INTEGER) AS feb,
         CAST(round(max(CASE position WHEN 3 THEN idx END)) AS INTEGER) AS mar, CAST(round(max(CASE position WHEN 4 THEN idx END)) AS INTEGER) AS apr,
         CAST(round(max(CASE position WHEN 5 THEN idx END)) AS INTEGER) AS may, CAST(round(max(CASE position WHEN 6 THEN idx END)) AS INTEGER) AS jun,
         CAST(round(max(CASE position WHEN 7 THEN idx END)) AS INTEGER) AS jul, CAST(round(max(CASE position WHEN 8 THEN idx END)) AS INTEGER) AS aug,
         CAST(round(max(CASE position WHEN 9 THEN idx END)) AS INTEGER) AS sep, CAST(round(max(CASE position WHEN 10 THEN idx END)) AS INTEGER) AS oct,
         CAST(round(max(CASE position WHEN 11 THEN idx END)) AS INTEGER) AS nov, CAST(round(max(CASE position WHEN 12 THEN idx END)) AS INTEGER) AS "dec"
  FROM by_month GROUP BY segment, item
)
SELECT o.segment, o.item, substr('MonTueWedThuFriSatSun', 3 * w.peak - 2, 3) AS peak_day,
       w.mon, w.tue, w.wed, w.thu, w.fri, w.sat, w.sun,
       substr('JanFebMarAprMayJunJulAugSepOctNovDec', 3 * m.peak - 2, 3) AS peak_month,
       m.jan, m.feb, m.mar, m.apr, m.may, m.jun, m.jul, m.aug, m.sep, m.oct, m.nov, m."dec", o.days
FROM overall AS o JOIN weekdays AS w USING (segment, item) JOIN months AS m USING (segment, item);
-- Without @by_segment the columns are those of the report before segments.
SELECT item, peak_day, mon, tue, wed, thu, fri, sat, sun, peak_month, jan, feb, mar, apr, may, jun, jul, aug,
       sep, oct, nov, "dec", days
FROM temp.almanac_seasonal_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY item;
SELECT * FROM temp.almanac_seasonal_rows WHERE @by_segment = 1 ORDER BY segment <> 'all segments', segment, item;
DROP TABLE temp.almanac_seasonal_rows;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
