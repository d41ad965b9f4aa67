#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# The demo: installs what is missing and builds almanac (tests/setup.sh),
# generates three years of sales of Hollow Oak Bakehouse (an invented
# three-shop bakery in America/Denver), runs the report library in sql/ with
# the real sqlite3 shell, prints the main tables, and writes the charts (SVG)
# and an HTML report with the charts inline into demo/out/.
#   demo/run.sh [--seed N]
# The same report for a database of your own (a table or view sales(ts, item,
# qty, amount), see sql/), e.g. from cron; nothing is generated then:
#   demo/run.sh --db /path/to/sales.db [--zone Europe/Vienna] [--out DIR]
# A database whose ts holds the zone's wall-clock time, not UTC: add
# --local-time, and the reports read it through a temporary view that turns
# each reading into its UTC instant once, with to_time(ts, FORMAT, zone)
# (FORMAT is --local-format, default '%Y-%m-%d %H:%M:%S'). Never pass a zone
# for local data without --local-time: every time would be shifted twice.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
seed=20230102
own_db=""
zone=America/Denver
out=demo/out
local_time=""
local_format='%Y-%m-%d %H:%M:%S'
while [ $# -gt 0 ]; do
  case $1 in
    --seed) seed=$2; shift 2 ;;
    --db) own_db=$(cd "$(dirname "$2")" && pwd)/$(basename "$2"); shift 2 ;;
    --zone) zone=$2; shift 2 ;;
    --out) mkdir -p "$2"; out=$(cd "$2" && pwd); shift 2 ;;
    --local-time) local_time=1; shift ;;
    --local-format) local_format=$2; shift 2 ;;
    *) echo "usage: demo/run.sh [--seed N] | --db FILE [--zone IANA-ZONE] [--out DIR]" \
            "[--local-time [--local-format FORMAT]]" >&2; exit 2 ;;
  esac
done

"$root/tests/setup.sh"
cd "$root"   # so that `.load build/almanac` and sql/... resolve from the repo root

rm -rf "$out/charts"
mkdir -p "$out/charts"
if [ -n "$own_db" ]; then
  db=$own_db
  business="Sales report"
elif [ -n "$local_time" ]; then
  echo "demo/run.sh: --local-time reads a database of your own; give it with --db FILE" >&2
  exit 2
else
  db="$out/shop.db"
  business="Hollow Oak Bakehouse: sales report"
  /usr/bin/python3 demo/generate.py --out "$db" --seed "$seed"
fi

# With --local-time, a temporary view named sales (found before main.sales)
# gives every report UTC instants; all other columns pass through unchanged.
local_view=()
if [ -n "$local_time" ]; then
  quote_sql() { printf "'%s'" "${1//\'/\'\'}"; }
  columns=$(sqlite3 -batch -init /dev/null -cmd ".load build/almanac" "$db" \
    "SELECT group_concat('\"' || replace(name, '\"', '\"\"') || '\"', ', ') FROM pragma_table_xinfo('sales') WHERE name <> 'ts'")
  local_view=(-cmd "CREATE TEMP VIEW sales AS SELECT to_time(ts, $(quote_sql "$local_format"), $(quote_sql "$zone")) AS ts${columns:+, $columns} FROM main.sales;")
fi

# report FILE MODE [name value ...]: one report file through the sqlite3 shell,
# parameters set with .parameter (in double quotes, so a text stays text).
report() {
  local file=$1 mode=$2
  shift 2
  local args=(-batch -bail -init /dev/null -cmd ".load build/almanac" "${local_view[@]}"
              -cmd ".parameter set @zone $zone")
  while [ $# -ge 2 ]; do
    args+=(-cmd ".parameter set @$1 \"$2\"")
    shift 2
  done
  case $mode in
    column) args+=(-cmd ".mode column" -cmd ".headers on") ;;
    html) args+=(-cmd ".mode html" -cmd ".headers on") ;;
    list) args+=(-cmd ".mode list" -cmd ".headers off") ;;
    insert) args+=(-cmd ".mode insert compared" -cmd ".headers off") ;;
  esac
  sqlite3 "${args[@]}" "$db" < "$file"
}

