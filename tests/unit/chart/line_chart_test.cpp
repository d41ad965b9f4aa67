// SPDX-License-Identifier: MIT
#include "core/chart/line_chart.h"

#include <catch2/catch.hpp>
#include <set>
#include <string>

#include "core/chart/chart_palette.h"
#include "core/text/error.h"

using namespace almanac;

namespace {
std::size_t count(const std::string& text, const std::string& needle) {
    std::size_t n = 0;
    for (auto at = text.find(needle); at != std::string::npos; at = text.find(needle, at + 1)) ++n;
    return n;
}
}  // namespace

TEST_CASE("layers are raw or smooth, in any case") {
    CHECK(parse_chart_layer("raw") == ChartLayer::Raw);
    CHECK(parse_chart_layer("SMOOTH") == ChartLayer::Smooth);
    CHECK_THROWS_WITH(parse_chart_layer("thin"),
                      "expected 'raw' (thin, light) or 'smooth' (thick)");
}

TEST_CASE("the palette has eight distinct colours and eight dash patterns for 64 series") {
    std::set<std::string> styles;
    for (std::size_t rank = 0; rank < 64; ++rank) {
        auto style = series_style(rank);
        styles.insert(style.colour + "/" + dash_array(style, 1));
    }
    CHECK(styles.size() == 64);
    std::set<std::string> colours;
    for (std::size_t i = 0; i < kPaletteSize; ++i) colours.insert(palette_colour(i));
    CHECK(colours.size() == 8);
    CHECK(dash_array(series_style(0), 2.75).empty());  // the first eight are solid
    CHECK(dash_array(series_style(8), 2) == "10 6");   // long dash, 5 and 3 widths
}

TEST_CASE("a chart refuses a 65th series and the 200,001st row") {
    LineChart chart;
    for (int i = 0; i < 64; ++i) chart.add(i, 1.0, "s" + std::to_string(i), ChartLayer::Raw);
    CHECK_NOTHROW(chart.add(1, 2.0, "s0", ChartLayer::Smooth));
    CHECK_THROWS_WITH(
        chart.add(1, 2.0, "one too many", ChartLayer::Raw),
        "more than 64 series; a chart holds at most 64 (8 colours x 8 dash patterns): "
        "chart the top items only");

    LineChart small(ChartLimits{64, 3});
    for (int i = 0; i < 3; ++i) small.add(i, 1.0, "a", ChartLayer::Raw);
    CHECK_THROWS_WITH(small.add(4, 1.0, "a", ChartLayer::Raw),
                      Catch::StartsWith("more than 3 points; a chart holds at most 3 rows"));
}

TEST_CASE("x kinds cannot mix in one chart") {
    LineChart chart;
    chart.accept_x_kind(AxisKind::Time);
    CHECK_NOTHROW(chart.accept_x_kind(AxisKind::Time));
    CHECK_THROWS_WITH(chart.accept_x_kind(AxisKind::Number),
                      "expected a time value like the earlier x values of this group; one axis "
                      "cannot mix numbers, time values and categories");
}

TEST_CASE("a missing value splits a line into subpaths; a lone value is a dot") {
    LineChart chart;
    chart.add(1, 1.0, "a", ChartLayer::Smooth);
    chart.add(2, 2.0, "a", ChartLayer::Smooth);
    chart.add(3, std::nullopt, "a", ChartLayer::Smooth);
    chart.add(4, 3.0, "a", ChartLayer::Smooth);
    chart.add(5, std::nullopt, "a", ChartLayer::Smooth);
    chart.add(6, 1.0, "a", ChartLayer::Smooth);
    chart.add(7, 2.0, "a", ChartLayer::Smooth);
    std::string svg = chart.render_svg({});
    CHECK(count(svg, "<path ") == 1);
    // Three runs: (1,2), (4) as a zero-length segment, (6,7).
    auto d = svg.substr(svg.find(" d=\"") + 4);
    d = d.substr(0, d.find('"'));
    CAPTURE(d);
    CHECK(count(d, "M") == 3);
    CHECK(count(d, "L") == 3);
}
