// SPDX-License-Identifier: MIT
#include "core/time/time_format.h"

#include <catch2/catch.hpp>

#include "core/text/error.h"

using namespace almanac;

namespace {
std::string read(const char* format, const char* text) {
    auto reading = TimeFormat::parse(format).read(text);
    return format_date_time(reading.local, TextForm::Precision::Fraction, false);
}
}  // namespace

TEST_CASE("a US export's 12-hour clock reads as the 24-hour time") {
    // common practice: 12 AM is midnight, 12 PM is noon.
    CHECK(read("%m/%d/%Y %I:%M %p", "3/5/2026 2:20 PM") == "2026-03-05 14:20:00.000");
    CHECK(read("%m/%d/%Y %I:%M %p", "3/5/2026 12:05 am") == "2026-03-05 00:05:00.000");
    CHECK(read("%m/%d/%Y %I:%M %p", "3/5/2026 12:05 PM") == "2026-03-05 12:05:00.000");
}

TEST_CASE("%e reads a day padded with a space") {
    // C strftime's %e writes " 5" for the 5th (from memory).
    CHECK(read("%b %e %Y %H:%M", "Mar  5 2026 09:00") == "2026-03-05 09:00:00.000");
}

TEST_CASE("two-digit years follow the POSIX pivot") {
    // POSIX strptime %y (from memory): 69-99 are 1969-1999, 00-68 are 2000-2068.
    CHECK(read("%d/%m/%y %H:%M", "01/01/68 00:00") == "2068-01-01 00:00:00.000");
    CHECK(read("%d/%m/%y %H:%M", "01/01/69 00:00") == "1969-01-01 00:00:00.000");
}

TEST_CASE("fractions of a second round half up to the millisecond, carrying into the day") {
    CHECK(read("%Y-%m-%d %H:%M:%S.%f", "2026-03-05 23:59:59.9995") == "2026-03-06 00:00:00.000");
    CHECK(read("%Y-%m-%d %H:%M:%S.%f", "2026-03-05 10:00:00.1234") == "2026-03-05 10:00:00.123");
}

TEST_CASE("spreadsheet serial 60 is refused, 59 and 61 are the days around it") {
    // from memory: the 1900 date system counts a 29 February 1900 that never was.
    CHECK(format_date(date::floor<date::days>(read_spreadsheet_serial(59))) == "1900-02-28");
    CHECK(format_date(date::floor<date::days>(read_spreadsheet_serial(61))) == "1900-03-01");
    CHECK_THROWS_AS(read_spreadsheet_serial(60), Error);
}

TEST_CASE("a format parsed once reads many texts") {
    auto format = TimeFormat::parse("%d.%m.%Y %H:%M");
    CHECK(format.has_time_of_day());
    CHECK_FALSE(format.has_offset());
    CHECK_THROWS_AS(format.read("31.04.2026 10:00"), Error);  // April has 30 days
}
