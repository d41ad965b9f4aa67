// SPDX-License-Identifier: MIT
#include "core/stats/period_totals.h"

#include <catch2/catch.hpp>
#include <string>

#include "core/text/error.h"

using namespace almanac;
using Kind = ItemKey::Kind;

namespace {
PeriodCell& text_cell(PeriodTotals& totals, const std::string& item, std::int64_t serial) {
    return totals.cell(Kind::Text, 0, 0, item, serial);
}
}  // namespace

TEST_CASE("rows of one item and period land in one cell, whatever order they come in") {
    PeriodTotals totals(1000);
    for (std::int64_t serial : {5, 3, 9, 3, 5, 1}) ++text_cell(totals, "tea", serial).rows;
    ++text_cell(totals, "coffee", 4).rows;
    CHECK(totals.first_serial() == 1);
    CHECK(totals.last_serial() == 9);
    REQUIRE(totals.item_count() == 2);
    auto order = totals.items_in_order();
    CHECK(totals.item(order[0]).bytes == "coffee");  // bytewise order (common practice)
    std::size_t tea = order[1];
    CHECK(totals.at(tea, 3)->rows == 2);
    CHECK(totals.at(tea, 5)->rows == 2);
    CHECK(totals.at(tea, 2) == nullptr);   // no row there: an empty period
    CHECK(totals.at(tea, 10) == nullptr);  // outside the item's cells
}

TEST_CASE("items are ordered as SQLite orders values: NULL, numbers by value, TEXT, BLOB") {
    // SQLite's documented sort order of values (common practice).
    ItemKey null_key, two, one_and_half, text, blob;
    two.kind = Kind::Integer;
    two.integer = 2;
    one_and_half.kind = Kind::Real;
    one_and_half.real = 1.5;
    text.kind = Kind::Text;
    text.bytes = "a";
    blob.kind = Kind::Blob;
    blob.bytes = std::string(1, '\0');
    CHECK(item_less(null_key, one_and_half));
    CHECK(item_less(one_and_half, two));
    CHECK(item_less(two, text));
    CHECK(item_less(text, blob));
    CHECK_FALSE(item_less(two, one_and_half));
    ItemKey big;
    big.kind = Kind::Integer;
    big.integer = 9007199254740993;  // 2^53 + 1: no double holds it
    ItemKey near;
    near.kind = Kind::Real;
    near.real = 9007199254740992.0;  // 2^53
    CHECK(item_less(near, big));     // compared exactly, not after rounding to a double
}

TEST_CASE("a whole REAL item is the same item as the INTEGER it equals, as in GROUP BY") {
    PeriodTotals totals(100);
    ++totals.cell(Kind::Integer, 3, 0, {}, 0).rows;
    ++totals.cell(Kind::Real, 0, 3.0, {}, 0).rows;
    ++totals.cell(Kind::Real, 0, 3.5, {}, 0).rows;
    CHECK(totals.item_count() == 2);
}

TEST_CASE("more item-periods than the limit is an error before the memory is taken") {
    PeriodTotals totals(10);
    text_cell(totals, "a", 0);
    text_cell(totals, "a", 4);  // 1 item x 5 periods
    text_cell(totals, "b", 1);  // 2 x 5 = 10: still within
    CHECK_THROWS_WITH(text_cell(totals, "c", 2),
                      "3 items over 5 periods are more item-period rows than the limit of 10: use "
                      "a longer period or a smaller source");
    CHECK_THROWS_AS(text_cell(totals, "a", 5), Error);  // 2 x 6
    CHECK(totals.last_serial() == 4);                   // a refused row changes nothing
}

TEST_CASE("rows arriving in descending period order keep every earlier cell") {
    PeriodTotals totals(100000);
    for (std::int64_t serial = 50000; serial-- > 0;) {
        PeriodCell& cell = text_cell(totals, "x", serial);
        ++cell.rows;
        cell.amount.add_integer(serial);
    }
    std::size_t x = totals.items_in_order()[0];
    CHECK(totals.at(x, 0)->rows == 1);
    CHECK(totals.at(x, 49999)->amount.value()->integer == 49999);
}
