// SPDX-License-Identifier: MIT
#include "core/chart/bar_chart.h"

#include <algorithm>
#include <cmath>

#include "core/chart/chart_frame.h"
#include "core/chart/chart_palette.h"
#include "core/chart/series_ranking.h"
#include "core/text/error.h"
#include "core/time/period_calendar.h"

namespace almanac {

namespace {

constexpr double kDay = 86400000.0;
// Share of a slot left empty on each side, so neighbouring groups stay apart.
constexpr double kSlotPadding = 0.1;
constexpr double kOutlineWidth = 1.25;

}  // namespace

std::uint32_t BarChart::series_id(std::string_view series) {
    check_row_limit(bars_.size(), limits_.max_points);
    return series_id_of(series_ids_, series, limits_.max_series);
}

void BarChart::add(double x, std::optional<double> y, std::string_view series) {
    std::uint32_t id = series_id(series);
    bars_.push_back({x, y.value_or(0.0), y.has_value(), id});
}

void BarChart::add_category(std::string_view category, std::optional<double> y,
                            std::string_view series) {
    std::uint32_t id = series_id(series);
    auto found = category_index_.find(category);
    if (found == category_index_.end()) {
        found = category_index_.emplace(std::string(category), categories_.size()).first;
        categories_.emplace_back(category);
    }
    bars_.push_back({double(found->second), y.value_or(0.0), y.has_value(), id});
}

std::string BarChart::render_svg(const ChartOptions& options) const {
    const AxisKind kind = x_kind_.kind().value_or(AxisKind::Number);
    const SeriesRanking ranking = rank_series(series_ids_, options.series_order);

    // The slot of each distinct x: where its group of bars may go.
    std::vector<double> xs;
    for (const Bar& bar : bars_) xs.push_back(bar.x);
    std::sort(xs.begin(), xs.end());
    xs.erase(std::unique(xs.begin(), xs.end()), xs.end());
    double step = kind == AxisKind::Time ? kDay : 1.0;
    if (xs.size() > 1) {
        step = xs[1] - xs[0];
        for (std::size_t i = 2; i < xs.size(); ++i) step = std::min(step, xs[i] - xs[i - 1]);
    }
    std::optional<PeriodCalendar> periods;
    // x is already on the zone's wall clock, so the periods are taken in UTC.
    if (kind == AxisKind::Time && options.period)
        periods.emplace(*options.period, ZoneClock::utc());
    auto slot_of = [&](double x) -> std::pair<double, double> {
        if (kind == AxisKind::Category) return {x - 0.5, x + 0.5};
        if (kind == AxisKind::Number) return {x - step / 2, x + step / 2};
        if (periods) {
            // A period start is the usual x; any instant inside the period will do.
            Period period = periods->period_of(instant_from_axis_value(x));
            return {double(period.start.time_since_epoch().count()),
                    double(period.end.time_since_epoch().count())};
        }
        return {x, x + step};  // x is a period start: the bar covers the step after it
    };

    ChartExtent extent;
    extent.kind = kind;
    if (kind == AxisKind::Category) extent.categories = categories_;
    bool any = false;
    for (double x : xs) {
        auto [low, high] = slot_of(x);
        extent.x_min = any ? std::min(extent.x_min, low) : low;
        extent.x_max = any ? std::max(extent.x_max, high) : high;
        any = true;
    }
    // The baseline is always on the axis: bars measure from zero.
    extent.y_min = 0;
    extent.y_max = 0;
    for (const Bar& bar : bars_) {
        if (!bar.has_y) continue;
        extent.y_min = std::min(extent.y_min, bar.y);
        extent.y_max = std::max(extent.y_max, bar.y);
    }
    if (extent.y_min == extent.y_max) extent.y_max = 1;
    extent.whole_days =
        std::all_of(xs.begin(), xs.end(), [](double x) { return std::fmod(x, kDay) == 0; }) &&
        (periods ? !periods->spec().is_sub_day() : std::fmod(step, kDay) == 0);

    const ChartLayout layout = lay_out_chart(options, ranking.names, extent);
    SvgWriter svg = draw_chart_frame(layout, options, "Bar chart");

    // Each group splits its slot (less the padding) into one lane per series,
    // in legend order, so a series keeps its lane in every group.
    const double lanes = double(std::max<std::size_t>(1, ranking.names.size()));
    const double zero = layout.py(0);
    svg.open("g", {{"class", "bars"}});
    for (const Bar& bar : bars_) {
        if (!bar.has_y) continue;
        auto [low, high] = slot_of(bar.x);
        double left = layout.px(low), right = layout.px(high);
        double inner = (right - left) * (1 - 2 * kSlotPadding);
        double lane_w = inner / lanes;
        std::size_t lane = ranking.position_of_id[bar.series];
        double x0 = left + (right - left) * kSlotPadding + lane_w * double(lane);
        double top = std::min(zero, layout.py(bar.y)), bottom = std::max(zero, layout.py(bar.y));
        SeriesStyle style = series_style(ranking.slots[lane]);
        SvgAttributes attributes = {{"class", "bar"},
                                    {"data-series", ranking.names[lane]},
                                    {"x", svg_number(x0)},
                                    {"y", svg_number(top)},
                                    {"width", svg_number(lane_w)},
                                    {"height", svg_number(bottom - top)},
                                    {"fill", style.colour}};
        // Beyond the palette, an outline's dash pattern tells the series apart.
        std::string dashes = dash_array(style, kOutlineWidth);
        if (!dashes.empty())
            attributes.insert(attributes.end(), {{"stroke", chart_style::kInk},
                                                 {"stroke-width", svg_number(kOutlineWidth)},
                                                 {"stroke-dasharray", dashes}});
        svg.empty("rect", attributes);
    }
    svg.close();
    svg.empty("line", {{"class", "baseline"},
                       {"x1", svg_number(layout.plot_x0)},
                       {"x2", svg_number(layout.plot_x1)},
                       {"y1", svg_number(zero)},
                       {"y2", svg_number(zero)},
                       {"stroke", chart_style::kInk},
                       {"stroke-width", "1"}});

    draw_chart_legend(svg, layout, ranking, LegendSwatch::Box, kOutlineWidth);
    return svg.finish();
}

}  // namespace almanac