# html_table TITLE NOTE FILE [name value ...]: a report as a table that
# scrolls sideways inside its own box on a narrow screen, never the page.
html_table() {
  local title=$1 note=$2 file=$3
  shift 3
  printf '<h2>%s</h2>\n<p class="note">%s</p>\n' "$title" "$note"
  report "$file" html "$@" | table_and_range
}

# table_and_range: a report's HTML rows as a table, and the note lines under
# it (the range it used, what it left out) as a paragraph after the table.
table_and_range() {
  awk 'BEGIN { print "<div class=\"wide\"><table>" }
       /^<TR><TH>note<\/TH>/ { range = 1; next }
       !range { print; next }
       /^<TR><TD>/ { sub(/^<TR><TD>/, ""); sub(/<\/TD>$/, ""); said = said (said ? "; " : "") $0 }
       END { print "</table></div>"; if (said) print "<p class=\"note\">" said "</p>" }'
}

# summary_table UNIT NOUN: the latest period of UNIT against the one before and
# a year earlier, per shop (sql/compare.sql through demo/summary_table.sql).
summary_table() {
  local unit=$1 noun=$2
  {
    printf 'CREATE TEMP TABLE compared(segment, item, period, days_in_period, days_covered, complete, span,'
    printf ' trading_days, amount, per_trading_day, against, base_period, base_span, base_trading_days,'
    printf ' base_amount, base_per_trading_day, change_pct, change_per_day_pct);\n'
    # The report's last line says which range it used; the summary states it apart.
    report sql/compare.sql insert unit "$unit" by_segment "$by_segment" | grep -v "^INSERT INTO compared VALUES('\(range \|left out\|[0-9]* rows\? without\)"
    printf "SELECT '<div class=\"wide\"><table class=\"summary\"><caption>%s ' || p.period || ' <span class=\"span\">' || p.span || '</span>'" "$noun"
    printf " || CASE WHEN p.complete THEN '' ELSE ' <span class=\"partial\">partial: ' || p.days_covered || ' of ' || p.days_in_period || ' days</span>' END"
    printf " || '</caption><thead><tr><th rowspan=\"2\">Shop</th><th rowspan=\"2\">Amount</th><th rowspan=\"2\">Trading days</th>"
    printf "<th colspan=\"2\">against ' || coalesce(p.base_period || '<br><span class=\"span\">' || p.base_span || '</span>', 'no base') || '</th>"
    printf "<th colspan=\"2\">against ' || coalesce(y.base_period || '<br><span class=\"span\">' || y.base_span || '</span>', 'no base') || '</th></tr>"
    printf "<tr><th>change</th><th>per trading day</th><th>change</th><th>per trading day</th></tr></thead><tbody>'"
    printf " FROM temp.compared AS p JOIN temp.compared AS y ON y.segment = p.segment AND y.against = 'year'"
    printf " WHERE p.segment = 'all segments' AND p.against = 'previous';\n"
    cat demo/summary_table.sql
    printf "SELECT '</tbody></table></div>';\n"
  } | sqlite3 -batch -bail -init /dev/null -cmd ".mode list" :memory:
}

# An SVG document goes inline into HTML without its XML declaration.
inline_svg() { sed '/^<?xml/d' "$1"; }
escape_html() { sed -e 's/&/\&amp;/g' -e 's/</\&lt;/g' -e 's/>/\&gt;/g'; }

section() { printf '\n== %s ==\n' "$1"; }

