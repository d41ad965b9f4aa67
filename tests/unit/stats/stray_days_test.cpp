// SPDX-License-Identifier: MIT
#include "core/stats/stray_days.h"

#include <catch2/catch.hpp>

#include "core/text/error.h"

using almanac::DayRows;
using almanac::split_stray_days;

namespace {
std::vector<DayRows> every_day(std::int64_t first, std::int64_t last, std::int64_t rows) {
    std::vector<DayRows> days;
    for (std::int64_t d = first; d <= last; ++d) days.push_back({d, rows});
    return days;
}
}  // namespace

TEST_CASE("a row twenty years before three years of sales is stray") {
    auto days = every_day(19000, 20094, 300);
    days.insert(days.begin(), DayRows{11695, 1});  // 7,305 days earlier
    auto split = split_stray_days(days);
    CHECK(split.kept.first == 19000);
    CHECK(split.kept.last == 20094);
    CHECK(split.kept.rows == 1095 * 300);
    REQUIRE(split.strays.size() == 1);
    CHECK(split.strays[0].first == 11695);
    CHECK(split.strays[0].rows == 1);
}

TEST_CASE("a gap must be longer than 90 empty days and than a quarter of the span") {
    // 91 empty days in ten years: a closure, not a break (a quarter of the span is ~900 days).
    auto long_data = every_day(10000, 11800, 5);
    auto rest = every_day(11892, 13650, 5);
    long_data.insert(long_data.end(), rest.begin(), rest.end());
    CHECK(split_stray_days(long_data).strays.empty());
    // A week without sales in a month of data: shorter than 90 days, kept.
    auto month = every_day(100, 110, 5);
    auto after = every_day(118, 130, 5);
    month.insert(month.end(), after.begin(), after.end());
    CHECK(split_stray_days(month).strays.empty());
    // 91 empty days between two runs of 60 days: both conditions hold, the later run (more rows) is kept.
    auto first = every_day(0, 59, 1);
    auto second = every_day(151, 210, 2);
    first.insert(first.end(), second.begin(), second.end());
    auto split = split_stray_days(first);
    CHECK(split.kept.first == 151);
    REQUIRE(split.strays.size() == 1);
    CHECK(split.strays[0].last == 59);
    // Exactly 90 empty days do not separate.
    auto edge = every_day(0, 59, 1);
    auto edge_after = every_day(150, 209, 2);
    edge.insert(edge.end(), edge_after.begin(), edge_after.end());
    CHECK(split_stray_days(edge).strays.empty());
}

TEST_CASE("strays on both sides, one day alone, and no days") {
    std::vector<DayRows> days{{0, 2}};
    auto middle = every_day(5000, 6000, 10);
    days.insert(days.end(), middle.begin(), middle.end());
    days.push_back({9000, 3});
    auto split = split_stray_days(days);
    CHECK(split.kept.first == 5000);
    REQUIRE(split.strays.size() == 2);
    CHECK(split.strays[0].first == 0);
    CHECK(split.strays[1].first == 9000);
    CHECK(split_stray_days({{42, 1}}).kept.first == 42);
    CHECK_THROWS_AS(split_stray_days({}), almanac::Error);
}
