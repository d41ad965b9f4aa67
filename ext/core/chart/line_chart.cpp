// SPDX-License-Identifier: MIT
#include "core/chart/line_chart.h"

#include <algorithm>
#include <cmath>

#include "core/chart/chart_frame.h"
#include "core/chart/chart_palette.h"
#include "core/chart/series_ranking.h"
#include "core/chart/svg_writer.h"
#include "core/text/ascii.h"
#include "core/text/error.h"
#include "core/text/utf8.h"
#include "core/time/period_calendar.h"

namespace almanac {

ChartLayer parse_chart_layer(std::string_view text) {
    std::string word = ascii_lowercase(text);
    if (word == "raw") return ChartLayer::Raw;
    if (word == "smooth") return ChartLayer::Smooth;
    throw Error("expected 'raw' (thin, light) or 'smooth' (thick)");
}

const char* chart_layer_name(ChartLayer layer) {
    return layer == ChartLayer::Raw ? "raw" : "smooth";
}

void LineChart::add(double x, std::optional<double> y, std::string_view series, ChartLayer layer) {
    check_row_limit(points_.size(), limits_.max_points);
    std::uint32_t id = series_id_of(series_ids_, series, limits_.max_series);
    points_.push_back({x, y.value_or(0.0), y.has_value(), layer, id});
}

namespace {

constexpr double kRawWidth = 1.25;
constexpr double kRawOpacity = 0.45;
constexpr double kSmoothWidth = 2.75;

using Point = LineChart::Point;

struct Line {
    std::size_t rank;
    ChartLayer layer;
    std::vector<std::pair<double, std::optional<double>>> points;  // in x order
};

// One line per (series, layer) that has rows, raw layers first so the thick
// smooth lines are drawn over them; each line's points in x order.
std::vector<Line> collect_lines(const std::vector<Point>& points,
                                const std::vector<std::size_t>& rank_of_id) {
    std::vector<Line> lines;
    std::map<std::pair<int, std::size_t>, std::size_t> index;  // (layer, rank) -> line
    for (const Point& p : points)
        index.emplace(std::make_pair(int(p.layer), rank_of_id[p.series]), 0);
    for (auto& [key, position] : index) {
        position = lines.size();
        lines.push_back({key.second, ChartLayer(key.first), {}});
    }
    for (const Point& p : points) {
        auto& line = lines[index[{int(p.layer), rank_of_id[p.series]}]];
        line.points.emplace_back(p.x, p.has_y ? std::optional<double>(p.y) : std::nullopt);
    }
    for (auto& line : lines)
        std::stable_sort(line.points.begin(), line.points.end(),
                         [](const auto& a, const auto& b) { return a.first < b.first; });
    return lines;
}

// The ranges of x and y (y 0 to 1 when no row has one), and whether every x
// is a midnight, which lets a time axis label dates only.
ChartExtent measure(const std::vector<Point>& points, AxisKind kind) {
    ChartExtent extent;
    extent.kind = kind;
    bool any_x = false, any_y = false;
    for (const Point& p : points) {
        extent.x_min = any_x ? std::min(extent.x_min, p.x) : p.x;
        extent.x_max = any_x ? std::max(extent.x_max, p.x) : p.x;
        any_x = true;
        if (!p.has_y) continue;
        extent.y_min = any_y ? std::min(extent.y_min, p.y) : p.y;
        extent.y_max = any_y ? std::max(extent.y_max, p.y) : p.y;
        any_y = true;
    }
    if (!any_y) extent.y_min = 0, extent.y_max = 1;
    constexpr double kDay = 86400000.0;
    extent.whole_days = std::all_of(points.begin(), points.end(),
                                    [&](const Point& p) { return std::fmod(p.x, kDay) == 0; });
    return extent;
}

// The path of one line. A missing y ends a subpath; the next value starts a
// new one ("M"). A value alone between gaps is a zero-length subpath, which
// round caps draw as a dot, so it does not vanish. With a period, x values
// are period starts: two points more than one period apart have a period
// without a row between them, and a line across it would invent values (x is
// already on the zone's wall clock, hence the UTC calendar).
std::string line_path(const Line& line, const ChartLayout& layout,
                      const std::optional<PeriodCalendar>& periods) {
    auto serial_of = [&](double x) {
        return periods->period_of(instant_from_axis_value(x)).serial;
    };
    std::string d;
    bool pen_down = false;
    double last_x = 0, last_y = 0;
    std::size_t run = 0;
    std::int64_t last_serial = 0;
    auto end_subpath = [&] {
        if (run == 1) d += "L" + svg_number(last_x) + " " + svg_number(last_y);
        pen_down = false;
        run = 0;
    };
    for (const auto& [x, y] : line.points) {
        if (!y) {
            end_subpath();
            continue;
        }
        if (periods) {
            std::int64_t serial = serial_of(x);
            if (pen_down && serial - last_serial > 1) end_subpath();
            last_serial = serial;
        }
        last_x = layout.px(x), last_y = layout.py(*y);
        d += (pen_down ? "L" : "M") + svg_number(last_x) + " " + svg_number(last_y);
        pen_down = true;
        ++run;
    }
    if (run == 1) d += "L" + svg_number(last_x) + " " + svg_number(last_y);
    return d;
}

void draw_lines(SvgWriter& svg, const std::vector<Line>& lines, const ChartLayout& layout,
                const SeriesRanking& ranking, const std::optional<PeriodCalendar>& periods) {
    svg.open("g", {{"class", "lines"},
                   {"fill", "none"},
                   {"stroke-linejoin", "round"},
                   {"stroke-linecap", "round"}});
    for (const Line& line : lines) {
        SeriesStyle style = series_style(ranking.slots[line.rank]);
        const bool raw = line.layer == ChartLayer::Raw;
        const double stroke_width = raw ? kRawWidth : kSmoothWidth;
        SvgAttributes attributes = {{"class", "line"},
                                    {"data-series", ranking.names[line.rank]},
                                    {"data-layer", chart_layer_name(line.layer)},
                                    {"stroke", style.colour},
                                    {"stroke-width", svg_number(stroke_width)}};
        if (raw) attributes.push_back({"stroke-opacity", svg_number(kRawOpacity)});
        std::string dashes = dash_array(style, stroke_width);
        if (!dashes.empty()) attributes.push_back({"stroke-dasharray", dashes});
        attributes.push_back({"d", line_path(line, layout, periods)});
        svg.empty("path", attributes);
    }
    svg.close();
}

}  // namespace

std::string LineChart::render_svg(const ChartOptions& options) const {
    // Ranks: the place of each series in the legend; its palette slot follows
    // series_order, then byte order of the name.
    const SeriesRanking ranking = rank_series(series_ids_, options.series_order);
    const ChartLayout layout = lay_out_chart(
        options, ranking.names, measure(points_, x_kind_.kind().value_or(AxisKind::Number)));
    std::optional<PeriodCalendar> periods;
    if (options.period) periods.emplace(*options.period, ZoneClock::utc());

    SvgWriter svg = draw_chart_frame(layout, options, "Line chart");
    draw_lines(svg, collect_lines(points_, ranking.position_of_id), layout, ranking, periods);
    // Legend: one entry per series, in colour order, drawn as the smooth line.
    draw_chart_legend(svg, layout, ranking, LegendSwatch::Line, kSmoothWidth);
    return svg.finish();
}

}  // namespace almanac
