// SPDX-License-Identifier: MIT
#include "core/time/period_calendar.h"

#include <catch2/catch.hpp>

#include "core/text/error.h"

using namespace almanac;

namespace {
Instant at(const char* text) {
    auto value = parse_time_text(text);
    return value.utc_instant();
}
PeriodCalendar utc(const char* spec) {
    return PeriodCalendar(parse_period_spec(spec), ZoneClock::utc());
}
PeriodCalendar zoned(const char* spec, const char* zone) {
    return PeriodCalendar(parse_period_spec(spec), ZoneClock::named(zone));
}
std::string floor_text(const PeriodCalendar& calendar, const char* t) {
    return calendar.format_boundary(calendar.period_of(at(t)).start);
}
std::string end_text(const PeriodCalendar& calendar, const char* t) {
    return calendar.format_boundary(calendar.period_of(at(t)).end);
}
std::string label(const PeriodCalendar& calendar, const char* t) {
    return calendar.label(calendar.period_of(at(t)));
}
}  // namespace

TEST_CASE("weeks start on Monday unless told otherwise") {
    // 2026-03-05 is a Thursday (common practice: any calendar).
    CHECK(floor_text(utc("week"), "2026-03-05 10:00") == "2026-03-02");
    CHECK(floor_text(utc("week starting sunday"), "2026-03-05") == "2026-03-01");
    CHECK(end_text(utc("week"), "2026-03-05") == "2026-03-09");
    // Before 1970: 1969-12-31 is a Wednesday in the week of Monday 1969-12-29.
    CHECK(floor_text(utc("week"), "1969-12-31 23:59:59") == "1969-12-29");
}

TEST_CASE("ISO 8601 week labels use the ISO week-numbering year") {
    // ISO 8601 week dates, from memory: 2008-12-29 is 2009-W01-1; 2010-01-03 is 2009-W53-7;
    // 2005-01-01 is 2004-W53-6.
    auto week = utc("week");
    CHECK(label(week, "2008-12-29") == "2009-W01");
    CHECK(label(week, "2010-01-03") == "2009-W53");
    CHECK(label(week, "2005-01-01") == "2004-W53");
    CHECK(label(utc("week starting sunday"), "2026-03-05") == "2026-03-01");
}

TEST_CASE("multiples count from the period holding 1970-01-01") {
    // README: 3 months == quarter, 6 months are Jan/Jul halves.
    CHECK(floor_text(utc("3 months"), "2026-05-20") == floor_text(utc("quarter"), "2026-05-20"));
    CHECK(floor_text(utc("6 months"), "2026-09-20") == "2026-07-01");
    CHECK(floor_text(utc("6 months"), "1969-09-20") == "1969-07-01");
    // 15 minutes are quarter-hours.
    CHECK(floor_text(utc("15 minutes"), "2026-03-05 10:44:59") == "2026-03-05 10:30:00");
    // Two-week periods: 1970-01-01 lies in the one starting Monday 1969-12-29.
    auto fortnight = utc("2 weeks");
    CHECK(fortnight.period_of(at("1970-01-01")).serial == 0);
    CHECK(floor_text(fortnight, "1970-01-12") == "1970-01-12");
    CHECK(floor_text(fortnight, "1970-01-11") == "1969-12-29");
}

TEST_CASE("half-months run from the 1st to the 15th and the 16th to the last day") {
    // Semi-monthly periods, the 1st-15th and the 16th-last day (common practice).
    auto half = utc("half-month");
    CHECK(label(half, "2026-02-15 23:59") == "2026-02 (1-15)");
    CHECK(label(half, "2026-02-16") == "2026-02 (16-28)");
    CHECK(label(half, "2024-02-20") == "2024-02 (16-29)");  // 2024 is a leap year
    CHECK(end_text(half, "2026-12-20") == "2027-01-01");
    CHECK(half.period_of(at("1970-01-01")).serial == 0);
    CHECK(half.period_of(at("1970-01-16")).serial == 1);
    CHECK(half.period_of(at("1969-12-31")).serial == -1);
}

TEST_CASE("fiscal quarters and years are named for the year they end in") {
    auto quarters = utc("quarter starting april");
    CHECK(floor_text(quarters, "2026-05-20") == "2026-04-01");
    CHECK(label(quarters, "2026-05-20") == "FY2027-Q1");
    CHECK(label(quarters, "2027-02-01") == "FY2027-Q4");
    CHECK(label(utc("year starting july"), "2026-06-30") == "FY2026");
    CHECK(label(utc("year starting july"), "2026-07-01") == "FY2027");
    CHECK(label(utc("quarter"), "2026-08-01") == "2026-Q3");
    CHECK(label(utc("year"), "2026-08-01") == "2026");
}

