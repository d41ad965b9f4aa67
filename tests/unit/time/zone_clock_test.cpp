// SPDX-License-Identifier: MIT
#include "core/time/zone_clock.h"

#include <catch2/catch.hpp>

#include "core/text/error.h"
#include "core/time/time_value.h"

using namespace almanac;
using namespace std::chrono;

namespace {
Instant at(const char* text) { return parse_time_text(text).instant(); }
LocalTime reading(const char* text) { return LocalTime{at(text).time_since_epoch()}; }
}  // namespace

TEST_CASE("unknown zones are refused without touching the file system") {
    CHECK_THROWS_WITH(ZoneClock::named("Mars/Olympus_Mons"),
                      Catch::Contains("not in the tz database"));
    CHECK_THROWS_WITH(ZoneClock::named("../../etc/passwd"),
                      Catch::Contains("expected an IANA time zone name"));
    CHECK_THROWS_AS(ZoneClock::named(""), Error);
}

TEST_CASE("a skipped reading is placed at the instant the clock jumped past it") {
    // US rule since 2007 (from memory; tests/reference checks it against zoneinfo):
    // 2026-03-08 02:00 MST (-07:00) becomes 03:00 MDT (-06:00), so 02:30 never shows.
    ZoneClock denver = ZoneClock::named("America/Denver");
    CHECK(denver.first_instant_at(reading("2026-03-08 02:30")) == at("2026-03-08 09:00Z"));
    CHECK(denver.first_instant_at(reading("2026-03-08 01:30")) == at("2026-03-08 08:30Z"));
    CHECK(denver.offset_at(at("2026-03-08 08:59Z")) == hours{-7});
    CHECK(denver.offset_at(at("2026-03-08 09:00Z")) == hours{-6});
}

TEST_CASE("a repeated reading is placed at its first occurrence") {
    // 2026-11-01 02:00 MDT falls back to 01:00 MST (from memory): 01:30 shows twice.
    ZoneClock denver = ZoneClock::named("America/Denver");
    CHECK(denver.first_instant_at(reading("2026-11-01 01:30")) == at("2026-11-01 07:30Z"));
    CHECK(denver.to_local(at("2026-11-01 08:30Z")) == reading("2026-11-01 01:30"));
}

TEST_CASE("UTC reads every instant as itself") {
    ZoneClock utc = ZoneClock::utc();
    CHECK(utc.is_utc());
    CHECK(utc.to_local(at("2026-03-08 09:00Z")) == reading("2026-03-08 09:00"));
    CHECK(utc.offset_at(at("2026-03-08 09:00Z")) == seconds{0});
}
