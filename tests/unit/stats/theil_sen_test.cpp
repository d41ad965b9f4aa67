// SPDX-License-Identifier: MIT
#include "core/stats/theil_sen.h"

#include <algorithm>
#include <catch2/catch.hpp>
#include <cmath>
#include <random>
#include <vector>

#include "core/exact/exact_sign.h"
#include "core/text/error.h"

using namespace almanac;

namespace {
// The definition, spelled out: every pairwise slope with distinct x,
// computed in double, sorted; the middle one, or the mean of the two middle
// ones as numpy.median takes it.
std::optional<double> slope_by_definition(const std::vector<Point>& points) {
    std::vector<double> slopes;
    for (std::size_t i = 0; i < points.size(); ++i)
        for (std::size_t j = 0; j < points.size(); ++j)
            if (points[i].x > points[j].x)
                slopes.push_back((points[i].y - points[j].y) / (points[i].x - points[j].x));
    if (slopes.empty()) return std::nullopt;
    std::sort(slopes.begin(), slopes.end());
    const std::size_t n = slopes.size();
    return n % 2 ? slopes[n / 2] : (slopes[n / 2 - 1] + slopes[n / 2]) / 2.0;
}

bool same_double(double a, double b) { return a == b || (std::isnan(a) && std::isnan(b)); }
}  // namespace

TEST_CASE("the Theil-Sen slope of small hand cases") {
    // Theil (1950), Sen (1968): median of pairwise slopes; worked by hand.
    // Slopes 1, 4.5, 8 → 4.5.
    CHECK(*theil_sen_slope({{1, 1}, {2, 2}, {3, 10}}) == 4.5);
    // A straight line: every slope is 2 (common practice).
    CHECK(*theil_sen_slope({{0, 1}, {1, 3}, {2, 5}, {3, 7}}) == 2.0);
    // One outlier does not move it: slopes 1 (six times), 13.5, 53/3, 26, 51;
    // the middle two are 1 and 1 → 1 (by hand).
    CHECK(*theil_sen_slope({{1, 1}, {2, 2}, {3, 3}, {4, 4}, {5, 55}}) == 1.0);
}

TEST_CASE("pairs with equal x are left out, and too few distinct x give no slope") {
    // Pairs (1,1)-(2,3) and (1,5)-(2,3) only: slopes 2 and −2 → mean 0 (by hand).
    CHECK(*theil_sen_slope({{1, 1}, {1, 5}, {2, 3}}) == 0.0);
    CHECK_FALSE(theil_sen_slope({}).has_value());
    CHECK_FALSE(theil_sen_slope({{3, 1}}).has_value());
    CHECK_FALSE(theil_sen_slope({{3, 1}, {3, 2}, {3, 9}}).has_value());
    // Duplicated points: (0,0)x2, (1,1)x2 → four pairs with slope 1 (by hand).
    CHECK(*theil_sen_slope({{0, 0}, {0, 0}, {1, 1}, {1, 1}}) == 1.0);
}

TEST_CASE("differences that overflow a double are an error") {
    CHECK_THROWS_AS(theil_sen_slope({{-1e308, 0}, {1e308, 1}}), Error);
    CHECK_THROWS_AS(theil_sen_slope({{0, -1e308}, {1, 1e308}}), Error);
}

