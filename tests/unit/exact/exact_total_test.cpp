// SPDX-License-Identifier: MIT
#include "core/exact/exact_total.h"

#include <catch2/catch.hpp>
#include <cstdint>
#include <limits>

using namespace almanac;

TEST_CASE("a total of integers is an integer while it fits in 64 bits") {
    // Integer arithmetic (from memory): (2^63 - 1) + 1 - 1 = 2^63 - 1, exact
    // although the middle total does not fit.
    constexpr std::int64_t kMost = std::numeric_limits<std::int64_t>::max();
    ExactTotal total;
    total.add_integer(kMost);
    total.add_integer(1);
    auto over = total.value();
    REQUIRE(over);
    CHECK_FALSE(over->is_integer);
    // math.fsum([2**63 - 1, 1]) == 9.223372036854775808e18 (each int as a double).
    CHECK(over->real == 9223372036854775808.0);
    total.remove_integer(1);
    auto back = total.value();
    REQUIRE(back);
    CHECK(back->is_integer);
    CHECK(back->integer == kMost);
}

TEST_CASE("one real value makes the total real, and removing it makes it an integer again") {
    ExactTotal total;
    total.add_integer(3);
    total.add_real(0.5);
    auto mixed = total.value();
    REQUIRE(mixed);
    CHECK_FALSE(mixed->is_integer);
    CHECK(mixed->real == 3.5);  // exact binary arithmetic (from memory)
    total.remove_real(0.5);
    auto whole = total.value();
    REQUIRE(whole);
    CHECK(whole->is_integer);
    CHECK(whole->integer == 3);
}

TEST_CASE("a total with no values is nothing, also after every value left") {
    ExactTotal total;
    CHECK_FALSE(total.value());
    total.add_real(1e15);
    total.remove_real(1e15);
    CHECK_FALSE(total.value());
}

TEST_CASE("a spike that left the frame leaves no trace in the total") {
    // Python documentation of math.fsum (from memory): fsum([.1]*10) == 1.0.
    ExactTotal total;
    total.add_real(1e300);
    for (int i = 0; i < 10; ++i) total.add_real(0.1);
    total.remove_real(1e300);
    auto value = total.value();
    REQUIRE(value);
    CHECK(value->real == 1.0);
}
