// SPDX-License-Identifier: MIT
#include "core/text/json_value.h"

#include <catch2/catch.hpp>

#include "core/chart/chart_options.h"
#include "core/text/error.h"
#include "core/text/utf8.h"

using namespace almanac;

TEST_CASE("valid JSON documents parse to their values") {
    // RFC 8259 sections 3-7 (values, objects, arrays, numbers, strings).
    auto v = parse_json(
        R"( {"a": [1, -2.5e2, true, false, null], "b": "x\"\\\/\n\u00e9\ud83d\ude00"} )");
    REQUIRE(v.type() == JsonValue::Type::Object);
    REQUIRE(v.object().size() == 2);
    const auto& a = v.object()[0].second.array();
    REQUIRE(a.size() == 5);
    CHECK(a[0].number() == 1);
    CHECK(a[1].number() == -250);
    CHECK(a[2].boolean());
    CHECK_FALSE(a[3].boolean());
    CHECK(a[4].type() == JsonValue::Type::Null);
    // \u00e9 is U+00E9 (C3 A9); the surrogate pair D83D DE00 is U+1F600 (F0 9F 98 80), RFC 8259
    // section 7.
    CHECK(v.object()[1].second.string() == "x\"\\/\n\xC3\xA9\xF0\x9F\x98\x80");
    CHECK(parse_json("0").number() == 0);
    CHECK(parse_json("[]").array().empty());
    CHECK(parse_json("{}").object().empty());
}

TEST_CASE("invalid JSON is an error that says where and what was expected") {
    // Each row is outside the RFC 8259 grammar.
    auto [text, message] = GENERATE(table<std::string, std::string>({
        {"", "invalid JSON at byte 1: expected a JSON value, found the end of the text"},
        {"{", "invalid JSON at byte 2: expected a key in double quotes"},
        {"{'title': 1}", "invalid JSON at byte 2: expected a key in double quotes"},
        {"{\"a\" 1}", "invalid JSON at byte 6: expected ':' after the key"},
        {"{\"a\": 1,}", "invalid JSON at byte 9: expected a key in double quotes"},
        {"{\"a\": 1} x",
         "invalid JSON at byte 10: expected the end of the text after the JSON value"},
        {"[1 2]", "invalid JSON at byte 4: expected ',' or ']' in an array"},
        {"01", "invalid JSON at byte 2: expected no leading zeros in a number"},
        {"1.", "invalid JSON at byte 3: expected a digit after the decimal point"},
        {"-", "invalid JSON at byte 2: expected a digit"},
        {"1e400", "invalid JSON at byte 1: expected a number within the range of a double"},
        {"NaN",
         "invalid JSON at byte 1: expected a JSON value (an object, array, string, number, true, "
         "false or null)"},
        {"tru",
         "invalid JSON at byte 1: expected a JSON value (an object, array, string, number, true, "
         "false or null)"},
        {"\"abc", "invalid JSON at byte 5: expected '\"' to close the string"},
        {"\"a\tb\"",
         "invalid JSON at byte 3: expected control characters in a string to be escaped (\\n, \\t, "
         "\\u00XX)"},
        {"\"\\x\"",
         "invalid JSON at byte 3: expected an escape: \\\" \\\\ \\/ \\b \\f \\n \\r \\t or "
         "\\uXXXX"},
        {"\"\\ud800\"",
         "invalid JSON at byte 8: expected a low surrogate (\\uDC00-\\uDFFF) after a high one"},
        {"\"\\udc00\"", "invalid JSON at byte 8: expected a high surrogate before a low one"},
        {"\"\xFF\"", "invalid JSON at byte 2: expected UTF-8 text"},
        {"{\"a\": 1, \"a\": 2}", "invalid JSON at byte 10: key \"a\" appears twice"},
    }));
    CAPTURE(text);
    CHECK_THROWS_WITH(parse_json(text), message);
}

TEST_CASE("nesting is limited so a hostile option cannot exhaust the stack") {
    std::string deep(100000, '[');
    CHECK_THROWS_WITH(parse_json(deep), Catch::Contains("nesting deeper than 32 levels"));
}

TEST_CASE("chart options read the four keys and refuse anything else") {
    auto options = parse_chart_options(
        R"({"title": "Sales <EUR>", "width": 900, "height": 300.0, "y_caption": "EUR"})");
    CHECK(options.title == "Sales <EUR>");
    CHECK(options.width == 900);
    CHECK(options.height == 300);
    CHECK(options.y_caption == "EUR");

    auto defaults = parse_chart_options(R"({"title": null, "width": null})");
    CHECK(defaults.title.empty());
    CHECK(defaults.width == ChartOptions{}.width);

    CHECK_THROWS_WITH(parse_chart_options(R"({"colour": "red"})"),
                      "unknown key \"colour\": expected title, width, height, y_caption, series_order, period or zone");
    CHECK_THROWS_WITH(
        parse_chart_options(R"({"width": "wide"})"),
        "key \"width\" = \"wide\": expected a whole number of pixels from 200 to 10000");
    CHECK_THROWS_WITH(parse_chart_options(R"({"width": 800.5})"),
                      "key \"width\" = 800.5: expected a whole number of pixels from 200 to 10000");
    CHECK_THROWS_WITH(parse_chart_options(R"({"height": 100})"),
                      "key \"height\" = 100: expected a whole number of pixels from 150 to 10000");
    CHECK_THROWS_WITH(parse_chart_options(R"({"title": 5})"),
                      "key \"title\" = 5: expected a string");
    CHECK_THROWS_WITH(parse_chart_options(R"(["title"])"),
                      "expected a JSON object such as {\"title\": \"Sales\"}, not an array");
    CHECK_THROWS_AS(parse_chart_options("{title: 1}"), Error);
}

TEST_CASE("a long string in a message is cut between characters, never inside one") {
    // Regression: the cut at byte 40 split an "é" (2 bytes, RFC 3629) and the message
    // was not UTF-8. 39 ASCII letters put the "é" across bytes 39-40.
    std::string value = std::string(39, 'a') + "\xC3\xA9\xC3\xA9";
    std::string shown = JsonValue::from_string(value).describe();
    CHECK(shown == "\"" + std::string(39, 'a') + "...\"");
    CHECK(is_valid_utf8(shown));
}
