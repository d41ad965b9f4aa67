// SPDX-License-Identifier: MIT
#include "core/exact/exact_sign.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <random>

using namespace almanac;

TEST_CASE("the sign of a sum of products is exact where rounding would decide it") {
    // oracle: std::fma rounds a·b − c once, which keeps the exact sign.
    std::mt19937_64 random(7);
    std::uniform_real_distribution<double> unit(-1, 1);
    std::uniform_int_distribution<int> exponent(-300, 300);
    for (int i = 0; i < 20000; ++i) {
        double a = std::ldexp(unit(random), exponent(random) / 2);
        double b = std::ldexp(unit(random), exponent(random) / 2);
        double c = a * b;  // rounded: the exact difference is a tiny remainder
        if (i % 3 == 0) c = std::nextafter(c, 0.0);
        const Product terms[2] = {{a, b}, {-c, 1.0}};
        const double residual = std::fma(a, b, -c);
        REQUIRE(exact_sign_of_sum(terms, 2) == (residual > 0) - (residual < 0));
    }
    // Cancellation across the whole exponent range (by hand).
    const Product huge[3] = {{1e308, 1e308}, {-1e308, 1e308}, {0x1p-1074, 0x1p-1074}};
    CHECK(exact_sign_of_sum(huge, 3) == 1);
    const Product zero[4] = {{3, 0.1}, {-0.1, 3}, {0, 5}, {0.5, -2}};
    const Product back[2] = {{0.5, -2}, {1, 1}};
    CHECK(exact_sign_of_sum(zero, 4) == -1);
    CHECK(exact_sign_of_sum(back, 2) == 0);
}
