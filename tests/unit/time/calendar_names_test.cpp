// SPDX-License-Identifier: MIT
#include "core/time/calendar_names.h"

#include <catch2/catch.hpp>

using namespace almanac;

TEST_CASE("names are read in full or by their first three letters, in any case") {
    // from memory: the English month and weekday names.
    CHECK(month_named("march") == date::March);
    CHECK(month_named("MAR") == date::March);
    CHECK(month_named("Sept") == std::nullopt);
    CHECK(month_named("marc") == std::nullopt);
    CHECK(weekday_named("sunday") == date::Sunday);
    CHECK(weekday_named("Thu") == date::Thursday);
    CHECK(weekday_named("th") == std::nullopt);
}

TEST_CASE("a name at the start of a text is its full name before its abbreviation") {
    auto june = match_month_name("June 5");
    REQUIRE(june);
    CHECK(june->value == date::June);
    CHECK(june->length == 4);
    auto jun = match_month_name("Jun 5");
    REQUIRE(jun);
    CHECK(jun->length == 3);
    auto sat = match_weekday_name("SATURDAY,");
    REQUIRE(sat);
    CHECK(sat->value == date::Saturday);
    CHECK(sat->length == 8);
    CHECK_FALSE(match_weekday_name("Xmas"));
}

TEST_CASE("every name reads back as itself") {
    for (unsigned m = 1; m <= 12; ++m) {
        const date::month month{m};
        CHECK(month_named(month_name(month)) == month);
        CHECK(month_named(month_abbreviation(month)) == month);
        CHECK(month_named(lowercase_month_name(month)) == month);
    }
    for (unsigned w = 0; w < 7; ++w) {
        const date::weekday weekday{w};
        CHECK(weekday_named(weekday_name(weekday)) == weekday);
        CHECK(weekday_named(lowercase_weekday_name(weekday)) == weekday);
    }
    CHECK(weekday_name(date::Monday) == "Monday");
    CHECK(month_abbreviation(date::December) == "Dec");
}