section "What would mislead a report: rows that do not read, empty amounts, stray and future rows, short days (sql/data_check.sql)"
report sql/data_check.sql column
section "The latest week against the week before and the same ISO week a year earlier, per shop (sql/compare.sql)"
report sql/compare.sql column by_segment 1
section "The latest month to date against the month before and a year earlier (sql/compare.sql)"
report sql/compare.sql column unit month
section "Weekly totals, last 13 ISO weeks (sql/totals.sql)"
report sql/totals.sql column last 13
section "Monthly totals (sql/totals.sql, @unit month)"
report sql/totals.sql column unit month
section "Trend per item, weekly amounts (sql/trend.sql)"
report sql/trend.sql column
section "Noise ranking, noisiest first (sql/noise_ranking.sql)"
report sql/noise_ranking.sql column
section "Weekday profile (sql/weekday_profile.sql)"
report sql/weekday_profile.sql column

# Seasons and unusual days (sql/seasonal_profile.sql, sql/anomalies.sql).
section "Seasonal profile: the season part per weekday and month, in percent of the mean day and week, the noise beside it (sql/seasonal_profile.sql)"
report sql/seasonal_profile.sql column
anomalies_list=$(report sql/anomalies.sql list)   # day|item|amount|typical|score|kind, for the charts too
recent_start=$(sqlite3 -batch -init /dev/null -cmd ".load build/almanac" "${local_view[@]}" "$db" \
  "SELECT period_shift(max(period_floor(ts, 'week', '$zone')), -12, 'week') FROM sales")
section "Unusual days of the last 13 weeks, the noise part against its neighbours', and the closures (sql/anomalies.sql)"
report sql/anomalies.sql column start "'$recent_start'"
printf '%s\n' "$anomalies_list" | awk -F'|' 'NF == 6 { n[$6]++ } NF == 4 { c++ } END {
  printf "Over the whole range: %d spike, %d drop, %d closed (item-days); %d closures of a shop or of the business\n",
         n["spike"], n["drop"], n["closed"], c }'

# A table with a segment column (the demo's shops) is broken down by it. The
# module is loaded for this look too: sales may be a view that calls almanac's
# functions (to_time, to_amount), and SQLite compiles a view to list its columns.
by_segment=$(sqlite3 -batch -init /dev/null -cmd ".load build/almanac" "${local_view[@]}" "$db" \
  "SELECT count(*) FROM pragma_table_xinfo('sales') WHERE name = 'segment'")

# Charts: weekly totals per shop as bars, the top three items together (the
# last 13 weeks), then one chart for each of the twelve largest. Every line
# chart passes the whole item list as series_order, so an item has one colour.
report sql/period_bars.sql list by_segment "$by_segment" title "Amount per week, last 13 weeks" > "$out/weekly_bars.svg"
report sql/daily_chart.sql list > "$out/chart_top_items.svg"
items=$(sqlite3 -batch -init /dev/null -cmd ".load build/almanac" "$db" \
  "SELECT item FROM sales GROUP BY item ORDER BY exact_sum(amount) DESC, item LIMIT 12")
declare -a chart_files=()
declare -a chart_items=()
declare -a parts_files=()
while IFS= read -r item; do
  [ -n "$item" ] || continue
  slug=$(printf '%s' "$item" | tr '[:upper:]' '[:lower:]' | tr -c 'a-z0-9' '-' | sed 's/-*$//')
  # The item's unusual days (sql/anomalies.sql) are marked on its chart.
  # In two layers of quotes, or one date alone would be read as arithmetic (2024-10-09 = 2005).
  marks=$(printf '%s\n' "$anomalies_list" | awk -F'|' -v item="$item" '$2 == item { print $1 }' | paste -sd, -)
  report sql/daily_chart.sql list item "$item" title "$item: amount per day and 7-day moving mean" \
    height 300 marks "'$marks'" > "$out/charts/$slug.svg"
  chart_files+=("$out/charts/$slug.svg")
  chart_items+=("$item")
  # Its trend, season and noise (demo/parts_chart.sql), for the HTML report's section.
  report demo/parts_chart.sql list item "$item" title "$item: amount per week, trend, trend + season" \
    > "$out/charts/$slug-parts.svg"
  parts_files+=("$out/charts/$slug-parts.svg")
done <<< "$items"

