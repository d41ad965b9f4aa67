// SPDX-License-Identifier: MIT
#include "core/chart/bar_chart.h"

#include <catch2/catch.hpp>
#include <string>

#include "core/chart/chart_palette.h"
#include "core/chart/series_ranking.h"
#include "core/text/error.h"

using namespace almanac;

namespace {
std::size_t count(const std::string& text, const std::string& needle) {
    std::size_t n = 0;
    for (auto at = text.find(needle); at != std::string::npos; at = text.find(needle, at + 1)) ++n;
    return n;
}
}  // namespace

TEST_CASE("a bar chart draws one bar per row with a value and none for a missing one") {
    BarChart chart;
    chart.accept_x_kind(AxisKind::Number);
    chart.add(1, 5.0, "a");
    chart.add(2, std::nullopt, "a");
    chart.add(1, -2.0, "b");
    std::string svg = chart.render_svg({});
    CHECK(count(svg, "class=\"bar\"") == 2);
    CHECK(count(svg, "class=\"baseline\"") == 1);
    CHECK(count(svg, "class=\"legend-entry\"") == 2);
}

TEST_CASE("categories keep the order in which they first appear") {
    BarChart chart;
    chart.accept_x_kind(AxisKind::Category);
    chart.add_category("Tue", 1.0, "a");
    chart.add_category("Mon", 2.0, "a");
    chart.add_category("Tue", 3.0, "b");
    std::string svg = chart.render_svg({});
    CHECK(svg.find(">Tue<") < svg.find(">Mon<"));
    CHECK(count(svg, "class=\"bar\"") == 3);
}

TEST_CASE("series_order gives listed names their slot, the rest follow sorted") {
    std::map<std::string, std::uint32_t, std::less<>> ids = {
        {"Zest", 0}, {"Espresso", 1}, {"Chai", 2}};
    SeriesRanking ranking = rank_series(ids, {"Rye", "Espresso"});
    CHECK(ranking.names == std::vector<std::string>{"Espresso", "Chai", "Zest"});
    CHECK(ranking.slots == std::vector<std::size_t>{1, 2, 3});
    CHECK(ranking.position_of_id == std::vector<std::size_t>{2, 0, 1});
    SeriesRanking plain = rank_series(ids, {});
    CHECK(plain.names == std::vector<std::string>{"Chai", "Espresso", "Zest"});
    CHECK(plain.slots == std::vector<std::size_t>{0, 1, 2});
}

TEST_CASE("a bar chart refuses a 65th series") {
    BarChart chart;
    chart.accept_x_kind(AxisKind::Number);
    for (int k = 0; k < 64; ++k) chart.add(1, 1.0, "s" + std::to_string(k));
    CHECK_THROWS_AS(chart.add(1, 1.0, "one more"), Error);
}
