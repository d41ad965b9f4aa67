-- SPDX-License-Identifier: MIT
-- The queries the Windows module must answer exactly as the Linux one does
-- (tests/windows/run.sh runs them in both and compares the output byte for
-- byte). One statement per line; errors go to stderr, which is compared too.
-- Not here: mann_kendall_p, whose p-value comes from the C library's erfc;
-- glibc's and the Windows C runtime's differ in the last digit or two (seen:
-- 0.17652891475265328 on Linux, 0.17652891475265331 under wine).
.bail off
.headers off
.mode list
CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL);
WITH RECURSIVE d(n) AS (SELECT 0 UNION ALL SELECT n + 1 FROM d WHERE n < 119) INSERT INTO sales SELECT datetime('2026-01-01', '+' || n || ' days', '+' || (n * 37 % 600) || ' minutes'), CASE n % 3 WHEN 0 THEN 'bread' WHEN 1 THEN 'cake' ELSE 'coffee' END, 1 + n % 5, round(2.5 + (n * 7919 % 1000) / 100.0, 2) FROM d;
SELECT period_floor('2026-03-05 14:20', 'week'), period_end('2026-03-05 14:20', 'month'), period_label('2026-03-05', 'half-month'), period_serial('2026-03-05', 'quarter starting october');
SELECT period_floor('2026-11-01 08:30:00', 'hour', 'America/Denver'), period_end('2026-11-01 08:30:00', 'hour', 'America/Denver'), period_label('2026-11-01 08:30:00', 'hour', 'America/Denver');
SELECT period_floor('2040-07-01 12:00', 'hour', 'America/Denver'), period_floor('2100-03-14 09:30', 'minute', 'America/Denver'), period_label('2100-01-01 12:00', 'hour', 'Australia/Sydney');
SELECT period_floor('2075-10-06 16:45', '15 minutes', 'Australia/Adelaide'), period_label('2099-03-29 01:30', 'hour', 'Europe/London'), period_serial('2090-07-01', 'day', 'Asia/Kolkata');
SELECT period_floor(2208988800, 'day', 'Europe/Berlin'), period_end(2451545.0, 'week', 'Pacific/Auckland'), period_shift('2038-03-31', 1, 'month', 'America/Sao_Paulo');
SELECT label, period_start, period_end, serial FROM periods('2044-03-13', '2044-03-14', '4 hours', 'America/New_York');
SELECT count(*), min(label), max(label) FROM periods('2026-01-01', '2027-01-01', 'week');
SELECT period_floor('2026-03-08 09:30:00', '2 hours', 'America/Denver'), period_floor('9999-12-30 12:00', 'day', 'Pacific/Kiritimati');
SELECT valid_time('2026-02-30'), valid_time('2026-02-28'), valid_time(x'00'), almanac_version() IS NOT NULL;
SELECT period_of_serial(20000, 'day', 'America/Denver');
SELECT item, count(*), exact_sum(amount), var_samp(amount), stddev_pop(qty), regr_slope(amount, julianday(ts)), regr_r2(amount, julianday(ts)) FROM sales GROUP BY item ORDER BY item;
SELECT item, median(amount), percentile_cont(amount, 0.9), theil_sen_slope(amount, julianday(ts)), resid_sd(amount, julianday(ts)), slope_stderr(amount, julianday(ts)) FROM sales GROUP BY item ORDER BY item;
SELECT ts, moving_mean(amount) OVER w, ewma(amount, ts, '1 week') OVER w, median(amount) OVER w FROM sales WINDOW w AS (ORDER BY ts ROWS BETWEEN 6 PRECEDING AND CURRENT ROW) ORDER BY ts LIMIT 12;
SELECT covar_samp(qty, amount), corr(qty, amount), regr_intercept(amount, qty), regr_sxy(amount, qty) FROM sales;
SELECT item, sparkline(total, week) FROM (SELECT item, period_floor(ts, 'week') week, sum(amount) total FROM sales GROUP BY 1, 2) GROUP BY item ORDER BY item;
SELECT svg_line_chart(period_floor(ts, 'week'), amount, item, 'raw', '{"title": "Weekly <sales> & more", "width": 640, "height": 360}') FROM sales;
SELECT length(svg_line_chart(julianday(ts), qty, item)) > 1000 FROM sales;
SELECT period_floor('2026-03-05', 'fortnight');
SELECT period_floor('2026-03-05', 'day', 'Mars/Olympus_Mons');
SELECT period_floor('2026-02-30', 'day');
SELECT median(amount) FROM (SELECT 'abc' amount);
SELECT percentile_cont(amount, 1.5) FROM sales;
SELECT svg_line_chart(ts, amount, item, 'raw', '{"colour": 1}') FROM sales;
SELECT period_position('2026-03-05', 'day', 'week'), period_position('2026-03-05', 'month', 'year starting april'), period_position('2040-11-04 12:00', 'hour', 'day', 'America/Denver');
SELECT item, mad(amount), theil_sen_slope(amount, julianday(ts), period_position(ts, 'day', 'week')) FROM sales GROUP BY item ORDER BY item;
SELECT to_time('03/05/2026 2:20 PM', '%m/%d/%Y %I:%M %p'), to_time('2045-03-12 02:30', '%Y-%m-%d %H:%M', 'America/Chicago'), to_time('46086.75', 'excel'), to_amount('(1.234,50 EUR)', ','), to_amount('$ 12,345.6');
SELECT svg_bar_chart(period_floor(ts, 'month'), amount, item, '{"title": "Monthly", "period": "month", "series_order": ["coffee", "bread"]}') FROM sales;
SELECT to_time('2026-02-30', '%Y-%m-%d');
SELECT period_position('2026-03-05', 'week', 'month');
SELECT 'done';
