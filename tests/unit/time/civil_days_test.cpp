// SPDX-License-Identifier: MIT
#include "core/time/civil_days.h"

#include <date/date.h>

#include <catch2/catch.hpp>

using namespace almanac;

TEST_CASE("civil day numbers agree with the date library on every day of years 0000-9999") {
    // Oracle: Howard Hinnant's date library (days_from_civil / civil_from_days).
    date::sys_days first{date::year{0} / 1 / 1}, last{date::year{9999} / 12 / 31};
    long compared = 0;
    for (auto day = first; day <= last; day += date::days{1}) {
        date::year_month_day expected{day};
        auto number = static_cast<std::int32_t>(day.time_since_epoch().count());
        CivilDate got = civil_from_day_number(number);
        if (got.year != int(expected.year()) || got.month != unsigned(expected.month()) ||
            got.day != unsigned(expected.day())) {
            FAIL("civil_from_day_number(" << number << ")");
        }
        if (day_number_from_civil(got.year, got.month, got.day) != number) {
            FAIL("day_number_from_civil for day " << number);
        }
        ++compared;
    }
    CHECK(compared == 3652425);  // 10,000 Gregorian years of 365.2425 days
}

TEST_CASE("month lengths and leap years are the civil-day algorithms' own answers") {
    // Oracle: the date library's year_month_day_last and year::is_leap, and the
    // day numbers of consecutive first days of the month.
    long months = 0;
    for (int year = 0; year <= 9999; ++year) {
        CHECK(is_leap_year(year) == date::year{year}.is_leap());
        for (unsigned month = 1; month <= 12; ++month) {
            const auto next = month == 12 ? day_number_from_civil(year + 1, 1, 1)
                                          : day_number_from_civil(year, month + 1, 1);
            const auto length = next - day_number_from_civil(year, month, 1);
            const date::year_month_day_last last{date::year{year},
                                                 date::month_day_last{date::month{month}}};
            if (std::int32_t(days_in_month(year, month)) != length ||
                days_in_month(year, month) != unsigned(last.day()))
                FAIL("days_in_month(" << year << ", " << month << ")");
            ++months;
        }
        if (std::int32_t(days_in_year(year)) !=
            day_number_from_civil(year + 1, 1, 1) - day_number_from_civil(year, 1, 1))
            FAIL("days_in_year(" << year << ")");
    }
    CHECK(months == 120000);
}
