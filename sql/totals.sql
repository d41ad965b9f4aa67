-- SPDX-License-Identifier: MIT
-- almanac report: totals and means per period, every period shown, in the
-- shop's local calendar. A period without sales is a row of zeros, not a
-- missing row; its means are NULL (there is nothing to average). Each row says
-- how much of its period the data covers, so a week cut off by the end of the
-- data is never read as a whole week.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount [, segment])
--     ts       when the sale happened: an almanac time value, normally UTC text
--              'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item     TEXT, what was sold
--     qty      number of units sold
--     amount   money received for the sale
--     segment  optional: a shop, a channel, a category — what @by_segment breaks
--              the totals down by. A table without it works as it is.
--   Other columns are ignored. A table with other names: put a view in front
--   of it in the same session (a temp view named sales is found before a
--   table main.sales, so it can also narrow one down or name the segment):
--     CREATE TEMP VIEW sales AS
--       SELECT sold_at AS ts, product AS item, units AS qty, total AS amount FROM pos_export;
--     CREATE TEMP VIEW sales AS SELECT ts, item, qty, amount, shop AS segment FROM main.sales;
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
--   @zone        IANA time zone of the shop's calendar       default 'UTC'
--   @unit        any period spec: 'week', 'half-month', 'month',
--                'quarter starting october', '2 weeks', ...  default 'week'
--   @start       first local day reported, "'YYYY-MM-DD'"   default: the day of the first sale
--   @stop        local day after the last one reported      default: the day after the last sale
--   @item        unset: all items together; '*': one row per item; a name: that item only
--                (a name that matches no item gives one row that names the closest item)
--   @last        show only the last N periods               default: every period
--   @by_segment  1: rows for each segment as well as for all segments   default 0
--
-- Columns:
--   period           the period's label (YYYY-Www for ISO weeks, YYYY-MM for months, ...)
--   segment          'all segments', or with @by_segment = 1 also each segment
--                    ('(none)' for rows whose segment is NULL)
--   item             the item, or 'all items'
--   days_in_period   local calendar days of the period
--   days_covered     of those, days inside the reported range [@start, @stop)
--   complete         1 when days_covered = days_in_period, else 0: the first and
--                    last period of the data are often partial
--   sales            number of sale rows              (0 when none)
--   qty              units sold                       (0 when none)
--   amount           money received, rounded to cents (0 when none)
--   days_with_sales  local days of the period with at least one sale (0 when none)
--   amount_per_day   amount / days_with_sales        (NULL when none)
--   mean_sale        amount / sales                  (NULL when none)
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.parameter set @unit month' -cmd '.mode column' shop.db < sql/totals.sql
-- period_totals keys by item only: for @by_segment it reads this view, whose
-- item is [segment, item], so each segment's days are totalled on their own.
-- The NATURAL LEFT JOIN finds sales.segment when the table has one and
-- otherwise joins nothing, leaving segment NULL: one view for both shapes.
DROP VIEW IF EXISTS temp.almanac_totals_segments;
CREATE TEMP VIEW almanac_totals_segments AS
  SELECT s.ts, json_array(coalesce(segment, '(none)'), s.item) AS item, s.qty, s.amount
  FROM sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment;
