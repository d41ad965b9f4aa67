// SPDX-License-Identifier: MIT
#include "core/chart/chart_options.h"

#include <cmath>

#include "core/text/error.h"
#include "core/text/json_value.h"

namespace almanac {

namespace {

std::string text_option(const std::string& key, const JsonValue& value) {
    if (value.type() != JsonValue::Type::String)
        throw Error("key \"" + key + "\" = " + value.describe() + ": expected a string");
    return value.string();
}

int size_option(const std::string& key, const JsonValue& value, int minimum, int maximum) {
    std::string expected = "expected a whole number of pixels from " + std::to_string(minimum) +
                           " to " + std::to_string(maximum);
    if (value.type() != JsonValue::Type::Number)
        throw Error("key \"" + key + "\" = " + value.describe() + ": " + expected);
    double number = value.number();
    if (std::floor(number) != number || number < minimum || number > maximum)
        throw Error("key \"" + key + "\" = " + value.describe() + ": " + expected);
    return static_cast<int>(number);
}

std::vector<std::string> names_option(const std::string& key, const JsonValue& value) {
    std::string expected = "expected an array of series names such as [\"Espresso\", \"Rye\"]";
    if (value.type() != JsonValue::Type::Array)
        throw Error("key \"" + key + "\" = " + value.describe() + ": " + expected);
    std::vector<std::string> names;
    for (const JsonValue& item : value.array()) {
        if (item.type() != JsonValue::Type::String)
            throw Error("key \"" + key + "\" holds " + item.describe() + ": " + expected);
        names.push_back(item.string());
    }
    return names;
}

}  // namespace

const char* known_chart_option_keys() {
    return "title, width, height, y_caption, series_order, period or zone";
}

ChartOptions parse_chart_options(std::string_view json) {
    if (json.size() > ChartOptions::kLongestText)
        throw Error("options are at most " + std::to_string(ChartOptions::kLongestText) +
                    " bytes of JSON; these have " + std::to_string(json.size()));
    JsonValue document = parse_json(json);
    if (document.type() != JsonValue::Type::Object)
        throw Error("expected a JSON object such as {\"title\": \"Sales\"}, not " +
                    std::string(describe_json_type(document.type())));
    ChartOptions options;
    for (const auto& [key, value] : document.object()) {
        bool is_null = value.type() == JsonValue::Type::Null;
        if (key == "title") {
            if (!is_null) options.title = text_option(key, value);
        } else if (key == "y_caption") {
            if (!is_null) options.y_caption = text_option(key, value);
        } else if (key == "width") {
            if (!is_null)
                options.width =
                    size_option(key, value, ChartOptions::kMinWidth, ChartOptions::kMaxWidth);
        } else if (key == "height") {
            if (!is_null)
                options.height =
                    size_option(key, value, ChartOptions::kMinHeight, ChartOptions::kMaxHeight);
        } else if (key == "series_order") {
            if (!is_null) options.series_order = names_option(key, value);
        } else if (key == "period") {
            if (!is_null) {
                std::string text = text_option(key, value);
                try {
                    options.period = parse_period_spec(text);
                } catch (const Error& error) {
                    throw Error("key \"" + key + "\" = " + value.describe() + ": " + error.what());
                }
            }
        } else if (key == "zone") {
            if (!is_null) {
                std::string text = text_option(key, value);
                try {
                    options.zone = ZoneClock::named(text);
                } catch (const Error& error) {
                    throw Error("key \"" + key + "\" = " + value.describe() + ": " + error.what());
                }
            }
        } else {
            throw Error("unknown key \"" + key + "\": expected " +
                        std::string(known_chart_option_keys()));
        }
    }
    return options;
}

void ChartSettings::accept(const std::optional<std::string>& text) {
    if (!read_) {
        read_ = true;
        text_ = text;
        if (text) options_ = parse_chart_options(*text);
        return;
    }
    if (text != text_)
        throw Error("expected the same options on every row of one chart (the first row had " +
                    (text_ ? "'" + *text_ + "'" : std::string("NULL")) + ")");
}

}  // namespace almanac
