// SPDX-License-Identifier: MIT
// Retail years of 52 or 53 whole weeks (README "Retail calendars"): a year
// ends on its anchor day, the last given weekday of a month or the one
// nearest that month's last day, and the next year begins the day after.
// Quarters are 13 weeks, the 53rd week going to the fourth; months split each
// quarter by a pattern such as 4-4-5, the 53rd week going to the last month.
// Years are named for the year of the anchor month in which they end.
#pragma once

#include <date/date.h>

#include <array>
#include <cstdint>
#include <string>

namespace almanac {

// Where every retail year ends.
struct RetailAnchor {
    date::weekday weekday = date::Saturday;
    date::month month = date::January;
    bool nearest = false;  // the weekday nearest the month's last day; else the last one in it

    bool operator==(const RetailAnchor& other) const {
        return weekday == other.weekday && month == other.month && nearest == other.nearest;
    }
    bool operator!=(const RetailAnchor& other) const { return !(*this == other); }
    // The spec words: "last saturday of january", "saturday nearest end of january".
    std::string describe() const;
};

// Weeks in the first, second and third month of every quarter.
struct RetailMonthPattern {
    std::array<unsigned, 3> weeks{{4, 4, 5}};

    bool operator==(const RetailMonthPattern& other) const { return weeks == other.weeks; }
    std::string describe() const;  // "4-4-5"
    // The week of the year (0-based) at which month 0..11 begins.
    unsigned first_week_of_month(unsigned month) const;
    // The month (0-11) that holds week 0..52 of the year.
    unsigned month_of_week(unsigned week) const;
};

// One retail year: its name and its days, as day numbers (days since 1970-01-01).
struct RetailYear {
    std::int32_t name;       // the year of the anchor month in which it ends
    std::int64_t first_day;  // the day after the previous year's anchor day
    std::int64_t last_day;   // its anchor day
    unsigned weeks() const { return unsigned((last_day - first_day + 1) / 7); }
};

// The anchor day of the retail year named `name`.
std::int64_t retail_year_end(const RetailAnchor& anchor, std::int32_t name);
RetailYear retail_year_named(const RetailAnchor& anchor, std::int32_t name);
// The retail year that holds `day`.
RetailYear retail_year_holding(const RetailAnchor& anchor, std::int64_t day);

}  // namespace almanac
