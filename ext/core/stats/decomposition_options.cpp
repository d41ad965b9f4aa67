// SPDX-License-Identifier: MIT
#include "core/stats/decomposition_options.h"

#include <cmath>
#include <string>

#include "core/text/error.h"
#include "core/text/json_value.h"

namespace almanac {
namespace {

constexpr const char* kKnownKeys = "expected \"seasonal\" or \"robust\"";
// Spans past this many cycles smooth nothing more: every subseries of a
// series that fits in memory is shorter.
constexpr double kLongestSeasonal = 1000001;

std::size_t seasonal_option(const JsonValue& value) {
    const char* expected = "expected an odd whole number of cycles from 7 to 1000001";
    if (value.type() != JsonValue::Type::Number)
        throw Error("key \"seasonal\" = " + value.describe() + ": " + expected);
    const double span = value.number();
    if (std::floor(span) != span || span < 7 || span > kLongestSeasonal ||
        std::fmod(span, 2.0) == 0.0)
        throw Error("key \"seasonal\" = " + value.describe() + ": " + expected);
    return static_cast<std::size_t>(span);
}

}  // namespace

DecompositionOptions parse_decomposition_options(std::string_view json) {
    JsonValue document = parse_json(json);
    if (document.type() != JsonValue::Type::Object)
        throw Error("expected a JSON object such as {\"seasonal\": 13, \"robust\": true}, not " +
                    std::string(describe_json_type(document.type())));
    DecompositionOptions options;
    for (const auto& [key, value] : document.object()) {
        const bool is_null = value.type() == JsonValue::Type::Null;
        if (key == "seasonal") {
            if (!is_null) options.seasonal = seasonal_option(value);
        } else if (key == "robust") {
            if (is_null) continue;
            if (value.type() != JsonValue::Type::Boolean)
                throw Error("key \"robust\" = " + value.describe() + ": expected true or false");
            options.robust = value.boolean();
        } else {
            throw Error("unknown key \"" + key + "\": " + kKnownKeys);
        }
    }
    return options;
}

}  // namespace almanac
