#include <catch2/catch.hpp>

#include "core/error.h"
#include "core/time_value.h"

using namespace almanac;

TEST_CASE("a bare date is a calendar day, not an instant") {
    auto value = parse_time_text("2026-03-05");
    CHECK(value.is_calendar_day);
    CHECK(format_date(value.day) == "2026-03-05");
}

TEST_CASE("the Julian day of J2000.0 is 2000-01-01 12:00 UTC") {
    // J2000.0 epoch = JD 2451545.0 (from memory; CHECKS.md).
    auto value = parse_time_real(2451545.0);
    CHECK(value.representation == Representation::JulianDay);
    CHECK(format_date_time(LocalTime{value.instant.time_since_epoch()}, TextForm::Precision::Seconds,
                           false) == "2000-01-01 12:00:00");
    CHECK(to_julian_day(value.instant) == 2451545.0);
}

TEST_CASE("impossible dates are errors, not normalised") {
    CHECK_THROWS_WITH(parse_time_text("2026-02-30"), Catch::Contains("2026-02 has 28 days"));
    CHECK_THROWS_AS(parse_time_text("2026-13-01"), Error);
    CHECK_THROWS_AS(parse_time_text("yesterday"), Error);
    CHECK_NOTHROW(parse_time_text("2024-02-29"));
}
