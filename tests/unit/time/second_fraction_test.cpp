// SPDX-License-Identifier: MIT
#include "core/time/second_fraction.h"

#include <catch2/catch.hpp>

using namespace almanac;

TEST_CASE("a fraction of a second rounds half up on its exact decimal value") {
    // Expected: SQLite 3.40's strftime('%f', ...) in the sqlite3 shell shows
    // 00.501 for .5005 and 00.500 for .50049 (tests/reference/test_second_fractions.py
    // compares every such fraction).
    CHECK(read_second_fraction("5005")->millis == 501);
    CHECK(read_second_fraction("50049")->millis == 500);
    CHECK(read_second_fraction("0005")->millis == 1);
    CHECK(read_second_fraction("00049999")->millis == 0);
    CHECK(read_second_fraction("5")->millis == 500);
    CHECK(read_second_fraction("25")->millis == 250);
    CHECK(read_second_fraction("9995")->millis == 1000);
}

TEST_CASE("a fraction reader counts what it read and stops where asked") {
    auto all = read_second_fraction("123456789012Z");
    REQUIRE(all);
    CHECK(all->digits == 12);
    CHECK(all->millis == 123);
    auto nine = read_second_fraction("123456789012", 9);
    REQUIRE(nine);
    CHECK(nine->digits == 9);
    CHECK_FALSE(read_second_fraction("Z"));
    CHECK_FALSE(read_second_fraction(""));
}