TEST_CASE("the selection by counting gives the definition's double exactly") {
    // oracle: slope_by_definition above (all pairs, sorted), on inputs large
    // enough (more than 2048 pairs) that the counting path is taken.
    const int kind = GENERATE(range(0, 10));
    const int n = GENERATE(70, 129, 300);
    std::mt19937_64 random(static_cast<unsigned>(kind * 131 + n));
    std::uniform_real_distribution<double> unit(0, 1);
    std::normal_distribution<double> noise(0, 1);
    std::vector<Point> points;
    for (int i = 0; i < n; ++i) {
        double x = i, y = 0;
        switch (kind) {
            case 0:  // a noisy trend
                y = 3 * i + 10 * noise(random);
                break;
            case 1:  // values near 1e9 with cents, julian-day x, spikes
                x = 2460000.5 + i;
                y = 1e9 + std::round(unit(random) * 1e6) / 100 + (i % 37 == 0 ? 1e12 : 0);
                break;
            case 2:  // long runs of equal values: many exact zero slopes
                y = std::floor(i / 25.0) * 7.25;
                break;
            case 3:  // many ties in x
                x = std::floor(i / 4.0);
                y = noise(random);
                break;
            case 4:  // collinear with a slope no double holds exactly
                y = i / 3.0;
                break;
            case 5:  // collinear, exact
                y = 5 - 2 * i;
                break;
            case 6:  // magnitudes from 1e-150 to 1e150
                x = std::ldexp(unit(random) + 0.5, static_cast<int>(unit(random) * 1000) - 500);
                y = std::ldexp(noise(random), static_cast<int>(unit(random) * 1000) - 500);
                break;
            case 7:  // values near 1e12 with cents, small integer x, many duplicates
                x = i % 10;
                y = 1e12 + std::round(unit(random) * 100) / 100;
                break;
            case 8:  // slopes straddling zero, half of them negative
                y = (i % 2 ? 1 : -1) * std::round(unit(random) * 20);
                break;
            default:  // a few distinct y values, random x
                x = std::round(unit(random) * 1e4) / 8;
                y = std::round(unit(random) * 3);
                break;
        }
        points.push_back({x, y});
    }
    std::shuffle(points.begin(), points.end(), random);
    auto expected = slope_by_definition(points);
    auto got = theil_sen_slope(points);
    REQUIRE(expected.has_value() == got.has_value());
    if (expected) {
        INFO("kind " << kind << ", n " << n << ": " << *got << " vs " << *expected);
        CHECK(same_double(*got, *expected));
    }
}

TEST_CASE("the seasonal Theil-Sen slope pairs points of one season only") {
    // Hirsch, Slack & Smith (1982); by hand: season 1 slopes 2, 2, 2; season 2
    // slopes 1 → median of {1, 2, 2, 2} is 2. Across seasons the jump of 100
    // between them would enter the two-argument slope.
    const SeasonKey one = numbered_season(1), two = numbered_season(2);
    std::vector<SeasonalPoint> points{
        {1, 1, one}, {2, 3, one}, {3, 5, one}, {1, 101, two}, {2, 102, two}};
    CHECK(*seasonal_theil_sen_slope(points) == 2.0);
    // No season holds two distinct x: no slope.
    CHECK_FALSE(seasonal_theil_sen_slope({{1, 1, one}, {2, 3, two}}));
}

TEST_CASE("the seasonal slope equals the brute-force median of within-season slopes") {
    std::mt19937 random(17);
    std::uniform_real_distribution<double> noise(-5, 5);
    int compared = 0;
    for (int n : {10, 80, 400, 3000}) {
        std::vector<SeasonalPoint> points;
        for (int i = 0; i < n; ++i)
            points.push_back(
                {double(i / 4), 0.3 * i + noise(random) + 10 * (i % 4), numbered_season(i % 4)});
        // Oracle: the definition, spelled out over every within-season pair.
        std::vector<double> slopes;
        for (const auto& a : points)
            for (const auto& b : points)
                if (same_season(a.season, b.season) && a.x > b.x)
                    slopes.push_back((a.y - b.y) / (a.x - b.x));
        std::sort(slopes.begin(), slopes.end());
        const std::size_t m = slopes.size();
        const double expected = m % 2 ? slopes[m / 2] : (slopes[m / 2 - 1] + slopes[m / 2]) / 2.0;
        CHECK(*seasonal_theil_sen_slope(points) == expected);
        ++compared;
    }
    CHECK(compared == 4);
}
