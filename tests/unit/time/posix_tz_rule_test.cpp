// SPDX-License-Identifier: MIT
#include "core/time/posix_tz_rule.h"

#include <catch2/catch.hpp>

#include "core/text/error.h"
#include "core/time/civil_days.h"

using namespace almanac;

namespace {
// Seconds since the epoch of a UTC date and time.
std::int64_t utc(int year, unsigned month, unsigned day, int hour = 0, int minute = 0) {
    return std::int64_t{day_number_from_civil(year, month, day)} * 86400 + hour * 3600 +
           minute * 60;
}
constexpr std::int32_t kHour = 3600;
}  // namespace

TEST_CASE("a footer rule keeps daylight saving in every later year") {
    // The US rule since 2007 (Energy Policy Act of 2005): from the second
    // Sunday of March to the first Sunday of November, 02:00 local. In 2040
    // those Sundays are March 11 and November 4 (Python's date.weekday()).
    auto denver = PosixTzRule::parse("MST7MDT,M3.2.0,M11.1.0");
    REQUIRE(denver.has_daylight_saving());
    auto summer = denver.span_at(utc(2040, 7, 1, 12));
    CHECK(summer.offset == -6 * kHour);
    CHECK(summer.begin == utc(2040, 3, 11, 9));  // 02:00 MST
    CHECK(summer.end == utc(2040, 11, 4, 8));    // 02:00 MDT
    auto winter = denver.span_at(utc(2040, 1, 1));
    CHECK(winter.offset == -7 * kHour);
    CHECK(winter.end == summer.begin);
    // Spans meet: the instant a span ends begins the next one.
    CHECK(denver.span_at(summer.end).begin == summer.end);
    CHECK(denver.span_at(summer.end - 1).end == summer.end);
    // Year 9999 still follows the rule (its second Sunday of March is the 14th,
    // datetime.date(9999, 3, 14).weekday() == 6).
    CHECK(denver.span_at(utc(9999, 3, 14, 9)).offset == -6 * kHour);
    CHECK(denver.span_at(utc(9999, 3, 14, 8, 59)).offset == -7 * kHour);
}

TEST_CASE("a southern rule has its summer across the new year") {
    // Australia/Sydney's footer (tzdata 2025b): summer from the first Sunday of
    // October to the first Sunday of April, 03:00 daylight time.
    auto sydney = PosixTzRule::parse("AEST-10AEDT,M10.1.0,M4.1.0/3");
    auto january = sydney.span_at(utc(2050, 1, 15));
    CHECK(january.offset == 11 * kHour);
    // 2049-10-03 and 2050-04-03 are first Sundays (Python's date.weekday()).
    CHECK(january.begin == utc(2049, 10, 2, 16));  // 2049-10-03 02:00 +10
    CHECK(january.end == utc(2050, 4, 2, 16));     // 2050-04-03 03:00 +11
    CHECK(sydney.span_at(utc(2050, 7, 1)).offset == 10 * kHour);
}

TEST_CASE("transition times may be negative or beyond a day, as RFC 8536 allows") {
    // RFC 8536 section 3.3.1's example for America/Godthab: changes at -2:00
    // and -1:00 local, i.e. 01:00 UTC on the last Sundays of March and October
    // (2030-03-31 and 2030-10-27 by Python's date.weekday()).
    auto nuuk = PosixTzRule::parse("<-03>3<-02>,M3.5.0/-2,M10.5.0/-1");
    auto summer = nuuk.span_at(utc(2030, 6, 1));
    CHECK(summer.offset == -2 * kHour);
    CHECK(summer.begin == utc(2030, 3, 31, 1));
    CHECK(summer.end == utc(2030, 10, 27, 1));
    // RFC 8536 section 3.3.1: "EST5EDT,0/0,J365/25" is daylight saving all year.
    auto always = PosixTzRule::parse("EST5EDT,0/0,J365/25");
    for (int year : {2040, 2041, 2044, 2100}) {
        for (unsigned month : {1u, 6u, 12u}) {
            CHECK(always.span_at(utc(year, month, 1)).offset == -4 * kHour);
            CHECK(always.span_at(utc(year, month, 31 - (month == 6))).offset == -4 * kHour);
        }
    }
}

TEST_CASE("a rule without daylight saving is one offset for all time") {
    auto kolkata = PosixTzRule::parse("IST-5:30");
    CHECK_FALSE(kolkata.has_daylight_saving());
    auto span = kolkata.span_at(utc(2200, 1, 1));
    CHECK(span.offset == 5 * kHour + 30 * 60);
    CHECK(span.begin == PosixTzRule::kFarPast);
    CHECK(span.end == PosixTzRule::kFarFuture);
    CHECK(PosixTzRule::parse("<+0545>-5:45").standard_offset() == 5 * kHour + 45 * 60);
    CHECK(PosixTzRule::parse("<-01>1").standard_offset() == -kHour);
}

TEST_CASE("a malformed rule is an error that says what was expected") {
    auto rule = GENERATE(as<std::string>{}, "", "7", "MS7", "MST", "MST7MDT,M13.1.0,M11.1.0",
                         "MST7MDT,M3.2.0", "MST7MDT,M3.2.7,M11.1.0", "MST7MDT,M3.2.0,M11.1.0,",
                         "<+03", "MST7MDT,J366,J1", "MST25", "MST7MDT,M3.2.0/168,M11.1.0");
    CAPTURE(rule);
    CHECK_THROWS_AS(PosixTzRule::parse(rule), Error);
}
