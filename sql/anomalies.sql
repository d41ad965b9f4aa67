-- SPDX-License-Identifier: MIT
-- almanac report: unusual days. Per item and local day, the part of the
-- day's amount that neither the item's level nor its weekly rhythm
-- explains, listing the days that break the pattern: promotions, closures,
-- a snow day; and, per shop (segment) and for the whole business, the runs
-- of days on which nothing at all was sold.
--
-- What a day is scored against: the noise part of the daily amounts
-- decomposed with cycle week (period_decomposition, STL): amount = trend +
-- season + noise, where trend + season is what the item's level and its
-- weekday would lead one to expect (typical below). The score measures the
-- day's noise against the noise of the 56 days before and the 56 days
-- after it (the day itself and the segment's closed days excluded, so a
-- wild day cannot hide itself and a closure does not widen its neighbours'
-- spread), with the modified z-score of Iglewicz & Hoaglin (1993):
--     score = 0.6745 * (noise - median of the neighbours' noise) / their MAD
-- and a day is listed when |score| > @threshold (default 3.5, their cut-off).
-- Which fit: the non-robust one ({"robust": false}). The robust fit follows
-- the bulk of the days closely and leaves the others wholly in the noise,
-- so its noise part is heavy-tailed even for normal day-to-day noise: with
-- it, a cut-off of 3.5 listed 21 ordinary days of 1,092 of a generated item
-- with normal noise, and 1,212 of the demo's 13,104 item-days. The
-- non-robust fit's noise is as close to normal as the days are: none of
-- that item's days, and 153 item-days on the demo. Its price: a closure
-- pulls the typical of the same weekday a week or two around it down a
-- little, so a normal day there can be listed as a small spike.
-- Because each item is measured against its own noise, the ordinary swings
-- of a noisy item are not unusual days: only what stands out of them is. A
-- day is skipped when fewer than 28 neighbours surround it or their spread
-- is 0 (an item sold three months a year has noise 0 out of season, where a
-- 0 is no news). A day without sales of an item is listed only when the
-- item sold within the 3 days before it and within the 3 days after it:
-- otherwise its season has ended or not begun, or the item is gone — a
-- change, not an unusual day.
--
-- Closures: a day on which a segment (or, as 'all segments', the whole
-- business) sold nothing at all, on a weekday on which it sells in most
-- weeks (at least half of them: a shop closed every Monday is not closed
-- anew each Monday), is a closed day; consecutive closed days, skipping the
-- segment's regular days off, make one closure, listed with its first and
-- last day. This is a second table after the days, whatever @by_segment is:
-- a two-week closure of one shop shows there, although the other shops'
-- sales keep every item of the business going.
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
--   @zone       IANA time zone of the shop's calendar       default 'UTC'
--   @start      first local day listed, "'YYYY-MM-DD'"     default: the day of the first sale
--   @stop       local day after the last one listed        default: the day after the last sale
--   @item       unset or '*': every item; a name: that item only (a name that
--               matches no item stops the report naming the closest item)
--   @day_start  'HH:MM': business days that begin at that hour    default: midnight
--   @threshold  |score| above which a day is listed       default 3.5
--   @by_segment 1: a first column segment, and the days of each segment
--               (scored on that segment's rows alone, over its own trading
--               days) after those of 'all segments' ('(none)' for a NULL
--               segment)                                  default 0
--   The decomposition reads the whole range, outside [@start, @stop) too, so
--   the first and last days listed have neighbours on both sides when there
--   are sales there; a closure is listed when it touches [@start, @stop).
--   Whole periods only: every day scored and every day it is scored against
--   is a whole (business) day of the data's range, chosen as in sql/trend.sql
--   (stray and future rows left out and named on the last line of the
--   output); a last day the data covers only in part is not scored, so it
--   cannot pass for a drop. @unit and @last are refused.
--
-- Columns of the days, one row per unusual day and item, oldest first:
--   day      the local day, YYYY-MM-DD
--   item
--   amount   the day's amount (0 when the item had no sales)
--   typical  trend + season of the day: what its level and weekday lead one to expect
--   score    the modified z-score of the day's noise part (see above), 1 place
--   kind     'spike' (score > threshold), 'closed' (no sales at all on a day
--            the item normally sells), or 'drop' (score < -threshold otherwise)
-- Columns of the closures, one row per closure, by segment ('all segments'
-- first) and first day:
--   segment, first_day, last_day, days (closed days in the run, regular days off not counted)
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/anomalies.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
DROP TABLE IF EXISTS temp.almanac_anomaly_settings;
CREATE TEMP TABLE almanac_anomaly_settings AS
SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@threshold, 3.5) AS threshold, coalesce(@by_segment, 0) AS by_segment,
       'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
       json_extract(r, '$.start_if_cut') AS start, json_extract(r, '$.stop_if_cut') AS stop
FROM temp.almanac_range
-- One look at sales as period_totals reads it, so that money written as text
-- stops the report naming sales itself (the decomposition reads a copy).
WHERE (SELECT count(*) FROM period_totals('sales', 'year', coalesce(@zone, 'UTC'))) >= 0
  AND refuse_parameter('@unit', @unit, 'anomalies.sql scores days; it takes no @unit') IS NULL
  AND refuse_parameter('@last', @last, 'anomalies.sql lists days of [@start, @stop); set @start instead') IS NULL;
-- The rows of the range for period_decomposition, each sale's ts moved to
-- the start of its (business) day: the decomposition's days are calendar
-- days, and a business day that begins at @day_start is the calendar day of
-- its start.
DROP TABLE IF EXISTS temp.almanac_parts_sales;
CREATE TEMP TABLE almanac_parts_sales AS
SELECT s.* FROM sales AS s, temp.almanac_anomaly_settings AS c, temp.almanac_range AS g
WHERE period_label(s.ts, c.day, c.zone) BETWEEN coalesce(c.start, json_extract(g.r, '$.start'))
      AND date(coalesce(c.stop, json_extract(g.r, '$.stop')), '-1 day');
