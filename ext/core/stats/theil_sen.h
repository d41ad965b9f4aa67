// SPDX-License-Identifier: MIT
// The Theil–Sen slope (Theil 1950, Sen 1968): the median of the slopes
// (y_j − y_i)/(x_j − x_i) over all pairs of points with distinct x, the mean
// of the two middle slopes when their count is even.
//
// "Exact" here means: the very double that sorting every pairwise slope,
// each computed in double precision as written above, and taking the median
// gives (numpy.median over those slopes, as scipy.stats.theilslopes does) —
// without ever holding the n(n−1)/2 slopes. Memory is O(n); time is
// O(n log n) per counting pass and a few dozen passes (see theil_sen.cpp).
#pragma once

#include <optional>
#include <vector>

#include "core/stats/point.h"

namespace almanac {

// nullopt when fewer than two distinct x. Coordinates must be finite; throws
// almanac::Error if two x or two y are so far apart that their difference
// overflows a double (slopes would then be infinite or undefined).
std::optional<double> theil_sen_slope(std::vector<Point> points);

// The seasonal form (Hirsch, Slack & Smith 1982): the median of the slopes
// of the pairs that share a season and have distinct x, with the same
// meaning of "exact"; nullopt when there is no such pair.
std::optional<double> seasonal_theil_sen_slope(std::vector<SeasonalPoint> points);

}  // namespace almanac
