// SPDX-License-Identifier: MIT
#include "core/stats/period_totals_listing.h"

#include <catch2/catch.hpp>
#include <string>

using namespace almanac;
using Kind = ValueKey::Kind;

namespace {
ValueView text(const std::string& bytes) { return ValueView{Kind::Text, 0, 0, bytes}; }
Instant at_ms(std::int64_t ms) { return Instant{Millis{ms}}; }

// A stand-in range on a calendar of 1-second periods: from the earliest
// row's period to the latest's, serial = seconds (arithmetic).
PeriodRange whole_seconds(Instant earliest, Instant latest) {
    std::int64_t first = earliest.time_since_epoch().count() / 1000;
    std::int64_t last = latest.time_since_epoch().count() / 1000;
    return PeriodRange{at_ms(first * 1000), at_ms((last + 1) * 1000), first, last};
}
}  // namespace

TEST_CASE("the rollup comes first, then each segment in order, each item with rows in it") {
    PeriodTotals totals(1000, true);
    auto row = [&](const char* segment, const char* item, std::int64_t second) {
        ++totals.cell(text(segment), text(item), second, at_ms(second * 1000)).rows;
    };
    row("south", "tea", 3);
    row("north", "tea", 5);
    row("north", "cocoa", 9);
    totals.finish();
    auto listed = list_series(totals, whole_seconds);
    REQUIRE(listed.size() == 5);  // rollup: cocoa, tea; north: cocoa, tea; south: tea
    auto item = [&](std::size_t k) { return totals.item(listed[k].item).bytes; };
    CHECK((listed[0].all_segments && item(0) == "cocoa"));
    CHECK((listed[1].all_segments && item(1) == "tea"));
    CHECK((!listed[2].all_segments && listed[2].group->key().bytes == "north" && item(2) == "cocoa"));
    CHECK((listed[3].group->key().bytes == "north" && item(3) == "tea"));
    CHECK((listed[4].group->key().bytes == "south" && item(4) == "tea"));
    // The rollup over every row's span, each segment over its own.
    CHECK(listed[0].range.first_serial == 3);
    CHECK(listed[0].range.last_serial == 9);
    CHECK(listed[2].range.first_serial == 5);
    CHECK(listed[4].range.last_serial == 3);
}

TEST_CASE("a range wider than the data is checked against the limit") {
    PeriodTotals totals(10, false);
    ++totals.cell(ValueView{}, text("tea"), 1, at_ms(1000)).rows;
    totals.finish();
    auto wide = [](Instant, Instant) { return PeriodRange{at_ms(0), at_ms(11000), 0, 10}; };
    CHECK_THROWS_WITH(list_series(totals, wide),
                      "1 item over 11 periods are more item-period rows than the limit of 10: use "
                      "a longer period, a shorter range or a smaller source");
}
