// SPDX-License-Identifier: MIT
// Conversions between civil dates (proleptic Gregorian) and day counts from
// 1970-01-01, done with multiplications and shifts only. They run once or
// twice per row for every period key, so they are worth making short.
//
// Algorithms: C. Neri and L. Schneider, "Euclidean affine functions and their
// application to calendar algorithms", Software: Practice and Experience 53
// (2023). They agree with the date library's days_from_civil/civil_from_days
// on every day of years 0000-9999 (tests/unit/civil_days_test.cpp).
#pragma once

#include <cstdint>

namespace almanac {

struct CivilDate {
    std::int32_t year;
    std::uint32_t month;  // 1-12
    std::uint32_t day;    // 1-31
};

namespace civil_detail {
constexpr std::uint32_t kShift = 82;  // 400-year cycles added to keep the arithmetic unsigned
constexpr std::uint32_t kDayShift = 719468 + 146097 * kShift;
constexpr std::uint32_t kYearShift = 400 * kShift;
}  // namespace civil_detail

constexpr CivilDate civil_from_day_number(std::int32_t days) {
    using namespace civil_detail;
    const std::uint32_t n = static_cast<std::uint32_t>(days) + kDayShift;
    const std::uint32_t n1 = 4 * n + 3;
    const std::uint32_t century = n1 / 146097;
    const std::uint32_t day_of_century = n1 % 146097 / 4;
    const std::uint32_t n2 = 4 * day_of_century + 3;
    const std::uint64_t p2 = std::uint64_t{2939745} * n2;
    const std::uint32_t year_of_century = static_cast<std::uint32_t>(p2 / 4294967296u);
    const std::uint32_t day_of_year = static_cast<std::uint32_t>(p2 % 4294967296u) / 2939745 / 4;
    const std::uint32_t year = 100 * century + year_of_century;
    const std::uint32_t n3 = 2141 * day_of_year + 197913;
    const std::uint32_t month = n3 / 65536;
    const std::uint32_t day = n3 % 65536 / 2141;
    // The computation counts years from March; January and February belong
    // to the next civil year.
    const std::uint32_t january_or_february = day_of_year >= 306;
    return CivilDate{static_cast<std::int32_t>(year - kYearShift + january_or_february),
                     january_or_february ? month - 12 : month, day + 1};
}

constexpr std::int32_t day_number_from_civil(std::int32_t year, std::uint32_t month,
                                             std::uint32_t day) {
    using namespace civil_detail;
    const std::uint32_t january_or_february = month <= 2;
    const std::uint32_t y = (static_cast<std::uint32_t>(year) + kYearShift) - january_or_february;
    const std::uint32_t m = january_or_february ? month + 12 : month;
    const std::uint32_t century = y / 100;
    const std::uint32_t year_days = 1461 * y / 4 - century + century / 4;
    const std::uint32_t month_days = (979 * m - 2919) / 32;
    return static_cast<std::int32_t>(year_days + month_days + (day - 1) - kDayShift);
}

// The calendar's facts, the one home for them: everything that asks whether a
// year is a leap year or how long a month is asks here. They are the civil-day
// algorithms' own answers (checked below and, for every month of years
// 0000-9999, in tests/unit/time/civil_days_test.cpp), written as the Gregorian
// rule so the per-row readers pay a few comparisons, not two conversions.
constexpr bool is_leap_year(std::int32_t year) {
    return year % 4 == 0 && (year % 100 != 0 || year % 400 == 0);
}

constexpr std::uint32_t days_in_month(std::int32_t year, std::uint32_t month) {
    constexpr unsigned char kDays[] = {0, 31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
    return month == 2 && is_leap_year(year) ? 29u : kDays[month];
}

constexpr std::uint32_t days_in_year(std::int32_t year) { return is_leap_year(year) ? 366u : 365u; }

static_assert(day_number_from_civil(1970, 1, 1) == 0);
static_assert(day_number_from_civil(2000, 3, 1) == 11017);
static_assert(civil_from_day_number(-719528).year == 0);
static_assert(day_number_from_civil(2000, 3, 1) - day_number_from_civil(2000, 2, 1) ==
              std::int32_t(days_in_month(2000, 2)));
static_assert(day_number_from_civil(1900, 3, 1) - day_number_from_civil(1900, 2, 1) ==
              std::int32_t(days_in_month(1900, 2)));
static_assert(day_number_from_civil(2025, 1, 1) - day_number_from_civil(2024, 1, 1) ==
              std::int32_t(days_in_year(2024)));

}  // namespace almanac
