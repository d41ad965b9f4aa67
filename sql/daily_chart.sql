-- SPDX-License-Identifier: MIT
-- almanac report: the overlay chart. For the top items (or one chosen item),
-- the raw daily amount as a thin light line and its 7-day moving mean as a
-- thick line in the same colour, so the noise and the direction show at once.
-- Prints one complete SVG document; send it to a file.
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount [, segment])
--     ts      when the sale happened: an almanac time value, normally UTC text
--             'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item    TEXT, what was sold
--     qty     number of units sold (not used here)
--     amount  money received for the sale
--     segment optional: a shop, a channel, a category (see @by_segment)
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
--   @start   first local day, "'YYYY-MM-DD'"             default: @weeks before @stop
--   @weeks   without @start: how many weeks before @stop  default 13 (0: from the first sale)
--   @stop    local day after the last one                default: the day after the last sale
--   @item    one item to draw ('*': the @top items; a name that matches no item
--            stops the report naming the closest item)  default: the @top items by amount
--   @day_start  'HH:MM': business days that begin at that hour     default: midnight
--   @top     how many items, the largest amount first    default 3
--   @title   the chart's title                           default 'Amount per day and 7-day moving mean'
--   @width, @height  size in pixels                      default 960 x 400
--   @marks   with @item: local days to mark, comma-separated 'YYYY-MM-DD,YYYY-MM-DD'
--            (the days sql/anomalies.sql lists for that item), each drawn as a
--            thick stroke from 0 to the day's amount (a dot at 0 for a closed
--            day) in a series named 'unusual day'
--            default: none
--   @by_segment  1: one series per segment instead of per item: 'all segments'
--            and each segment, each the amount of every item (or of @item)
--            sold there; @top does not apply. The days are those of the whole
--            table, so the series share one axis                default 0
--
-- What is drawn: every local day of the range for each item, a day without
-- sales (a closed day) as 0, because that is what the till took. The smooth
-- line is moving_mean(amount, 7) OVER a frame of the day, the 3 before and the
-- 3 after (RANGE over the day serial, so it is 7 calendar days); it starts on
-- the 4th day and ends on the 4th day from the end, where the frame is whole.
--
-- Every day drawn is a whole day of the data's range: stray rows and rows
-- later than now are left out (data_range()), and the title says so when any
-- were. A day the range cuts is never drawn, so no partial period needs a mark.
--
-- Side effect: leaves the points in the temp table chart_points(item, serial,
-- day, layer, value), for a look with SELECT or a chart of your own.
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           shop.db < sql/daily_chart.sql > chart.svg
DROP TABLE IF EXISTS temp.chart_points;
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
-- Day totals per segment and item over the data's range, read in one pass
-- (period_totals), only days with sales: kept in a temp table for the chart's
-- points and for its order of items, and dropped at the end.
DROP TABLE IF EXISTS temp.almanac_chart_days;
CREATE TEMP TABLE almanac_chart_days AS
SELECT CASE WHEN t.all_segments = 0 THEN coalesce(t.segment, '(none)') END AS segment, t.item, t.serial,
       t.period_start, t.period_end, t.amount
FROM temp.almanac_range,
     period_totals('sales', 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC'),
                   json_extract(r, '$.start'), json_extract(r, '$.stop')) AS t
