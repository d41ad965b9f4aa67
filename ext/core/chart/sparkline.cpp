// SPDX-License-Identifier: MIT
#include "core/chart/sparkline.h"

#include <algorithm>
#include <cmath>

#include "core/chart/axis_ticks.h"

namespace almanac {

int sparkline_level(double y, double min, double max) {
    if (!(max > min)) return 3;  // U+2584, the middle of the eight heights
    // The formula as written, unless an intermediate overflows (values
    // beyond 2.5e307); then the overflow-free fraction.
    double scaled = 7.0 * (y - min) / (max - min);
    if (!std::isfinite(scaled) || !std::isfinite(max - min))
        scaled = 7.0 * axis_fraction(y, min, max);
    // std::round rounds halves away from zero, exactly (floor(v + 0.5) does
    // not: 0.49999999999999994 + 0.5 rounds up to 1 in binary arithmetic).
    return std::clamp(static_cast<int>(std::round(scaled)), 0, 7);
}

void Sparkline::add(double x, std::optional<double> y) { points_.push_back({x, y}); }

std::string Sparkline::render() const {
    std::vector<Point> ordered = points_;
    std::stable_sort(ordered.begin(), ordered.end(),
                     [](const Point& a, const Point& b) { return a.x < b.x; });
    double min = 0, max = 0;
    bool any = false;
    for (const Point& p : ordered) {
        if (!p.y) continue;
        min = any ? std::min(min, *p.y) : *p.y;
        max = any ? std::max(max, *p.y) : *p.y;
        any = true;
    }
    std::string out;
    out.reserve(ordered.size() * 3);
    for (const Point& p : ordered) {
        if (!p.y) {
            out += ' ';
            continue;
        }
        // U+2581 + level, in UTF-8: E2 96 81..88.
        out += "\xE2\x96";
        out += static_cast<char>(0x81 + sparkline_level(*p.y, min, max));
    }
    return out;
}

}  // namespace almanac
