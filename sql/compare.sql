-- SPDX-License-Identifier: MIT
-- almanac report: the latest period to date, compared like with like.
--
-- The latest period is the one that holds the last day of the range; it is
-- usually still running (data that ends on a Wednesday has three days of its
-- week). It is compared with two base periods over the same elapsed span:
--   previous  the period before it: its first N days, N the days elapsed now
--   year      the same period a year earlier, its first N days. For ISO weeks
--             that is the same ISO 8601 week number of the previous ISO year
--             (2025-W10 against 2024-W10: the same weekdays and the same place
--             in the season; a week 53 whose previous year has none has no
--             base); for retail units and fiscal quarters and years the
--             period of the same label in the previous retail (fiscal) year
--             (FY2026-P03 against FY2025-P03, FY2026-W10 against FY2025-W10;
--             a retail week 53 whose previous year has none has no base: its
--             base_period says so and its change is NULL); for every other
--             unit the period that holds the start shifted back 12 months
--             (the same month, half-month or quarter).
-- A base span is cut at the end of its period (a 31-day month elapsed against
-- a 30-day one), and a base span that the data does not cover entirely is not
-- compared at all (its figures and changes are NULL): a partial period is never
-- set against a whole one.
--
-- The latest period ends, by default, with the last whole day of the data:
-- a day still running (it holds the present moment) is left out, stray rows
-- and rows later than now too (data_range(); the last line of the output
-- says which range was used and what was left out). With @day_start '04:00'
-- every day counted here is a business day from 04:00 to 04:00, so the few
-- sales after midnight of a shop open late count for the day they belong to.
--
-- Trading days are the local days of a span on which the segment (all of them
-- for 'all segments') made at least one sale, of any item: a closed day is not
-- a trading day. Per-trading-day figures take out the closed days and the
-- weekday mix, so the change is given on both bases.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount [, segment])
--     ts       when the sale happened: an almanac time value, normally UTC text
--              'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item     TEXT, what was sold
--     qty      number of units sold (not used here)
--     amount   money received for the sale
--     segment  optional: a shop, a channel, a category — what @by_segment breaks
--              the comparison down by. A table without it works as it is.
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
--   @unit        a spec of a day or longer: 'week', 'half-month', 'month',
--                'quarter starting october', a retail unit such as
--                'retail month ending saturday nearest end of january', ...
--                                                            default 'week'
--   @against     'previous', 'year', or unset for both
--   @start       first local day of the data, "'YYYY-MM-DD'" default: the day of the first sale
--   @stop        local day after the last one compared      default: the day after the last sale
--   @item        unset: all items together; '*': one row per item; a name: that item only
--                (a name that matches no item stops the report with a message that
--                names the closest item, from known_name())
--   @by_segment  1: rows for each segment as well as for all segments   default 0
--   @day_start   'HH:MM': a business day begins at that hour     default: midnight
--                (not with a retail @unit: retail periods begin at midnight
--                and take no 'from', so the spec is refused)
--
-- Columns:
--   segment                'all segments', or with @by_segment = 1 also each segment
--   item                   the item, or 'all items'
--   period                 the latest period's label
--   days_in_period         its local calendar days
--   days_covered           of those, days up to the end of the range: the elapsed span
--   complete               1 when the latest period is whole, else 0
--   span                   the days compared, first..last ('2025-12-16..2025-12-28')
--   trading_days           days of the span with sales
--   amount                 money received in the span, rounded to cents
--   per_trading_day        amount / trading_days
--   against                'previous' or 'year'
--   base_period            the base period's label ('none: FY2023-W53 does not exist'
--                          for a retail week 53 without a base)
--   base_span              its days compared: the same number of days from its start
--   base_trading_days      days of the base span with sales
--   base_amount            money received in the base span
--   base_per_trading_day   base_amount / base_trading_days
--   change_pct             100 * (amount - base_amount) / base_amount
--   change_per_day_pct     the same change per trading day
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' -cmd '.headers on' shop.db < sql/compare.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment, @against AS against,
         'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
         coalesce(@unit, 'week') || coalesce(' from ' || period_floor('2000-01-03', coalesce(@unit, 'week'))
                                             || ' ' || @day_start, '') AS spec,
         'week' || coalesce(' from 2000-01-03 ' || @day_start, '') AS iso_week,
         coalesce(@start, json_extract(r, '$.start')) AS start, coalesce(@stop, json_extract(r, '$.whole_stop')) AS stop
  FROM temp.almanac_range
),
-- Day totals per segment and item, read in one pass (period_totals); only days
-- with sales. A span's amount is the sum of its days' totals, its trading days
-- the days listed.
days AS MATERIALIZED (
  SELECT CASE WHEN t.all_segments THEN 'all segments' ELSE coalesce(t.segment, '(none)') END AS segment,
         t.item, t.serial AS day, t.amount
  FROM settings, period_totals('sales', settings.day, settings.zone, settings.start, settings.stop) AS t
  WHERE (t.all_segments = 1 OR settings.by_segment = 1) AND t.sales > 0
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM days WHERE segment = 'all segments'),
latest AS (
  SELECT period_floor(period_of_serial(data_after - 1, s.day, s.zone), s.spec, s.zone) AS start, data_first, data_after
  FROM (SELECT period_serial(start, day, zone) AS data_first, period_serial(stop, day, zone) AS data_after
        FROM settings), settings AS s
),
-- The ISO week (the spec's periods are the calendar's weeks) is compared with
-- the week of the same number a year earlier, 52 or 53 weeks back.
bases AS (
  SELECT 'previous' AS against, period_shift(latest.start, -1, s.spec, s.zone) AS start, NULL AS wanted
  FROM latest, settings AS s
  WHERE s.against IS NULL OR s.against = 'previous'
  UNION ALL
  -- Retail and fiscal periods (labels FYyyyy, FYyyyy-Qn, -Pnn, -Wnn) are compared
  -- with the one of the same label in the year before: FY2026-W10 with FY2025-W10,
  -- found among the periods a year's worth of them back (52 or 53 retail weeks,
  -- 12 months, 4 quarters, 1 year). A week 53 whose year before has none has no base.
  SELECT 'year', CASE WHEN y.wanted IS NOT NULL THEN
                (SELECT b.start FROM (SELECT period_shift(latest.start, column1, s.spec, s.zone) AS start
                                      FROM (VALUES (-1), (-4), (-12), (-52), (-53))
                                      UNION ALL
                                      SELECT period_floor(period_shift(latest.start, -12, 'month', s.zone), s.spec, s.zone)) AS b
                 WHERE period_label(b.start, coalesce(@unit, 'week'), s.zone) = y.wanted LIMIT 1)
              WHEN period_floor(latest.start, s.iso_week, s.zone) = latest.start
                   AND period_end(latest.start, s.iso_week, s.zone) = period_end(latest.start, s.spec, s.zone) THEN
                CASE period_position(latest.start, 'week', 'year', s.zone)
                  WHEN period_position(period_shift(latest.start, -52, s.iso_week, s.zone), 'week', 'year', s.zone)
                    THEN period_shift(latest.start, -52, s.iso_week, s.zone)
                  WHEN period_position(period_shift(latest.start, -53, s.iso_week, s.zone), 'week', 'year', s.zone)
                    THEN period_shift(latest.start, -53, s.iso_week, s.zone)
                END
              ELSE period_floor(period_shift(latest.start, -12, 'month', s.zone), s.spec, s.zone)
         END, y.wanted
  FROM latest, settings AS s,
       (SELECT CASE WHEN label GLOB 'FY[0-9][0-9][0-9][0-9]*'
                    THEN printf('FY%04d', substr(label, 3, 4) - 1) || substr(label, 7) END AS wanted
        FROM (SELECT period_label(latest.start, coalesce(@unit, 'week'), s.zone) AS label
              FROM latest, settings AS s)) AS y
  WHERE s.against IS NULL OR s.against = 'year'
),
windows AS (
  SELECT *, min(base_first_day + elapsed, base_end_day) AS base_after_day,
         -- the base span counts only when the data covers all of it
         base_first_day >= data_first AND min(base_first_day + elapsed, base_end_day) <= data_after AS base_covered
  FROM (SELECT b.against, latest.start, b.start AS base_start, b.wanted, latest.data_first, latest.data_after,
               period_serial(latest.start, s.day, s.zone) AS first_day,
               period_serial(period_end(latest.start, s.spec, s.zone), s.day, s.zone) AS end_day,
               latest.data_after - period_serial(latest.start, s.day, s.zone) AS elapsed,
               period_serial(b.start, s.day, s.zone) AS base_first_day,
               period_serial(period_end(b.start, s.spec, s.zone), s.day, s.zone) AS base_end_day
        FROM bases AS b, latest, settings AS s)
),
-- Each day of a span, with the side it counts for (a base span ends before the latest starts).
in_spans AS (
  SELECT w.against, d.day >= w.first_day AS latest, d.segment, d.item, d.amount, d.day
  FROM windows AS w JOIN days AS d ON (d.day >= w.first_day AND d.day < w.data_after)
    OR (w.base_covered AND d.day >= w.base_first_day AND d.day < w.base_after_day)
),
-- Trading days count the days of every item of the segment; amounts only those of the items chosen.
trading AS (
  SELECT against, segment, count(DISTINCT CASE WHEN latest THEN day END) AS trading_days,
         count(DISTINCT CASE WHEN NOT latest THEN day END) AS base_trading_days
  FROM in_spans GROUP BY 1, 2
),
amounts AS (
  SELECT i.against, i.segment, CASE WHEN chosen.item IS NULL THEN 'all items' ELSE i.item END AS item,
         exact_sum(CASE WHEN latest THEN amount END) AS amount, exact_sum(CASE WHEN NOT latest THEN amount END) AS base
  FROM in_spans AS i, chosen WHERE chosen.item IS NULL OR chosen.item = '*' OR i.item = chosen.item GROUP BY 1, 2, 3
),
items AS (
  SELECT DISTINCT CASE WHEN chosen.item IS NULL THEN 'all items' ELSE d.item END AS item FROM days AS d, chosen
  WHERE d.segment = 'all segments' AND (chosen.item IS NULL OR chosen.item = '*' OR d.item = chosen.item)
),
compared AS (
  SELECT g.segment, i.item, w.against, w.start, w.base_start, w.wanted, w.end_day - w.first_day AS days_in_period, w.elapsed,
         w.base_after_day - w.base_first_day AS base_days, coalesce(a.amount, 0) AS amount,
         coalesce(t.trading_days, 0) AS trading_days, CASE WHEN w.base_covered THEN coalesce(a.base, 0) END AS base_amount,
         CASE WHEN w.base_covered THEN coalesce(t.base_trading_days, 0) END AS base_trading_days
  FROM windows AS w CROSS JOIN (SELECT DISTINCT segment FROM days) AS g CROSS JOIN items AS i
  LEFT JOIN trading AS t ON t.against = w.against AND t.segment = g.segment
  LEFT JOIN amounts AS a ON a.against = w.against AND a.segment = g.segment AND a.item = i.item
)
SELECT c.segment, c.item, period_label(c.start, coalesce(@unit, 'week'), s.zone) AS period, c.days_in_period,
       c.elapsed AS days_covered, c.elapsed = c.days_in_period AS complete,
       period_label(c.start, s.day, s.zone) || '..'
         || period_label(period_shift(c.start, c.elapsed - 1, s.day, s.zone), s.day, s.zone) AS span,
       c.trading_days, round(c.amount, 2) AS amount,
       round(c.amount / nullif(c.trading_days, 0), 2) AS per_trading_day,
       c.against, coalesce(period_label(c.base_start, coalesce(@unit, 'week'), s.zone),
                           'none: ' || c.wanted || ' does not exist') AS base_period,
       period_label(c.base_start, s.day, s.zone) || '..'
         || period_label(period_shift(c.base_start, c.base_days - 1, s.day, s.zone), s.day, s.zone) AS base_span,
       c.base_trading_days, round(c.base_amount, 2) AS base_amount,
       round(c.base_amount / nullif(c.base_trading_days, 0), 2) AS base_per_trading_day,
       round(100.0 * (c.amount - c.base_amount) / nullif(c.base_amount, 0), 1) AS change_pct,
       round(100.0 * (c.amount / nullif(c.trading_days, 0) - c.base_amount / nullif(c.base_trading_days, 0))
             / nullif(c.base_amount / nullif(c.base_trading_days, 0), 0), 1) AS change_per_day_pct
FROM compared AS c, settings AS s ORDER BY c.segment <> 'all segments', c.segment, c.item, c.against <> 'previous';
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
