// SPDX-License-Identifier: MIT
#include "core/time/time_value.h"

#include <catch2/catch.hpp>

#include "core/text/error.h"

using namespace almanac;

TEST_CASE("a bare date is a calendar day, not an instant") {
    auto value = parse_time_text("2026-03-05");
    CHECK(value.is_calendar_day());
    CHECK(format_date(value.day()) == "2026-03-05");
}

TEST_CASE("the Julian day of J2000.0 is 2000-01-01 12:00 UTC") {
    // J2000.0 epoch = JD 2451545.0 (from memory).
    auto value = parse_time_real(2451545.0);
    CHECK(value.representation == Representation::JulianDay);
    CHECK(format_date_time(LocalTime{value.instant().time_since_epoch()},
                           TextForm::Precision::Seconds, false) == "2000-01-01 12:00:00");
    CHECK(to_julian_day(value.instant()) == 2451545.0);
}

TEST_CASE("impossible dates are errors, not normalised") {
    CHECK_THROWS_WITH(parse_time_text("2026-02-30"), Catch::Contains("2026-02 has 28 days"));
    CHECK_THROWS_AS(parse_time_text("2026-13-01"), Error);
    CHECK_THROWS_AS(parse_time_text("yesterday"), Error);
    CHECK_NOTHROW(parse_time_text("2024-02-29"));
}

TEST_CASE("numbers follow SQLite's auto rule") {
    // SQLite date.c 'auto': 0 <= v < 5373484.5 is a Julian day, else Unix seconds.
    CHECK(parse_time_real(5373484.4).representation == Representation::JulianDay);
    CHECK(parse_time_real(5373484.5).representation == Representation::UnixSeconds);
    CHECK(parse_time_integer(-1).representation == Representation::UnixSeconds);
    CHECK(parse_time_integer(-1).integer_input);
    // -1 Unix seconds is 1969-12-31 23:59:59 (README).
    CHECK(format_date_time(LocalTime{parse_time_integer(-1).instant().time_since_epoch()},
                           TextForm::Precision::Seconds, false) == "1969-12-31 23:59:59");
}

TEST_CASE("a Unix time in milliseconds is refused with a hint") {
    CHECK_THROWS_WITH(parse_time_integer(1700000000000LL), Catch::Contains("milliseconds"));
    CHECK_THROWS_WITH(parse_time_real(1.7e12), Catch::Contains("milliseconds"));
}

TEST_CASE("text forms: T, fractions, Z and offsets") {
    auto value = parse_time_text("2026-03-05T10:00:00.125+05:30");
    CHECK(value.form.t_separator);
    CHECK(value.form.precision == TextForm::Precision::Fraction);
    CHECK(value.form.suffix == TextForm::Suffix::Offset);
    CHECK(format_date_time(LocalTime{value.instant().time_since_epoch()},
                           TextForm::Precision::Fraction, false) == "2026-03-05 04:30:00.125");
    CHECK(parse_time_text("2026-03-05 10:00Z").form.suffix == TextForm::Suffix::Z);
    CHECK_THROWS_AS(parse_time_text("2026-03-05 24:00"), Error);
    CHECK_THROWS_AS(parse_time_text("2026-03-05 10:60"), Error);
    CHECK_THROWS_AS(parse_time_text("2026-03-05 10:00 +15:00"), Error);
    CHECK_THROWS_AS(parse_time_text("2026-03-05 10"), Error);
}
