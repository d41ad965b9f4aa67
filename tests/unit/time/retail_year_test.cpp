// SPDX-License-Identifier: MIT
#include "core/time/retail_year.h"

#include <catch2/catch.hpp>

#include "core/time/civil_days.h"

using namespace almanac;

namespace {
std::int64_t day(int y, unsigned m, unsigned d) { return day_number_from_civil(y, m, d); }
}  // namespace

TEST_CASE("a year ending on the last saturday of january ends in january") {
    const RetailAnchor anchor{date::Saturday, date::January, false};
    // from memory: the last Saturdays of January 2025 and 2026 are the 25th and the 31st.
    CHECK(retail_year_end(anchor, 2025) == day(2025, 1, 25));
    CHECK(retail_year_end(anchor, 2026) == day(2026, 1, 31));
    const RetailYear fy2026 = retail_year_named(anchor, 2026);
    CHECK(fy2026.first_day == day(2025, 1, 26));
    CHECK(fy2026.weeks() == 53);
    CHECK(retail_year_named(anchor, 2025).weeks() == 52);
}

TEST_CASE("a year ending on the saturday nearest the end of a month may end in the next one") {
    // from memory: 2025-01-31 is a Friday, so the nearest Saturday is 1 February;
    // 2025-12-31 is a Wednesday, and the nearest Saturday is 3 January 2026 (the
    // example of the README: still FY2025).
    CHECK(retail_year_end({date::Saturday, date::January, true}, 2025) == day(2025, 2, 1));
    CHECK(retail_year_end({date::Saturday, date::December, true}, 2025) == day(2026, 1, 3));
    // 2026-12-31 is a Thursday: the nearest Saturday is 2 January 2027, still FY2026.
    CHECK(retail_year_end({date::Saturday, date::December, true}, 2026) == day(2027, 1, 2));
    CHECK(retail_year_holding({date::Saturday, date::December, true}, day(2027, 1, 2)).name ==
          2026);
    CHECK(retail_year_holding({date::Saturday, date::December, true}, day(2027, 1, 3)).name ==
          2027);
}

TEST_CASE("every day lies in exactly one retail year of whole weeks") {
    const RetailAnchor anchor = GENERATE(RetailAnchor{date::Sunday, date::March, false},
                                         RetailAnchor{date::Friday, date::December, true},
                                         RetailAnchor{date::Saturday, date::January, true});
    for (std::int64_t d = day(1990, 1, 1); d < day(2061, 1, 1); ++d) {
        const RetailYear year = retail_year_holding(anchor, d);
        if (d < year.first_day || d > year.last_day) FAIL("day " << d);
        if (year.weeks() != 52 && year.weeks() != 53) FAIL("year " << year.name);
        if ((year.last_day - year.first_day + 1) % 7 != 0) FAIL("year " << year.name);
    }
}

TEST_CASE("month patterns place months at whole weeks and give the 53rd week to the last") {
    // common practice: 4-4-5 is four, four and five weeks in each quarter.
    const RetailMonthPattern pattern{{{4, 4, 5}}};
    CHECK(pattern.first_week_of_month(0) == 0);
    CHECK(pattern.first_week_of_month(1) == 4);
    CHECK(pattern.first_week_of_month(2) == 8);
    CHECK(pattern.first_week_of_month(3) == 13);
    CHECK(pattern.first_week_of_month(11) == 47);
    CHECK(pattern.month_of_week(7) == 1);
    CHECK(pattern.month_of_week(8) == 2);
    CHECK(pattern.month_of_week(12) == 2);
    CHECK(pattern.month_of_week(51) == 11);
    CHECK(pattern.month_of_week(52) == 11);
    const RetailMonthPattern five_first{{{5, 4, 4}}};
    CHECK(five_first.month_of_week(4) == 0);
    CHECK(five_first.month_of_week(5) == 1);
    for (unsigned month = 0; month < 12; ++month) {
        CHECK(five_first.month_of_week(five_first.first_week_of_month(month)) == month);
        CHECK(pattern.month_of_week(pattern.first_week_of_month(month)) == month);
    }
}
