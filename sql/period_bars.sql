-- SPDX-License-Identifier: MIT
-- almanac report: the totals of the last periods as a bar chart, one bar per
-- period (and per segment with @by_segment 1), each bar inside its period on
-- the calendar axis; a period without sales is a bar of 0, not a gap.
-- Prints one complete SVG document; send it to a file.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount [, segment])
--     ts       when the sale happened: an almanac time value, normally UTC text
--              'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item     TEXT, what was sold (with @item, only that item is counted)
--     qty      number of units sold (not used here)
--     amount   money received for the sale
--     segment  optional: a shop, a channel, a category; @by_segment 1 draws one
--              bar per segment and period instead of one for all
--   Other columns are ignored; a temp view named sales can rename or narrow
--   a table (see sql/totals.sql).
--
-- Your data (README, "Your data"): ts holds UTC instants; @zone only chooses the
-- calendar. An export written in local time is converted once, in the view,
-- with to_time(text, format, zone): left as it is, @zone would shift every
-- local time a second time. Money and quantities written as text ('$1,050.00')
-- are read with to_amount() in the view: the report adds with exact_sum() and
-- stops on text it cannot read, where SQLite's sum() would count '1,050.00' as 1.
--
-- Parameters (sqlite3 shell: .parameter set @name value; unset ones take the default):
--   @zone        IANA time zone of the shop's calendar       default 'UTC'
--   @unit        any period spec of a day or longer          default 'week'
--   @last        how many periods, ending with the latest    default 13
--   @item        one item only                               default: all items
--   @by_segment  1: one bar per segment                      default 0
--   @title, @width, @height                                  default 'Amount per period', 960 x 360
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           shop.db < sql/period_bars.sql > weekly.svg
-- period_totals keys by item only: for @by_segment it reads this view, whose
-- item is [segment, item], so each segment's days are totalled on their own.
-- The NATURAL LEFT JOIN finds sales.segment when the table has one and
-- otherwise joins nothing, leaving segment NULL (sql/totals.sql does the same).
DROP VIEW IF EXISTS temp.almanac_bars_segments;
CREATE TEMP VIEW almanac_bars_segments AS
  SELECT s.ts, json_array(coalesce(segment, '(none)'), s.item) AS item, s.amount
  FROM sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment;
WITH
settings AS (
  SELECT spec, zone, last, by_segment,
         -- Periods of whole local days: not those of hours, minutes or seconds,
         -- nor periods that start at a time of day ('week from 2024-01-15 06:00').
         NOT (lower(spec) GLOB '*hour*' OR lower(spec) GLOB '*minute*' OR lower(spec) GLOB '*second*'
              OR replace(upper(spec), ' ', '') GLOB 'PT*' OR spec GLOB '*:*') AS whole_days
  FROM (SELECT coalesce(@unit, 'week') AS spec, coalesce(@zone, 'UTC') AS zone, coalesce(@last, 13) AS last,
               coalesce(@by_segment, 0) AS by_segment)
),
-- Day totals per item, read in one pass without sorting the rows
-- (period_totals), from sales or, with @by_segment, from the view above; only
-- the chosen item's days with sales.
days AS MATERIALIZED (
  SELECT CASE WHEN settings.by_segment = 1 THEN json_extract(t.item, '$[0]') ELSE 'all segments' END AS segment,
         t.serial, t.period_start, t.period_end, t.amount
  FROM settings,
       period_totals(CASE WHEN settings.by_segment = 1 THEN 'temp.almanac_bars_segments' ELSE 'sales' END,
                     'day', settings.zone) AS t
  WHERE t.sales > 0
    AND (@item IS NULL OR CASE WHEN settings.by_segment = 1 THEN json_extract(t.item, '$[1]') ELSE t.item END = @item)
),
range AS (
  SELECT period_shift(period_floor(max(days.period_end), settings.spec), 1 - settings.last, settings.spec) AS start,
         max(days.period_end) AS stop
  FROM days, settings
),
-- A period of whole days sums its days' totals; one that is not (a spec of
-- hours, or one starting at a time of day) sums the rows themselves.
source AS (
  SELECT s.ts, s.item, s.amount, CASE WHEN settings.by_segment = 1 THEN coalesce(segment, '(none)')
                                      ELSE 'all segments' END AS segment
  FROM settings, sales AS s NATURAL LEFT JOIN (SELECT NULL AS segment) AS no_segment
  WHERE NOT settings.whole_days AND (@item IS NULL OR s.item = @item)
),
totals AS (
  SELECT period_serial(d.period_start, settings.spec, settings.zone) AS serial, d.segment,
         exact_sum(d.amount) AS amount
  FROM settings, range, days AS d
  WHERE settings.whole_days AND d.serial >= period_serial(range.start, 'day', settings.zone)
  GROUP BY 1, 2
  UNION ALL
  SELECT period_serial(src.ts, settings.spec, settings.zone) AS serial, src.segment,
         exact_sum(src.amount) AS amount
  FROM settings, range, source AS src
  WHERE period_serial(src.ts, 'day', settings.zone) >= period_serial(range.start, 'day', settings.zone)
  GROUP BY 1, 2
),
bars AS (
  SELECT p.period_start, g.segment, coalesce(t.amount, 0) AS amount
  FROM settings, range, periods(range.start, range.stop, settings.spec, settings.zone) AS p
  CROSS JOIN (SELECT DISTINCT segment FROM days) AS g
  LEFT JOIN totals AS t ON t.serial = p.serial AND t.segment = g.segment
)
SELECT svg_bar_chart(period_start, round(amount, 2), segment,
                     json_object('title', coalesce(@title, 'Amount per period'),
                                 'y_caption', 'amount', 'period', settings.spec,
                                 'width', coalesce(@width, 960), 'height', coalesce(@height, 360)))
-- Bars in period order, segments by name within a period: the same SVG on every run.
FROM (SELECT * FROM bars ORDER BY period_start, segment) AS bars, settings
-- A name that matches no item prints the one row below instead of a chart.
HAVING @item IS NULL OR @item = '*' OR EXISTS (SELECT 1 FROM sales AS s WHERE s.item = @item);

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
SELECT message
FROM closest;
DROP VIEW temp.almanac_bars_segments;
