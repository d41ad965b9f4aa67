-- SPDX-License-Identifier: MIT
-- almanac report: the trend table. Which items are rising, which falling,
-- which just noisy — judged so that a season is not taken for a trend.
--
-- Per item, the weekly amounts (every whole ISO week of the range, a week
-- without sales counted as 0) are judged with the Mann-Kendall test
-- (mann_kendall_p) and measured with the Sen slope (theil_sen_slope), both
-- robust: they use the order of the weeks, not the size of their swings, so
-- one promotion week or one closed week cannot make a trend.
--
-- The seasonal test. When the range holds at least two whole years (104
-- whole weeks), the test and the slope are seasonal (Hirsch, Slack & Smith
-- 1982): the season is the ISO week number, period_position(week, 'week',
-- 'year'), so week 40 is compared only with week 40 of the other years.
-- Why the week number and not the month of the week: every pair it compares
-- is a whole year apart, so the season cancels exactly — with months, weeks
-- of the same month and year are compared too, and for an item that starts
-- or stops selling within a month (pumpkin loaf in September) those pairs
-- measure the season's ramp, not growth. The price is few points per
-- season, which is why two whole years are needed. For the Sen slope, the
-- weeks of the year in which the item never sold (in no year of the range)
-- are left out: their pairs are 0 = 0 and would pull the median to 0 for an
-- item sold three months a year; pct_per_year is then growth of the weeks
-- in which the item trades.
-- With less than two whole years the test is the plain one over all weeks:
-- it cannot tell a season from a trend, so for a seasonal item the verdict
-- describes the part of its season the range holds (an autumn item judged
-- on July to November is "rising"). Read such verdicts with the shape column.
--
-- Money at its resolution. The weekly amounts are rounded to @resolution
-- (default 0.01, cents) before the test and the slope compare them: sums of
-- binary fractions are not exact, so 869.40 in one week and
-- 869.4000000000001 in the same week of another year would count as a rise
-- and move the p-value, although both are 869.40. The test compares whole
-- multiples of @resolution (round(amount / @resolution)); the slopes are
-- given in money again.
--
-- The season beside the trend. season_strength is the strength of the
-- yearly season of Wang, Smith & Hyndman (2006), max(0, 1 - var(noise) /
-- var(season + noise)), from the weekly amounts decomposed with cycle year
-- (period_decomposition, STL): 0 when the weeks swing no more than noise,
-- near 1 when the swings are the season. From 0.9 on the season dominates
-- and the verdict says so: 'rising, strongly seasonal', 'no clear trend,
-- strongly seasonal'. Why so high: with few years each week of the year has
-- only a few values, and the season part takes up part of the noise too
-- (on three years, items without a season still show about 0.7); the
-- demo's seasonal items, whose season swings far more than their noise,
-- show 0.93 to 1.0. It needs two whole years of weeks (NULL below, and the
-- verdict says nothing of the season then).
--
-- Reads a table or view named sales:
--   sales(ts, item, qty, amount [, segment])
--     ts      when the sale happened: an almanac time value, normally UTC text
--             'YYYY-MM-DD HH:MM:SS' as point-of-sale exports write it
--     item    TEXT, what was sold
--     qty     number of units sold (not used here)
--     amount  money received for the sale (added with exact_sum)
--     segment optional: a shop, a channel, a category (see @by_segment)
--   Other columns are ignored. A table with other names: put a view in front
--   of it in the same session (a temp view named sales is found before a
--   table main.sales, so it can also narrow one down):
--     CREATE TEMP VIEW sales AS
--       SELECT sold_at AS ts, product AS item, units AS qty, total AS amount FROM pos_export;
--   To measure units instead of money: CREATE TEMP VIEW sales AS
--       SELECT ts, item, qty, qty AS amount FROM main.sales;
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
--   @zone         IANA time zone of the shop's calendar     default 'UTC'
--   @start        first local day, "'YYYY-MM-DD'"          default: the day of the first sale
--   @stop         local day after the last one             default: the day after the last sale
--   @spark_weeks  weeks per sparkline character            default 4
--   @by_segment   1: a first column segment, and the table of each segment
--                 (computed on that segment's rows alone: its own range, weeks
--                 and test) after the one of 'all segments' ('(none)' for rows
--                 whose segment is NULL)                  default 0
--   @item         unset or '*': every item; a name: that item's row only (a name
--                 that matches no item stops the report naming the closest item)
--   @day_start    'HH:MM': weeks of business days that begin at that hour
--   @resolution   the money's resolution: amounts are compared in whole
--                 multiples of it (see above)             default 0.01
--   Whole periods only: only whole ISO weeks (Monday to Sunday) inside the
--   range are used (covered_start = period_start and covered_end = period_end
--   in period_totals): a week cut by either end would look like a drop.
--   The range: [@start, @stop) when given; by default each segment's own
--   days from its first sale to its last, without stray rows (a run of days
--   more than 90 empty days and a quarter of the span away from the rest) and
--   rows later than now, which are left out of every segment (data_range());
--   the last line of the output says which range was used and what was left out.
--   @unit and @last make no sense here and are refused.
--
-- The verdict rule:
--   'too few periods'  fewer than 10 whole weeks: the normal approximation
--                      behind the p-value is commonly used from n = 10 on;
--   'rising'/'falling' p_value < 0.05, in the direction of the Sen slope
--                      (of the least-squares slope when the Sen slope is 0);
--   'no clear trend'   otherwise, and when the test has no variance (every
--                      week the same amount);
--   ', strongly seasonal' follows the verdict when season_strength >= 0.9.
--
-- Columns, one row per item, rising items first:
--   item
--   verdict          see the rule above
--   pct_per_year     (365.2425/7) * sen_slope / the mean of the weeks the slope
--                    used, in percent: a year of the Sen slope next to the
--                    typical week in which the item trades
--   p_value          two-sided p-value of the (seasonal) Mann-Kendall test,
--                    rounded to 4 places (0.0: below 0.00005)
--   test             'seasonal (ISO week)' or 'plain' (less than two whole years)
--   weeks            whole weeks in the range
--   mean_per_week    mean weekly amount over those weeks (a week without sales as 0),
--                    the same number as in sql/noise_ranking.sql
--   sen_slope        Sen slope: change of the weekly amount per week
--   ls_slope         least-squares slope, regr_slope, for comparison: a
--                    season or one wild week can pull it far from the Sen slope
--   season_strength  strength of the yearly season (see above), 2 places;
--                    NULL with less than two whole years
--   shape            sparkline of the weekly amounts, one character per
--                    @spark_weeks weeks (their mean), oldest first
--
-- Run:
--   sqlite3 -cmd '.load build/almanac' -cmd '.parameter set @zone America/Denver' \
--           -cmd '.mode column' shop.db < sql/trend.sql
DROP TABLE IF EXISTS temp.almanac_range;
CREATE TEMP TABLE almanac_range AS SELECT
  data_range(ts, amount, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC')) AS r FROM sales;
-- The rows of the range for period_decomposition, each sale's ts moved to
-- the start of its (business) day: the decomposition's weeks are weeks of
-- calendar days, and a business day that begins at @day_start is the
-- calendar day of its start.
DROP TABLE IF EXISTS temp.almanac_parts_sales;
CREATE TEMP TABLE almanac_parts_sales AS
SELECT s.* FROM sales AS s, temp.almanac_range AS g
WHERE period_label(s.ts, 'day' || coalesce(' from 2000-01-01 ' || @day_start, ''), coalesce(@zone, 'UTC'))
      BETWEEN coalesce(@start, json_extract(g.r, '$.start'))
          AND date(coalesce(@stop, json_extract(g.r, '$.stop')), '-1 day');
UPDATE temp.almanac_parts_sales SET ts = period_floor(ts, 'day from 2000-01-01 ' || @day_start, coalesce(@zone, 'UTC'))
WHERE @day_start IS NOT NULL;
DROP TABLE IF EXISTS temp.almanac_trend_rows;
CREATE TEMP TABLE almanac_trend_rows AS
WITH
settings AS (
  SELECT coalesce(@zone, 'UTC') AS zone, coalesce(@spark_weeks, 4) AS spark_weeks, 10 AS min_weeks,
         104 AS seasonal_weeks, coalesce(@by_segment, 0) AS by_segment, 0.9 AS strongly_seasonal,
         coalesce(@resolution, 0.01) AS resolution,
         'week' || coalesce(' from 2000-01-03 ' || @day_start, '') AS spec,
         coalesce(@start, json_extract(r, '$.start_if_cut')) AS start, coalesce(@stop, json_extract(r, '$.stop_if_cut')) AS stop
  FROM temp.almanac_range
  WHERE refuse_parameter('@unit', @unit, 'trend.sql judges whole ISO weeks; it takes no @unit') IS NULL
    AND refuse_parameter('@last', @last, 'trend.sql judges every whole week of the range; set @start instead') IS NULL
    AND refuse_parameter('@resolution', CASE WHEN typeof(@resolution) NOT IN ('integer', 'real') OR @resolution <= 0
                                             THEN @resolution END, 'expected a positive number, such as 0.01 for cents')
        IS NULL
),
-- Weekly totals, whole weeks only, an item's week without sales as 0 (period_totals' zero fill).
weekly AS MATERIALIZED (
  SELECT CASE WHEN t.all_segments THEN 'all segments' ELSE coalesce(t.segment, '(none)') END AS segment,
         t.item, t.serial, t.sales, t.amount AS total,
         period_position(t.period_start, 'week', 'year', settings.zone) AS week_of_year
  FROM settings, period_totals('sales', settings.spec, settings.zone, settings.start, settings.stop) AS t
  WHERE (t.all_segments = 1 OR settings.by_segment = 1)
    AND t.covered_start = t.period_start AND t.covered_end = t.period_end
),
chosen AS (SELECT known_name(item, @item, 'item') AS item FROM weekly WHERE segment = 'all segments'),
span AS (
  SELECT segment, count(DISTINCT serial) AS weeks, min(serial) AS first,
         count(DISTINCT serial) >= (SELECT seasonal_weeks FROM settings) AS seasonal
  FROM weekly GROUP BY segment
),
-- The season of each week for the tests: its ISO week number when the
-- range is seasonal, else NULL; and NULL as well, in a seasonal range,
-- for a week of the year in which the item never sold.
seasons AS (
  SELECT w.segment, w.item, w.serial, w.total, w.sales,
         CASE WHEN span.seasonal AND traded.any_sales THEN w.week_of_year END AS season
  FROM weekly AS w JOIN span USING (segment)
  JOIN (SELECT segment, item, week_of_year, max(total <> 0) AS any_sales
        FROM weekly GROUP BY 1, 2, 3) AS traded USING (segment, item, week_of_year)
),
-- The tests compare whole multiples of the resolution (cents by default), so
-- equal money ties; the Sen slope is turned back into money.
fit AS (
  SELECT s.segment, s.item, span.seasonal,
         CASE WHEN span.seasonal THEN mann_kendall_p(round(s.total / settings.resolution), s.serial, s.season)
              ELSE mann_kendall_p(round(s.total / settings.resolution), s.serial) END AS p,
         settings.resolution * CASE WHEN span.seasonal THEN theil_sen_slope(round(s.total / settings.resolution), s.serial, s.season)
              ELSE theil_sen_slope(round(s.total / settings.resolution), s.serial) END AS sen,
         CASE WHEN span.seasonal THEN avg(CASE WHEN s.season IS NOT NULL THEN s.total END)
              ELSE avg(s.total) END AS traded_mean,
         avg(s.total) AS mean, regr_slope(s.total, s.serial) AS ls
  FROM seasons AS s JOIN span USING (segment), chosen, settings
  WHERE chosen.item IS NULL OR chosen.item = '*' OR s.item = chosen.item GROUP BY s.segment, s.item
  HAVING sum(s.sales) > 0
),
-- The yearly season's strength (Wang, Smith & Hyndman 2006) from the weekly
-- amounts decomposed with cycle year; NULL parts (under two years) give NULL.
strength AS (
  SELECT CASE WHEN d.all_segments THEN 'all segments' ELSE coalesce(d.segment, '(none)') END AS segment, d.item,
         max(0, 1 - power(stddev_samp(d.noise), 2) / power(stddev_samp(d.season + d.noise), 2)) AS season_strength
  FROM settings, period_decomposition('almanac_parts_sales', 'week', 'year', settings.zone) AS d
  WHERE d.all_segments = 1 OR settings.by_segment = 1
  GROUP BY 1, 2 HAVING count(d.noise) > 0
),
shape AS (
  SELECT segment, item, sparkline(total, block) AS shape
  FROM (SELECT w.segment, w.item, (w.serial - span.first) / settings.spark_weeks AS block, avg(w.total) AS total
        FROM weekly AS w JOIN span USING (segment), settings GROUP BY 1, 2, 3) GROUP BY segment, item
)
SELECT f.segment, f.item, CASE WHEN span.weeks < settings.min_weeks THEN 'too few periods'
            WHEN f.p IS NULL OR f.p >= 0.05 THEN 'no clear trend'
            WHEN coalesce(nullif(f.sen, 0), f.ls) > 0 THEN 'rising'
            WHEN coalesce(nullif(f.sen, 0), f.ls) < 0 THEN 'falling'
            ELSE 'no clear trend' END
         || CASE WHEN span.weeks >= settings.min_weeks AND g.season_strength >= settings.strongly_seasonal
                 THEN ', strongly seasonal' ELSE '' END AS verdict,
       round(100.0 * (365.2425 / 7) * f.sen / f.traded_mean, 1) AS pct_per_year, round(f.p, 4) AS p_value,
       CASE WHEN f.seasonal THEN 'seasonal (ISO week)' ELSE 'plain' END AS test, span.weeks,
       round(f.mean, 2) AS mean_per_week, round(f.sen, 2) AS sen_slope, round(f.ls, 2) AS ls_slope,
       round(g.season_strength, 2) AS season_strength, s.shape,
       row_number() OVER (PARTITION BY f.segment ORDER BY f.sen / f.traded_mean DESC, f.item) AS place
FROM fit AS f JOIN shape AS s USING (segment, item) JOIN span USING (segment)
     LEFT JOIN strength AS g USING (segment, item), settings;
-- Without @by_segment the columns are those of the report before segments.
SELECT item, verdict, pct_per_year, p_value, test, weeks, mean_per_week, sen_slope, ls_slope, season_strength, shape
FROM temp.almanac_trend_rows WHERE coalesce(@by_segment, 0) <> 1 ORDER BY place;
SELECT segment, item, verdict, pct_per_year, p_value, test, weeks, mean_per_week, sen_slope, ls_slope, season_strength,
       shape
FROM temp.almanac_trend_rows WHERE @by_segment = 1 ORDER BY segment <> 'all segments', segment, place;
DROP TABLE temp.almanac_trend_rows;
DROP TABLE temp.almanac_parts_sales;
SELECT value AS note FROM temp.almanac_range, json_each(r, '$.notes');
DROP TABLE temp.almanac_range;
