-- SPDX-License-Identifier: MIT
-- almanac report: the weekday profile. How a typical Monday, Tuesday, ...
-- compares with the rest of the week, in the shop's local calendar.
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
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, @item AS item_choice
),
chosen AS (
  SELECT s.ts, CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE s.item END AS item,
         s.qty, s.amount, period_serial(s.ts, 'day', settings.zone) AS day
  FROM sales AS s, settings
  WHERE settings.item_choice IS NULL OR settings.item_choice = '*' OR s.item = settings.item_choice
),
range AS (
  SELECT coalesce(@start, min(period_floor(s.ts, 'day', settings.zone))) AS start,
         coalesce(@stop, max(period_end(s.ts, 'day', settings.zone))) AS stop
  FROM sales AS s, settings
),
daily_sales AS (
  SELECT c.day AS serial, c.item, exact_sum(c.qty) AS qty, exact_sum(c.amount) AS amount
  FROM chosen AS c, settings, range
  WHERE c.day >= period_serial(range.start, 'day', settings.zone)
    AND c.day < period_serial(range.stop, 'day', settings.zone)
  GROUP BY 1, 2
),
-- Every day of the range for every item. Day serial 0 is 1970-01-01, a
-- Thursday, so (serial + 3) mod 7 counts from Monday = 0 (the outer + 7 keeps
-- days before 1970 positive).
daily AS (
  SELECT i.item, ((p.serial + 3) % 7 + 7) % 7 AS weekday,
         t.serial AS sold, t.qty, t.amount
  FROM settings, range, periods(range.start, range.stop, 'day', settings.zone) AS p
  CROSS JOIN (SELECT DISTINCT item FROM chosen) AS i
  LEFT JOIN daily_sales AS t ON t.serial = p.serial AND t.item = i.item
),
profile AS (
  SELECT item, weekday, count(*) AS days, count(sold) AS days_with_sales,
         coalesce(exact_sum(qty), 0) AS qty, coalesce(exact_sum(amount), 0) AS amount,
         avg(amount) AS mean, median(amount) AS median
  FROM daily
  GROUP BY item, weekday
),
overall AS (
  SELECT item, exact_sum(amount) AS amount, exact_sum(amount) / exact_sum(days_with_sales) AS mean_day
  FROM profile
  GROUP BY item
)
SELECT CASE p.weekday WHEN 0 THEN 'Monday' WHEN 1 THEN 'Tuesday' WHEN 2 THEN 'Wednesday'
         WHEN 3 THEN 'Thursday' WHEN 4 THEN 'Friday' WHEN 5 THEN 'Saturday' ELSE 'Sunday' END AS weekday,
       p.item, p.days, p.days_with_sales, p.qty,
       round(p.amount, 2) AS amount,
       round(100.0 * p.amount / o.amount, 1) AS share_pct,
       round(p.mean, 2) AS mean_per_day,
       round(p.median, 2) AS median_per_day,
       round(100.0 * p.mean / o.mean_day, 1) AS "index"
FROM profile AS p JOIN overall AS o USING (item)
ORDER BY p.item, p.weekday;
