// SPDX-License-Identifier: MIT
#include "core/stats/period_totals.h"

#include <catch2/catch.hpp>
#include <string>

#include "core/text/error.h"

using namespace almanac;
using Kind = ValueKey::Kind;

namespace {
ValueView text(const std::string& bytes) { return ValueView{Kind::Text, 0, 0, bytes}; }
const ValueView kNoSegment{};

Instant at_ms(std::int64_t ms) { return Instant{Millis{ms}}; }

PeriodCell& text_cell(PeriodTotals& totals, const std::string& item, std::int64_t serial) {
    return totals.cell(kNoSegment, text(item), serial, at_ms(serial * 1000));
}

PeriodCell& segment_cell(PeriodTotals& totals, const std::string& segment, const std::string& item,
                         std::int64_t serial) {
    return totals.cell(text(segment), text(item), serial, at_ms(serial * 1000));
}

void add_row(PeriodCell& cell, double amount) {
    ++cell.rows;
    cell.amount.add_real(amount);
}
}  // namespace

TEST_CASE("rows of one item and period land in one cell, whatever order they come in") {
    PeriodTotals totals(1000, false);
    for (std::int64_t serial : {5, 3, 9, 3, 5, 1}) ++text_cell(totals, "tea", serial).rows;
    ++text_cell(totals, "coffee", 4).rows;
    totals.finish();
    const TotalsGroup& all = totals.rollup();
    CHECK(all.first_serial() == 1);
    CHECK(all.last_serial() == 9);
    CHECK(all.rows() == 7);
    CHECK(all.earliest() == at_ms(1000));
    CHECK(all.latest() == at_ms(9000));
    REQUIRE(totals.item_count() == 2);
    CHECK(totals.segment_count() == 0);
    auto order = totals.items_in_order();
    CHECK(totals.item(order[0]).bytes == "coffee");  // bytewise order (common practice)
    std::size_t tea = order[1];
    CHECK(all.at(tea, 3)->rows == 2);
    CHECK(all.at(tea, 5)->rows == 2);
    CHECK(all.at(tea, 2) == nullptr);   // no row there: an empty period
    CHECK(all.at(tea, 10) == nullptr);  // outside the item's cells
}

TEST_CASE("values are ordered as SQLite orders them: NULL, numbers by value, TEXT, BLOB") {
    // SQLite's documented sort order of values (common practice).
    ValueKey null_key, two, one_and_half, text_key, blob;
    two.kind = Kind::Integer;
    two.integer = 2;
    one_and_half.kind = Kind::Real;
    one_and_half.real = 1.5;
    text_key.kind = Kind::Text;
    text_key.bytes = "a";
    blob.kind = Kind::Blob;
    blob.bytes = std::string(1, '\0');
    CHECK(value_less(null_key, one_and_half));
    CHECK(value_less(one_and_half, two));
    CHECK(value_less(two, text_key));
    CHECK(value_less(text_key, blob));
    CHECK_FALSE(value_less(two, one_and_half));
    ValueKey big;
    big.kind = Kind::Integer;
    big.integer = 9007199254740993;  // 2^53 + 1: no double holds it
    ValueKey near;
    near.kind = Kind::Real;
    near.real = 9007199254740992.0;  // 2^53
    CHECK(value_less(near, big));    // compared exactly, not after rounding to a double
}

TEST_CASE("a whole REAL item is the same item as the INTEGER it equals, as in GROUP BY") {
    PeriodTotals totals(100, false);
    ++totals.cell(kNoSegment, ValueView{Kind::Integer, 3, 0, {}}, 0, at_ms(0)).rows;
    ++totals.cell(kNoSegment, ValueView{Kind::Real, 0, 3.0, {}}, 0, at_ms(0)).rows;
    ++totals.cell(kNoSegment, ValueView{Kind::Real, 0, 3.5, {}}, 0, at_ms(0)).rows;
    CHECK(totals.item_count() == 2);
}

TEST_CASE("more item-periods than the limit is an error before the memory is taken") {
    PeriodTotals totals(10, false);
    text_cell(totals, "a", 0);
    text_cell(totals, "a", 4);  // 1 item x 5 periods
    text_cell(totals, "b", 1);  // 2 x 5 = 10: still within
    CHECK_THROWS_WITH(text_cell(totals, "c", 2),
                      "3 items over 5 periods are more item-period rows than the limit of 10: use "
                      "a longer period, a shorter range or a smaller source");
    CHECK_THROWS_AS(text_cell(totals, "a", 5), Error);  // 2 x 6
    CHECK(totals.item_count() == 2);                    // a refused row changes nothing
    totals.finish();
    CHECK(totals.rollup().last_serial() == 4);
}

TEST_CASE("the limit counts every segment and the rollup") {
    // (segments + 1) x items x periods: 2 segments, 1 item, 5 periods = 15 (arithmetic)
    PeriodTotals totals(15, true);
    segment_cell(totals, "north", "a", 0);
    segment_cell(totals, "north", "a", 4);
    segment_cell(totals, "south", "a", 2);
    CHECK_THROWS_WITH(segment_cell(totals, "west", "a", 2),
                      "1 item over 5 periods in 3 segments and their rollup are more item-period "
                      "rows than the limit of 15: use a longer period, a shorter range or a "
                      "smaller source");
    CHECK(totals.segment_count() == 2);
    CHECK_THROWS_AS(totals.check_listing(0, 5), Error);  // a listing one period wider
    CHECK_NOTHROW(totals.check_listing(0, 4));
}

