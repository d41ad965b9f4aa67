// SPDX-License-Identifier: MIT
// A data point of the robust trend statistics (Theil–Sen, Mann–Kendall),
// and the same with the season it belongs to for their seasonal forms
// (Hirsch, Slack & Smith 1982), which compare points of one season only.
#pragma once

namespace almanac {

struct Point {
    double x;
    double y;
};

struct SeasonalPoint {
    double x;
    double y;
    // Any number naming the season (period_position gives 1, 2, ...); points
    // of one season share it exactly.
    double season;
};

}  // namespace almanac
