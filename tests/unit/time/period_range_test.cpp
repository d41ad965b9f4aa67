// SPDX-License-Identifier: MIT
#include "core/time/period_range.h"

#include <catch2/catch.hpp>

#include "core/time/time_value.h"

using namespace almanac;

namespace {
Instant at(const char* text) { return parse_time_text(text).utc_instant(); }
PeriodCalendar calendar_of(const char* spec, const char* zone = nullptr) {
    return PeriodCalendar(parse_period_spec(spec), zone ? ZoneClock::named(zone) : ZoneClock::utc());
}
}  // namespace

TEST_CASE("the data's range runs from the local day of the earliest row to the end of the latest's") {
    // Denver is UTC-7 in January (tzdata): local midnight of 2026-01-07 is 07:00 UTC.
    PeriodCalendar weeks = calendar_of("week", "America/Denver");
    PeriodRange range = covering_range(weeks, std::nullopt, std::nullopt, at("2026-01-07 10:00"),
                                       at("2026-01-20 03:00"));
    CHECK(range.start == at("2026-01-07 07:00"));  // 03:00 local on the 7th: that day's midnight
    CHECK(range.stop == at("2026-01-20 07:00"));   // 20:00 local on the 19th: the 20th's midnight
    CHECK(range.periods() == 3);                   // weeks of Jan 5, 12 and 19 (ISO weeks)
    Period first = weeks.period_by_serial(range.first_serial);
    Coverage part = coverage_of(first, range);
    CHECK(part.start == range.start);  // the first week covered from Wednesday
    CHECK(part.end == first.end);
}

TEST_CASE("sub-day units take whole periods of the earliest and latest rows") {
    PeriodCalendar hours = calendar_of("hour");
    PeriodRange range = covering_range(hours, std::nullopt, std::nullopt, at("2026-01-07 10:20"),
                                       at("2026-01-07 12:05"));
    CHECK(range.start == at("2026-01-07 10:00"));
    CHECK(range.stop == at("2026-01-07 13:00"));
    CHECK(range.periods() == 3);
}

TEST_CASE("given bounds are used as they are; an empty range lists no period") {
    PeriodCalendar months = calendar_of("month");
    PeriodRange range = covering_range(months, at("2026-01-15"), std::nullopt, at("2026-01-01"),
                                       at("2026-03-02 09:00"));
    CHECK(range.start == at("2026-01-15"));
    CHECK(range.stop == at("2026-03-03"));
    CHECK(range.periods() == 3);
    CHECK(covering_range(months, at("2026-02-01"), at("2026-02-01")).periods() == 0);
}

TEST_CASE("a bound inside a day is written as a date-time, a day start as a date") {
    PeriodCalendar days = calendar_of("day", "Europe/Berlin");
    // Berlin is UTC+1 in January (tzdata).
    CHECK(format_range_bound(days, at("2026-01-06 23:00")) == "2026-01-07");
    CHECK(format_range_bound(days, at("2026-01-07 11:30")) == "2026-01-07 12:30:00+01:00");
    CHECK(format_range_bound(calendar_of("week"), at("2026-01-07 11:30:00.250")) ==
          "2026-01-07 11:30:00.250");
    CHECK(format_range_bound(calendar_of("hour"), at("2026-01-07 11:00")) == "2026-01-07 11:00:00");
}
