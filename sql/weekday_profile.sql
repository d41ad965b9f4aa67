-- SPDX-License-Identifier: MIT
-- almanac report: the weekday profile. How a typical Monday, Tuesday, ...
-- compares with the rest of the week, in the shop's local calendar.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount [, segment])
--     ts      when the sale happened: an almanac time value, normally UTC text
--             'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item    TEXT, what was sold
--     qty     number of units sold
--     amount  money received for the sale
--     segment optional: a shop, a channel, a category (see @by_segment)
--   Other columns are ignored. A table with other names: put a view in front
--   of it in the same session (a temp view named sales is found before a
--   table main.sales, so it can also narrow one down):
--     CREATE TEMP VIEW sales AS
--       SELECT sold_at AS ts, product AS item, units AS qty, total AS amount FROM pos_export;
--     CREATE TEMP VIEW sales AS SELECT * FROM main.sales WHERE shop = 'Millrace';
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
--   @item    unset: all items together; '*': one profile per item; a name: that item only
--            (a name that matches no item stops the report naming the closest item)
--   @day_start  'HH:MM': business days that begin at that hour     default: midnight
--   Whole periods only: the days counted are whole days of the range. The
--   range is chosen as in sql/trend.sql (stray and future rows left out and
--   named on the last line of the output). @unit and @last are refused.
--   @by_segment  1: a first column segment, and the profile of each segment
--                (computed on that segment's rows alone, over its own range)
--                after the one of 'all segments' ('(none)' for a NULL segment)   default 0
--
-- Columns, Monday first:
--   weekday          Monday .. Sunday
--   item             the item, or 'all items'
--   days             calendar days of that weekday in the range
--   days_with_sales  of those, days with at least one sale (closed days are not)
--   qty, amount      totals over those days (0 when none)
--   share_pct        the weekday's share of the amount of all weekdays, in percent
--   mean_per_day     mean amount of a day with sales      (NULL when none)
--   median_per_day   median amount of a day with sales    (NULL when none)
--   index            100 * mean_per_day / the mean of all days with sales:
--                    above 100 a busier day than the average day
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/weekday_profile.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
DROP TABLE IF EXISTS temp.almanac_weekday_rows;
CREATE TEMP TABLE almanac_weekday_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment,
         'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
         coalesce(@start, json_extract(r, '$.start_if_cut')) AS start, coalesce(@stop, json_extract(r, '$.stop_if_cut')) AS stop
  FROM temp.almanac_range
  WHERE refuse_parameter('@unit', @unit, 'weekday_profile.sql profiles days; it takes no @unit') IS NULL
    AND refuse_parameter('@last', @last, 'weekday_profile.sql profiles every day of the range') IS NULL
),
-- Day totals per segment and item, every day of the segment's range (period_totals' zero fill).
totals AS MATERIALIZED (
  SELECT CASE WHEN t.all_segments THEN 'all segments' ELSE coalesce(t.segment, '(none)') END AS segment,
         t.item, t.period_start, t.sales, t.qty, t.amount
  FROM settings, period_totals('sales', settings.day, settings.zone, settings.start, settings.stop) AS t
  WHERE (t.all_segments = 1 OR settings.by_segment = 1)
    AND t.covered_start = t.period_start AND t.covered_end = t.period_end
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM totals WHERE segment = 'all segments'),
-- The chosen item's days; all items together are the exact sum of the items' day totals.
daily AS (
  SELECT t.segment, CASE WHEN chosen.item IS NULL THEN 'all items' ELSE t.item END AS item,
         period_position(t.period_start, 'day', 'week', settings.zone) - 1 AS weekday,
         sum(t.sales) AS sales, exact_sum(t.qty) AS qty, exact_sum(t.amount) AS amount
  FROM totals AS t, chosen, settings
  WHERE chosen.item IS NULL OR chosen.item = '*' OR t.item = chosen.item GROUP BY 1, 2, t.period_start
),
profile AS (
  SELECT segment, item, weekday, count(*) AS days, count(CASE WHEN sales > 0 THEN 1 END) AS days_with_sales,
         exact_sum(qty) AS qty, exact_sum(amount) AS amount,
         avg(CASE WHEN sales > 0 THEN amount END) AS mean, median(CASE WHEN sales > 0 THEN amount END) AS median
  FROM daily GROUP BY segment, item, weekday
),
overall AS (
  SELECT segment, item, exact_sum(amount) AS amount, exact_sum(amount) / exact_sum(days_with_sales) AS mean_day
  FROM profile GROUP BY segment, item
)
SELECT p.segment, p.weekday AS weekday_number, CASE p.weekday WHEN 0 THEN 'Monday' WHEN 1 THEN 'Tuesday' WHEN 2 THEN 'Wednesday'
         WHEN 3 THEN 'Thursday' WHEN 4 THEN 'Friday' WHEN 5 THEN 'Saturday' ELSE 'Sunday' END AS weekday,
       p.item, p.days, p.days_with_sales, p.qty, round(p.amount, 2) AS amount,
       round(100.0 * p.amount / o.amount, 1) AS share_pct, round(p.mean, 2) AS mean_per_day,
       round(p.median, 2) AS median_per_day, round(100.0 * p.mean / o.mean_day, 1) AS "index"
FROM profile AS p JOIN overall AS o USING (segment, item);
-- Without @by_segment the columns are those of the report before segments.
SELECT weekday, item, days, days_with_sales, qty, amount, share_pct, mean_per_day, median_per_day, "index"
FROM temp.almanac_weekday_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY item, weekday_number;
SELECT segment, weekday, item, days, days_with_sales, qty, amount, share_pct, mean_per_day, median_per_day, "index"
FROM temp.almanac_weekday_rows WHERE @by_segment = 1 ORDER BY segment <> 'all segments', segment, item, weekday_number;
DROP TABLE temp.almanac_weekday_rows;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