last_day=$(sqlite3 -batch -init /dev/null -cmd ".load build/almanac" "${local_view[@]}" "$db" \
  "SELECT period_shift(max(period_end(ts, 'day', '$zone')), -1, 'day') FROM sales")
{
  printf '<!DOCTYPE html>\n<html lang="en">\n<head>\n<meta charset="utf-8">\n'
  printf '<meta name="viewport" content="width=device-width, initial-scale=1">\n<title>%s</title>\n' "$business"
  cat <<'HEAD'
<style>
body { font-family: "DejaVu Sans", Verdana, sans-serif; margin: 0 auto; padding: 1em 1.5em; color: #222;
       max-width: 1200px; line-height: 1.35; }
h1 { font-size: 1.5em; margin: 0.2em 0; }
h2 { font-size: 1.2em; margin: 1.6em 0 0.3em 0; }
h3 { font-size: 1em; margin: 1em 0 0.2em 0; }
.wide { overflow-x: auto; max-width: 100%; }
table { border-collapse: collapse; margin-bottom: 1em; font-size: 0.8em; }
th, td { border-bottom: 1px solid #ccc; padding: 0.25em 0.6em; text-align: right; white-space: nowrap; }
th { background: #f2f2f2; text-align: left; }
td:first-child, td:nth-child(2) { text-align: left; }
table.summary { font-size: 0.95em; }
table.summary td { text-align: right; }
table.summary caption { text-align: left; font-weight: bold; padding: 0.2em 0; }
table.summary th[scope=row] { background: none; }
table.summary tr.total th, table.summary tr.total td { font-weight: bold; border-bottom: 2px solid #888; }
td.up { color: #0a6b2f; }
td.down { color: #b3261e; }
td.none { color: #888; text-align: center; }
th .span { font-weight: normal; font-size: 0.85em; color: #555; }
.partial { display: inline-block; background: #fff0c2; color: #5c4500; border-radius: 3px;
           padding: 0 0.35em; font-size: 0.85em; font-weight: normal; }
.chart { margin: 0.5em 0 1.5em 0; }
.chart svg { display: block; max-width: 100%; height: auto; }
.note { color: #555; font-size: 0.9em; margin: 0.3em 0; }
@media (max-width: 600px) {
  body { padding: 0.5em 0.6em; }
  table, table.summary { font-size: 0.72em; }
  th, td { padding: 0.2em 0.3em; }
  th { white-space: normal; }
}
@media print {
  @page { size: A4; margin: 12mm; }
  body { max-width: none; padding: 0; font-size: 9pt; }
  .wide { overflow: visible; }
  table { font-size: 6.5pt; width: 100%; table-layout: auto; }
  th, td { white-space: normal; overflow-wrap: anywhere; padding: 0.15em 0.3em; }
  h2, h3 { break-after: avoid; }
  .chart, tr { break-inside: avoid; }
}
</style>
</head>
<body>
HEAD
  printf '<h1>%s</h1>\n' "$business"
  printf '<p class="note">Sales up to %s (local calendar %s). ' "$last_day" "$zone"
  printf 'The figures describe past sales; they are not forecasts and not financial advice.</p>\n'
  printf '<h2>The latest week against the week before and the same week last year</h2>\n'
  printf '<p class="note">Each side counts the same days from the start of its week; a partial week is marked. '
  printf 'Trading days are days with sales; per trading day takes out closed days.</p>\n'
  summary_table week Week
  printf '<h2>The month to date against the month before and the same month last year</h2>\n'
  summary_table month Month
  printf '<div class="chart">\n'
  inline_svg "$out/weekly_bars.svg"
  printf '</div>\n'
  html_table "Trend per item" \
    "Weekly amounts, whole ISO weeks. The verdict is the seasonal Mann&ndash;Kendall test, each week against the same ISO week of the other years (the plain test with less than two whole years): rising or falling when p &lt; 0.05, in the direction of the Sen slope; otherwise no clear trend. &ldquo;strongly seasonal&rdquo; is added when the season strength is at least 0.9. Amounts are compared to the cent." \
    sql/trend.sql
  printf '<h2>Trend, season and noise</h2>\n<p class="note">%s</p>\n' \
    "Each item's weekly amounts split by STL (period_decomposition, cycle year): the amounts thin, the trend thick in the same colour, trend + season in the second colour. What the amounts do beyond trend + season is the noise; the noise ranking below measures it in the daily amounts."
  for i in "${!parts_files[@]}"; do
    printf '<h3>%s</h3>\n<div class="chart">\n' "$(printf '%s' "${chart_items[$i]}" | escape_html)"
    inline_svg "${parts_files[$i]}"
    printf '</div>\n'
  done
  printf '<h2>Unusual days</h2>\n<p>%s</p>\n<details><summary>%s</summary>\n' \
    "A day's noise part (its amount minus trend + season, period_decomposition with cycle week) against the noise of the 56 days before and after (the day and closed days excluded); listed when the modified z-score 0.6745 &times; (noise &minus; median) / MAD is beyond &plusmn;3.5. After the days, the closures: runs of days on which a shop, or the whole business, sold nothing, with their first and last day. Each item's chart below marks its unusual days." \
    "$(printf '%s\n' "$anomalies_list" | awk -F'|' 'NF == 6' | wc -l) item-days and $(printf '%s\n' "$anomalies_list" | awk -F'|' 'NF == 4' | wc -l) closures: show the list"
  report sql/anomalies.sql html | table_and_range
  printf '</details>\n'
  printf '<h2>The three largest items, last 13 weeks: raw days and their 7-day moving mean</h2>\n<div class="chart">\n'
  inline_svg "$out/chart_top_items.svg"
  printf '</div>\n'
  printf '<h2>Each item</h2>\n'
  for i in "${!chart_files[@]}"; do
    printf '<h3>%s</h3>\n<div class="chart">\n' "$(printf '%s' "${chart_items[$i]}" | escape_html)"
    inline_svg "${chart_files[$i]}"
    printf '</div>\n'
  done
  html_table "Weekly totals, last 13 weeks" \
    "Every ISO week shown; complete = 0 marks a week the data covers only in part." sql/totals.sql last 13
  html_table "Monthly totals" "Means are empty where a month has no sales." sql/totals.sql unit month
  html_table "Fiscal quarters (fiscal year from October)" "" sql/totals.sql unit "quarter starting october"
  html_table "Noise ranking" "The spread of each item's daily noise part (what neither its level nor its weekday explains; closed days left out) relative to its mean day, noisiest first; beside it the trend and season strengths of its weekly amounts (0 to 1: how much of the swings is trend, how much season)." \
    sql/noise_ranking.sql
  html_table "Weekday profile" "Mean and median of a day with sales; index 100 = the average such day." \
    sql/weekday_profile.sql
  html_table "Seasonal profile" \
    "The season part of each weekday (daily amounts, cycle week) and month (weekly amounts, cycle year), in percent of the item's mean day and week: how far above or below its own level the item typically is then. A peak is named only when it stands out of the noise beside it." \
    sql/seasonal_profile.sql
  if [ -z "$own_db" ]; then
    printf '<p class="note">Hollow Oak Bakehouse is invented: three shops (Millrace, Quarry Hill, Lantern Square), generated by demo/generate.py.</p>\n'
  fi
  printf '<p class="note">Made with almanac'"'"'s report library (sql/) in the sqlite3 shell, %s, from %s.</p>\n' \
    "$(date -u '+%Y-%m-%d %H:%M UTC')" "$(printf '%s' "$db" | escape_html)"
  printf '</body>\n</html>\n'
} > "$out/report.html"

section "Written"
case $out in /*) where=$out ;; *) where=$root/$out ;; esac
case $db in /*) db_where=$db ;; *) db_where=$root/$db ;; esac
echo "database:  $db_where"
echo "charts:    $where/chart_top_items.svg and $where/charts/*.svg (${#chart_files[@]} items)"
echo "report:    $where/report.html  (open it in a browser)"
