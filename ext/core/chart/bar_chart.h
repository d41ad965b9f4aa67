// SPDX-License-Identifier: MIT
// A bar chart as a complete SVG document: one bar per row, the bars of one x
// side by side in legend order, colours by the same rule as the line chart
// (series_order, then sorted names), a zero baseline with negative bars below
// it. Time x gets a calendar axis with each bar inside its period (the
// `period` option's, or the smallest step between the x values); numbers get a
// numeric axis with bars centred on their x; categories (TEXT that is neither)
// get one slot each, in the order they first appear.
#pragma once

#include <cstddef>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/chart/axis_kind.h"
#include "core/chart/chart_options.h"
#include "core/chart/line_chart.h"

namespace almanac {

class BarChart {
  public:
    explicit BarChart(ChartLimits limits = {}) : limits_(limits) {}

    // Throws almanac::Error when the kind differs from the first x's.
    void accept_x_kind(AxisKind kind) { x_kind_.accept(kind); }

    // One row with a numeric or time x. Throws almanac::Error past a limit.
    void add(double x, std::optional<double> y, std::string_view series);
    // One row with a category x.
    void add_category(std::string_view category, std::optional<double> y, std::string_view series);

    std::size_t bar_count() const { return bars_.size(); }
    bool empty() const { return bars_.empty(); }

    std::string render_svg(const ChartOptions& options) const;

  private:
    struct Bar {
        double x;  // the value, or the category's index
        double y;
        bool has_y;
        std::uint32_t series;
    };
    std::uint32_t series_id(std::string_view series);

    ChartLimits limits_;
    AxisKindGuard x_kind_;
    std::map<std::string, std::uint32_t, std::less<>> series_ids_;
    std::map<std::string, std::size_t, std::less<>> category_index_;
    std::vector<std::string> categories_;  // in order of first appearance
    std::vector<Bar> bars_;
};

}  // namespace almanac
