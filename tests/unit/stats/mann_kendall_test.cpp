// SPDX-License-Identifier: MIT
#include "core/stats/mann_kendall.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <cstring>
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
    const SeasonKey one = numbered_season(1), two = numbered_season(2);
    std::vector<SeasonalPoint> points{{1, 1, one}, {2, 3, one}, {3, 2, one}, {1, 5, two},
                                      {2, 4, two}, {3, 7, two}, {4, 6, two}};
    const KendallScore a = kendall_score({{1, 1}, {2, 3}, {3, 2}});
    const KendallScore b = kendall_score({{1, 5}, {2, 4}, {3, 7}, {4, 6}});
    const KendallScore both = seasonal_kendall_score(points);
    CHECK(both.s == a.s + b.s);
    CHECK(both.variance == a.variance + b.variance);
}

TEST_CASE("seasons named by text give the bits of the same seasons numbered in their order") {
    // The per-season sums run in SQLite's order of the season values, so
    // 'Mon' < 'Tue' < 'Wed' (by their bytes) add up as 1 < 2 < 3 do.
    std::mt19937 random(23);
    std::uniform_real_distribution<double> noise(-3, 3);
    const char* names[] = {"Mon", "Tue", "Wed"};
    std::vector<SeasonalPoint> numbered, named;
    for (int i = 0; i < 90; ++i) {
        const double x = i / 3, y = 0.1 * i + noise(random);
        numbered.push_back({x, y, numbered_season(i % 3 + 1)});
        SeasonKey label;
        label.kind = SeasonKey::Kind::Text;
        label.bytes = names[i % 3];
        named.push_back({x, y, label});
    }
    const KendallScore a = seasonal_kendall_score(numbered);
    const KendallScore b = seasonal_kendall_score(named);
    CHECK(a.s == b.s);
    CHECK(std::memcmp(&a.variance, &b.variance, sizeof(double)) == 0);  // common practice: bits
}
