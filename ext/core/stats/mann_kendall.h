// SPDX-License-Identifier: MIT
// The Mann–Kendall test for a monotonic trend (Mann 1945, Kendall 1975) and
// its seasonal form (Hirsch, Slack & Smith 1982, Water Resources Research
// 18(1)): Kendall's S = Σ_{i<j} sgn(x_j − x_i)·sgn(y_j − y_i), its variance
// under "no trend" with the tie corrections for both x and y of the tau-b
// asymptotic test, z = S/√Var(S) without continuity correction, and the
// two-sided p-value 2(1 − Φ(|z|)). Without seasons the p-value is the one
// scipy.stats.kendalltau(x, y, method="asymptotic") gives; with seasons S
// and Var(S) are the sums of the per-season values, added in the order of
// the seasons (point.h), so equal seasons however coded give equal bits.
//
// S is counted exactly, as an integer, in O(n log n): the pairs that are
// discordant are the inversions of y once the points are in x order, which
// merge sort counts (Knight 1966).
#pragma once

#include <cstdint>
#include <optional>
#include <vector>

#include "core/stats/point.h"

namespace almanac {

struct KendallScore {
    std::int64_t s = 0;
    double variance = 0;  // exactly 0 when every x or every y is tied
};

// Coordinates must be finite; throws almanac::Error otherwise.
KendallScore kendall_score(std::vector<Point> points);
KendallScore seasonal_kendall_score(std::vector<SeasonalPoint> points);

// The two-sided p-value; nullopt when the variance is 0 (fewer than two
// points, or every x or every y tied, in every season).
std::optional<double> mann_kendall_p(const KendallScore& score);

}  // namespace almanac
