-- SPDX-License-Identifier: MIT
-- demo/run.sh: one item's weekly amounts split into trend, season and noise
-- (period_decomposition with cycle year), as one SVG line chart:
--   the amounts thin and light, the trend thick in the same colour
--   (svg_line_chart's 'raw' and 'smooth' layers of one series), and trend +
--   season as a second, thick series: where the amounts leave it, that is
--   the noise. Whole ISO weeks only (a partial week would look like a drop).
-- Parameters: @item (the item), @zone, @title. An item with fewer than two
-- whole years of weeks has no parts: only its amounts are drawn.
WITH
parts AS (
  SELECT d.period_start, d.amount, d.trend, d.season
  FROM period_decomposition('sales', 'week', 'year', coalesce(@zone, 'UTC')) AS d
  WHERE d.all_segments = 1 AND d.item = @item
),
points(x, y, series, layer) AS (
  SELECT period_start, amount, @item, 'raw' FROM parts
  UNION ALL SELECT period_start, trend, @item, 'smooth' FROM parts
  UNION ALL SELECT period_start, trend + season, @item || ': trend + season', 'smooth' FROM parts
)
SELECT svg_line_chart(x, y, series, layer,
                      json_object('title', coalesce(@title, @item), 'height', 300, 'y_caption', 'amount per week',
                                  'series_order', json_array(@item, @item || ': trend + season'),
                                  'period', 'week', 'zone', coalesce(@zone, 'UTC')))
FROM points;
