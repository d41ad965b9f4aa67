// SPDX-License-Identifier: MIT
#include "core/stats/low_pass_filter.h"

#include <catch2/catch.hpp>
#include <vector>

using namespace almanac;

TEST_CASE("a moving average of length 2 is the mean of each neighbouring pair") {
    // By hand.
    std::vector<double> x{1, 2, 3, 5}, out(3);
    moving_average(x.data(), x.size(), 2, out.data());
    CHECK(out == std::vector<double>{1.5, 2.5, 4.0});
}

TEST_CASE("the low-pass averages take a whole cycle's pattern out and leave a line") {
    // A zero-mean pattern averages to 0 over each whole cycle, and moving
    // averages keep a line a line (common practice).
    const std::size_t period = 4, n = 5 * period;
    const double pattern[] = {2, -1, 0.5, -1.5};
    std::vector<double> x(n), out(n - period + 1), scratch(n - period + 1);
    for (std::size_t i = 0; i < n; ++i)
        x[i] = 10 + 0.5 * static_cast<double>(i) + pattern[i % period];
    low_pass_averages(x.data(), n, period, out.data(), scratch.data());
    // Each average is centred: the three lags add (period − 1)/2 twice and 1.
    for (std::size_t j = 0; j < n - 2 * period; ++j)
        CHECK(out[j] == Approx(10 + 0.5 * (static_cast<double>(j) + period)).margin(1e-12));
}