TEST_CASE("from anchors give billing cycles that clamp in short months") {
    auto billing = utc("month from 2024-01-31");
    // Periods start on the 31st, or the month's last day when it is shorter.
    CHECK(floor_text(billing, "2024-03-01") == "2024-02-29");
    CHECK(floor_text(billing, "2024-03-30") == "2024-02-29");
    CHECK(floor_text(billing, "2024-03-31") == "2024-03-31");
    CHECK(floor_text(utc("month from 2024-01-15"), "2024-03-10") == "2024-02-15");
    // A from with a time of day writes date-times, so results read back.
    CHECK(floor_text(utc("day from 2024-01-01 06:00"), "2024-05-05 05:59") ==
          "2024-05-04 06:00:00");
}

TEST_CASE("shifting by months clamps to the month's last day") {
    auto month = utc("month");
    auto shift_day = [&](const PeriodCalendar& calendar, const char* day, std::int64_t n) {
        return format_date(calendar.shift_day(parse_time_text(day).day(), n));
    };
    // Month-end clamping (common practice): Jan 31 + 1 month is the end of February.
    CHECK(shift_day(month, "2024-01-31", 1) == "2024-02-29");
    CHECK(shift_day(month, "2025-01-31", 1) == "2025-02-28");
    CHECK(shift_day(month, "2024-03-31", -1) == "2024-02-29");
    CHECK(shift_day(utc("year"), "2024-02-29", 1) == "2025-02-28");
    CHECK(shift_day(utc("year"), "2024-02-29", 4) == "2028-02-29");
    // 2100 is not a leap year (Gregorian rule: divisible by 100, not by 400).
    CHECK(shift_day(utc("day"), "2100-02-28", 1) == "2100-03-01");
    CHECK(shift_day(utc("day"), "2000-02-28", 1) == "2000-02-29");
    // A half-month keeps the offset from the start of its half, clamped.
    CHECK(shift_day(utc("half-month"), "2026-01-31", 1) == "2026-02-15");
    CHECK(shift_day(utc("half-month"), "2026-01-31", 2) == "2026-02-28");
    CHECK(shift_day(utc("week"), "2026-03-05", -52) == "2025-03-06");
}

TEST_CASE("serials of neighbouring periods differ by one, far from 1970 too") {
    for (const char* spec : {"day", "week", "half-month", "month", "quarter starting february",
                             "year", "7 hours", "15 minutes"}) {
        auto calendar = utc(spec);
        for (const char* t : {"1900-03-01 12:00", "2150-07-19 03:00", "0001-01-01", "9998-06-01"}) {
            auto period = calendar.period_of(at(t));
            auto following = calendar.next(period);
            CHECK(following.serial == period.serial + 1);
            CHECK(following.start == period.end);
            CHECK(calendar.period_by_serial(period.serial).start == period.start);
        }
    }
}

TEST_CASE("a fall-back night has two hour periods with distinct labels") {
    // America/Denver left daylight time at 2026-11-01 08:00 UTC (tz database,
    // as read by Python's zoneinfo; the reference checks compare every change).
    auto hours = zoned("hour", "America/Denver");
    auto first = hours.period_of(at("2026-11-01 07:30"));
    auto second = hours.period_of(at("2026-11-01 08:30"));
    CHECK(hours.label(first) == "2026-11-01 01:00-06:00");
    CHECK(hours.label(second) == "2026-11-01 01:00-07:00");
    CHECK(second.serial == first.serial + 1);
    CHECK(second.start == first.end);
    // The local day is 25 hours long.
    auto day = zoned("day", "America/Denver").period_of(at("2026-11-01 12:00"));
    CHECK(day.end - day.start == std::chrono::hours{25});
}

TEST_CASE("a spring-forward night skips the hour that never happened") {
    // America/Denver entered daylight time at 2026-03-08 09:00 UTC (tz database).
    auto hours = zoned("hour", "America/Denver");
    auto before = hours.period_of(at("2026-03-08 08:30"));
    auto after = hours.period_of(at("2026-03-08 09:30"));
    CHECK(hours.label(before) == "2026-03-08 01:00-07:00");
    CHECK(hours.label(after) == "2026-03-08 03:00-06:00");
    CHECK(after.serial == before.serial + 1);
    auto day = zoned("day", "America/Denver").period_of(at("2026-03-08 12:00"));
    CHECK(day.end - day.start == std::chrono::hours{23});
}

TEST_CASE("multi-hour periods stretch across an offset change rather than overlap") {
    // With 2-hour periods a 1-hour change cannot keep every period 2 hours
    // long; the one holding the change is longer or shorter (README, Zones).
    auto two_hours = zoned("2 hours", "America/Denver");
    auto across = two_hours.period_of(at("2026-03-08 08:30"));
    CHECK(two_hours.format_boundary(across.start) == "2026-03-08 00:00:00-07:00");
    CHECK(two_hours.format_boundary(across.end) == "2026-03-08 04:00:00-06:00");
    CHECK(two_hours.next(across).serial == across.serial + 1);
}
