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
--             base); for every other unit the period that holds the start
--             shifted back 12 months (the same month, half-month or quarter).
-- A base span is cut at the end of its period (a 31-day month elapsed against
-- a 30-day one), and a base span that the data does not cover entirely is not
-- compared at all (its figures and changes are NULL): a partial period is never
-- set against a whole one.
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
--                'quarter starting october', ...            default 'week'
--   @against     'previous', 'year', or unset for both
--   @start       first local day of the data, "'YYYY-MM-DD'" default: the day of the first sale
--   @stop        local day after the last one compared      default: the day after the last sale
--   @item        unset: all items together; '*': one row per item; a name: that item only
--                (a name that matches no item gives one row that names the closest item)
--   @by_segment  1: rows for each segment as well as for all segments   default 0
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
--   base_period            the base period's label
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
-- period_totals keys by item only: for @by_segment it reads this view, whose
-- item is [segment, item], so each segment's days are totalled on their own.
-- The NATURAL LEFT JOIN finds sales.segment when the table has one and
-- otherwise joins nothing, leaving segment NULL: one view for both shapes.
DROP VIEW IF EXISTS temp.almanac_compare_segments;
CREATE TEMP VIEW almanac_compare_segments AS
  SELECT s.ts, json_array(coalesce(segment, '(none)'), s.item) AS item, s.amount
  FROM sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment;
