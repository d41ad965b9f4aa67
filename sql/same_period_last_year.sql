-- SPDX-License-Identifier: MIT
-- almanac report: each period beside the same period of the year before.
--
-- For weeks, "the same period last year" is the same ISO 8601 week number of
-- the previous ISO year (2025-W10 beside 2024-W10), not the week that holds
-- the date one year back: that way both weeks have the same weekdays and the
-- same place in the season. Most ISO years have 52 weeks, some 53, so the
-- counterpart is period_shift(week, -52, 'week') when that lands on the same
-- week number and period_shift(week, -53, 'week') otherwise; a week 53 whose
-- previous year has no week 53 has no counterpart (NULL). For every other
-- unit the counterpart is period_floor(period_shift(start, -12, 'month'), unit):
-- the same month, half-month or (fiscal) quarter one year earlier.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount)
--     ts      when the sale happened: an almanac time value, normally UTC text
--             'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item    TEXT, what was sold
--     qty     number of units sold (not used here)
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
--   @unit    'week', 'half-month', 'month', 'quarter', or a fiscal quarter
--            such as 'quarter starting october'           default 'week'
--   @start   first local day, "'YYYY-MM-DD'"             default: the day of the first sale
--   @stop    local day after the last one                default: the day after the last sale
--   @item    unset: all items together; '*': one row per item and period; a name: that item only
--   @last    show only the last N periods                default: every period
--
-- Columns:
--   period            the period's label (YYYY-Www for weeks)
--   item              the item, or 'all items'
--   amount            money received in the period (0 when no sales)
--   last_year_period  the label of the same period a year earlier
--   last_year_amount  its amount: 0 when it had no sales, NULL when it lies
--                     outside the range (no data to compare) or does not exist
--   change            amount - last_year_amount
--   change_pct        100 * change / last_year_amount (NULL when last year is 0 or NULL)
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/same_period_last_year.sql
WITH
settings AS (
  SELECT coalesce(@unit, 'week') AS spec, coalesce(@zone, 'UTC') AS zone, @item AS item_choice
),
chosen AS (
  SELECT s.ts, CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE s.item END AS item,
         s.amount, period_serial(s.ts, 'day', settings.zone) AS day
  FROM sales AS s, settings
  WHERE settings.item_choice IS NULL OR settings.item_choice = '*' OR s.item = settings.item_choice
),
range AS (
  SELECT coalesce(@start, min(period_floor(s.ts, 'day', settings.zone))) AS start,
         coalesce(@stop, max(period_end(s.ts, 'day', settings.zone))) AS stop
  FROM sales AS s, settings
),
totals AS (
  SELECT period_serial(c.ts, settings.spec, settings.zone) AS serial, c.item, exact_sum(c.amount) AS amount
  FROM chosen AS c, settings, range
  WHERE c.day >= period_serial(range.start, 'day', settings.zone)
    AND c.day < period_serial(range.stop, 'day', settings.zone)
  GROUP BY 1, 2
),
-- Every period of the range with its amount, 0 when it had no sales.
filled AS (
  SELECT p.serial, p.period_start, p.label, i.item, coalesce(t.amount, 0) AS amount
  FROM settings, range, periods(range.start, range.stop, settings.spec, settings.zone) AS p
  CROSS JOIN (SELECT DISTINCT item FROM chosen) AS i
  LEFT JOIN totals AS t ON t.serial = p.serial AND t.item = i.item
),
-- The start of each period's counterpart a year earlier. period_start is a
-- local date here (a zone and a unit of a day or longer), so the shifts are
-- plain calendar arithmetic and need no zone. An ISO week label is how a
-- week shows itself: YYYY-Www.
periods_with_last_year AS (
  SELECT DISTINCT p.serial, p.period_start, p.label,
         CASE WHEN p.label GLOB '[0-9][0-9][0-9][0-9]-W[0-9][0-9]' THEN
                CASE substr(p.label, 6)
                  WHEN substr(period_label(period_shift(p.period_start, -52, 'week'), 'week'), 6)
                    THEN period_shift(p.period_start, -52, 'week')
                  WHEN substr(period_label(period_shift(p.period_start, -53, 'week'), 'week'), 6)
                    THEN period_shift(p.period_start, -53, 'week')
                END
              ELSE period_floor(period_shift(p.period_start, -12, 'month'), settings.spec)
         END AS last_year_start
  FROM filled AS p, settings
),
report AS (
  SELECT f.serial, f.label AS period, f.item, f.amount,
         CASE WHEN y.last_year_start IS NOT NULL THEN
           coalesce(ly.label,
                    period_label(y.last_year_start, settings.spec))
         END AS last_year_period,
         ly.amount AS last_year_amount
  FROM filled AS f
  JOIN periods_with_last_year AS y ON y.serial = f.serial
  CROSS JOIN settings
  LEFT JOIN filled AS ly ON ly.period_start = y.last_year_start AND ly.item = f.item
)
SELECT period, item, round(amount, 2) AS amount, last_year_period,
       round(last_year_amount, 2) AS last_year_amount,
       round(amount - last_year_amount, 2) AS change,
       round(100.0 * (amount - last_year_amount) / nullif(last_year_amount, 0), 1) AS change_pct
FROM report
WHERE @last IS NULL OR serial > (SELECT max(serial) FROM report) - @last
ORDER BY serial, item;
