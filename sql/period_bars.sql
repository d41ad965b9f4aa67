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
--   @item        one item only ('*' or unset: all items; a name that matches no
--                item stops the report naming the closest item)  default: all items
--   @day_start   'HH:MM': periods of business days that begin at that hour
--   @by_segment  1: one bar per segment                      default 0
--   @title, @width, @height                                  default 'Amount per period', 960 x 360
--
-- A period only partly inside the data's range (the latest week, still running,
-- or a month the data starts in) is drawn as its own series, named
-- '<segment> (partial period)', so its bar has its own colour and the legend
-- says what it is: a short bar there is not a bad week. The range is that of
-- the data without stray rows and rows later than now (data_range()); when
-- any were left out, the title says so. @start is refused: the chart ends with
-- the data and goes back @last periods.
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           shop.db < sql/period_bars.sql > weekly.svg
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
WITH
settings AS (
  SELECT *, period_shift(period_floor(stop, spec, zone), 1 - last, spec, zone) AS start
  FROM (SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@last, 13) AS last, coalesce(@by_segment, 0) AS by_segment,
               coalesce(@unit, 'week') || coalesce(' from ' || period_floor('2000-01-03', coalesce(@unit, 'week'))
                                                   || ' ' || @day_start, '') AS spec,
               coalesce(@stop, json_extract(r, '$.stop')) AS stop,
               iif(json_extract(r, '$.left_out') > 0, ' (' || json_extract(r, '$.note') || ')', '') AS left_out
        FROM temp.almanac_range
        WHERE refuse_parameter('@start', @start, 'period_bars.sql draws the last @last periods; set @last') IS NULL)
),
-- Period totals per segment and item, read in one pass (period_totals); an
-- empty period is a row of 0.
totals AS MATERIALIZED (
  SELECT CASE WHEN t.all_segments = 0 THEN coalesce(t.segment, '(none)') ELSE 'all segments' END AS segment,
         t.all_segments, t.item, t.period_start, t.amount,
         t.covered_start <> t.period_start OR t.covered_end <> t.period_end AS partial
  FROM settings, period_totals('sales', settings.spec, settings.zone, settings.start, settings.stop) AS t
  WHERE t.all_segments = 1 OR settings.by_segment = 1
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM totals WHERE all_segments = 1),
bars AS (
  SELECT t.period_start, t.segment || CASE WHEN t.partial THEN ' (partial period)' ELSE '' END AS series,
         exact_sum(t.amount) AS amount
  FROM totals AS t, chosen
  WHERE (chosen.item IS NULL OR chosen.item = '*' OR t.item = chosen.item)
    -- by segment: the segments' rows, or all segments for a table without a segment column
    AND t.all_segments = (SELECT CASE WHEN settings.by_segment = 1 THEN min(all_segments) ELSE 1 END
                          FROM totals, settings) GROUP BY t.period_start, t.segment, t.partial
)
SELECT svg_bar_chart(period_start, round(amount, 2), series,
                     json_object('title', coalesce(@title, 'Amount per period') || settings.left_out,
                                 'y_caption', 'amount', 'period', settings.spec,
                                 'width', coalesce(@width, 960), 'height', coalesce(@height, 360)))
-- Bars in period order, segments by name within a period: the same SVG on every run.
FROM (SELECT * FROM bars ORDER BY period_start, series) AS bars, settings;
DROP TABLE temp.almanac_range;