WHERE t.sales > 0 AND (t.all_segments = 1 OR coalesce(@by_segment, 0) = 1);
CREATE TEMP TABLE chart_points AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@by_segment, 0) AS by_segment,
         'day' || coalesce(' from 2000-01-01 ' || @day_start, '') AS day,
         (SELECT known_name(item, @item, 'item') FROM (SELECT DISTINCT item FROM temp.almanac_chart_days)) AS item
  WHERE refuse_parameter('@unit', @unit, 'daily_chart.sql draws days; it takes no @unit') IS NULL
),
-- 1,092 days of three items do not fit in 960 pixels: by default the chart
-- shows the last 13 weeks, where a day is still a few pixels wide.
range AS (
  SELECT coalesce(@start, CASE WHEN coalesce(@weeks, 13) = 0 THEN first
                               ELSE max(first, period_shift(stop, -coalesce(@weeks, 13), 'week')) END) AS start, stop
  FROM (SELECT json_extract(r, '$.start') AS first, coalesce(@stop, json_extract(r, '$.stop')) AS stop
        FROM temp.almanac_range)
),
-- The series a day counts for: its item; with @by_segment, 'all segments' and its own segment.
daily_sales AS (
  -- A day's takings in cents, so the smooth line is the mean of the amounts the raw line shows.
  SELECT d.serial, CASE WHEN settings.by_segment = 1 THEN coalesce(d.segment, 'all segments') ELSE d.item END AS item,
         round(exact_sum(d.amount), 2) AS amount
  FROM temp.almanac_chart_days AS d, settings, range
  WHERE (settings.item IS NULL OR settings.item = '*' OR d.item = settings.item)
    AND d.serial >= period_serial(range.start, settings.day, settings.zone)
    AND d.serial < period_serial(range.stop, settings.day, settings.zone) GROUP BY 1, 2
),
chosen AS (
  SELECT item FROM (SELECT d.item FROM daily_sales AS d, settings WHERE settings.by_segment <> 1
                     GROUP BY d.item ORDER BY exact_sum(d.amount) DESC, d.item LIMIT coalesce(@top, 3))
  UNION ALL
  SELECT DISTINCT d.item FROM daily_sales AS d, settings WHERE settings.by_segment = 1
),
daily AS (
  SELECT c.item, p.serial, period_label(p.period_start, settings.day, settings.zone) AS day,
         coalesce(t.amount, 0) AS amount
  FROM settings, range, periods(range.start, range.stop, settings.day, settings.zone) AS p
  CROSS JOIN chosen AS c
  LEFT JOIN daily_sales AS t ON t.serial = p.serial AND t.item = c.item
)
SELECT item, serial, day, 'raw' AS layer, amount AS value, 0 AS step FROM daily
UNION ALL
SELECT item, serial, day, 'smooth', moving_mean(amount, 7) OVER (PARTITION BY item ORDER BY serial
                                    RANGE BETWEEN 3 PRECEDING AND 3 FOLLOWING), 0 FROM daily
UNION ALL
-- A marked day: 0, the day's amount, then no value, which ends the stroke.
SELECT 'unusual day', d.serial, d.day, 'smooth', CASE s.step WHEN 1 THEN 0 WHEN 2 THEN d.amount END, s.step
FROM daily AS d
JOIN json_each('["' || replace(coalesce(@marks, ''), ',', '","') || '"]') AS m ON m.value = d.day
CROSS JOIN (SELECT 1 AS step UNION ALL SELECT 2 UNION ALL SELECT 3) AS s
WHERE @item IS NOT NULL AND @item <> '*';

-- Every item of the table, largest first: each item keeps its colour in every chart, whichever
-- items it shows. By segment: 'all segments', then the segments by name.
WITH series AS (
  SELECT 'all segments' AS name, 0 AS place WHERE coalesce(@by_segment, 0) = 1
  UNION ALL
  SELECT coalesce(segment, item), CASE WHEN segment IS NULL THEN -exact_sum(amount) ELSE 1 END
  FROM temp.almanac_chart_days WHERE (segment IS NOT NULL) = (coalesce(@by_segment, 0) = 1) GROUP BY 1
)
SELECT svg_line_chart(day, value, item, layer, json_object(
         'title', coalesce(@title, 'Amount per day and 7-day moving mean') || (SELECT CASE WHEN json_extract(r,
           '$.left_out') > 0 THEN ' (' || json_extract(r, '$.note') || ')' ELSE '' END FROM temp.almanac_range),
         'y_caption', 'amount per day', 'width', coalesce(@width, 960), 'height', coalesce(@height, 400),
         'series_order', (SELECT json_group_array(name) FROM (SELECT name FROM series ORDER BY place, name))))
FROM (SELECT * FROM temp.chart_points ORDER BY item, layer, serial, step);
DROP TABLE temp.almanac_chart_days;
DROP TABLE temp.almanac_range;
