-- SPDX-License-Identifier: MIT
-- almanac report: the data check. Lists the rows of sales that would stop a
-- report or mislead it, one row per finding, with the row's rowid and the
-- reason, so they can be fixed or left out in the view that maps the table:
--   time      ts does not read as a time value (valid_time(ts) = 0): every
--             report stops on it
--   amount    amount is TEXT that does not read as a number (valid_number):
--             every report stops on it ('1,050.00': read it with to_amount()
--             in the view); or amount is empty (NULL, or '' read by
--             to_amount): the sale counts, its money does not
--   stray     ts lies in a run of days far from the rest of the data (more
--             than 90 empty days and a quarter of the span away, data_range):
--             the reports leave it out and name it
--   future    ts is later than the present moment: left out and named too
--   short day the row's day has far fewer sales than its weekday's typical
--             day: under a quarter of the median of the same weekday over
--             the 8 weeks before and after (a till that stopped early, a day
--             cut by the export, sales after midnight of a shop open late:
--             see @day_start)
--
-- Reads a table or view named sales(ts, item, qty, amount [, segment]) as
-- the reports do, and its rowid: a view in front of a table passes it on as
-- a column named rowid (CREATE TEMP VIEW sales AS SELECT rowid, ... FROM export).
--
-- Parameters (sqlite3 shell: .parameter set @name value):
--   @zone        IANA time zone of the shop's calendar       default 'UTC'
--   @day_start   'HH:MM': business days that begin at that hour   default: midnight
--
-- Columns, in the order of the list above, then rowid:
--   rowid, ts, item, amount, check (the kind above), reason
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/data_check.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS
SELECT data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r
FROM sales WHERE valid_time(ts);
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, 'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
         json_extract(r, '$.start') AS start, json_extract(r, '$.stop') AS stop
  FROM temp.almanac_range
),
rows AS (
  SELECT s.rowid AS row_id, s.ts, s.item, s.amount, valid_time(s.ts) AS readable,
         CASE WHEN valid_time(s.ts) THEN period_serial(s.ts, settings.day, settings.zone) END AS day
  FROM sales AS s, settings
),
-- Sales per day of the kept range (counted from the rows: period_totals would
-- stop on the amounts this check is there to find).
day_sales AS (
  SELECT r.day, count(*) AS sales,
         period_label(period_of_serial(r.day, s.day, s.zone), s.day, s.zone) AS label,
         period_position(period_of_serial(r.day, s.day, s.zone), 'day', 'week', s.zone) AS weekday
  FROM rows AS r, settings AS s
  WHERE r.day >= period_serial(s.start, s.day, s.zone) AND r.day < period_serial(s.stop, s.day, s.zone)
  GROUP BY r.day
),
short_days AS (
  SELECT day, label, sales, typical
  FROM (SELECT day, label, sales, median(sales) OVER (PARTITION BY weekday ORDER BY day
                                                      ROWS BETWEEN 8 PRECEDING AND 8 FOLLOWING EXCLUDE CURRENT ROW)
                                    AS typical,
               count(*) OVER (PARTITION BY weekday ORDER BY day ROWS BETWEEN 8 PRECEDING AND 8 FOLLOWING) AS around
        FROM day_sales)
  WHERE around > 8 AND 4 * sales < typical
),
findings AS (
  SELECT 1 AS k, row_id, ts, item, amount, 'time' AS "check",
         'ts = ' || quote(ts) || ' is not a time value: every report stops on it' AS reason
  FROM rows WHERE NOT readable AND ts IS NOT NULL
  UNION ALL
  SELECT 2, row_id, ts, item, amount, 'amount',
         CASE WHEN amount IS NULL OR amount = '' THEN 'the amount is empty: the sale counts, its money does not'
              ELSE 'amount = ' || quote(amount) || ' is not a number: every report stops on it '
                   || '(money written as text is read with to_amount() in the view)' END
  FROM rows WHERE amount IS NULL OR amount = '' OR NOT valid_number(amount)
  UNION ALL
  SELECT 3, row_id, ts, item, amount, CASE WHEN julianday(ts, 'auto') > julianday('now') THEN 'future' ELSE 'stray' END,
         CASE WHEN julianday(ts, 'auto') > julianday('now') THEN 'later than now: left out of every report'
              ELSE 'far from the rest of the data (' || json_extract(r, '$.first_day') || '..'
                   || json_extract(r, '$.last_day') || '): left out of every report' END
  FROM rows, settings, temp.almanac_range
  WHERE readable AND (rows.day < period_serial(settings.start, settings.day, settings.zone)
                      OR rows.day >= period_serial(settings.stop, settings.day, settings.zone))
  UNION ALL
  SELECT 4, row_id, ts, item, amount, 'short day',
         'the day ' || d.label || ' has ' || d.sales || ' sales where its weekday typically has ' || d.typical
           || ': a partial day? (@day_start makes days begin later)'
  FROM rows JOIN short_days AS d USING (day)
)
SELECT row_id AS rowid, ts, item, amount, "check", reason FROM findings ORDER BY k, row_id;
DROP TABLE temp.almanac_range;
