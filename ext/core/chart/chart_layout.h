// SPDX-License-Identifier: MIT
// Where everything of a chart goes: title, plot area, axes and legend, from
// the options, the series names and the extent of the data. Line and bar
// charts share it, so both look alike and a fix in one is a fix in both.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "core/chart/axis_kind.h"
#include "core/chart/axis_ticks.h"
#include "core/chart/chart_options.h"

namespace almanac {

// Text widths are estimated (no font metrics in a SQL function): 0.6 em per
// character fits DejaVu Sans, the usual sans-serif on Linux, and errs wide
// for most others.
namespace chart_style {
constexpr double kFont = 12;
constexpr double kCharWidth = 0.6 * kFont;
constexpr double kTitleFont = 15;
constexpr double kMargin = 12;
constexpr double kLegendRow = 18;
constexpr double kSwatch = 26;
constexpr std::size_t kLegendChars = 32;
constexpr const char* kInk = "#333333";
constexpr const char* kAxis = "#666666";
constexpr const char* kGrid = "#e3e3e3";
}  // namespace chart_style

double text_width(std::string_view text);

// What the data spans. A category axis has one tick per category, at
// x = 0, 1, 2, ... with the category's name as its label.
struct ChartExtent {
    AxisKind kind = AxisKind::Number;
    double x_min = 0, x_max = 0;
    double y_min = 0, y_max = 1;
    bool whole_days = false;              // every time x is a midnight (dates)
    std::vector<std::string> categories;  // non-empty: a category axis
};

struct ChartLayout {
    double width = 0, height = 0;
    bool has_title = false, has_caption = false;
    double plot_x0 = 0, plot_x1 = 0, plot_y0 = 0, plot_y1 = 0;
    double plot_w = 0, plot_h = 0;
    AxisScale x_scale, y_scale;
    // The legend: columns of per_column entries, names cut to legend_chars.
    std::size_t per_column = 1, columns = 0, legend_chars = chart_style::kLegendChars;
    double legend_w = 0;

    double px(double x) const {
        return plot_x0 + axis_fraction(x, x_scale.low, x_scale.high) * plot_w;
    }
    double py(double y) const {
        return plot_y1 - axis_fraction(y, y_scale.low, y_scale.high) * plot_h;
    }
};

ChartLayout lay_out_chart(const ChartOptions& options, const std::vector<std::string>& names,
                          const ChartExtent& extent);

}  // namespace almanac
