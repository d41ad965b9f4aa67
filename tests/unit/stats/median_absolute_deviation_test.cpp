// SPDX-License-Identifier: MIT
#include "core/stats/median_absolute_deviation.h"

#include <catch2/catch.hpp>

using namespace almanac;

TEST_CASE("the median absolute deviation ignores one wild value") {
    // By hand: median 2; deviations 1 1 0 0 2 4 7 → sorted 0 0 1 1 2 4 7 → 1.
    // (Same as scipy.stats.median_abs_deviation([1,1,2,2,4,6,9]) = 1.0, from memory.)
    CHECK(*median_absolute_deviation({1, 1, 2, 2, 4, 6, 9}) == 1.0);
    // Even count: median (2+3)/2 = 2.5; deviations 1.5 .5 .5 97.5 → (0.5+1.5)/2 = 1 (by hand).
    CHECK(*median_absolute_deviation({1, 2, 3, 100}) == 1.0);
    CHECK(*median_absolute_deviation({7}) == 0.0);
    CHECK_FALSE(median_absolute_deviation({}));
}
