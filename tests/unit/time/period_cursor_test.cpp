// SPDX-License-Identifier: MIT
#include "core/time/period_cursor.h"

#include <catch2/catch.hpp>

#include "core/text/error.h"
#include "core/time/calendar_from_text.h"

using namespace almanac;

TEST_CASE("a range lists every period that overlaps it, in order, partial ones included") {
    // 2026-03-01 is a Sunday: its ISO week starts Monday 2026-02-23; the range
    // to 2026-03-20 (a Friday) touches four weeks (common practice, ISO 8601).
    PeriodCalendar calendar = calendar_from_text("week", std::nullopt);
    PeriodCursor range(calendar, parse_time_text("2026-03-01").utc_instant(),
                      parse_time_text("2026-03-20").utc_instant());
    std::vector<std::string> labels;
    for (; !range.done(); range.advance()) labels.push_back(calendar.label(range.current()));
    CHECK(labels == std::vector<std::string>{"2026-W09", "2026-W10", "2026-W11", "2026-W12"});
}

TEST_CASE("an empty or reversed range has no periods") {
    PeriodCalendar calendar = calendar_from_text("day", std::nullopt);
    Instant t = parse_time_text("2026-03-01").utc_instant();
    CHECK(PeriodCursor(calendar, t, t).done());
    CHECK(PeriodCursor(calendar, t + Millis(1), t).done());
}

TEST_CASE("a range of more periods than the limit stops with an error saying how many") {
    PeriodCalendar calendar = calendar_from_text("second", std::nullopt);
    Instant start = parse_time_text("2000-01-01").utc_instant();
    PeriodCursor range(calendar, start, start + std::chrono::hours(24 * 366));
    std::int64_t rows = 1;
    try {
        while (!range.done()) {
            range.advance();
            ++rows;
        }
        FAIL("no error");
    } catch (const Error& error) {
        // 366 days of seconds (from memory: 86400 seconds a day).
        CHECK(std::string(error.what()).find("the range holds 31622400 periods") == 0);
        CHECK(rows == PeriodCursor::kMostPeriods);
    }
}

TEST_CASE("calendar texts say which of spec and zone was wrong") {
    try {
        calendar_from_text("wek", std::nullopt);
        FAIL("no error");
    } catch (const CalendarTextError& error) {
        CHECK(error.culprit() == CalendarTextError::Culprit::Spec);
    }
    try {
        calendar_from_text("week", std::string_view("Mars/Base"));
        FAIL("no error");
    } catch (const CalendarTextError& error) {
        CHECK(error.culprit() == CalendarTextError::Culprit::Zone);
    }
    try {
        position_from_text("week", "month", std::nullopt);
        FAIL("no error");
    } catch (const CalendarTextError& error) {
        CHECK(error.culprit() == CalendarTextError::Culprit::Cycle);
    }
}