WITH
settings AS (
  SELECT coalesce(@unit, 'week') AS spec, coalesce(@zone, 'UTC') AS zone, @item AS item_choice,
         coalesce(@by_segment, 0) AS by_segment, @against AS against
),
-- Day totals per item, read in one pass without sorting the rows (period_totals):
-- 'all segments' from sales, and with @by_segment each segment from the view
-- above (a NULL source reads nothing); only days with sales. A span's amount is
-- the sum of its days' totals, its trading days the days listed.
day_totals AS MATERIALIZED (
  SELECT 'all segments' AS segment, t.item, t.serial AS day, t.period_start, t.period_end, t.amount
  FROM settings, period_totals('sales', 'day', settings.zone) AS t
  WHERE t.sales > 0
  UNION ALL
  SELECT json_extract(t.item, '$[0]'), json_extract(t.item, '$[1]'), t.serial, t.period_start, t.period_end,
         t.amount
  FROM settings, period_totals(CASE WHEN settings.by_segment = 1 THEN 'temp.almanac_compare_segments' END,
                               'day', settings.zone) AS t
  WHERE t.sales > 0
),
range AS (
  SELECT coalesce(@start, min(period_start)) AS start, coalesce(@stop, max(period_end)) AS stop
  FROM day_totals
  WHERE segment = 'all segments'
),
-- Local dates from here on: period starts and day serials are plain calendar
-- arithmetic on them (a local date's day serial is the same with or without
-- the zone), so no zone is needed.
latest AS (
  SELECT period_floor(period_shift(range.stop, -1, 'day'), settings.spec) AS start,
         period_serial(range.start, 'day') AS data_first, period_serial(range.stop, 'day') AS data_after
  FROM range, settings
),
bases AS (
  SELECT 'previous' AS against, period_shift(latest.start, -1, settings.spec) AS start
  FROM latest, settings
  WHERE settings.against IS NULL OR settings.against = 'previous'
  UNION ALL
  -- An ISO week label is how a week shows itself: YYYY-Www.
  SELECT 'year',
         CASE WHEN period_label(latest.start, settings.spec) GLOB '[0-9][0-9][0-9][0-9]-W[0-9][0-9]' THEN
                CASE substr(period_label(latest.start, settings.spec), 6)
                  WHEN substr(period_label(period_shift(latest.start, -52, 'week'), 'week'), 6)
                    THEN period_shift(latest.start, -52, 'week')
                  WHEN substr(period_label(period_shift(latest.start, -53, 'week'), 'week'), 6)
                    THEN period_shift(latest.start, -53, 'week')
                END
              ELSE period_floor(period_shift(latest.start, -12, 'month'), settings.spec)
         END
  FROM latest, settings
  WHERE settings.against IS NULL OR settings.against = 'year'
),
spans AS (
  SELECT b.against, latest.start, b.start AS base_start,
         period_serial(latest.start, 'day') AS first_day,
         period_serial(period_end(latest.start, settings.spec), 'day') AS end_day,
         latest.data_after - period_serial(latest.start, 'day') AS elapsed,
         period_serial(b.start, 'day') AS base_first_day,
         period_serial(period_end(b.start, settings.spec), 'day') AS base_end_day,
         latest.data_first, latest.data_after
  FROM bases AS b, latest, settings
),
windows AS (
  SELECT against, start, base_start, first_day, end_day, elapsed, base_first_day,
         min(base_first_day + elapsed, base_end_day) AS base_after_day,
         -- the base span counts only when the data covers all of it
         base_first_day >= data_first AND min(base_first_day + elapsed, base_end_day) <= data_after AS base_covered,
         data_after
  FROM spans
),
-- Only the days compared are kept.
in_spans AS (
  SELECT w.against, 'latest' AS side, c.segment, c.item, c.amount, c.day
  FROM windows AS w JOIN day_totals AS c ON c.day >= w.first_day AND c.day < w.data_after
  UNION ALL
  SELECT w.against, 'base', c.segment, c.item, c.amount, c.day
  FROM windows AS w JOIN day_totals AS c ON c.day >= w.base_first_day AND c.day < w.base_after_day
  WHERE w.base_covered
),
trading AS (
  SELECT against, side, segment, count(DISTINCT day) AS trading_days
  FROM in_spans GROUP BY 1, 2, 3
),
amounts AS (
  SELECT i.against, i.side, i.segment,
         CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE i.item END AS item,
         exact_sum(i.amount) AS amount
  FROM in_spans AS i, settings
  WHERE settings.item_choice IS NULL OR settings.item_choice = '*' OR i.item = settings.item_choice
  GROUP BY 1, 2, 3, 4
),
segments AS (
  SELECT 'all segments' AS segment
  UNION ALL
  SELECT DISTINCT segment FROM day_totals WHERE segment <> 'all segments'
),
items AS (
  SELECT DISTINCT CASE WHEN settings.item_choice IS NULL THEN 'all items' ELSE d.item END AS item
  FROM day_totals AS d, settings
  WHERE d.segment = 'all segments'
    AND (settings.item_choice IS NULL OR settings.item_choice = '*' OR d.item = settings.item_choice)
),
compared AS (
  SELECT g.segment, i.item, w.against, w.start, w.base_start, w.base_covered,
         w.end_day - w.first_day AS days_in_period, w.elapsed,
         w.base_after_day - w.base_first_day AS base_days,
         coalesce(now_amount.amount, 0) AS amount, coalesce(now_days.trading_days, 0) AS trading_days,
         CASE WHEN w.base_covered THEN coalesce(base_amount.amount, 0) END AS base_amount,
         CASE WHEN w.base_covered THEN coalesce(base_days.trading_days, 0) END AS base_trading_days
  FROM windows AS w
  CROSS JOIN segments AS g
  CROSS JOIN items AS i
  LEFT JOIN amounts AS now_amount ON now_amount.against = w.against AND now_amount.side = 'latest'
    AND now_amount.segment = g.segment AND now_amount.item = i.item
  LEFT JOIN trading AS now_days ON now_days.against = w.against AND now_days.side = 'latest'
    AND now_days.segment = g.segment
  LEFT JOIN amounts AS base_amount ON base_amount.against = w.against AND base_amount.side = 'base'
    AND base_amount.segment = g.segment AND base_amount.item = i.item
  LEFT JOIN trading AS base_days ON base_days.against = w.against AND base_days.side = 'base'
    AND base_days.segment = g.segment
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
  SELECT c.segment, c.item, period_label(c.start, settings.spec) AS period, c.days_in_period,
         c.elapsed AS days_covered, c.elapsed = c.days_in_period AS complete,
         c.start || '..' || period_shift(c.start, c.elapsed - 1, 'day') AS span,
         c.trading_days, round(c.amount, 2) AS amount,
         round(c.amount / nullif(c.trading_days, 0), 2) AS per_trading_day,
         c.against, period_label(c.base_start, settings.spec) AS base_period,
         c.base_start || '..' || period_shift(c.base_start, c.base_days - 1, 'day') AS base_span,
         c.base_trading_days, round(c.base_amount, 2) AS base_amount,
         round(c.base_amount / nullif(c.base_trading_days, 0), 2) AS base_per_trading_day,
         round(100.0 * (c.amount - c.base_amount) / nullif(c.base_amount, 0), 1) AS change_pct,
         round(100.0 * (c.amount / nullif(c.trading_days, 0) - c.base_amount / nullif(c.base_trading_days, 0))
               / nullif(c.base_amount / nullif(c.base_trading_days, 0), 0), 1) AS change_per_day_pct,
         0 AS message_row
  FROM compared AS c, settings
  UNION ALL
  SELECT NULL, closest.message, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL,
         NULL, NULL, NULL, NULL, 1
  FROM closest
)
SELECT segment, item, period, days_in_period, days_covered, complete, span, trading_days, amount,
       per_trading_day, against, base_period, base_span, base_trading_days, base_amount,
       base_per_trading_day, change_pct, change_per_day_pct
FROM output
ORDER BY message_row, segment <> 'all segments', segment, item, against <> 'previous';
DROP VIEW temp.almanac_compare_segments;
