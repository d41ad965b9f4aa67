// SPDX-License-Identifier: MIT
// almanac's own series palette and the dash patterns that take over when a
// chart has more series than colours.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace almanac {

constexpr std::size_t kPaletteSize = 8;
constexpr std::size_t kDashPatterns = 8;  // 8 colours x 8 patterns = 64 series

// "#rrggbb" of palette entry i (0 <= i < kPaletteSize).
const char* palette_colour(std::size_t i);

// How the series at `rank` (its place in sorted name order) is drawn.
struct SeriesStyle {
    std::string colour;          // "#rrggbb"
    std::vector<double> dashes;  // in multiples of the stroke width; empty = solid
};
SeriesStyle series_style(std::size_t rank);

// The dash pattern as an SVG stroke-dasharray for a given stroke width;
// empty for a solid line.
std::string dash_array(const SeriesStyle& style, double stroke_width);

}  // namespace almanac
