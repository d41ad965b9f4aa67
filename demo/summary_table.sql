-- SPDX-License-Identifier: MIT
-- The summary table at the top of report.html: the rows of sql/compare.sql
-- (with @by_segment 1), put into temp.compared by demo/run.sh, as one HTML
-- row per segment: the amount of the latest period to date, then its change
-- against the previous period and against the same period a year earlier, in
-- money and per trading day. (The period and whether it is partial are the
-- same for every row: demo/run.sh writes them once, in the caption.)
WITH
escaped AS (
  SELECT *, replace(replace(replace(segment, '&', '&amp;'), '<', '&lt;'), '>', '&gt;') AS shown
  FROM temp.compared
),
-- A change as a signed percentage with its direction as a class, or a dash
-- when there is nothing to compare.
cells AS (
  SELECT segment, shown, against, period, span, complete, days_covered, days_in_period,
         trading_days, amount, per_trading_day, base_period, base_span,
         CASE WHEN change_pct IS NULL THEN '<td class="none">—</td><td class="none">—</td>'
              ELSE '<td class="' || CASE WHEN change_pct < 0 THEN 'down' ELSE 'up' END || '">'
                   || CASE WHEN change_pct > 0 THEN '+' ELSE '' END || printf('%.1f', change_pct) || ' %</td>'
                   || '<td class="' || CASE WHEN change_per_day_pct < 0 THEN 'down' ELSE 'up' END || '">'
                   || CASE WHEN change_per_day_pct > 0 THEN '+' ELSE '' END
                   || coalesce(printf('%.1f', change_per_day_pct) || ' %', '—') || '</td>'
         END AS change_cells
  FROM escaped
)
SELECT '<tr' || CASE WHEN p.segment = 'all segments' THEN ' class="total"' ELSE '' END || '>'
       || '<th scope="row">' || CASE WHEN p.segment = 'all segments' THEN 'All shops' ELSE p.shown END || '</th>'
       || '<td>' || printf('%.2f', p.amount) || '</td>'
       || '<td>' || p.trading_days || '</td>'
       || p.change_cells || y.change_cells || '</tr>'
FROM cells AS p JOIN cells AS y ON y.segment = p.segment AND y.against = 'year'
WHERE p.against = 'previous'
ORDER BY p.segment <> 'all segments', p.segment;
