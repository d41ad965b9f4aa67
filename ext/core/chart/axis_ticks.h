// SPDX-License-Identifier: MIT
// Ticks for a numeric axis: round-number steps (1, 2 or 5 times a power of
// ten), labels with just enough decimals to tell neighbouring ticks apart.
#pragma once

#include <string>
#include <vector>

namespace almanac {

struct AxisTick {
    double value;         // in data units (milliseconds since 1970 for time axes)
    std::string label;    // first line under / beside the tick
    std::string context;  // optional second line (a calendar axis puts the year here)
};

struct AxisScale {
    double low;                   // data value at the start of the axis
    double high;                  // data value at its end (> low)
    std::vector<AxisTick> ticks;  // in increasing order, all within [low, high]
};

// The smallest step of the form 1, 2 or 5 x 10^k that splits `range` into at
// most `max_intervals` intervals. range > 0, max_intervals >= 1.
double round_step(double range, int max_intervals);

// The label of value k*step: fixed notation with as many decimals as the
// step needs, or %g-style scientific notation for magnitudes beyond 1e15 or
// steps below 1e-6, where fixed notation would be unreadable.
std::string tick_label(double value, double step);

// Ticks at every multiple of a round step between min and max. With
// `extend` the axis runs out to the multiples just outside the data (a y axis
// that starts and ends on a labelled line); without it the axis is exactly
// [min, max] (an x axis whose lines reach both edges). A zero-width range is
// widened around its value first. Needs finite min <= max.
AxisScale numeric_scale(double min, double max, int max_intervals, bool extend);

// The fraction of the way from low to high at which v lies, without
// overflowing when high - low exceeds the largest double.
double axis_fraction(double v, double low, double high);

}  // namespace almanac
