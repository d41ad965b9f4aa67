// SPDX-License-Identifier: MIT
#include "core/chart/line_chart.h"

#include <algorithm>
#include <cctype>
#include <cmath>

#include "core/chart/axis_ticks.h"
#include "core/chart/calendar_ticks.h"
#include "core/chart/chart_palette.h"
#include "core/chart/series_ranking.h"
#include "core/chart/svg_writer.h"
#include "core/text/error.h"
#include "core/text/xml_text.h"
#include "core/time/period_calendar.h"

namespace almanac {

ChartLayer parse_chart_layer(std::string_view text) {
    std::string word;
    for (char c : text) word += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    if (word == "raw") return ChartLayer::Raw;
    if (word == "smooth") return ChartLayer::Smooth;
    throw Error("expected 'raw' (thin, light) or 'smooth' (thick)");
}

const char* chart_layer_name(ChartLayer layer) {
    return layer == ChartLayer::Raw ? "raw" : "smooth";
}

void LineChart::add(double x, std::optional<double> y, std::string_view series, ChartLayer layer) {
    if (points_.size() >= limits_.max_points)
        throw Error("more than " + std::to_string(limits_.max_points) +
                    " points; a chart holds at most " + std::to_string(limits_.max_points) +
                    " rows: aggregate first (e.g. one row per series and day)");
    auto found = series_ids_.find(series);
    if (found == series_ids_.end()) {
        if (series_ids_.size() >= limits_.max_series)
            throw Error("more than " + std::to_string(limits_.max_series) +
                        " series; a chart holds at most " + std::to_string(limits_.max_series) +
                        " (8 colours x 8 dash patterns): chart the top items only");
        found = series_ids_.emplace(std::string(series), std::uint32_t(series_ids_.size())).first;
    }
    points_.push_back({x, y.value_or(0.0), y.has_value(), layer, found->second});
}

namespace {

// Layout constants, in pixels. Text widths are estimated (no font metrics in
// a SQL function): 0.6 em per character fits DejaVu Sans, the usual
// sans-serif on Linux, and errs wide for most others.
constexpr double kFont = 12;
constexpr double kCharWidth = 0.6 * kFont;
constexpr double kTitleFont = 15;
constexpr double kMargin = 12;
constexpr double kLegendRow = 18;
constexpr double kSwatch = 26;
constexpr double kRawWidth = 1.25;
constexpr double kRawOpacity = 0.45;
constexpr double kSmoothWidth = 2.75;
constexpr std::size_t kLegendChars = 32;

constexpr const char* kInk = "#333333";
constexpr const char* kAxis = "#666666";
constexpr const char* kGrid = "#e3e3e3";

double text_width(std::string_view text) { return double(utf8_length(text)) * kCharWidth; }

struct Line {
    std::size_t rank;
    ChartLayer layer;
    std::vector<std::pair<double, std::optional<double>>> points;  // in x order
};

}  // namespace

std::string LineChart::render_svg(const ChartOptions& options) const {
    const double width = options.width, height = options.height;
    const XKind kind = x_kind_.kind().value_or(XKind::Number);

    // Ranks: the place of each series in the legend; its palette slot follows
    // series_order, then byte order of the name.
    const SeriesRanking ranking = rank_series(series_ids_, options.series_order);
    const std::vector<std::string>& names = ranking.names;
    const std::vector<std::size_t>& rank_of_id = ranking.position_of_id;

    // One line per (series, layer) that has rows, raw layers first so the
    // thick smooth lines are drawn over them.
    std::vector<Line> lines;
    {
        std::map<std::pair<int, std::size_t>, std::size_t> index;  // (layer, rank) -> line
        for (const Point& p : points_) {
            std::size_t rank = rank_of_id[p.series];
            index.emplace(std::make_pair(int(p.layer), rank), 0);
        }
        for (auto& [key, position] : index) {
            position = lines.size();
            lines.push_back({key.second, ChartLayer(key.first), {}});
        }
        for (const Point& p : points_) {
            auto& line = lines[index[{int(p.layer), rank_of_id[p.series]}]];
            line.points.emplace_back(p.x, p.has_y ? std::optional<double>(p.y) : std::nullopt);
        }
        for (auto& line : lines)
            std::stable_sort(line.points.begin(), line.points.end(),
                             [](const auto& a, const auto& b) { return a.first < b.first; });
    }

    // Data ranges.
    double x_min = 0, x_max = 0, y_min = 0, y_max = 1;
    bool any_x = false, any_y = false;
    for (const Point& p : points_) {
        x_min = any_x ? std::min(x_min, p.x) : p.x;
        x_max = any_x ? std::max(x_max, p.x) : p.x;
        any_x = true;
        if (!p.has_y) continue;
        y_min = any_y ? std::min(y_min, p.y) : p.y;
        y_max = any_y ? std::max(y_max, p.y) : p.y;
        any_y = true;
    }
    if (!any_y) y_min = 0, y_max = 1;

    // Vertical layout: title, plot, two lines of x labels.
    const bool has_title = !options.title.empty();
    const double top = kMargin + (has_title ? kTitleFont + 14 : 4);
    const double bottom = kMargin + 2 * kFont + 14;
    const double plot_h = std::max(40.0, height - top - bottom);

    AxisScale y_scale = numeric_scale(y_min, y_max, std::max(2, int(plot_h / 45)), true);
    double y_label_w = 0;
    for (const auto& tick : y_scale.ticks) y_label_w = std::max(y_label_w, text_width(tick.label));

    // Horizontal layout: caption, y labels, plot, legend columns.
    const bool has_caption = !options.y_caption.empty();
    const double left = kMargin + (has_caption ? kFont + 10 : 0) + y_label_w + 8;
    const std::size_t per_column = std::max<std::size_t>(1, std::size_t(plot_h / kLegendRow));
    const std::size_t columns = names.empty() ? 0 : (names.size() + per_column - 1) / per_column;
    std::size_t legend_chars = kLegendChars;
    std::size_t longest = 0;
    for (const auto& name : names) longest = std::max(longest, utf8_length(name));
    legend_chars = std::min(legend_chars, longest);
    auto legend_width = [&](std::size_t chars) {
        return double(columns) * (kSwatch + 6 + double(chars + 1) * kCharWidth + 10);
    };
    // Long names give way to the plot: the legend takes at most 40% of the width.
    while (legend_chars > 6 && legend_width(legend_chars) > 0.4 * width) --legend_chars;
    const double legend_w = columns ? legend_width(legend_chars) : 0;
    const double right = kMargin + legend_w;
    const double plot_w = std::max(40.0, width - left - right);
    const double plot_x0 = left, plot_x1 = left + plot_w;
    const double plot_y0 = top, plot_y1 = top + plot_h;

    AxisScale x_scale;
    if (kind == XKind::Time) {
        constexpr double kDay = 86400000.0;
        bool whole_days = std::all_of(points_.begin(), points_.end(),
                                      [&](const Point& p) { return std::fmod(p.x, kDay) == 0; });
        x_scale = calendar_scale(instant_from_axis_value(x_min), instant_from_axis_value(x_max),
                                 std::max(2, int(plot_w / 64)), whole_days);
    } else {
        // Fewer ticks until the widest label fits its share of the axis.
        for (int target = std::max(2, int(plot_w / 80));; --target) {
            x_scale = numeric_scale(x_min, x_max, target, false);
            double widest = 0;
            for (const auto& tick : x_scale.ticks)
                widest = std::max(widest, text_width(tick.label));
            double share = plot_w / double(std::max<std::size_t>(1, x_scale.ticks.size()));
            if (widest + 12 <= share || target <= 1) break;
        }
    }

    auto px = [&](double x) {
        return plot_x0 + axis_fraction(x, x_scale.low, x_scale.high) * plot_w;
    };
    auto py = [&](double y) {
        return plot_y1 - axis_fraction(y, y_scale.low, y_scale.high) * plot_h;
    };

    SvgWriter svg(width, height,
                  {{"font-family", "DejaVu Sans, Verdana, Arial, sans-serif"},
                   {"font-size", svg_number(kFont)},
                   {"role", "img"}});
    svg.text("title", {}, has_title ? options.title : "Line chart");
    svg.empty("rect",
              {{"width", svg_number(width)}, {"height", svg_number(height)}, {"fill", "#ffffff"}});
    if (has_title)
        svg.text("text",
                 {{"class", "chart-title"},
                  {"x", svg_number(plot_x0)},
                  {"y", svg_number(kMargin + kTitleFont)},
                  {"font-size", svg_number(kTitleFont)},
                  {"font-weight", "bold"},
                  {"fill", kInk}},
                 options.title);

    // Grid under everything.
    svg.open("g", {{"class", "grid"}, {"stroke", kGrid}, {"stroke-width", "1"}});
    for (const auto& tick : y_scale.ticks)
        svg.empty("line", {{"x1", svg_number(plot_x0)},
                           {"x2", svg_number(plot_x1)},
                           {"y1", svg_number(py(tick.value))},
                           {"y2", svg_number(py(tick.value))}});
    for (const auto& tick : x_scale.ticks)
        svg.empty("line", {{"x1", svg_number(px(tick.value))},
                           {"x2", svg_number(px(tick.value))},
                           {"y1", svg_number(plot_y0)},
                           {"y2", svg_number(plot_y1)}});
    svg.close();

    // Y axis: labels right-aligned beside the ticks, the caption turned up the side.
    svg.open("g", {{"class", "y-axis"}, {"fill", kInk}});
    svg.empty("line", {{"x1", svg_number(plot_x0)},
                       {"x2", svg_number(plot_x0)},
                       {"y1", svg_number(plot_y0)},
                       {"y2", svg_number(plot_y1)},
                       {"stroke", kAxis}});
    for (const auto& tick : y_scale.ticks)
        svg.text("text",
                 {{"x", svg_number(plot_x0 - 6)},
                  {"y", svg_number(py(tick.value) + kFont * 0.35)},
                  {"text-anchor", "end"}},
                 tick.label);
    if (has_caption) {
        double cx = kMargin + kFont * 0.8, cy = (plot_y0 + plot_y1) / 2;
        svg.text("text",
                 {{"class", "y-caption"},
                  {"x", svg_number(cx)},
                  {"y", svg_number(cy)},
                  {"text-anchor", "middle"},
                  {"transform", "rotate(-90 " + svg_number(cx) + " " + svg_number(cy) + ")"}},
                 options.y_caption);
    }
    svg.close();

    // X axis: labels centred under the ticks, context (year, day) on a second line.
    svg.open("g", {{"class", "x-axis"}, {"fill", kInk}, {"text-anchor", "middle"}});
    svg.empty("line", {{"x1", svg_number(plot_x0)},
                       {"x2", svg_number(plot_x1)},
                       {"y1", svg_number(plot_y1)},
                       {"y2", svg_number(plot_y1)},
                       {"stroke", kAxis}});
    for (const auto& tick : x_scale.ticks) {
        double x = px(tick.value);
        svg.empty("line", {{"x1", svg_number(x)},
                           {"x2", svg_number(x)},
                           {"y1", svg_number(plot_y1)},
                           {"y2", svg_number(plot_y1 + 4)},
                           {"stroke", kAxis}});
        svg.text("text", {{"x", svg_number(x)}, {"y", svg_number(plot_y1 + 6 + kFont)}},
                 tick.label);
        if (!tick.context.empty())
            svg.text(
                "text",
                {{"x", svg_number(x)}, {"y", svg_number(plot_y1 + 8 + 2 * kFont)}, {"fill", kAxis}},
                tick.context);
    }
    svg.close();

    // With a period, x values are period starts: two points more than one
    // period apart have a period without a row between them, and a line
    // across it would invent values. (x is already on the zone's wall clock.)
    std::optional<PeriodCalendar> periods;
    if (options.period) periods.emplace(*options.period, ZoneClock::utc());
    auto serial_of = [&](double x) {
        return periods->period_of(instant_from_axis_value(x)).serial;
    };

    // The lines. A missing y ends a subpath; the next value starts a new one
    // ("M"). A value alone between gaps is a zero-length subpath, which round
    // caps draw as a dot, so it does not vanish.
    svg.open("g", {{"class", "lines"},
                   {"fill", "none"},
                   {"stroke-linejoin", "round"},
                   {"stroke-linecap", "round"}});
    for (const Line& line : lines) {
        std::string d;
        bool pen_down = false;
        double last_x = 0, last_y = 0;
        std::size_t run = 0;
        std::int64_t last_serial = 0;
        for (const auto& [x, y] : line.points) {
            if (y && periods && pen_down) {
                std::int64_t serial = serial_of(x);
                if (serial - last_serial > 1) {
                    if (run == 1) d += "L" + svg_number(last_x) + " " + svg_number(last_y);
                    pen_down = false;
                    run = 0;
                }
            }
            if (y && periods) last_serial = serial_of(x);
            if (!y) {
                if (run == 1) d += "L" + svg_number(last_x) + " " + svg_number(last_y);
                pen_down = false;
                run = 0;
                continue;
            }
            last_x = px(x), last_y = py(*y);
            d += (pen_down ? "L" : "M") + svg_number(last_x) + " " + svg_number(last_y);
            pen_down = true;
            ++run;
        }
        if (run == 1) d += "L" + svg_number(last_x) + " " + svg_number(last_y);

        SeriesStyle style = series_style(ranking.slots[line.rank]);
        const bool raw = line.layer == ChartLayer::Raw;
        const double stroke_width = raw ? kRawWidth : kSmoothWidth;
        SvgAttributes attributes = {{"class", "line"},
                                    {"data-series", names[line.rank]},
                                    {"data-layer", chart_layer_name(line.layer)},
                                    {"stroke", style.colour},
                                    {"stroke-width", svg_number(stroke_width)}};
        if (raw) attributes.push_back({"stroke-opacity", svg_number(kRawOpacity)});
        std::string dashes = dash_array(style, stroke_width);
        if (!dashes.empty()) attributes.push_back({"stroke-dasharray", dashes});
        attributes.push_back({"d", d});
        svg.empty("path", attributes);
    }
    svg.close();

    // Legend: one entry per series, in colour order, drawn as the smooth line.
    svg.open("g", {{"class", "legend"}, {"fill", kInk}});
    const double column_w = columns ? legend_w / double(columns) : 0;
    for (std::size_t rank = 0; rank < names.size(); ++rank) {
        double x = plot_x1 + kMargin + double(rank / per_column) * column_w;
        double y = plot_y0 + kLegendRow * (double(rank % per_column) + 0.5);
        SeriesStyle style = series_style(ranking.slots[rank]);
        svg.open("g", {{"class", "legend-entry"}, {"data-series", names[rank]}});
        std::string shown = shorten_utf8(names[rank], legend_chars);
        if (shown != names[rank]) svg.text("title", {}, names[rank]);
        SvgAttributes swatch = {
            {"x1", svg_number(x)},      {"x2", svg_number(x + kSwatch)},
            {"y1", svg_number(y)},      {"y2", svg_number(y)},
            {"stroke", style.colour},   {"stroke-width", svg_number(kSmoothWidth)},
            {"stroke-linecap", "round"}};
        std::string dashes = dash_array(style, kSmoothWidth);
        if (!dashes.empty()) swatch.push_back({"stroke-dasharray", dashes});
        svg.empty("line", swatch);
        svg.text("text", {{"x", svg_number(x + kSwatch + 6)}, {"y", svg_number(y + kFont * 0.35)}},
                 shown);
        svg.close();
    }
    svg.close();
    return svg.finish();
}

}  // namespace almanac
