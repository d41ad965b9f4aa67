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
--   @item    unset: every item; a name: that item only
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
-- The rows are gathered in a temporary table first, so that the segment column
-- appears only with @by_segment = 1; the table is dropped at the end.
DROP TABLE IF EXISTS temp.almanac_seasonal_rows;
-- period_totals keys by item only: for @by_segment it reads this view, whose
-- item is [segment, item], so each segment's days are totalled on their own.
DROP VIEW IF EXISTS temp.almanac_seasonal_segments;
CREATE TEMP VIEW almanac_seasonal_segments AS
  SELECT s.ts, json_array(coalesce(segment, '(none)'), s.item) AS item, s.amount
  FROM sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment;
CREATE TEMP TABLE almanac_seasonal_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, @item AS item_choice, coalesce(@by_segment, 0) AS by_segment
),
-- Day totals per item, read in one pass without sorting the rows (period_totals):
-- 'all segments' from sales, and with @by_segment each segment from the view
-- above (a NULL source reads nothing). Every item has a row for every day from
-- the first sale to the last; sales = 0 on a day without any.
day_totals AS MATERIALIZED (
  SELECT 'all segments' AS segment, t.item, t.serial, t.period_start, t.period_end, t.sales, t.amount
  FROM settings, period_totals('sales', 'day', settings.zone) AS t
  UNION ALL
  SELECT json_extract(t.item, '$[0]'), json_extract(t.item, '$[1]'), t.serial, t.period_start, t.period_end,
         t.sales, t.amount
  FROM settings, period_totals(CASE WHEN settings.by_segment = 1 THEN 'temp.almanac_seasonal_segments' END,
                               'day', settings.zone) AS t
),
-- The local days of a segment's first and last sale, of any item.
range AS (
  SELECT segment, coalesce(@start, min(period_start)) AS start, coalesce(@stop, max(period_end)) AS stop
  FROM day_totals
  WHERE sales > 0
  GROUP BY segment
),
daily_sales AS (
  SELECT t.segment, t.serial, t.item, t.amount
  FROM day_totals AS t, settings
  WHERE t.sales > 0 AND (settings.item_choice IS NULL OR t.item = settings.item_choice)
),
days AS (
  SELECT range.segment, p.serial, period_position(p.period_start, 'day', 'week') AS weekday,
         period_position(p.period_start, 'month', 'year') AS month
  FROM settings, range, periods(range.start, range.stop, 'day', settings.zone) AS p
),
daily AS (
  SELECT d.segment, i.item, d.weekday, d.month, coalesce(t.amount, 0) AS amount
  FROM days AS d
  JOIN (SELECT DISTINCT segment, item FROM daily_sales) AS i USING (segment)
  LEFT JOIN daily_sales AS t ON t.segment = d.segment AND t.serial = d.serial AND t.item = i.item
),
overall AS (
  SELECT segment, item, avg(amount) AS mean, count(*) AS days FROM daily GROUP BY segment, item
),
by_weekday AS (
  SELECT d.segment, d.item, d.weekday AS position, 100.0 * avg(d.amount) / o.mean AS idx
  FROM daily AS d JOIN overall AS o USING (segment, item) GROUP BY d.segment, d.item, d.weekday
),
by_month AS (
  SELECT d.segment, d.item, d.month AS position, 100.0 * avg(d.amount) / o.mean AS idx
  FROM daily AS d JOIN overall AS o USING (segment, item) GROUP BY d.segment, d.item, d.month
),
peaks AS (
  SELECT segment, item,
         (SELECT position FROM by_weekday AS w WHERE w.segment = o.segment AND w.item = o.item
          ORDER BY idx DESC, position LIMIT 1) AS day,
         (SELECT position FROM by_month AS m WHERE m.segment = o.segment AND m.item = o.item
          ORDER BY idx DESC, position LIMIT 1) AS month
  FROM overall AS o
)
SELECT o.segment, o.item,
       substr('MonTueWedThuFriSatSun', 3 * p.day - 2, 3) AS peak_day,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_weekday WHERE segment = o.segment AND item = o.item AND position = 1) AS mon,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_weekday WHERE segment = o.segment AND item = o.item AND position = 2) AS tue,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_weekday WHERE segment = o.segment AND item = o.item AND position = 3) AS wed,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_weekday WHERE segment = o.segment AND item = o.item AND position = 4) AS thu,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_weekday WHERE segment = o.segment AND item = o.item AND position = 5) AS fri,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_weekday WHERE segment = o.segment AND item = o.item AND position = 6) AS sat,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_weekday WHERE segment = o.segment AND item = o.item AND position = 7) AS sun,
       substr('JanFebMarAprMayJunJulAugSepOctNovDec', 3 * p.month - 2, 3) AS peak_month,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 1) AS jan,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 2) AS feb,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 3) AS mar,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 4) AS apr,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 5) AS may,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 6) AS jun,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 7) AS jul,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 8) AS aug,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 9) AS sep,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 10) AS oct,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 11) AS nov,
       (SELECT CAST(round(idx) AS INTEGER) FROM by_month WHERE segment = o.segment AND item = o.item AND position = 12) AS "dec",
       o.days
FROM overall AS o JOIN peaks AS p USING (segment, item);
-- Without @by_segment the columns are those of the report before segments.
SELECT item, peak_day, mon, tue, wed, thu, fri, sat, sun, peak_month, jan, feb, mar, apr, may, jun, jul, aug,
       sep, oct, nov, "dec", days
FROM temp.almanac_seasonal_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY item;
SELECT * FROM temp.almanac_seasonal_rows WHERE @by_segment = 1
ORDER BY segment <> 'all segments', segment, item;
DROP TABLE temp.almanac_seasonal_rows;
DROP VIEW temp.almanac_seasonal_segments;

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
SELECT message AS item, NULL AS peak_day, NULL AS mon, NULL AS tue, NULL AS wed, NULL AS thu, NULL AS fri,
       NULL AS sat, NULL AS sun, NULL AS peak_month, NULL AS jan, NULL AS feb, NULL AS mar, NULL AS apr,
       NULL AS may, NULL AS jun, NULL AS jul, NULL AS aug, NULL AS sep, NULL AS oct, NULL AS nov,
       NULL AS "dec", NULL AS days
FROM closest;
