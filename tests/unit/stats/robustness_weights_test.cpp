// SPDX-License-Identifier: MIT
#include "core/stats/robustness_weights.h"

#include <catch2/catch.hpp>
#include <vector>

using namespace almanac;

TEST_CASE("robustness weights are the bisquare of the remainder over six median remainders") {
    // Cleveland et al. (1990): B(|r| / (6 · median |r|)), B(u) = (1 − u²)².
    // Remainders 1, 1, 2, 3, 12: median 2, scale 12 (by hand).
    std::vector<double> y{1, -1, 2, 3, 12}, fit(5, 0.0), w(5);
    RobustnessWeights weights;
    weights.compute(y.data(), fit.data(), y.size(), w.data());
    auto bisquare = [](double u) { return (1 - u * u) * (1 - u * u); };
    CHECK(w[0] == Approx(bisquare(1.0 / 12)));
    CHECK(w[1] == w[0]);
    CHECK(w[2] == Approx(bisquare(2.0 / 12)));
    CHECK(w[3] == Approx(bisquare(3.0 / 12)));
    CHECK(w[4] == 0.0);  // at the scale itself: beyond the 99.9 % cut-off
}

TEST_CASE("an even count takes the mean of the two middle remainders") {
    // Remainders 1, 2, 4, 100: median 3, scale 18; 4/18 → bisquare (by hand).
    std::vector<double> y{1, 2, 4, 100}, fit(4, 0.0), w(4);
    RobustnessWeights weights;
    weights.compute(y.data(), fit.data(), y.size(), w.data());
    const double u = 4.0 / 18;
    CHECK(w[2] == Approx((1 - u * u) * (1 - u * u)));
    CHECK(w[3] == 0.0);
}

TEST_CASE("a fit that is exact at half the points or more leaves every weight at 1") {
    std::vector<double> y{0, 0, 0, 5}, fit(4, 0.0), w(4);
    RobustnessWeights weights;
    weights.compute(y.data(), fit.data(), y.size(), w.data());
    CHECK(w == std::vector<double>{1, 1, 1, 1});
}
