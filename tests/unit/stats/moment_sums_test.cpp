// SPDX-License-Identifier: MIT
#include "core/stats/moment_sums.h"

#include <catch2/catch.hpp>
#include <cmath>

using namespace almanac;

TEST_CASE("NumAcc1 has mean 10000002 and standard deviation 1") {
    // NIST StRD univariate NumAcc1 certified values (from memory).
    UnivariateMoments m;
    for (double v : {10000001.0, 10000003.0, 10000002.0}) m.add(v);
    CHECK(*m.standard_deviation(true) == 1.0);
    CHECK(*m.variance(true) == 1.0);
}

TEST_CASE("variance of 1, 2, 3, 4 is 5/3 (sample) and 5/4 (population)") {
    // Σ(x − 2.5)² = 5 by hand (common practice textbook example).
    UnivariateMoments m;
    for (double v : {1.0, 2.0, 3.0, 4.0}) m.add(v);
    CHECK(*m.variance(true) == 5.0 / 3.0);
    CHECK(*m.variance(false) == 1.25);
    CHECK(*m.standard_deviation(false) == std::sqrt(1.25));
}

TEST_CASE("too few rows give no variance") {
    UnivariateMoments m;
    CHECK_FALSE(m.variance(false));
    m.add(5.0);
    CHECK_FALSE(m.variance(true));
    CHECK(*m.variance(false) == 0.0);
}

TEST_CASE("a spike that left the frame does not disturb the variance") {
    // Property: the frame after the spike equals a fresh computation of it.
    UnivariateMoments fresh, slid;
    slid.add(1e15);
    slid.add(3.25);
    for (double v : {1000000000.01, 1000000000.02, 1000000000.04}) {
        fresh.add(v);
        slid.add(v);
    }
    slid.remove(1e15);
    slid.remove(3.25);
    CHECK(*slid.variance(true) == *fresh.variance(true));
}

TEST_CASE("a straight line is fitted exactly, with the standard's special cases") {
    // y = 3 + 2x on x = 0..4: slope 2, intercept 3, no residual (from memory).
    BivariateMoments m;
    for (int x = 0; x < 5; ++x) m.add(3.0 + 2.0 * x, x);
    CHECK(*m.slope() == 2.0);
    CHECK(*m.intercept() == 3.0);
    CHECK(*m.r_squared() == 1.0);
    CHECK(*m.correlation() == 1.0);
    CHECK(*m.residual_sd() == 0.0);
    CHECK(*m.slope_stderr() == 0.0);
    CHECK(*m.sxx() == 10.0);
    CHECK(*m.mean_x() == 2.0);

    // ISO/IEC 9075 REGR_R2: 1 when Syy = 0 and Sxx > 0; NULL when Sxx = 0.
    BivariateMoments flat;
    for (int x = 0; x < 3; ++x) flat.add(7.0, x);
    CHECK(*flat.r_squared() == 1.0);
    CHECK_FALSE(flat.correlation());
    CHECK(*flat.slope() == 0.0);
    BivariateMoments vertical;
    for (int y = 0; y < 3; ++y) vertical.add(y, 7.0);
    CHECK_FALSE(vertical.slope());
    CHECK_FALSE(vertical.intercept());
    CHECK_FALSE(vertical.r_squared());
    CHECK_FALSE(vertical.residual_sd());
    CHECK(*vertical.covariance(true) == 0.0);
}

TEST_CASE("residual spread of a small fit") {
    // Points (0,0), (1,1), (2,1), (3,3): slope 0.9, intercept -0.1, Sxx 5, SSE 0.7,
    // worked by hand (common practice least-squares formulas).
    BivariateMoments m;
    m.add(0, 0);
    m.add(1, 1);
    m.add(1, 2);
    m.add(3, 3);
    CHECK(*m.slope() == Approx(0.9).epsilon(1e-15));
    CHECK(*m.intercept() == Approx(-0.1).epsilon(1e-14));
    CHECK(*m.residual_sd() == Approx(std::sqrt(0.35)).epsilon(1e-15));
    CHECK(*m.slope_stderr() == Approx(std::sqrt(0.35 / 5.0)).epsilon(1e-15));
    CHECK_FALSE(BivariateMoments().slope());
}
