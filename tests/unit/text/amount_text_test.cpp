// SPDX-License-Identifier: MIT
#include "core/text/amount_text.h"

#include <catch2/catch.hpp>
#include <cmath>

#include "core/text/error.h"

using namespace almanac;

TEST_CASE("money as exports write it reads as its amount") {
    // common practice: US, German and Swiss grouping; accounting parentheses.
    CHECK(*read_amount("$1,050.00", '.') == 1050.0);
    CHECK(*read_amount("1.050,00 \xE2\x82\xAC", ',') == 1050.0);
    CHECK(*read_amount("CHF 1'050.00", '.') == 1050.0);
    CHECK(*read_amount("(12.50)", '.') == -12.5);
}

TEST_CASE("an empty text is no amount") { CHECK_FALSE(read_amount("  ", '.')); }

TEST_CASE("a text that could be read two ways is refused") {
    // README: '12.3.4', '1,05.00', two signs are errors.
    CHECK_THROWS_AS(read_amount("12.3.4", '.'), Error);
    CHECK_THROWS_AS(read_amount("1,05.00", '.'), Error);
    CHECK_THROWS_AS(read_amount("-(5)", '.'), Error);
}

TEST_CASE("a negative zero is zero") {
    // common practice: "-0.00" on a receipt is no refund.
    double zero = *read_amount("-0.00", '.');
    CHECK(zero == 0.0);
    CHECK_FALSE(std::signbit(zero));
}
