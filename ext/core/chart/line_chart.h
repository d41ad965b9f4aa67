// SPDX-License-Identifier: MIT
// A line chart as a complete SVG document: one line per (series, layer),
// points in x order, a missing y breaks the line; colours from almanac's
// palette by sorted series name, so the same data always gets the same
// colours and a series keeps its colour in every layer; a numeric or
// calendar x axis, a round-number y axis, a legend.
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

namespace almanac {

// 'raw' is drawn thin and light under 'smooth', which is thick and full
// strength: the noise and the direction of one series at once.
enum class ChartLayer : std::uint8_t { Raw = 0, Smooth = 1 };

// Throws almanac::Error unless text is raw or smooth (any case).
ChartLayer parse_chart_layer(std::string_view text);
const char* chart_layer_name(ChartLayer layer);

struct ChartLimits {
    std::size_t max_series = 64;      // 8 colours x 8 dash patterns
    std::size_t max_points = 200000;  // rows, including those with a missing y
};

class LineChart {
  public:
    explicit LineChart(ChartLimits limits = {}) : limits_(limits) {}

    // The x kind of the chart: the first value decides, the other kind is
    // refused (throws almanac::Error saying what was expected).
    void accept_x_kind(AxisKind kind) { x_kind_.accept(kind); }

    // One row. Throws almanac::Error past a limit.
    void add(double x, std::optional<double> y, std::string_view series, ChartLayer layer);

    std::size_t point_count() const { return points_.size(); }
    bool empty() const { return points_.empty(); }
    std::size_t series_count() const { return series_ids_.size(); }

    // Measures the data (extent), lays the chart out (chart_layout.h), draws
    // the frame and legend (chart_frame.h) and the lines between them.
    std::string render_svg(const ChartOptions& options) const;

    // One row as added.
    struct Point {
        double x;
        double y;
        bool has_y;
        ChartLayer layer;
        std::uint32_t series;  // id in order of first appearance
    };

  private:
    ChartLimits limits_;
    AxisKindGuard x_kind_;
    std::map<std::string, std::uint32_t, std::less<>> series_ids_;
    std::vector<Point> points_;
};

}  // namespace almanac
