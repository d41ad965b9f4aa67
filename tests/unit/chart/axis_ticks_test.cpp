// SPDX-License-Identifier: MIT
#include "core/chart/axis_ticks.h"

#include <catch2/catch.hpp>
#include <chrono>
#include <vector>

#include "core/chart/calendar_ticks.h"
#include "core/time/time_value.h"

using namespace almanac;

namespace {
std::vector<std::string> labels(const AxisScale& scale) {
    std::vector<std::string> out;
    for (const auto& tick : scale.ticks) out.push_back(tick.label);
    return out;
}
std::vector<std::string> contexts(const AxisScale& scale) {
    std::vector<std::string> out;
    for (const auto& tick : scale.ticks) out.push_back(tick.context);
    return out;
}
Instant at(const char* text) { return parse_time_text(text).instant(); }
Instant day(const char* text) { return parse_time_text(text).utc_instant(); }
}  // namespace

TEST_CASE("steps are 1, 2 or 5 times a power of ten") {
    // common practice ("nice numbers" for axis labels); rows hand computed.
    auto [range, intervals, step] = GENERATE(table<double, int, double>({
        {100, 5, 20},
        {100, 10, 10},
        {100, 4, 50},
        {7, 5, 2},
        {0.3, 3, 0.1},  // 0.3/3 is 0.09999999999999999 in binary: still 0.1
        {1, 1, 1},
        {12345, 6, 5000},
        {0.00042, 4, 0.0002},
    }));
    CAPTURE(range, intervals);
    CHECK(round_step(range, intervals) == Approx(step).epsilon(1e-12));
}

TEST_CASE("a y axis is extended to whole steps and labelled with the decimals the step needs") {
    auto scale = numeric_scale(3.2, 47.9, 5, true);
    // hand computed: step 10 covers [3.2, 47.9] in 5 intervals, from 0 to 50.
    CHECK(scale.low == 0);
    CHECK(scale.high == 50);
    CHECK(labels(scale) == std::vector<std::string>{"0", "10", "20", "30", "40", "50"});

    auto fine = numeric_scale(0.12, 0.38, 5, true);
    // hand computed: 0.26 / 5 = 0.052; of 0.01, 0.02, 0.05, 0.1 the first >= 0.052 is 0.1.
    CHECK(labels(fine) == std::vector<std::string>{"0.1", "0.2", "0.3", "0.4"});

    auto negative = numeric_scale(-0.7, 0.2, 4, true);
    // 0.9/4 = 0.225 -> step 0.5; ticks -1, -0.5, 0, 0.5, all with the step's one decimal
    // (common practice: one axis, one number of decimals), and no "-0.0".
    CHECK(labels(negative) == std::vector<std::string>{"-1.0", "-0.5", "0.0", "0.5"});
}

TEST_CASE("an x axis keeps the data's own ends and ticks inside them") {
    auto scale = numeric_scale(1.5, 9.5, 4, false);
    CHECK(scale.low == 1.5);
    CHECK(scale.high == 9.5);
    CHECK(labels(scale) == std::vector<std::string>{"2", "4", "6", "8"});
}

TEST_CASE("a single value gets an axis around it") {
    auto scale = numeric_scale(5, 5, 4, true);
    CHECK(scale.low < 5);
    CHECK(scale.high > 5);
    CHECK_FALSE(scale.ticks.empty());
    auto zero = numeric_scale(0, 0, 4, true);
    CHECK(zero.low == -1);
    CHECK(zero.high == 1);
}

TEST_CASE("extreme magnitudes switch to scientific labels and never loop forever") {
    auto huge = numeric_scale(0, 3e20, 3, true);
    CHECK(labels(huge) == std::vector<std::string>{"0", "1e+20", "2e+20", "3e+20"});
    // A range of a few units at 1e20 (where doubles are 16384 apart): terminates, ticks increase.
    auto narrow = numeric_scale(1e20, 1e20 + 65536, 5, true);
    for (std::size_t i = 1; i < narrow.ticks.size(); ++i)
        CHECK(narrow.ticks[i].value > narrow.ticks[i - 1].value);
    auto widest = numeric_scale(-1.7e308, 1.7e308, 4, true);
    CHECK_FALSE(widest.ticks.empty());
    CHECK(axis_fraction(0, -1.7e308, 1.7e308) == Approx(0.5));
}

TEST_CASE("a calendar axis picks the finest boundary that leaves room for its labels") {
    SECTION("four months with room for eight labels: two-week boundaries (Mondays)") {
        // 2024-01-15 is a Monday (from memory; date(2024, 1, 15).isocalendar() is 2024-W03-1),
        // and "2 weeks" counts from the Monday before 1970-01-01, so W03 starts a pair.
        auto scale = calendar_scale(day("2024-01-15"), day("2024-04-20"), 8);
        CHECK(labels(scale).size() == 7);
        CHECK(labels(scale).front() == "15 Jan");
    }
    SECTION("four months with room for four labels: month starts, the year on the first") {
        // Calendar facts (common practice): month starts 2024-02-01 ... 2024-04-01;
        // two-week ticks would need 7.
        auto scale = calendar_scale(day("2024-01-15"), day("2024-04-20"), 4);
        CHECK(labels(scale) == std::vector<std::string>{"Feb", "Mar", "Apr"});
        CHECK(contexts(scale) == std::vector<std::string>{"2024", "", ""});
    }
    SECTION("five weeks: ISO weeks start on Mondays") {
        // 2024-01-01 is a Monday (from memory; date.isocalendar() gives 2024-W01-1).
        auto scale = calendar_scale(day("2024-01-01"), day("2024-02-04"), 8);
        CHECK(labels(scale) ==
              std::vector<std::string>{"1 Jan", "8 Jan", "15 Jan", "22 Jan", "29 Jan"});
    }
    SECTION("a week of days") {
        auto scale = calendar_scale(day("2023-12-29"), day("2024-01-03"), 8);
        CHECK(labels(scale) ==
              std::vector<std::string>{"29 Dec", "30 Dec", "31 Dec", "1 Jan", "2 Jan", "3 Jan"});
        CHECK(contexts(scale) == std::vector<std::string>{"2023", "", "", "2024", "", ""});
    }
    SECTION("two years: quarters, labelled Qn with the year") {
        auto scale = calendar_scale(day("2023-01-01"), day("2024-12-31"), 8);
        CHECK(labels(scale) ==
              std::vector<std::string>{"Q1", "Q2", "Q3", "Q4", "Q1", "Q2", "Q3", "Q4"});
        CHECK(contexts(scale).front() == "2023");
        CHECK(contexts(scale)[4] == "2024");
    }
    SECTION("three years with room for four labels: years") {
        auto scale = calendar_scale(day("2021-03-01"), day("2024-06-01"), 4);
        CHECK(labels(scale) == std::vector<std::string>{"2022", "2023", "2024"});
    }
    SECTION("decades land on round years") {
        auto scale = calendar_scale(day("1931-05-01"), day("2019-01-01"), 5);
        CHECK(labels(scale) == std::vector<std::string>{"1940", "1960", "1980", "2000"});
    }
    SECTION("a few hours: clock times, the day on the first") {
        auto scale = calendar_scale(at("2024-03-05 08:10"), at("2024-03-05 13:00"), 6);
        CHECK(labels(scale) ==
              std::vector<std::string>{"09:00", "10:00", "11:00", "12:00", "13:00"});
        CHECK(contexts(scale).front() == "5 Mar 2024");
    }
}
