// SPDX-License-Identifier: MIT
#include "core/stats/seasonal_trend_decomposition.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "core/text/error.h"

using namespace almanac;

TEST_CASE("the default smoothers follow the period and the seasonal span") {
    // Cleveland et al. (1990): n_t the odd integer from 1.5·n_p/(1 − 1.5/n_s),
    // n_l the smallest odd integer above n_p. 1.5·7/(1 − 1.5/7) = 13.36 → 15;
    // with n_s = 13: 11.87 → 13; 1.5·52/(1 − 1.5/7) = 99.3 → 101 (by hand).
    CHECK(StlSettings::defaults(7, 7, false).trend == 15);
    CHECK(StlSettings::defaults(7, 13, false).trend == 13);
    CHECK(StlSettings::defaults(52, 7, false).trend == 101);
    CHECK(StlSettings::defaults(7, 7, false).low_pass == 9);
    CHECK(StlSettings::defaults(12, 7, false).low_pass == 13);
    const StlSettings robust = StlSettings::defaults(12, 7, true);
    CHECK((robust.inner == 2 && robust.outer == 15));
    const StlSettings plain = StlSettings::defaults(12, 7, false);
    CHECK((plain.inner == 5 && plain.outer == 0));
    CHECK_THROWS_AS(StlSettings::defaults(7, 8, false), Error);
    CHECK_THROWS_AS(StlSettings::defaults(1, 7, false), Error);
}

TEST_CASE("a line plus a repeating zero-mean pattern comes apart into the two exactly") {
    // Local lines reproduce a line and whole-cycle averages remove the
    // pattern, so every step is exact up to rounding (common practice). Not
    // robust: an exact fit leaves only rounding noise to weigh points by.
    const std::size_t period = 7, n = 10 * period;
    const double pattern[] = {3, -1, -1, 0.5, -2, 1, -0.5};
    std::vector<double> y(n);
    for (std::size_t i = 0; i < n; ++i)
        y[i] = 50 + 0.3 * static_cast<double>(i) + pattern[i % period];
    SeasonalTrendDecomposition stl;
    StlParts parts;
    stl.decompose(y, StlSettings::defaults(period, 7, false), parts);
    for (std::size_t i = 0; i < n; ++i) {
        CHECK(parts.trend[i] == Approx(50 + 0.3 * static_cast<double>(i)).margin(1e-9));
        CHECK(parts.season[i] == Approx(pattern[i % period]).margin(1e-9));
        CHECK(std::fabs(parts.remainder[i]) < 1e-9);
        CHECK(parts.weight[i] == 1.0);
    }
}

TEST_CASE(
    "a robust fit gives a promotion spike a weight near zero and keeps it out of the season") {
    const std::size_t period = 7, n = 8 * period;
    std::vector<double> y(n);
    for (std::size_t i = 0; i < n; ++i)
        y[i] = 20 + 4 * std::sin(6.283185307179586 * static_cast<double>(i) / period) +
               0.3 * std::cos(1.7 * static_cast<double>(i));  // a little irregularity
    y[30] += 100;
    SeasonalTrendDecomposition stl;
    StlParts parts;
    stl.decompose(y, StlSettings::defaults(period, 7, true), parts);
    CHECK(parts.weight[30] < 0.01);
    CHECK(parts.remainder[30] > 90);
    StlParts plain_parts;  // the same object again: nothing carries over
    stl.decompose(y, StlSettings::defaults(period, 7, false), plain_parts);
    CHECK(plain_parts.weight[30] == 1.0);
    CHECK(plain_parts.remainder[30] < parts.remainder[30]);
}

TEST_CASE("fewer than two whole cycles is refused") {
    SeasonalTrendDecomposition stl;
    StlParts parts;
    CHECK_THROWS_AS(
        stl.decompose(std::vector<double>(13, 1.0), StlSettings::defaults(7, 7, false), parts),
        Error);
}
