// SPDX-License-Identifier: MIT
#include "core/time/local_reading.h"

#include <catch2/catch.hpp>

using namespace almanac;

namespace {
LocalTime reading(int y, unsigned m, unsigned d, int h, int mi) {
    return LocalTime{
               date::local_days{date::year{y} / date::month{m} / date::day{d}}.time_since_epoch()} +
           std::chrono::hours{h} + std::chrono::minutes{mi};
}
std::string utc(Instant t) {
    return format_date_time(LocalTime{t.time_since_epoch()}, TextForm::Precision::Minutes, false);
}
}  // namespace

TEST_CASE("a repeated reading of a fall-back night is its first occurrence") {
    // zoneinfo, fold=0 (from memory): Denver 2026-11-01 01:30 is MDT, UTC-6, so 07:30 UTC.
    auto denver = ZoneClock::named("America/Denver");
    CHECK(utc(instant_of_local_reading(denver, reading(2026, 11, 1, 1, 30))) == "2026-11-01 07:30");
}

TEST_CASE("a skipped reading of a spring-forward gap is read on the clock before the change") {
    // zoneinfo, fold=0 (from memory): Denver 2026-03-08 02:30 does not exist; read with MST, UTC-7.
    auto denver = ZoneClock::named("America/Denver");
    CHECK(utc(instant_of_local_reading(denver, reading(2026, 3, 8, 2, 30))) == "2026-03-08 09:30");
}

TEST_CASE("an ordinary reading is the one instant it names") {
    auto sydney = ZoneClock::named("Australia/Sydney");
    // Sydney in January is AEDT, UTC+11 (from memory).
    CHECK(utc(instant_of_local_reading(sydney, reading(2026, 1, 15, 9, 0))) == "2026-01-14 22:00");
}
