// SPDX-License-Identifier: MIT
#include "core/stats/loess.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

using namespace almanac;

TEST_CASE("a local line through points on a line is the line, at every span and position") {
    // Common practice: weighted least squares of degree 1 reproduces a line exactly.
    std::vector<double> y(40), fit(40);
    Loess loess;
    for (std::size_t i = 0; i < y.size(); ++i) y[i] = 3.0 - 0.25 * static_cast<double>(i + 1);
    for (std::size_t span : {3u, 7u, 15u, 39u, 41u, 101u}) {
        loess.smooth(y.data(), y.size(), span, 1, nullptr, fit.data());
        for (std::size_t i = 0; i < y.size(); ++i) CHECK(fit[i] == Approx(y[i]).margin(1e-12));
    }
    // Beyond the ends too: the extension of the line.
    const auto before = loess.fit_at(y.data(), y.size(), 7, 1, 0.0, 1, 7, nullptr);
    CHECK(*before == Approx(3.0).margin(1e-12));
}

TEST_CASE("tricube weights give the nearest points the most say and the window's ends none") {
    // By hand: span 3 at position 2 has half-width 1, so positions 1 and 3
    // lie at the 99.9 % cut-off and weigh nothing; the fit is y at 2.
    std::vector<double> y{0.0, 1.0, 0.0};
    Loess loess;
    CHECK(*loess.fit_at(y.data(), 3, 3, 1, 2.0, 1, 3, nullptr) == 1.0);
    // Half-width 2 (span 5 over 3 points adds (5 − 3)/2 = 1): weights
    // (1 − (1/2)³)³ = 0.669921875 at the ends, 1 in the middle; degree 0
    // is their weighted mean (by hand).
    const double end = 0.669921875;
    CHECK(*loess.fit_at(y.data(), 3, 5, 0, 2.0, 1, 3, nullptr) ==
          Approx(1.0 / (1.0 + 2 * end)).epsilon(1e-15));
}

TEST_CASE("a point whose robustness weights are all zero keeps its own value") {
    std::vector<double> y{5.0, 1.0, 9.0}, zero(3, 0.0), fit(3);
    Loess loess;
    CHECK_FALSE(loess.fit_at(y.data(), 3, 3, 1, 2.0, 1, 3, zero.data()));
    loess.smooth(y.data(), 3, 3, 1, zero.data(), fit.data());
    CHECK(fit == y);
}
