// SPDX-License-Identifier: MIT
// The parts every chart draws the same way around its data: background,
// title, grid, axes and legend. The chart itself draws between the frame and
// the legend.
#pragma once

#include "core/chart/chart_layout.h"
#include "core/chart/series_ranking.h"
#include "core/chart/svg_writer.h"

namespace almanac {

// Opens the document: <title> (the title, or `fallback_title` for screen
// readers), background, visible title, grid, y axis with caption, x axis.
SvgWriter draw_chart_frame(const ChartLayout& layout, const ChartOptions& options,
                           const char* fallback_title);

// How a legend entry shows its series: as a stretch of thick line or as a box.
enum class LegendSwatch { Line, Box };

// One entry per series in legend order, each in its series' colour and dashes.
void draw_chart_legend(SvgWriter& svg, const ChartLayout& layout, const SeriesRanking& ranking,
                       LegendSwatch swatch, double line_width);

}  // namespace almanac
