// SPDX-License-Identifier: MIT
// The period spec grammar (ours; case-insensitive, spaces free):
//   spec  := [count] unit [starting weekday|month-name] [from YYYY-MM-DD[ HH:MM[:SS]]]
//          | ISO 8601 single-component duration: PnY PnM PnW PnD PTnH PTnM PTnS
//          | retail (year|quarter|month|week) [4-4-5|4-5-4|5-4-4] ending anchor
//   anchor := last weekday of month-name | weekday nearest end of month-name
// Parsed once per statement; the parsed form is all the calendar needs.
#pragma once

#include <date/date.h>

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

#include "core/time/retail_year.h"
#include "core/time/time_value.h"

namespace almanac {

enum class PeriodUnit {
    Second,
    Minute,
    Hour,
    Day,
    Week,
    HalfMonth,
    Month,
    Quarter,
    Year,
    RetailWeek,
    RetailMonth,
    RetailQuarter,
    RetailYear,
};

struct PeriodSpec {
    PeriodUnit unit = PeriodUnit::Day;
    std::int64_t count = 1;
    date::weekday week_start = date::Monday;  // week only
    date::month year_start = date::January;   // quarter and year: fiscal when not January
    bool explicit_start = false;              // "starting ..." was written
    std::optional<LocalTime> from;            // a wall-clock moment at which one period starts
    RetailAnchor retail_anchor;               // retail units: where each retail year ends
    RetailMonthPattern retail_pattern;        // retail month: weeks per month of a quarter

    bool is_sub_day() const;        // second, minute, hour
    bool is_month_based() const;    // month, quarter, year (not half-month)
    bool is_fiscal() const;         // quarter or year starting other than January
    bool is_retail() const;         // a retail year, quarter, month or week
    std::int64_t months() const;    // length in months, for month-based units
    std::int64_t days() const;      // length in days, for day and week
    Millis sub_day_length() const;  // for sub-day units
    // Elapsed length for units of fixed length (second through week, where a
    // day counts 24 hours); throws Error naming the spec for half-month, month,
    // quarter and year, whose length varies. ewma's half_life uses it.
    Millis fixed_length() const;
    std::string describe() const;  // canonical words, e.g. "2 weeks starting sunday"
};

// The longest spec text read (README "Limits"): every spec of the grammar
// fits many times over, and a message never has to quote more.
constexpr std::size_t kLongestSpec = 200;

// Throws almanac::Error saying what was expected.
PeriodSpec parse_period_spec(std::string_view text);

}  // namespace almanac
