// SPDX-License-Identifier: MIT
#include "core/stats/decomposition_options.h"

#include <catch2/catch.hpp>
#include <string>

#include "core/text/error.h"

using namespace almanac;

namespace {
std::string refusal(const char* json) {
    try {
        parse_decomposition_options(json);
    } catch (const Error& error) {
        return error.what();
    }
    return "";
}
}  // namespace

TEST_CASE("decomposition options left out keep their defaults") {
    const DecompositionOptions none = parse_decomposition_options("{}");
    CHECK(none.seasonal == 7);
    CHECK_FALSE(none.robust);
    const DecompositionOptions given =
        parse_decomposition_options(R"({"seasonal": 13, "robust": false})");
    CHECK(given.seasonal == 13);
    CHECK(given.robust == false);
    CHECK(parse_decomposition_options(R"({"seasonal": null, "robust": null})").seasonal == 7);
}

TEST_CASE("a seasonal span that is even, short or not whole is refused with what is allowed") {
    const std::string expected = "expected an odd whole number of cycles from 7 to 1000001";
    CHECK(refusal(R"({"seasonal": 8})") == "key \"seasonal\" = 8: " + expected);
    CHECK(refusal(R"({"seasonal": 5})") == "key \"seasonal\" = 5: " + expected);
    CHECK(refusal(R"({"seasonal": 7.5})") == "key \"seasonal\" = 7.5: " + expected);
    CHECK(refusal(R"({"seasonal": "9"})") == "key \"seasonal\" = \"9\": " + expected);
}

TEST_CASE("an unknown option names the known ones") {
    CHECK(refusal(R"({"period": 12})") ==
          "unknown key \"period\": expected \"seasonal\" or \"robust\"");
    CHECK(refusal(R"({"robust": 1})") == "key \"robust\" = 1: expected true or false");
    CHECK(refusal("[7]").rfind("expected a JSON object", 0) == 0);
    CHECK(refusal("{seasonal: 7}").rfind("invalid JSON", 0) == 0);
}
