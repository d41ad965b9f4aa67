// SPDX-License-Identifier: MIT
#include "core/chart/axis_ticks.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/text/number_text.h"

namespace almanac {

double round_step(double range, int max_intervals) {
    double raw = range / std::max(1, max_intervals);
    double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
    for (double multiple : {1.0, 2.0, 5.0, 10.0}) {
        double step = multiple * magnitude;
        // The tolerance keeps 0.30000000000000004 / 0.1 from asking for a 4th interval.
        if (step * (1 + 1e-9) >= raw && std::isfinite(step)) return step;
    }
    return std::numeric_limits<double>::max();
}

std::string tick_label(double value, double step) {
    if (std::fabs(value) < step * 1e-9) value = 0;  // -0 and 1e-17 are zero
    if (std::fabs(value) >= 1e15 || step < 1e-6 || step >= 1e15) {
        // value / step overflows to inf for a huge value over a tiny step; more
        // than 17 significant digits never helps, so clamp before converting.
        double wanted = std::ceil(std::log10(std::fabs(value) / step + 1));
        int digits = !(wanted < 16) ? 17 : 1 + std::max(0, int(wanted));
        return general_double(value, digits);
    }
    int decimals = std::max(0, -int(std::floor(std::log10(step) + 1e-9)));
    std::string text = fixed_double(value, decimals);
    if (text == "-0" || text.find_first_not_of("-0.") == std::string::npos)
        text = text.substr(text[0] == '-');
    return text;
}

double axis_fraction(double v, double low, double high) {
    double span = high - low;
    if (std::isfinite(span)) return (v - low) / span;
    return (v / 2 - low / 2) / (high / 2 - low / 2);
}

AxisScale numeric_scale(double min, double max, int max_intervals, bool extend) {
    if (min == max) {
        double widen = min == 0 ? 1.0 : std::fabs(min) * 0.1;
        min -= widen;
        max += widen;
    }
    double range = max - min;
    if (!std::isfinite(range)) range = std::numeric_limits<double>::max();
    double step = round_step(range, max_intervals);
    if (!(step > 0) || !std::isfinite(min / step) || !std::isfinite(max / step)) {
        // Ranges near the limits of a double: label the two ends only.
        return {min, max, {{min, tick_label(min, range), ""}, {max, tick_label(max, range), ""}}};
    }
    double first = std::ceil(min / step), last = std::floor(max / step);
    AxisScale scale{min, max, {}};
    if (extend) {
        first = std::floor(min / step);
        last = std::ceil(max / step);
        double low = first * step, high = last * step;
        if (std::isfinite(low)) scale.low = low;
        if (std::isfinite(high)) scale.high = high;
    }
    // Count in integers from `first`, so a k beyond 2^53 (a tiny step on a
    // huge value) cannot stall the loop; repeated values are dropped.
    int intervals =
        std::isfinite(last - first) ? int(std::min(last - first, 4.0 * max_intervals + 4)) : -1;
    for (int i = 0; i <= intervals; ++i) {
        double value = (first + i) * step;
        if (!std::isfinite(value) || value < scale.low || value > scale.high) continue;
        if (!scale.ticks.empty() && value <= scale.ticks.back().value) continue;
        scale.ticks.push_back({value, tick_label(value, step), ""});
    }
    return scale;
}

}  // namespace almanac
