#!/usr/bin/env bash
# The demo: installs what is missing and builds almanac (tests/setup.sh),
# generates three years of sales of Hollow Oak Bakehouse (an invented
# three-shop bakery in America/Denver), runs the report library in sql/ with
# the real sqlite3 shell, prints the main tables, and writes the charts (SVG)
# and an HTML report with the charts inline into demo/out/.
#   demo/run.sh [--seed N]
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
seed=20230102
if [ "${1:-}" = "--seed" ] && [ -n "${2:-}" ]; then seed=$2; fi

"$root/tests/setup.sh"
cd "$root"   # so that `.load build/almanac` and sql/... resolve from the repo root

out=demo/out
rm -rf "$out/charts"
mkdir -p "$out/charts"
db="$out/shop.db"
zone=America/Denver
/usr/bin/python3 demo/generate.py --out "$db" --seed "$seed"

# report FILE MODE [name value ...]: one report file through the sqlite3 shell,
# parameters set with .parameter (in double quotes, so a text stays text).
report() {
  local file=$1 mode=$2
  shift 2
  local args=(-batch -bail -init /dev/null -cmd ".load build/almanac"
              -cmd ".parameter set @zone $zone")
  while [ $# -ge 2 ]; do
    args+=(-cmd ".parameter set @$1 \"$2\"")
    shift 2
  done
  case $mode in
    column) args+=(-cmd ".mode column" -cmd ".headers on") ;;
    html) args+=(-cmd ".mode html" -cmd ".headers on") ;;
    list) args+=(-cmd ".mode list" -cmd ".headers off") ;;
  esac
  sqlite3 "${args[@]}" "$db" < "$file"
}

# html_table TITLE NOTE FILE [name value ...]
html_table() {
  local title=$1 note=$2 file=$3
  shift 3
  printf '<h2>%s</h2>\n<p>%s</p>\n<table>\n' "$title" "$note"
  report "$file" html "$@"
  printf '</table>\n'
}

# An SVG document goes inline into HTML without its XML declaration.
inline_svg() { sed '/^<?xml/d' "$1"; }
escape_html() { sed -e 's/&/\&amp;/g' -e 's/</\&lt;/g' -e 's/>/\&gt;/g'; }

section() { printf '\n== %s ==\n' "$1"; }

section "Weekly totals, last 13 ISO weeks (sql/totals_week.sql)"
report sql/totals_week.sql column last 13
section "Monthly totals (sql/totals_month.sql)"
report sql/totals_month.sql column
section "Trend per item, weekly amounts (sql/trend.sql)"
report sql/trend.sql column
section "Noise ranking, noisiest first (sql/noise_ranking.sql)"
report sql/noise_ranking.sql column
section "Weekday profile (sql/weekday_profile.sql)"
report sql/weekday_profile.sql column
section "Same ISO week last year, last 6 weeks (sql/same_period_last_year.sql)"
report sql/same_period_last_year.sql column last 6

# Charts: the top three items together, then one chart per item.
report sql/daily_chart.sql list > "$out/chart_top_items.svg"
items=$(sqlite3 -batch -init /dev/null "$db" \
  "SELECT item FROM sales GROUP BY item ORDER BY sum(amount) DESC, item")
declare -a chart_files=()
declare -a chart_items=()
while IFS= read -r item; do
  slug=$(printf '%s' "$item" | tr '[:upper:]' '[:lower:]' | tr -c 'a-z0-9' '-' | sed 's/-*$//')
  report sql/daily_chart.sql list item "$item" title "$item: amount per day and 7-day moving mean" \
    height 300 > "$out/charts/$slug.svg"
  chart_files+=("$out/charts/$slug.svg")
  chart_items+=("$item")
done <<< "$items"

{
  cat <<'HEAD'
<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>Hollow Oak Bakehouse: sales report</title>
<style>
body { font-family: "DejaVu Sans", sans-serif; margin: 2em; color: #222; max-width: 1000px; }
table { border-collapse: collapse; margin-bottom: 1em; font-size: 0.85em; }
th, td { border-bottom: 1px solid #ccc; padding: 0.2em 0.6em; text-align: right; }
th { background: #f2f2f2; }
td:first-child, td:nth-child(2) { text-align: left; }
.chart { margin: 1em 0 2em 0; }
.note { color: #555; font-size: 0.9em; }
</style>
</head>
<body>
<h1>Hollow Oak Bakehouse: sales report</h1>
<p class="note">An invented bakery with three shops (Millrace, Quarry Hill, Lantern Square);
local calendar America/Denver. Made with almanac's report library (sql/) in the sqlite3 shell.
The figures describe past sales; they are not forecasts and not financial advice.</p>
HEAD
  printf '<p class="note">Generated %s from %s.</p>\n' "$(date -u '+%Y-%m-%d %H:%M UTC')" "$db"
  printf '<h2>The three largest items: raw days and their 7-day moving mean</h2>\n<div class="chart">\n'
  inline_svg "$out/chart_top_items.svg"
  printf '</div>\n'
  html_table "Trend per item" \
    "Slope of the weekly amount per week; verdict rising/falling when |slope| &gt; 2 &times; its standard error (a rule of thumb)." \
    sql/trend.sql
  html_table "Noise ranking" "Spread of the weeks around each item's trend line, relative to its mean week; noisiest first." \
    sql/noise_ranking.sql
  html_table "Weekly totals, last 13 weeks" "Every ISO week shown; a week without sales would be a row of zeros." \
    sql/totals_week.sql last 13
  html_table "Monthly totals" "Means are NULL (empty) where a month has no sales." sql/totals_month.sql
  html_table "Fiscal quarters (fiscal year from October)" "" sql/totals_fiscal_quarter.sql
  html_table "Weekday profile" "Mean and median of a day with sales; index 100 = the average such day." \
    sql/weekday_profile.sql
  html_table "Same ISO week last year, last 13 weeks" "" sql/same_period_last_year.sql last 13
  printf '<h2>Each item</h2>\n'
  for i in "${!chart_files[@]}"; do
    printf '<h3>%s</h3>\n<div class="chart">\n' "$(printf '%s' "${chart_items[$i]}" | escape_html)"
    inline_svg "${chart_files[$i]}"
    printf '</div>\n'
  done
  printf '</body>\n</html>\n'
} > "$out/report.html"

section "Written"
echo "database:  $root/$db"
echo "charts:    $root/$out/chart_top_items.svg and $root/$out/charts/*.svg (${#chart_files[@]} items)"
echo "report:    $root/$out/report.html  (open it in a browser)"
