-- SPDX-License-Identifier: MIT
-- almanac report: totals and means per week, every week shown (ISO 8601 weeks,
-- Monday to Sunday, in the shop's time zone). A week without sales is a row of
-- zeros, not a missing row; its means are NULL (there is nothing to average).
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount)
--     ts      when the sale happened: an almanac time value, normally UTC text
--             'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item    TEXT, what was sold
--     qty     number of units sold
--     amount  money received for the sale
--   Other columns are ignored. A table with other names: put a view in front
--   of it in the same session (a temp view named sales is found before a
--   table main.sales, so it can also narrow one down):
--     CREATE TEMP VIEW sales AS
--       SELECT sold_at AS ts, product AS item, units AS qty, total AS amount FROM pos_export;
--     CREATE TEMP VIEW sales AS SELECT * FROM main.sales WHERE shop = 'Millrace';
--
-- Parameters (sqlite3 shell: .parameter set @name value; unset ones take the default;
-- a date needs both kinds of quotes, or the shell computes 2025-01-06 = 2018):
--   @zone    IANA time zone of the shop's calendar        default 'UTC'
--   @start   first local day reported, "'YYYY-MM-DD'"    default: the day of the first sale
--   @stop    local day after the last one reported       default: the day after the last sale
--   @item    unset: all items together; '*': one row per item and week; a name: that item only
--   @last    show only the last N weeks                  default: every week
--
-- Columns:
--   week             ISO week label, YYYY-Www
--   item             the item, or 'all items'
--   sales            number of sale rows              (0 when none)
--   qty              units sold                       (0 when none)
--   amount           money received, rounded to cents (0 when none)
--   days_with_sales  local days of the week with at least one sale (0 when none)
--   amount_per_day   amount / days_with_sales        (NULL when none)
--   mean_sale        amount / sales                  (NULL when none)
--   The first and last week can be partly outside the range: days_with_sales shows it.
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/totals_week.sql
WITH
settings AS (
  SELECT 'week' AS spec, coalesce(@zone, 'UTC') AS zone, @item AS item_choice
),
chosen AS (
  SELECT s.ts, CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE s.item END AS item,
         s.qty, s.amount, period_serial(s.ts, 'day', settings.zone) AS day
  FROM sales AS s, settings
  WHERE settings.item_choice IS NULL OR settings.item_choice = '*' OR s.item = settings.item_choice
),
-- The range is that of the whole table, also when one item is chosen, so every
-- item's rows cover the same periods.
range AS (
  SELECT coalesce(@start, min(period_floor(s.ts, 'day', settings.zone))) AS start,
         coalesce(@stop, max(period_end(s.ts, 'day', settings.zone))) AS stop
  FROM sales AS s, settings
),
-- Sales summed per period; only periods that have sales appear here.
totals AS (
  SELECT period_serial(c.ts, settings.spec, settings.zone) AS serial, c.item,
         count(*) AS sales, exact_sum(c.qty) AS qty, exact_sum(c.amount) AS amount,
         count(DISTINCT c.day) AS days_with_sales
  FROM chosen AS c, settings, range
  WHERE c.day >= period_serial(range.start, 'day', settings.zone)
    AND c.day < period_serial(range.stop, 'day', settings.zone)
  GROUP BY 1, 2
),
-- Every period of the range for every item; the LEFT JOIN leaves the empty ones NULL.
report AS (
  SELECT p.serial, p.label, i.item,
         coalesce(t.sales, 0) AS sales,
         coalesce(t.qty, 0) AS qty,
         round(coalesce(t.amount, 0), 2) AS amount,
         coalesce(t.days_with_sales, 0) AS days_with_sales,
         round(t.amount / t.days_with_sales, 2) AS amount_per_day,
         round(t.amount / t.sales, 2) AS mean_sale
  FROM settings, range, periods(range.start, range.stop, settings.spec, settings.zone) AS p
  CROSS JOIN (SELECT DISTINCT item FROM chosen) AS i
  LEFT JOIN totals AS t ON t.serial = p.serial AND t.item = i.item
)
SELECT label AS week, item, sales, qty, amount, days_with_sales, amount_per_day, mean_sale
FROM report
WHERE @last IS NULL OR serial > (SELECT max(serial) FROM report) - @last
ORDER BY serial, item;