UPDATE temp.almanac_parts_sales SET ts = period_floor(ts, 'day from 2000-01-01 ' || @day_start, coalesce(@zone, 'UTC'))
WHERE @day_start IS NOT NULL;
DROP TABLE IF EXISTS temp.almanac_anomaly_rows;
CREATE TEMP TABLE almanac_anomaly_rows AS
WITH
settings AS (SELECT * FROM temp.almanac_anomaly_settings),
daily AS MATERIALIZED (
  SELECT CASE WHEN d.all_segments THEN 'all segments' ELSE coalesce(d.segment, '(none)') END AS segment,
         d.item, d.serial, d.label AS day, d.amount, d.trend + d.season AS typical, d.noise
  FROM settings, period_decomposition('almanac_parts_sales', 'day', 'week', settings.zone, '{"robust": false}') AS d
  WHERE d.all_segments = 1 OR settings.by_segment = 1
),
-- A day on which the segment sold nothing at all is a closure (listed in the
-- second table), not noise: it does not count in its neighbours' spread.
open_days AS (
  SELECT segment, serial, sum(amount <> 0) > 0 AS open FROM daily GROUP BY segment, serial
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM daily WHERE segment = 'all segments'),
scored AS (
  SELECT segment, d.item, day, amount, typical, noise,
         median(CASE WHEN o.open THEN noise END) OVER around AS centre,
         mad(CASE WHEN o.open THEN noise END) OVER around AS spread,
         count(CASE WHEN o.open THEN noise END) OVER around AS neighbours,
         max(amount <> 0) OVER (PARTITION BY segment, d.item ORDER BY serial
                                ROWS BETWEEN 3 PRECEDING AND 1 PRECEDING) AS sold_before,
         max(amount <> 0) OVER (PARTITION BY segment, d.item ORDER BY serial
                                ROWS BETWEEN 1 FOLLOWING AND 3 FOLLOWING) AS sold_after
  FROM daily AS d JOIN open_days AS o USING (segment, serial), chosen
  WHERE chosen.item IS NULL OR chosen.item = '*' OR d.item = chosen.item
  WINDOW around AS (PARTITION BY segment, d.item ORDER BY serial
                    ROWS BETWEEN 56 PRECEDING AND 56 FOLLOWING EXCLUDE CURRENT ROW)
)
SELECT sc.segment, sc.day, sc.item, sc.amount, round(sc.typical, 2) AS typical,
       round(0.6745 * (sc.noise - sc.centre) / sc.spread, 1) AS score, CASE WHEN sc.noise > sc.centre THEN 'spike'
            WHEN sc.amount = 0 THEN 'closed'
            ELSE 'drop' END AS kind
FROM scored AS sc, settings
WHERE sc.neighbours >= 28 AND sc.spread > 0 AND (sc.amount <> 0 OR (sc.sold_before AND sc.sold_after))
  AND abs(0.6745 * (sc.noise - sc.centre) / sc.spread) > settings.threshold
  AND sc.day >= coalesce(@start, '0000-01-01') AND sc.day < coalesce(@stop, '9999-12-31');
-- Closures: each segment's days with no sale at all, on weekdays it normally trades.
DROP TABLE IF EXISTS temp.almanac_closure_rows;
CREATE TEMP TABLE almanac_closure_rows AS
WITH
settings AS (SELECT * FROM temp.almanac_anomaly_settings),
days AS MATERIALIZED (
  SELECT CASE WHEN t.all_segments THEN 'all segments' ELSE coalesce(t.segment, '(none)') END AS segment,
         t.serial, t.label AS day, sum(t.sales) AS sales, period_position(t.period_start, 'day', 'week', settings.zone) AS weekday
  FROM settings, period_totals('almanac_parts_sales', 'day', settings.zone) AS t
  WHERE t.covered_start = t.period_start AND t.covered_end = t.period_end
  GROUP BY 1, 2
),
trading_weekdays AS (
  SELECT segment, weekday FROM days GROUP BY segment, weekday HAVING avg(sales > 0) >= 0.5
),
-- Gaps and islands over the trading weekdays only: consecutive closed days
-- share (place among trading days - place among closed days).
numbered AS (
  SELECT d.segment, d.day, d.sales, row_number() OVER (PARTITION BY d.segment ORDER BY d.serial) AS place
  FROM days AS d JOIN trading_weekdays USING (segment, weekday)
),
closed AS (
  SELECT segment, day, place - row_number() OVER (PARTITION BY segment ORDER BY place) AS run
  FROM numbered WHERE sales = 0
)
SELECT segment, min(day) AS first_day, max(day) AS last_day, count(*) AS days
FROM closed GROUP BY segment, run
HAVING max(day) >= coalesce(@start, '0000-01-01') AND min(day) < coalesce(@stop, '9999-12-31');
DROP TABLE temp.almanac_parts_sales;
DROP TABLE temp.almanac_anomaly_settings;
-- Without @by_segment the columns are those of the report before segments.
SELECT day, item, amount, typical, score, kind
FROM temp.almanac_anomaly_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY day, item;
SELECT * FROM temp.almanac_anomaly_rows WHERE @by_segment = 1 ORDER BY segment <> 'all segments', segment, day, item;
SELECT segment, first_day, last_day, days FROM temp.almanac_closure_rows
ORDER BY segment <> 'all segments', segment, first_day;
DROP TABLE temp.almanac_anomaly_rows;
DROP TABLE temp.almanac_closure_rows;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
