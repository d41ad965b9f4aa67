// SPDX-License-Identifier: MIT
#include "core/time/period_position.h"

#include <date/date.h>

#include <catch2/catch.hpp>
#include <string>

#include "core/text/error.h"

using namespace almanac;

namespace {
std::int64_t position_of(date::sys_days day, const char* spec, const char* cycle) {
    PeriodPosition position(parse_period_spec(spec), parse_period_spec(cycle), ZoneClock::utc());
    return position.position(Instant{day});
}
constexpr auto kMarch5 = date::sys_days{date::year{2026} / 3 / 5};  // a Thursday
}  // namespace

TEST_CASE("a day's position names its weekday, its day of month and its day of year") {
    // 2026-03-05 is a Thursday (from memory; Python's date(2026,3,5).isoweekday() == 4).
    CHECK(position_of(kMarch5, "day", "week") == 4);
    CHECK(position_of(kMarch5, "day", "week starting sunday") == 5);
    CHECK(position_of(kMarch5, "day", "month") == 5);
    // 31 + 28 + 5 = 64 (common practice: tm_yday + 1).
    CHECK(position_of(kMarch5, "day", "year") == 64);
}

TEST_CASE("months, quarters and half-months count from the start of a calendar or fiscal year") {
    // Calendar arithmetic by hand (common practice): March is month 3, and
    // month 12 of a fiscal year that starts in April.
    CHECK(position_of(kMarch5, "month", "year") == 3);
    CHECK(position_of(kMarch5, "month", "year starting april") == 12);
    CHECK(position_of(kMarch5, "quarter", "year") == 1);
    CHECK(position_of(kMarch5, "quarter", "year starting april") == 4);
    CHECK(position_of(kMarch5, "half-month", "year") == 5);
    CHECK(position_of(kMarch5, "half-month", "month") == 1);
    CHECK(position_of(date::sys_days{date::year{2026} / 3 / 16}, "half-month", "month") == 2);
}

TEST_CASE("a week within a calendar year is its ISO 8601 week number") {
    // ISO 8601 week dates (from memory; confirmed by Python's isocalendar()):
    // 2008-12-29 is 2009-W01, 2010-01-03 is 2009-W53, 2005-01-01 is 2004-W53.
    CHECK(position_of(date::sys_days{date::year{2008} / 12 / 29}, "week", "year") == 1);
    CHECK(position_of(date::sys_days{date::year{2010} / 1 / 3}, "week", "year") == 53);
    CHECK(position_of(date::sys_days{date::year{2005} / 1 / 1}, "week", "year") == 53);
}

TEST_CASE("a 25-hour local day has hour positions 1 to 25") {
    // America/Denver fell back on 2026-11-01 at 02:00 MDT (tz database; from memory):
    // local midnight is 06:00 UTC and the day lasts until 07:00 UTC the next day.
    PeriodPosition position(parse_period_spec("hour"), parse_period_spec("day"),
                            ZoneClock::named("America/Denver"));
    const Instant midnight =
        Instant{date::sys_days{date::year{2026} / 11 / 1}} + std::chrono::hours{6};
    CHECK(position.position(midnight) == 1);
    CHECK(position.position(midnight + std::chrono::hours{24}) == 25);
    CHECK(position.position(midnight + std::chrono::hours{25}) == 1);
}

TEST_CASE("pairs that do not nest are refused with the rule that says which do") {
    const char* refused[][2] = {{"week", "month"},
                                {"month", "week"},
                                {"day", "day"},
                                {"month", "month"},
                                {"quarter", "half-month"},
                                {"7 minutes", "hour"},
                                {"2 days", "week"},
                                {"quarter", "year starting february"}};
    for (const auto& pair : refused) {
        INFO(pair[0] << " in " << pair[1]);
        CHECK_THROWS_AS(PeriodPosition(parse_period_spec(pair[0]), parse_period_spec(pair[1]),
                                       ZoneClock::utc()),
                        Error);
    }
    CHECK_THROWS_WITH(
        check_position_spec(parse_period_spec("day from 2024-01-03")),
        "expected a spec without 'from': positions count from the start of the cycle");
}
