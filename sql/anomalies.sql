-- SPDX-License-Identifier: MIT
-- almanac report: unusual days. Per item and local day, the day's amount
-- against the typical amount of the same weekday in the surrounding weeks,
-- listing the days that break the pattern: promotions, closures, a snow day.
--
-- The typical level of a day is the median of the same weekday over the 8
-- weeks before and the 8 weeks after it (the day itself excluded, so a wild
-- day cannot hide itself), and its spread is their MAD (median absolute
-- deviation). A Saturday is compared with Saturdays only, so an ordinary
-- busy Saturday is not a spike. The score is the modified z-score of
-- Iglewicz & Hoaglin (1993):
--     score = 0.6745 * (amount - typical) / MAD
-- and a day is listed when |score| > @threshold (default 3.5, their cut-off).
-- Days without sales of the item count as 0 from the first to the last day
-- on which the shop sold anything (so a closed day is a 0, not a gap); a day
-- is skipped when fewer than 8 same weekdays surround it or their MAD is 0
-- (the score is not defined; an item sold three months a year has MAD 0 and
-- median 0 out of season, where a 0 is no news). A day without sales of an
-- item is listed only when the item sold within the 3 days before it and
-- within the 3 days after it: otherwise its season has ended or not begun,
-- or the item is gone — a change, not an unusual day. (At the end of the
-- range, where only earlier weeks surround a day, the first days after a
-- season would otherwise all be "closed"; the price is that a closure in the
-- last 3 days of the data is not listed yet.)
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
--   The surrounding weeks are read outside [@start, @stop) too, when there are sales there.
--   Whole periods only: every day scored and every day it is scored against is
--   a whole day of the data's range, chosen as in sql/trend.sql (stray and
--   future rows left out and named on the last line of the output).
--   @unit and @last are refused.
--
-- Columns, one row per unusual day and item, oldest first:
--   day      the local day, YYYY-MM-DD
--   item
--   amount   the day's amount (0 when the item had no sales)
--   typical  the median of the same weekday over the 8 weeks either side
--   score    the modified z-score, rounded to 1 place
--   kind     'spike' (score > threshold), 'closed' (no sales at all on a day
--            the item normally sells), or 'drop' (score < -threshold otherwise)
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/anomalies.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
DROP TABLE IF EXISTS temp.almanac_anomaly_rows;
CREATE TEMP TABLE almanac_anomaly_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@threshold, 3.5) AS threshold, coalesce(@by_segment, 0) AS by_segment,
         'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
         json_extract(r, '$.start_if_cut') AS start, json_extract(r, '$.stop_if_cut') AS stop
  FROM temp.almanac_range
  WHERE refuse_parameter('@unit', @unit, 'anomalies.sql scores days; it takes no @unit') IS NULL
    AND refuse_parameter('@last', @last, 'anomalies.sql lists days of [@start, @stop); set @start instead') IS NULL
),
-- Day totals per segment and item, every day from the segment's first sale to
-- its last, a day without sales of the item as 0 (period_totals' zero fill).
daily AS MATERIALIZED (
  SELECT CASE WHEN t.all_segments THEN 'all segments' ELSE coalesce(t.segment, '(none)') END AS segment,
         t.item, t.serial, period_label(t.period_start, settings.day, settings.zone) AS day, t.amount,
         period_position(t.period_start, 'day', 'week', settings.zone) AS weekday
  FROM settings, period_totals('sales', settings.day, settings.zone, settings.start, settings.stop) AS t
  WHERE (t.all_segments = 1 OR settings.by_segment = 1)
    AND t.covered_start = t.period_start AND t.covered_end = t.period_end
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM daily WHERE segment = 'all segments'),
scored AS (
  SELECT segment, d.item, day, amount, median(amount) OVER same_weekday AS typical,
         mad(amount) OVER same_weekday AS spread, count(*) OVER same_weekday AS neighbours,
         max(amount <> 0) OVER (PARTITION BY segment, d.item ORDER BY serial
                                ROWS BETWEEN 3 PRECEDING AND 1 PRECEDING) AS sold_before,
         max(amount <> 0) OVER (PARTITION BY segment, d.item ORDER BY serial
                                ROWS BETWEEN 1 FOLLOWING AND 3 FOLLOWING) AS sold_after
  FROM daily AS d, chosen
  WHERE chosen.item IS NULL OR chosen.item = '*' OR d.item = chosen.item
  WINDOW same_weekday AS (PARTITION BY segment, d.item, weekday ORDER BY serial
                          ROWS BETWEEN 8 PRECEDING AND 8 FOLLOWING EXCLUDE CURRENT ROW)
)
SELECT sc.segment, sc.day, sc.item, sc.amount, sc.typical,
       round(0.6745 * (sc.amount - sc.typical) / sc.spread, 1) AS score, CASE WHEN sc.amount > sc.typical THEN 'spike'
            WHEN sc.amount = 0 THEN 'closed'
            ELSE 'drop' END AS kind
FROM scored AS sc, settings
WHERE sc.neighbours >= 8 AND sc.spread > 0 AND (sc.amount <> 0 OR (sc.sold_before AND sc.sold_after))
  AND abs(0.6745 * (sc.amount - sc.typical) / sc.spread) > settings.threshold
  AND sc.day >= coalesce(@start, '0000-01-01') AND sc.day < coalesce(@stop, '9999-12-31');
-- Without @by_segment the columns are those of the report before segments.
SELECT day, item, amount, typical, score, kind
FROM temp.almanac_anomaly_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY day, item;
SELECT * FROM temp.almanac_anomaly_rows WHERE @by_segment = 1 ORDER BY segment <> 'all segments', segment, day, item;
DROP TABLE temp.almanac_anomaly_rows;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
