// SPDX-License-Identifier: MIT
// A data point of the robust trend statistics (Theil–Sen, Mann–Kendall),
// and the same with the season it belongs to for their seasonal forms
// (Hirsch, Slack & Smith 1982), which compare points of one season only.
#pragma once

#include <algorithm>
#include <vector>

#include "core/stats/period_totals.h"

namespace almanac {

struct Point {
    double x;
    double y;
};

// A season is any SQL value but NULL: a number (period_position gives 1,
// 2, ...) or a label ('Mon', 'spring'), compared as SQLite compares values
// (numbers by value, then TEXT by its bytes), as items are.
using SeasonKey = ValueKey;

inline SeasonKey numbered_season(double number) {
    SeasonKey key;
    key.kind = SeasonKey::Kind::Real;
    key.real = number;
    return key;
}
inline bool same_season(const SeasonKey& a, const SeasonKey& b) {
    return !value_less(a, b) && !value_less(b, a);
}

struct SeasonalPoint {
    double x;
    double y;
    SeasonKey season;
};

// Points ordered by season, in SQLite's order of the season values, so that
// sums over the seasons run in the same order whether a season is coded as a
// number or as text: the same seasons give the same bits.
inline void sort_by_season(std::vector<SeasonalPoint>& points) {
    std::sort(points.begin(), points.end(), [](const SeasonalPoint& a, const SeasonalPoint& b) {
        return value_less(a.season, b.season);
    });
}

}  // namespace almanac
