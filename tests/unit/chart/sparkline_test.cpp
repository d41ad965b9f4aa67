// SPDX-License-Identifier: MIT
#include "core/chart/sparkline.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <string>

using namespace almanac;

namespace {
// U+2581 + level in UTF-8 (Unicode block "Block Elements": 2581 LOWER ONE EIGHTH BLOCK ... 2588
// FULL BLOCK).
std::string block(int level) { return std::string("\xE2\x96") + char(0x81 + level); }
}  // namespace

TEST_CASE("levels follow round(7 (y - min) / (max - min)) with halves rounded up") {
    // README "Reports: sparklines and line charts" gives the formula; the rows are hand computed.
    CHECK(sparkline_level(0, 0, 7) == 0);
    CHECK(sparkline_level(7, 0, 7) == 7);
    CHECK(sparkline_level(3.5, 0, 7) == 4);  // 3.5 rounds up
    CHECK(sparkline_level(3.49, 0, 7) == 3);
    CHECK(sparkline_level(5, 1, 10) == 3);  // 7*4/9 = 3.11
    CHECK(sparkline_level(3, 1, 10) == 2);  // 7*2/9 = 1.56
    CHECK(sparkline_level(-1, -1, 1) == 0);
    CHECK(sparkline_level(0, -1, 1) == 4);  // 3.5
    // 0.49999999999999994 (the largest double below one half) rounds down; floor(v + 0.5) would
    // not.
    CHECK(sparkline_level(0.49999999999999994, 0, 7) == 0);
}

TEST_CASE("a constant series is all middle blocks") {
    CHECK(sparkline_level(5, 5, 5) == 3);  // README: all U+2584
    Sparkline line;
    for (int i = 0; i < 4; ++i) line.add(i, 2.5);
    CHECK(line.render() == block(3) + block(3) + block(3) + block(3));
}

TEST_CASE("ranges wider than the largest double do not overflow") {
    // max - min = 3.4e308 is infinite in binary64; the fraction is still 0, 1/2, 1.
    CHECK(sparkline_level(-1.7e308, -1.7e308, 1.7e308) == 0);
    CHECK(sparkline_level(0, -1.7e308, 1.7e308) == 4);  // 3.5 rounds up
    CHECK(sparkline_level(1.7e308, -1.7e308, 1.7e308) == 7);
    CHECK(sparkline_level(3e307, 0, 1.7e308) == 1);  // 7 * 0.176 = 1.24; 7 * 3e307 overflows
}

TEST_CASE("rows are drawn in x order, ties in arrival order, missing values as spaces") {
    Sparkline line;
    line.add(3, 7.0);
    line.add(1, 0.0);
    line.add(2, std::nullopt);
    line.add(1, 7.0);  // same x as the second row: comes after it
    CHECK(line.render() == block(0) + block(7) + " " + block(7));
}

TEST_CASE("a series of only missing values is all spaces") {
    Sparkline line;
    line.add(1, std::nullopt);
    line.add(2, std::nullopt);
    CHECK(line.render() == "  ");
}
