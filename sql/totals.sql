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
WITH
settings AS (
  SELECT coalesce(@unit, 'week') AS spec, coalesce(@zone, 'UTC') AS zone, @item AS item_choice,
         coalesce(@by_segment, 0) AS by_segment
),
-- The NATURAL LEFT JOIN finds sales.segment when the table has one and
-- otherwise joins nothing, leaving segment NULL: one query for both shapes.
source AS (
  SELECT s.ts, s.item, s.qty, s.amount, segment
  FROM sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment
),
-- The range is that of the whole table, also when one item is chosen, so every
-- item's rows cover the same periods.
range AS (
  SELECT coalesce(@start, min(period_floor(src.ts, 'day', settings.zone))) AS start,
         coalesce(@stop, max(period_end(src.ts, 'day', settings.zone))) AS stop
  FROM source AS src, settings
),
days AS (
  SELECT period_serial(range.start, 'day', settings.zone) AS first_day,
         period_serial(range.stop, 'day', settings.zone) AS after_day
  FROM range, settings
),
chosen AS (
  SELECT src.ts, CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE src.item END AS item,
         src.qty, src.amount, period_serial(src.ts, 'day', settings.zone) AS day,
         coalesce(src.segment, '(none)') AS segment
  FROM source AS src, settings
  WHERE settings.item_choice IS NULL OR settings.item_choice = '*' OR src.item = settings.item_choice
),
-- Every row counts for all segments, and with @by_segment also for its own.
counted AS (
  SELECT c.ts, c.item, c.qty, c.amount, c.day, 'all segments' AS segment FROM chosen AS c
  UNION ALL
  SELECT c.ts, c.item, c.qty, c.amount, c.day, c.segment FROM chosen AS c, settings
  WHERE settings.by_segment = 1
),
-- Sales summed per period; only periods that have sales appear here.
totals AS (
  SELECT period_serial(c.ts, settings.spec, settings.zone) AS serial, c.segment, c.item,
         count(*) AS sales, exact_sum(c.qty) AS qty, exact_sum(c.amount) AS amount,
         count(DISTINCT c.day) AS days_with_sales
  FROM counted AS c, settings, days
  WHERE c.day >= days.first_day AND c.day < days.after_day
  GROUP BY 1, 2, 3
),
segments AS (
  SELECT 'all segments' AS segment
  UNION ALL
  SELECT DISTINCT coalesce(src.segment, '(none)') FROM source AS src, settings WHERE settings.by_segment = 1
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
    AND NOT EXISTS (SELECT 1 FROM source AS src WHERE src.item = settings.item_choice)
),
positions(k) AS (SELECT 1 UNION ALL SELECT k + 1 FROM positions WHERE k < 200),
name_pairs AS (
  SELECT n.item, substr(lower(n.item), positions.k, 2) AS pair
  FROM (SELECT DISTINCT item FROM source WHERE item IS NOT NULL) AS n, positions, missing
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