TEST_CASE("the rollup is one exact total of all rows, not a sum of the segments' rounded sums") {
    PeriodTotals totals(1000, true);
    // 1e16 + 1 + 1 - 1e16: each segment's own total rounds (1e16 + 1 is not a double), the
    // exact total of all four is 2 (arithmetic).
    add_row(segment_cell(totals, "north", "a", 7), 1e16);
    add_row(segment_cell(totals, "north", "a", 7), 1.0);
    add_row(segment_cell(totals, "south", "a", 7), 1.0);
    add_row(segment_cell(totals, "south", "a", 7), -1e16);
    totals.finish();
    REQUIRE(totals.segment_count() == 2);
    auto segments = totals.segments_in_order();
    CHECK(totals.segment(segments[0]).key().bytes == "north");
    CHECK(totals.segment(segments[0]).at(0, 7)->amount.value()->real == 1e16);  // rounded, half to even
    CHECK(totals.segment(segments[1]).at(0, 7)->amount.value()->real == 1.0 - 1e16);
    const PeriodCell* all = totals.rollup().at(0, 7);
    REQUIRE(all);
    CHECK(all->rows == 4);
    CHECK(all->amount.value()->real == 2.0);
}

TEST_CASE("totals read in parts and merged equal one reading of every row") {
    struct Row {
        const char* segment;
        const char* item;
        std::int64_t serial;
        double amount;
    };
    const Row rows[] = {{"b", "x", 3, 0.1}, {"a", "y", 1, 1e300},  {"a", "y", 1, -1e300},
                        {"b", "x", 9, 0.2}, {"a", "x", 3, 1e-300}, {"c", "z", 5, 7.0},
                        {"b", "y", 1, 0.3}, {"a", "x", 2, 0.7}};
    PeriodTotals whole(1000, true);
    for (const Row& row : rows) add_row(segment_cell(whole, row.segment, row.item, row.serial), row.amount);
    whole.finish();
    for (std::size_t split = 0; split <= 8; ++split) {
        PeriodTotals first(1000, true), second(1000, true);
        for (std::size_t i = 0; i < 8; ++i) {
            PeriodTotals& part = i < split ? first : second;
            add_row(segment_cell(part, rows[i].segment, rows[i].item, rows[i].serial), rows[i].amount);
        }
        first.merge(std::move(second));
        first.finish();
        REQUIRE(first.item_count() == whole.item_count());
        REQUIRE(first.segment_count() == whole.segment_count());
        auto items = first.items_in_order(), whole_items = whole.items_in_order();
        auto segments = first.segments_in_order(), whole_segments = whole.segments_in_order();
        auto same_group = [&](const TotalsGroup& a, const TotalsGroup& b) {
            CHECK(a.key().bytes == b.key().bytes);
            CHECK(a.rows() == b.rows());
            CHECK(a.first_serial() == b.first_serial());
            CHECK(a.last_serial() == b.last_serial());
            for (std::size_t k = 0; k < items.size(); ++k) {
                CHECK(first.item(items[k]).bytes == whole.item(whole_items[k]).bytes);
                for (std::int64_t serial = 0; serial <= 10; ++serial) {
                    const PeriodCell* x = a.at(items[k], serial);
                    const PeriodCell* y = b.at(whole_items[k], serial);
                    REQUIRE((x == nullptr) == (y == nullptr));
                    if (!x) continue;
                    CHECK(x->rows == y->rows);
                    CHECK(x->amount.value()->real == y->amount.value()->real);
                }
            }
        };
        same_group(first.rollup(), whole.rollup());
        for (std::size_t s = 0; s < segments.size(); ++s)
            same_group(first.segment(segments[s]), whole.segment(whole_segments[s]));
    }
}

TEST_CASE("the earliest row's representation does not depend on the order rows come in") {
    PeriodTotals a(100, false), b(100, false);
    a.set_earliest_form(at_ms(5), Representation::JulianDay, false);
    a.set_earliest_form(at_ms(5), Representation::Text, false);
    b.set_earliest_form(at_ms(5), Representation::Text, false);
    b.set_earliest_form(at_ms(5), Representation::JulianDay, false);
    CHECK(a.representation() == Representation::Text);
    CHECK(b.representation() == Representation::Text);
    CHECK(b.is_new_earliest(at_ms(4)));
    CHECK_FALSE(b.is_new_earliest(at_ms(6)));
    b.set_earliest_form(at_ms(4), Representation::UnixSeconds, true);
    CHECK(b.representation() == Representation::UnixSeconds);
    CHECK(b.integer_input());
}

TEST_CASE("rows arriving in descending period order keep every earlier cell") {
    PeriodTotals totals(100000, false);
    for (std::int64_t serial = 50000; serial-- > 0;) {
        PeriodCell& cell = text_cell(totals, "x", serial);
        ++cell.rows;
        cell.amount.add_integer(serial);
    }
    totals.finish();
    std::size_t x = totals.items_in_order()[0];
    CHECK(totals.rollup().at(x, 0)->rows == 1);
    CHECK(totals.rollup().at(x, 49999)->amount.value()->integer == 49999);
}
