// SPDX-License-Identifier: MIT
#include "core/time/period_spec.h"

#include <catch2/catch.hpp>

#include "core/text/error.h"

using namespace almanac;

namespace {
// One row of a spec table: the text and the unit and count it must parse to.
struct SpecRow {
    const char* text;
    PeriodUnit unit;
    std::int64_t count;
};

void check_spec(const SpecRow& row) {
    INFO(row.text);
    auto spec = parse_period_spec(row.text);
    CHECK(spec.unit == row.unit);
    CHECK(spec.count == row.count);
}
}  // namespace

TEST_CASE("spec words name units, with plurals, counts and free spacing") {
    // Expected values: the README's spec grammar (the contract).
    auto row = GENERATE(values<SpecRow>({
        {"day", PeriodUnit::Day, 1},
        {"DAYS", PeriodUnit::Day, 1},
        {"2 weeks", PeriodUnit::Week, 2},
        {"2weeks", PeriodUnit::Week, 2},
        {"  15 minutes ", PeriodUnit::Minute, 15},
        {"half-month", PeriodUnit::HalfMonth, 1},
        {"half month", PeriodUnit::HalfMonth, 1},
        {"3 months", PeriodUnit::Month, 3},
        {"quarter", PeriodUnit::Quarter, 1},
        {"year", PeriodUnit::Year, 1},
        {"90 seconds", PeriodUnit::Second, 90},
        {"hour", PeriodUnit::Hour, 1},
    }));
    check_spec(row);
}

TEST_CASE("ISO 8601 single-component durations map onto units") {
    // ISO 8601-1:2019 duration designators: Y M W D, and H M S after T.
    auto row = GENERATE(values<SpecRow>({
        {"P1Y", PeriodUnit::Year, 1},
        {"P3M", PeriodUnit::Month, 3},
        {"P1W", PeriodUnit::Week, 1},
        {"P10D", PeriodUnit::Day, 10},
        {"PT12H", PeriodUnit::Hour, 12},
        {"pt15m", PeriodUnit::Minute, 15},
        {"PT30S", PeriodUnit::Second, 30},
    }));
    check_spec(row);
}

TEST_CASE("starting and from modify weeks, quarters and years") {
    auto sunday = parse_period_spec("week starting sunday");
    CHECK(sunday.week_start == date::Sunday);
    auto fiscal = parse_period_spec("quarter starting April");
    CHECK(fiscal.year_start == date::April);
    CHECK(fiscal.is_fiscal());
    CHECK_FALSE(parse_period_spec("year starting january").is_fiscal());
    auto billing = parse_period_spec("month from 2024-01-15");
    REQUIRE(billing.from);
    CHECK(format_date(date::floor<date::days>(*billing.from)) == "2024-01-15");
    // 2024-01-03 was a Wednesday (common practice: any calendar).
    CHECK(parse_period_spec("2 weeks from 2024-01-03").week_start == date::Wednesday);
    CHECK(parse_period_spec("day from 2024-01-01 06:00").from.has_value());
}

TEST_CASE("bad specs say what was expected") {
    CHECK_THROWS_WITH(parse_period_spec("P1M2D"), Catch::Contains("mixed or malformed duration"));
    CHECK_THROWS_WITH(parse_period_spec("0 days"), Catch::Contains("positive whole number"));
    CHECK_THROWS_WITH(parse_period_spec("-3 days"), Catch::Contains("positive whole number"));
    CHECK_THROWS_WITH(parse_period_spec("fortnight"), Catch::Contains("unknown unit 'fortnight'"));
    CHECK_THROWS_WITH(parse_period_spec("2 half-months"),
                      Catch::Contains("half-month takes no count"));
    CHECK_THROWS_WITH(parse_period_spec("month starting monday"),
                      Catch::Contains("'starting' applies to"));
    CHECK_THROWS_WITH(parse_period_spec("week starting sunday from 2024-01-03"),
                      Catch::Contains("contradicts 'starting sunday'"));
    CHECK_THROWS_WITH(parse_period_spec("year starting april from 2024-05-01"),
                      Catch::Contains("contradicts 'starting april'"));
    CHECK_THROWS_WITH(parse_period_spec("month from 2024-02-30"),
                      Catch::Contains("2024-02 has 29 days"));
    CHECK_THROWS_WITH(parse_period_spec(""), Catch::Contains("empty"));
    CHECK_THROWS_AS(parse_period_spec("week starting"), Error);
    CHECK_THROWS_AS(parse_period_spec("3"), Error);
}

TEST_CASE("only units of fixed length have one") {
    CHECK(parse_period_spec("2 weeks").fixed_length() == Millis{14LL * 86400000});
    CHECK(parse_period_spec("PT12H").fixed_length() == Millis{12LL * 3600000});
    CHECK_THROWS_WITH(parse_period_spec("month").fixed_length(),
                      Catch::Contains("no fixed length"));
}

TEST_CASE("retail specs name the unit, the month pattern and the anchor") {
    // Expected values: the README's retail grammar (the contract).
    auto spec = parse_period_spec("  Retail   Months 4-5-4 ending SAT nearest   end of jan ");
    CHECK(spec.unit == PeriodUnit::RetailMonth);
    CHECK(spec.retail_pattern.weeks == std::array<unsigned, 3>{{4, 5, 4}});
    CHECK(spec.retail_anchor == RetailAnchor{date::Saturday, date::January, true});
    CHECK(spec.describe() == "retail month 4-5-4 ending saturday nearest end of january");
    auto year = parse_period_spec("retail year ending last sunday of march");
    CHECK(year.unit == PeriodUnit::RetailYear);
    CHECK(year.retail_anchor == RetailAnchor{date::Sunday, date::March, false});
    CHECK(year.describe() == "retail year ending last sunday of march");
    CHECK(parse_period_spec("retail month ending last sunday of march").retail_pattern.weeks ==
          std::array<unsigned, 3>{{4, 4, 5}});
    CHECK(parse_period_spec("retail weeks ending friday nearest end of december").unit ==
          PeriodUnit::RetailWeek);
    CHECK(parse_period_spec("retail quarter ending last friday of june").unit ==
          PeriodUnit::RetailQuarter);
}

TEST_CASE("retail specs refuse what the grammar does not allow, saying what was expected") {
    auto refused = [](const char* text, const char* words) {
        INFO(text);
        try {
            parse_period_spec(text);
            FAIL("accepted");
        } catch (const Error& error) {
            CHECK_THAT(error.what(), Catch::Contains(words));
        }
    };
    refused("2 retail weeks ending last saturday of january", "takes no count");
    refused("retail year", "needs an anchor");
    refused("retail month 4-4-4 ending last saturday of january", "expected 4-4-5, 4-5-4 or 5-4-4");
    refused("retail week 4-4-5 ending last saturday of january", "retail month only");
    refused("retail year starting february", "takes no 'starting'");
    refused("retail year ending last saturday of january from 2025-01-26", "takes no 'from'");
    refused("retail fortnight ending last saturday of january", "unknown retail unit");
    refused("retail year ending final saturday of january", "is not a weekday");
    refused("retail year ending last saturday in january", "the anchor has 'of'");
    refused("retail year ending saturday closest end of january", "the anchor has 'nearest'");
    refused("retail year ending saturday nearest", "the anchor ends before 'end'");
    refused("retail year ending last saturday of smarch", "is not a month");
    refused("retail year ending last saturday of january please", "unexpected 'please'");
    refused("retail", "needs a unit");
}
