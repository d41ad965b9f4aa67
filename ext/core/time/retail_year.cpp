// SPDX-License-Identifier: MIT
#include "core/time/retail_year.h"

#include "core/time/calendar_names.h"
#include "core/time/civil_days.h"

namespace almanac {
namespace {

// Weekdays as days since Sunday, 1970-01-01 being a Thursday.
unsigned weekday_of(std::int64_t day) { return unsigned(((day + 4) % 7 + 7) % 7); }

}  // namespace

std::string RetailAnchor::describe() const {
    if (nearest)
        return lowercase_weekday_name(weekday) + " nearest end of " + lowercase_month_name(month);
    return "last " + lowercase_weekday_name(weekday) + " of " + lowercase_month_name(month);
}

std::string RetailMonthPattern::describe() const {
    return std::to_string(weeks[0]) + "-" + std::to_string(weeks[1]) + "-" +
           std::to_string(weeks[2]);
}

unsigned RetailMonthPattern::first_week_of_month(unsigned month) const {
    unsigned week = 13 * (month / 3);
    for (unsigned i = 0; i < month % 3; ++i) week += weeks[i];
    return week;
}

unsigned RetailMonthPattern::month_of_week(unsigned week) const {
    // The 53rd week belongs to the twelfth month.
    if (week >= 52) return 11;
    unsigned quarter = week / 13, in_quarter = week % 13;
    unsigned month = 0;
    while (month < 2 && in_quarter >= weeks[month]) in_quarter -= weeks[month++];
    return 3 * quarter + month;
}

std::int64_t retail_year_end(const RetailAnchor& anchor, std::int32_t name) {
    const unsigned month = unsigned(anchor.month);
    const std::int64_t month_end = day_number_from_civil(name, month, days_in_month(name, month));
    const unsigned wanted = anchor.weekday.c_encoding();
    // Days back from the month's last day to the last such weekday (0-6).
    const std::int64_t back = (weekday_of(month_end) + 7 - wanted) % 7;
    if (!anchor.nearest || back <= 3) return month_end - back;
    // Nearer forwards: a few days into the next month.
    return month_end - back + 7;
}

RetailYear retail_year_named(const RetailAnchor& anchor, std::int32_t name) {
    return RetailYear{name, retail_year_end(anchor, name - 1) + 1, retail_year_end(anchor, name)};
}

RetailYear retail_year_holding(const RetailAnchor& anchor, std::int64_t day) {
    // The year of the civil date is the name or one off it: a year ends
    // within a few days of its anchor month's end.
    std::int32_t name = civil_from_day_number(static_cast<std::int32_t>(day)).year;
    if (unsigned(civil_from_day_number(static_cast<std::int32_t>(day)).month) >
        unsigned(anchor.month))
        ++name;
    while (day > retail_year_end(anchor, name)) ++name;
    while (day <= retail_year_end(anchor, name - 1)) --name;
    return retail_year_named(anchor, name);
}

}  // namespace almanac
