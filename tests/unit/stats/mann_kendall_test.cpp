// SPDX-License-Identifier: MIT
#include "core/stats/mann_kendall.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <random>
#include <vector>

using namespace almanac;

namespace {
int sign(double v) { return (v > 0) - (v < 0); }

// The definition, pair by pair (Kendall's S).
std::int64_t s_by_definition(const std::vector<Point>& points) {
    std::int64_t s = 0;
    for (std::size_t i = 0; i < points.size(); ++i)
        for (std::size_t j = i + 1; j < points.size(); ++j)
            s += sign(points[j].x - points[i].x) * sign(points[j].y - points[i].y);
    return s;
}
}  // namespace

TEST_CASE("Kendall's S counted by merge sort equals the pair-by-pair sum, ties included") {
    std::mt19937 random(9);
    std::uniform_int_distribution<int> value(0, 6);  // few values: many ties in x and in y
    int compared = 0;
    for (int n = 0; n < 60; ++n) {
        std::vector<Point> points;
        for (int i = 0; i < n; ++i)
            points.push_back({double(value(random)), double(value(random))});
        CHECK(kendall_score(points).s == s_by_definition(points));  // the definition itself
        ++compared;
    }
    CHECK(compared == 60);
}

TEST_CASE("without ties the variance is n(n-1)(2n+5)/18") {
    // Mann (1945), Kendall (1975): Var(S) = n(n−1)(2n+5)/18 (from memory).
    std::vector<Point> points{{1, 3}, {2, 1}, {3, 4}, {4, 2}, {5, 5}};
    const KendallScore score = kendall_score(points);
    CHECK(score.s == 4);                                 // by hand: 7 concordant, 3 discordant
    CHECK(score.variance == Approx(5 * 4 * 15 / 18.0));  // 16.67
}

TEST_CASE("every y tied gives no p-value rather than a rounding artefact") {
    CHECK_FALSE(mann_kendall_p(kendall_score({{1, 2}, {2, 2}, {3, 2}, {4, 2}})));
    CHECK_FALSE(mann_kendall_p(kendall_score({{1, 2}})));
}

TEST_CASE("the seasonal score is the sum of the seasons' scores") {
    // Hirsch, Slack & Smith (1982): S and Var(S) are sums over the seasons.
    std::vector<SeasonalPoint> points{{1, 1, 1}, {2, 3, 1}, {3, 2, 1}, {1, 5, 2},
                                      {2, 4, 2}, {3, 7, 2}, {4, 6, 2}};
    const KendallScore a = kendall_score({{1, 1}, {2, 3}, {3, 2}});
    const KendallScore b = kendall_score({{1, 5}, {2, 4}, {3, 7}, {4, 6}});
    const KendallScore both = seasonal_kendall_score(points);
    CHECK(both.s == a.s + b.s);
    CHECK(both.variance == a.variance + b.variance);
}
