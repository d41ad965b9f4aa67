// SPDX-License-Identifier: MIT
#include "core/stats/order_statistics.h"

#include <algorithm>
#include <catch2/catch.hpp>
#include <random>
#include <vector>

#include "core/text/error.h"

using namespace almanac;

namespace {
// The definition itself, for comparison: sort everything, interpolate
// between ranks floor(h) and floor(h) + 1 with numpy's formula.
double quantile_by_sorting(std::vector<double> values, double p) {
    std::sort(values.begin(), values.end());
    QuantilePosition at = quantile_position(values.size(), p);
    if (at.lower + 1 == values.size()) return values.back();
    return interpolate(values[at.lower], values[at.lower + 1], at.fraction);
}
}  // namespace

TEST_CASE("quantile positions follow h = (n - 1) p") {
    // Hyndman & Fan (1996), definition 7: h = (n − 1)p + 1 in 1-based ranks.
    auto at = quantile_position(4, 0.25);
    CHECK(at.lower == 0);
    CHECK(at.fraction == 0.75);
    at = quantile_position(5, 0.5);
    CHECK(at.lower == 2);
    CHECK(at.fraction == 0.0);
    at = quantile_position(5, 1.0);
    CHECK(at.lower == 4);
    at = quantile_position(1, 0.3);
    CHECK(at.lower == 0);
    CHECK(at.fraction == 0.0);
}

TEST_CASE("quantiles interpolate linearly between neighbouring order statistics") {
    // R's default quantile(1:4, 0.25) = 1.75 (type 7; from memory).
    CHECK(*quantile_of({4, 1, 3, 2}, 0.25) == 1.75);
    // numpy.percentile documentation: a = [[10, 7, 4], [3, 2, 1]],
    // np.percentile(a, 50) is 3.5.
    CHECK(*quantile_of({10, 7, 4, 3, 2, 1}, 0.5) == 3.5);
    // The extremes are the minimum and the maximum (common practice).
    CHECK(*quantile_of({5, -2, 9}, 0.0) == -2);
    CHECK(*quantile_of({5, -2, 9}, 1.0) == 9);
    CHECK(*quantile_of({42}, 0.7) == 42);
    CHECK_FALSE(quantile_of({}, 0.5).has_value());
}

TEST_CASE("a probability outside [0, 1] is refused") {
    CHECK_NOTHROW(check_quantile_probability(0.0));
    CHECK_NOTHROW(check_quantile_probability(1.0));
    CHECK_THROWS_AS(check_quantile_probability(1.5), Error);
    CHECK_THROWS_AS(check_quantile_probability(-0.01), Error);
    CHECK_THROWS_AS(check_quantile_probability(std::nan("")), Error);
}

TEST_CASE("the sliding quantile matches sorting after every insert and remove") {
    const double p = GENERATE(0.0, 0.1, 0.25, 0.5, 0.9, 1.0, 0.3333333333333333);
    const std::size_t width = GENERATE(1, 2, 7, 31, 100);
    std::mt19937_64 random(static_cast<unsigned>(width * 1000 + p * 977));
    std::uniform_int_distribution<int> small(0, 20);  // many equal values
    std::uniform_real_distribution<double> wide(-1e9, 1e9);
    SlidingQuantile window(p);
    std::vector<double> series;
    for (int i = 0; i < 600; ++i) series.push_back(i % 3 ? small(random) : wide(random));
    std::size_t compared = 0;
    for (std::size_t i = 0; i < series.size(); ++i) {
        window.insert(series[i]);
        if (i >= width) REQUIRE(window.remove(series[i - width]));
        const std::size_t first = i >= width ? i - width + 1 : 0;
        std::vector<double> frame(series.begin() + first, series.begin() + i + 1);
        // oracle: the definition (sort the frame, interpolate), as above
        REQUIRE(window.size() == frame.size());
        REQUIRE(*window.value() == quantile_by_sorting(frame, p));
        ++compared;
    }
    // The frame shrinks back to empty.
    for (std::size_t i = series.size() - std::min(width, series.size()); i < series.size(); ++i)
        REQUIRE(window.remove(series[i]));
    CHECK(window.size() == 0);
    CHECK_FALSE(window.value().has_value());
    CHECK(compared == series.size());
}

TEST_CASE("values may leave the sliding quantile in any order") {
    SlidingQuantile window(0.5);
    for (double v : {5.0, 1.0, 4.0, 1.0, 3.0}) window.insert(v);
    CHECK(*window.value() == 3.0);  // sorted 1 1 3 4 5 (hand-computed)
    CHECK(window.remove(4.0));      // not the oldest
    CHECK(*window.value() == 2.0);  // 1 1 3 5 → (1 + 3) / 2 (hand-computed)
    CHECK_FALSE(window.remove(7.0));
    CHECK(window.remove(1.0));
    CHECK(window.remove(1.0));
    CHECK(*window.value() == 4.0);  // 3 5 (hand-computed)
}

TEST_CASE("a frame takes values up to its documented limit and refuses the next one") {
    // source: README "Limits" (10,000,000 values per group or window frame)
    REQUIRE(almanac::kMostFrameValues == 10000000);
    REQUIRE_NOTHROW(almanac::check_frame_room(almanac::kMostFrameValues - 1));
    REQUIRE_THROWS_AS(almanac::check_frame_room(almanac::kMostFrameValues), almanac::Error);
}
