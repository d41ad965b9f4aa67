// SPDX-License-Identifier: MIT
// A small, strict JSON reader (RFC 8259) for option arguments: no comments,
// no trailing commas, no single quotes, no NaN, no duplicate object keys, a
// nesting limit. Written here because options are tiny and almanac takes no
// dependency beyond SQLite and the date library.
#pragma once

#include <memory>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace almanac {

class JsonValue {
  public:
    enum class Type { Null, Boolean, Number, String, Array, Object };

    Type type() const { return type_; }
    bool boolean() const { return boolean_; }
    double number() const { return number_; }
    const std::string& string() const { return string_; }
    const std::vector<JsonValue>& array() const { return array_; }
    // Members in the order written (keys are unique).
    const std::vector<std::pair<std::string, JsonValue>>& object() const { return object_; }

    // The value as a message shows it: strings quoted, containers summarised.
    std::string describe() const;

    static JsonValue null() { return JsonValue(Type::Null); }
    static JsonValue from_boolean(bool value);
    static JsonValue from_number(double value);
    static JsonValue from_string(std::string value);
    static JsonValue from_array(std::vector<JsonValue> items);
    static JsonValue from_object(std::vector<std::pair<std::string, JsonValue>> members);

  private:
    explicit JsonValue(Type type) : type_(type) {}
    Type type_;
    bool boolean_ = false;
    double number_ = 0;
    std::string string_;
    std::vector<JsonValue> array_;
    std::vector<std::pair<std::string, JsonValue>> object_;
};

// Name of a JSON type for messages: "a string", "a number", ...
const char* describe_json_type(JsonValue::Type type);

// Throws almanac::Error "invalid JSON at byte N: expected ..." (N counts from 1).
JsonValue parse_json(std::string_view text);

}  // namespace almanac
