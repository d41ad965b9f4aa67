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
--                'quarter starting october', '2 weeks', a retail unit such
--                as 'retail month ending saturday nearest end of january'
--                (labels FY2026-P03), ...                    default 'week'
--   @start       first local day reported, "'YYYY-MM-DD'"   default: the day of the first sale
--   @stop        local day after the last one reported      default: the day after the last sale
--   @item        unset: all items together; '*': one row per item; a name: that item only
--                (a name that matches no item stops the report with a message that
--                names the closest item, from known_name())
--   @last        show only the last N periods               default: every period
--   @by_segment  1: rows for each segment as well as for all segments   default 0
--   @day_start   'HH:MM': a business day begins at that hour ('04:00' counts
--                a sale at 00:45 in the day before); periods start at it too
--                (not with a retail @unit: retail periods begin at midnight
--                and take no 'from', so the spec is refused)
--                                                            default: midnight
--
-- The range: [@start, @stop) when given; by default the local days from the
-- first sale to the last, without stray rows (a run of days separated from
-- the rest by more than 90 empty days and a quarter of the span: a till with
-- a reset clock) and without rows later than now (data_range()). The last
-- line of the output says which range was used and what was left out.
-- A period only partly inside the range (the first and last often are) is
-- listed with its coverage: days_covered and complete.
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
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment,
         'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
         coalesce(@unit, 'week') || coalesce(' from ' || period_floor('2000-01-03', coalesce(@unit, 'week'))
                                             || ' ' || @day_start, '') AS spec,
         coalesce(@start, json_extract(r, '$.start')) AS start, coalesce(@stop, json_extract(r, '$.stop')) AS stop
  FROM temp.almanac_range
),
-- Periods made of whole days are summed from day totals, so each also counts
-- its days with sales; a period of hours, or one that starts at a time of
-- day the days do not, is read at its own spec. Only one of the two reads
-- the rows: the other's source is NULL, which reads nothing.
shape AS (
  SELECT *, period_floor(probe, day, zone) = probe AS whole_days
  FROM (SELECT *, period_floor('2000-01-03 12:34:56', spec, zone) AS probe FROM settings)
),
totals AS MATERIALIZED (
  SELECT t.all_segments, t.segment, t.item, t.period_start, t.covered_start, t.covered_end, t.sales, t.qty, t.amount,
         t.serial AS day, period_serial(t.period_start, shape.spec, shape.zone) AS period
  FROM shape, period_totals(CASE WHEN shape.whole_days THEN 'sales' END, shape.day, shape.zone,
                            shape.start, shape.stop) AS t
  WHERE t.all_segments = 1 OR shape.by_segment = 1
  UNION ALL
  SELECT t.all_segments, t.segment, t.item, t.period_start, t.covered_start, t.covered_end, t.sales, t.qty, t.amount,
         period_serial(t.period_start, shape.day, shape.zone), t.serial
  FROM shape, period_totals(CASE WHEN NOT shape.whole_days THEN 'sales' END, shape.spec, shape.zone,
                            shape.start, shape.stop) AS t
  WHERE t.all_segments = 1 OR shape.by_segment = 1
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM totals WHERE all_segments = 1),
per_period AS (
  SELECT t.period, CASE WHEN t.all_segments THEN 'all segments' ELSE coalesce(t.segment, '(none)') END AS segment,
         CASE WHEN chosen.item IS NULL THEN 'all items' ELSE t.item END AS item,
         min(t.period_start) AS first_start, min(t.covered_start) AS covered_start, max(t.covered_end) AS covered_end,
         sum(t.sales) AS sales, exact_sum(t.qty) AS qty, exact_sum(t.amount) AS amount,
         count(DISTINCT CASE WHEN t.sales > 0 THEN t.day END) AS days_with_sales
  FROM totals AS t, chosen
  WHERE chosen.item IS NULL OR chosen.item = '*' OR t.item = chosen.item GROUP BY 1, 2, 3
)
-- A period's days are counted on the local calendar (of business days, with @day_start).
SELECT period_label(t.first_start, coalesce(@unit, 'week'), s.zone) AS period, t.segment, t.item,
       period_serial(period_end(t.first_start, s.spec, s.zone), s.day, s.zone)
         - period_serial(period_floor(t.first_start, s.spec, s.zone), s.day, s.zone) AS days_in_period,
       period_serial(t.covered_end, s.day, s.zone) - period_serial(t.covered_start, s.day, s.zone) AS days_covered,
       t.covered_start = period_floor(t.first_start, s.spec, s.zone)
         AND t.covered_end = period_end(t.first_start, s.spec, s.zone) AS complete,
       t.sales, t.qty, round(t.amount, 2) AS amount, t.days_with_sales,
       round(t.amount / nullif(t.days_with_sales, 0), 2) AS amount_per_day,
       round(t.amount / nullif(t.sales, 0), 2) AS mean_sale
FROM per_period AS t, shape AS s
WHERE @last IS NULL OR t.period > (SELECT max(period) FROM per_period) - @last
ORDER BY t.period, t.segment <> 'all segments', t.segment, t.item;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
