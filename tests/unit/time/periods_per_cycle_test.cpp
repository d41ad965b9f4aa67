// SPDX-License-Identifier: MIT
#include "core/time/periods_per_cycle.h"

#include <catch2/catch.hpp>

using namespace almanac;

namespace {
std::int64_t per(const char* spec, const char* cycle) {
    return periods_per_cycle(parse_period_spec(spec), parse_period_spec(cycle));
}
}  // namespace

TEST_CASE("a cycle holds the season lengths analysts use") {
    // Common practice (7 days a week, 24 hours a day, 52 weeks, 12 months,
    // 4 quarters, 24 half-months a year, 3 months a quarter), and a year of
    // 365.2425 days (the Gregorian mean, from memory) gives 365 days.
    CHECK(per("day", "week") == 7);
    CHECK(per("hour", "day") == 24);
    CHECK(per("hour", "week") == 168);
    CHECK(per("day", "year") == 365);
    CHECK(per("week", "year") == 52);
    CHECK(per("half-month", "year") == 24);
    CHECK(per("month", "year") == 12);
    CHECK(per("quarter", "year") == 4);
    CHECK(per("month", "quarter") == 3);
    CHECK(per("month", "year starting april") == 12);
    CHECK(per("day", "week starting sunday") == 7);
}

TEST_CASE("other pairs are counted by mean lengths") {
    // 365.2425 / 12 = 30.44 days a month; 8,760 hours a year of 365 days
    // gives 8,765.82 in the mean year (by hand).
    CHECK(per("day", "month") == 30);
    CHECK(per("hour", "year") == 8766);
    CHECK(per("15 minutes", "day") == 96);
    CHECK(per("half-month", "month") == 2);
    CHECK(per("2 months", "year") == 6);
}
