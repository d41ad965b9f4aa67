// SPDX-License-Identifier: MIT
// A sparkline: one block character (U+2581 lowest ... U+2588 highest) per
// value, in x order, for a glance at a series in a terminal.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/chart/axis_kind.h"

namespace almanac {

// The level 0..7 of y on the scale [min, max]: round(7 (y - min) / (max - min)),
// rounding halves up (as SQLite's round() does for these non-negative values).
// A constant series (min == max) is level 3 throughout.
int sparkline_level(double y, double min, double max);

// Collects the rows of one group.
class Sparkline {
  public:
    // Ties in x keep the order in which rows arrived (a stable sort).
    void add(double x, std::optional<double> y);
    bool empty() const { return points_.empty(); }
    // UTF-8 text, one character per added row: a block for a value, a space for
    // a missing value (so every column stays one row).
    std::string render() const;

  private:
    struct Point {
        double x;
        std::optional<double> y;
    };
    std::vector<Point> points_;
};

}  // namespace almanac