WITH
settings AS (
  SELECT spec, zone, item_choice, by_segment,
         -- Periods of whole local days: not those of hours, minutes or seconds,
         -- nor periods that start at a time of day ('week from 2024-01-15 06:00').
         NOT (lower(spec) GLOB '*hour*' OR lower(spec) GLOB '*minute*' OR lower(spec) GLOB '*second*'
              OR replace(upper(spec), ' ', '') GLOB 'PT*' OR spec GLOB '*:*') AS whole_days
  FROM (SELECT coalesce(@unit, 'week') AS spec, coalesce(@zone, 'UTC') AS zone, @item AS item_choice,
               coalesce(@by_segment, 0) AS by_segment)
),
-- Day totals per item, read in one pass without sorting the rows (period_totals):
-- 'all segments' from sales, and with @by_segment each segment from the view
-- above (a NULL source reads nothing). Every item has a row for every day from
-- the first sale to the last; sales = 0 on a day without any. A period's
-- totals are the sums of its days' totals, which also count its days with sales.
day_totals AS MATERIALIZED (
  SELECT 'all segments' AS segment, t.item, t.serial, t.period_start, t.period_end, t.sales, t.qty, t.amount
  FROM settings, period_totals('sales', 'day', settings.zone) AS t
  UNION ALL
  SELECT json_extract(t.item, '$[0]'), json_extract(t.item, '$[1]'), t.serial, t.period_start, t.period_end,
         t.sales, t.qty, t.amount
  FROM settings, period_totals(CASE WHEN settings.by_segment = 1 THEN 'temp.almanac_totals_segments' END,
                               'day', settings.zone) AS t
),
-- The range is that of the whole table, also when one item is chosen, so every
-- item's rows cover the same periods.
range AS (
  SELECT coalesce(@start, min(period_start)) AS start, coalesce(@stop, max(period_end)) AS stop
  FROM day_totals
  WHERE segment = 'all segments' AND sales > 0
),
days AS (
  SELECT period_serial(range.start, 'day', settings.zone) AS first_day,
         period_serial(range.stop, 'day', settings.zone) AS after_day
  FROM range, settings
),
chosen AS (
  SELECT d.segment, CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE d.item END AS item,
         d.serial AS day, d.period_start, d.sales, d.qty, d.amount
  FROM day_totals AS d, settings
  WHERE d.sales > 0
    AND (settings.item_choice IS NULL OR settings.item_choice = '*' OR d.item = settings.item_choice)
),
-- A period shorter than a day, or one that starts at a time of day, is not
-- made of whole days: its sales are summed from the rows themselves. Every
-- row counts for all segments, and with @by_segment also for its own.
counted AS (
  SELECT s.ts, CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE s.item END AS item,
         s.qty, s.amount, period_serial(s.ts, 'day', settings.zone) AS day, 'all segments' AS segment
  FROM settings, sales AS s
  WHERE NOT settings.whole_days
    AND (settings.item_choice IS NULL OR settings.item_choice = '*' OR s.item = settings.item_choice)
  UNION ALL
  SELECT s.ts, CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE s.item END,
         s.qty, s.amount, period_serial(s.ts, 'day', settings.zone), coalesce(segment, '(none)')
  FROM settings, sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment
  WHERE NOT settings.whole_days AND settings.by_segment = 1
    AND (settings.item_choice IS NULL OR settings.item_choice = '*' OR s.item = settings.item_choice)
),
-- Sales summed per period; only periods that have sales appear here. Periods of
-- whole days sum their days' totals.
totals AS (
  SELECT period_serial(c.period_start, settings.spec, settings.zone) AS serial, c.segment, c.item,
         sum(c.sales) AS sales, exact_sum(c.qty) AS qty, exact_sum(c.amount) AS amount,
         count(DISTINCT c.day) AS days_with_sales
  FROM settings, days, chosen AS c
  WHERE settings.whole_days AND c.day >= days.first_day AND c.day < days.after_day
  GROUP BY 1, 2, 3
  UNION ALL
  SELECT period_serial(c.ts, settings.spec, settings.zone) AS serial, c.segment, c.item,
         count(*) AS sales, exact_sum(c.qty) AS qty, exact_sum(c.amount) AS amount,
         count(DISTINCT c.day) AS days_with_sales
  FROM settings, days, counted AS c
  WHERE c.day >= days.first_day AND c.day < days.after_day
  GROUP BY 1, 2, 3
),
segments AS (
  SELECT 'all segments' AS segment
  UNION ALL
  SELECT DISTINCT segment FROM day_totals WHERE segment <> 'all segments' AND sales > 0
),
-- Every period of the range for every segment and item; the LEFT JOIN leaves the
-- empty ones NULL. A period's days are counted on the local calendar.
report AS (
  SELECT p.serial, p.label, g.segment, i.item,
         period_serial(p.period_end, 'day', settings.zone)
           - period_serial(p.period_start, 'day', settings.zone) AS days_in_period,
         min(period_serial(p.period_end, 'day', settings.zone), days.after_day)
           - max(period_serial(p.period_start, 'day', settings.zone), days.first_day) AS days_covered,
         coalesce(t.sales, 0) AS sales,
         coalesce(t.qty, 0) AS qty,
         round(coalesce(t.amount, 0), 2) AS amount,
         coalesce(t.days_with_sales, 0) AS days_with_sales,
         round(t.amount / t.days_with_sales, 2) AS amount_per_day,
         round(t.amount / t.sales, 2) AS mean_sale
  FROM settings, range, days, periods(range.start, range.stop, settings.spec, settings.zone) AS p
  CROSS JOIN segments AS g
  CROSS JOIN (SELECT DISTINCT item FROM chosen) AS i
  LEFT JOIN totals AS t ON t.serial = p.serial AND t.segment = g.segment AND t.item = i.item
),
-- A name that matches no item gets one row that says so and names the item
-- closest to it: the most letter pairs in common, ignoring case (Dice's
-- coefficient of the two sets of pairs), ties by name.
missing AS (
  SELECT settings.item_choice AS wanted FROM settings
  WHERE settings.item_choice IS NOT NULL AND settings.item_choice <> '*'
    AND NOT EXISTS (SELECT 1 FROM day_totals AS d
                    WHERE d.segment = 'all segments' AND d.item = settings.item_choice)
),
positions(k) AS (SELECT 1 UNION ALL SELECT k + 1 FROM positions WHERE k < 200),
name_pairs AS (
  SELECT n.item, substr(lower(n.item), positions.k, 2) AS pair
  FROM (SELECT DISTINCT item FROM day_totals WHERE segment = 'all segments' AND item IS NOT NULL) AS n,
       positions, missing
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
),
output AS (
  SELECT serial, label AS period, segment, item, days_in_period, days_covered,
         days_covered = days_in_period AS complete,
         sales, qty, amount, days_with_sales, amount_per_day, mean_sale
  FROM report
  WHERE @last IS NULL OR serial > (SELECT max(serial) FROM report) - @last
  UNION ALL
  SELECT NULL, NULL, NULL, closest.message, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL
  FROM closest
)
SELECT period, segment, item, days_in_period, days_covered, complete,
       sales, qty, amount, days_with_sales, amount_per_day, mean_sale
FROM output
ORDER BY serial IS NULL, serial, segment <> 'all segments', segment, item;
DROP VIEW temp.almanac_totals_segments;
