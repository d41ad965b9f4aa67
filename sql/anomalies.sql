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
--   @item       unset: every item; a name: that item only
--   @threshold  |score| above which a day is listed       default 3.5
--   @by_segment 1: a first column segment, and the days of each segment
--               (scored on that segment's rows alone, over its own trading
--               days) after those of 'all segments' ('(none)' for a NULL
--               segment)                                  default 0
--   The surrounding weeks are read outside [@start, @stop) too, when there are sales there.
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
-- The rows are gathered in a temporary table first, so that the segment column
-- appears only with @by_segment = 1; the table is dropped at the end.
DROP TABLE IF EXISTS temp.almanac_anomaly_rows;
-- period_totals keys by item only: for @by_segment it reads this view, whose
-- item is [segment, item], so each segment's days are totalled on their own.
DROP VIEW IF EXISTS temp.almanac_anomaly_segments;
CREATE TEMP VIEW almanac_anomaly_segments AS
  SELECT s.ts, json_array(coalesce(segment, '(none)'), s.item) AS item, s.amount
  FROM sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment;
CREATE TEMP TABLE almanac_anomaly_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@threshold, 3.5) AS threshold, @item AS item_choice,
         coalesce(@by_segment, 0) AS by_segment
),
-- Day totals per item, read in one pass without sorting the rows (period_totals):
-- 'all segments' from sales, and with @by_segment each segment from the view
-- above (a NULL source reads nothing). Every item has a row for every day from
-- its segment's first sale to its last; sales = 0 on a day without any.
day_totals AS MATERIALIZED (
  SELECT 'all segments' AS segment, t.item, t.serial, t.period_start, t.period_end, t.sales, t.amount
  FROM settings, period_totals('sales', 'day', settings.zone) AS t
  UNION ALL
  SELECT json_extract(t.item, '$[0]'), json_extract(t.item, '$[1]'), t.serial, t.period_start, t.period_end,
         t.sales, t.amount
  FROM settings, period_totals(CASE WHEN settings.by_segment = 1 THEN 'temp.almanac_anomaly_segments' END,
                               'day', settings.zone) AS t
),
daily_sales AS (
  SELECT t.segment, t.serial, t.item, t.amount
  FROM day_totals AS t, settings
  WHERE t.sales > 0 AND (settings.item_choice IS NULL OR t.item = settings.item_choice)
),
-- The first and last day with a sale of the segment, of any item.
trading AS (
  SELECT segment, min(period_start) AS first, max(period_end) AS stop
  FROM day_totals
  WHERE sales > 0
  GROUP BY segment
),
days AS (
  SELECT trading.segment, p.serial, p.period_start AS day, period_position(p.period_start, 'day', 'week') AS weekday
  FROM settings, trading, periods(trading.first, trading.stop, 'day', settings.zone) AS p
),
daily AS (
  SELECT d.segment, i.item, d.serial, d.day, d.weekday, coalesce(t.amount, 0) AS amount
  FROM days AS d
  JOIN (SELECT DISTINCT segment, item FROM daily_sales) AS i USING (segment)
  LEFT JOIN daily_sales AS t ON t.segment = d.segment AND t.serial = d.serial AND t.item = i.item
),
scored AS (
  SELECT segment, item, day, amount,
         median(amount) OVER same_weekday AS typical,
         mad(amount) OVER same_weekday AS spread,
         count(*) OVER same_weekday AS neighbours,
         max(amount <> 0) OVER (PARTITION BY segment, item ORDER BY serial
                                ROWS BETWEEN 3 PRECEDING AND 1 PRECEDING) AS sold_before,
         max(amount <> 0) OVER (PARTITION BY segment, item ORDER BY serial
                                ROWS BETWEEN 1 FOLLOWING AND 3 FOLLOWING) AS sold_after
  FROM daily
  WINDOW same_weekday AS (PARTITION BY segment, item, weekday ORDER BY serial
                          ROWS BETWEEN 8 PRECEDING AND 8 FOLLOWING EXCLUDE CURRENT ROW)
)
SELECT sc.segment, sc.day, sc.item, sc.amount, sc.typical,
       round(0.6745 * (sc.amount - sc.typical) / sc.spread, 1) AS score,
       CASE WHEN sc.amount > sc.typical THEN 'spike'
            WHEN sc.amount = 0 THEN 'closed'
            ELSE 'drop' END AS kind
FROM scored AS sc, settings
WHERE sc.neighbours >= 8 AND sc.spread > 0 AND (sc.amount <> 0 OR (sc.sold_before AND sc.sold_after))
  AND abs(0.6745 * (sc.amount - sc.typical) / sc.spread) > settings.threshold
  AND sc.day >= coalesce(@start, '0000-01-01') AND sc.day < coalesce(@stop, '9999-12-31');
-- Without @by_segment the columns are those of the report before segments.
SELECT day, item, amount, typical, score, kind
FROM temp.almanac_anomaly_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY day, item;
SELECT * FROM temp.almanac_anomaly_rows WHERE @by_segment = 1
ORDER BY segment <> 'all segments', segment, day, item;
DROP TABLE temp.almanac_anomaly_rows;
DROP VIEW temp.almanac_anomaly_segments;

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
SELECT NULL AS day, message AS item, NULL AS amount, NULL AS typical, NULL AS score, NULL AS kind
FROM closest;
