// SPDX-License-Identifier: MIT
#include "core/exact/exact_number.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <cstdint>

using namespace almanac;

TEST_CASE("exact numbers multiply and subtract without rounding") {
    // (2^40 + 1)(2^40 - 1) = 2^80 - 1 (difference of squares, from memory).
    ExactNumber a(std::uint64_t(1) << 40), one(1);
    ExactNumber product = (a + one) * (a - one);
    ExactNumber square = a * a;
    CHECK((product - square).to_double() == -1.0);
    CHECK((square - product).sign() == 1);
    CHECK((product - product).is_zero());
    CHECK(product.to_double() == std::ldexp(1.0, 80));  // 2^80 - 1 rounds to 2^80
    CHECK(ExactNumber(3).to_scaled().to_double() == 3.0);
}
