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
-- The rows are gathered in a temporary table first, so that the segment column
-- appears only with @by_segment = 1; the table is dropped at the end.
DROP TABLE IF EXISTS temp.almanac_weekday_rows;
-- period_totals keys by item only: for @by_segment it reads this view, whose
-- item is [segment, item], so each segment's days are totalled on their own.
DROP VIEW IF EXISTS temp.almanac_weekday_segments;
CREATE TEMP VIEW almanac_weekday_segments AS
  SELECT s.ts, json_array(coalesce(segment, '(none)'), s.item) AS item, s.qty, s.amount
  FROM sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment;
CREATE TEMP TABLE almanac_weekday_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, @item AS item_choice, coalesce(@by_segment, 0) AS by_segment
),
-- Day totals per item, read in one pass without sorting the rows (period_totals):
-- 'all segments' from sales, and with @by_segment each segment from the view
-- above (a NULL source reads nothing); everything below is computed per
-- segment, so a segment's figures are those of the report run on that segment
-- alone. Every item has a row for every day from the first sale to the last;
-- sales = 0 on a day without any.
day_totals AS MATERIALIZED (
  SELECT 'all segments' AS segment, t.item, t.serial, t.period_start, t.period_end, t.sales, t.qty, t.amount
  FROM settings, period_totals('sales', 'day', settings.zone) AS t
  UNION ALL
  SELECT json_extract(t.item, '$[0]'), json_extract(t.item, '$[1]'), t.serial, t.period_start, t.period_end,
         t.sales, t.qty, t.amount
  FROM settings, period_totals(CASE WHEN settings.by_segment = 1 THEN 'temp.almanac_weekday_segments' END,
                               'day', settings.zone) AS t
),
-- The local days of a segment's first and last sale, of any item.
range AS (
  SELECT segment, coalesce(@start, min(period_start)) AS start, coalesce(@stop, max(period_end)) AS stop
  FROM day_totals
  WHERE sales > 0
  GROUP BY segment
),
-- The chosen item's days with sales; all items together are the exact sum of
-- the items' day totals.
chosen AS (
  SELECT t.segment, CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE t.item END AS item,
         t.serial AS day, exact_sum(t.qty) AS qty, exact_sum(t.amount) AS amount
  FROM day_totals AS t, settings
  WHERE t.sales > 0
    AND (settings.item_choice IS NULL OR settings.item_choice = '*' OR t.item = settings.item_choice)
  GROUP BY 1, 2, 3
),
daily_sales AS (
  SELECT c.segment, c.day AS serial, c.item, c.qty, c.amount
  FROM chosen AS c JOIN range USING (segment), settings
  WHERE c.day >= period_serial(range.start, 'day', settings.zone)
    AND c.day < period_serial(range.stop, 'day', settings.zone)
),
-- Every day of the range for every item. Day serial 0 is 1970-01-01, a
-- Thursday, so (serial + 3) mod 7 counts from Monday = 0 (the outer + 7 keeps
-- days before 1970 positive).
daily AS (
  SELECT range.segment, i.item, ((p.serial + 3) % 7 + 7) % 7 AS weekday,
         t.serial AS sold, t.qty, t.amount
  FROM settings, range, periods(range.start, range.stop, 'day', settings.zone) AS p
  JOIN (SELECT DISTINCT segment, item FROM chosen) AS i ON i.segment = range.segment
  LEFT JOIN daily_sales AS t ON t.segment = range.segment AND t.serial = p.serial AND t.item = i.item
),
profile AS (
  SELECT segment, item, weekday, count(*) AS days, count(sold) AS days_with_sales,
         coalesce(exact_sum(qty), 0) AS qty, coalesce(exact_sum(amount), 0) AS amount,
         avg(amount) AS mean, median(amount) AS median
  FROM daily
  GROUP BY segment, item, weekday
),
overall AS (
  SELECT segment, item, exact_sum(amount) AS amount,
         exact_sum(amount) / exact_sum(days_with_sales) AS mean_day
  FROM profile
  GROUP BY segment, item
)
SELECT p.segment, p.weekday AS weekday_number, CASE p.weekday WHEN 0 THEN 'Monday' WHEN 1 THEN 'Tuesday' WHEN 2 THEN 'Wednesday'
         WHEN 3 THEN 'Thursday' WHEN 4 THEN 'Friday' WHEN 5 THEN 'Saturday' ELSE 'Sunday' END AS weekday,
       p.item, p.days, p.days_with_sales, p.qty,
       round(p.amount, 2) AS amount,
       round(100.0 * p.amount / o.amount, 1) AS share_pct,
       round(p.mean, 2) AS mean_per_day,
       round(p.median, 2) AS median_per_day,
       round(100.0 * p.mean / o.mean_day, 1) AS "index"
FROM profile AS p JOIN overall AS o USING (segment, item);
-- Without @by_segment the columns are those of the report before segments.
SELECT weekday, item, days, days_with_sales, qty, amount, share_pct, mean_per_day, median_per_day, "index"
FROM temp.almanac_weekday_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY item, weekday_number;
SELECT segment, weekday, item, days, days_with_sales, qty, amount, share_pct, mean_per_day, median_per_day,
       "index"
FROM temp.almanac_weekday_rows WHERE @by_segment = 1
ORDER BY segment <> 'all segments', segment, item, weekday_number;
DROP TABLE temp.almanac_weekday_rows;
DROP VIEW temp.almanac_weekday_segments;

-- A name that matches no item gets one row that says so and names the item
-- closest to it: the most letter pairs in common, ignoring case (Dice's
-- coefficient of the two sets of pairs), ties by name; as totals.sql does.
WITH
missing AS (
  SELECT @item AS wanted
  WHERE @item IS NOT NULL AND @item <> '*' AND NOT EXISTS (SELECT 1 FROM sales AS s WHERE s.item = @item)
),
positions(k) AS (SELECT 1 UNION ALL SELECT k + 1 FROM positions WHERE k < 200),
name_pairs AS (
  SELECT n.item, substr(lower(n.item), positions.k, 2) AS pair
  FROM (SELECT DISTINCT item FROM sales WHERE item IS NOT NULL) AS n, positions, missing
  WHERE positions.k < length(n.item)
),
wanted_pairs AS (
  SELECT DISTINCT substr(lower(missing.wanted), positions.k, 2) AS pair
  FROM missing, positions WHERE positions.k < length(missing.wanted)
),
closest AS (
  SELECT 'no item named ' || quote(missing.wanted) || '; the closest item is '
           || coalesce(quote((SELECT n.item FROM name_pairs AS n
                              GROUP BY n.item
                              ORDER BY 2.0 * count(DISTINCT CASE WHEN n.pair IN wanted_pairs THEN n.pair END)
                                         / (count(DISTINCT n.pair) + (SELECT count(*) FROM wanted_pairs)) DESC,
                                       n.item
                              LIMIT 1)), 'none: the table has no items') AS message
  FROM missing
)
SELECT NULL AS weekday, message AS item, NULL AS days, NULL AS days_with_sales, NULL AS qty, NULL AS amount,
       NULL AS share_pct, NULL AS mean_per_day, NULL AS median_per_day, NULL AS "index"
FROM closest;
