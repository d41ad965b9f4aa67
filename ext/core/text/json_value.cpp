// SPDX-License-Identifier: MIT
#include "core/text/json_value.h"

#include <cmath>
#include <cstdint>

#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/text/utf8.h"

namespace almanac {

JsonValue JsonValue::from_boolean(bool value) {
    JsonValue v(Type::Boolean);
    v.boolean_ = value;
    return v;
}
JsonValue JsonValue::from_number(double value) {
    JsonValue v(Type::Number);
    v.number_ = value;
    return v;
}
JsonValue JsonValue::from_string(std::string value) {
    JsonValue v(Type::String);
    v.string_ = std::move(value);
    return v;
}
JsonValue JsonValue::from_array(std::vector<JsonValue> items) {
    JsonValue v(Type::Array);
    v.array_ = std::move(items);
    return v;
}
JsonValue JsonValue::from_object(std::vector<std::pair<std::string, JsonValue>> members) {
    JsonValue v(Type::Object);
    v.object_ = std::move(members);
    return v;
}

const char* describe_json_type(JsonValue::Type type) {
    switch (type) {
        case JsonValue::Type::Null:
            return "null";
        case JsonValue::Type::Boolean:
            return "a boolean";
        case JsonValue::Type::Number:
            return "a number";
        case JsonValue::Type::String:
            return "a string";
        case JsonValue::Type::Array:
            return "an array";
        case JsonValue::Type::Object:
            return "an object";
    }
    return "a value";
}

std::string JsonValue::describe() const {
    switch (type_) {
        case Type::Null:
            return "null";
        case Type::Boolean:
            return boolean_ ? "true" : "false";
        case Type::Number:
            return readable_double(number_);
        case Type::String: {
            constexpr std::size_t kLongest = 40;
            // Cut at a character boundary: half a UTF-8 sequence would make
            // the whole message invalid text.
            std::string shown = string_.size() > kLongest
                                    ? std::string(utf8_prefix(string_, kLongest)) + "..."
                                    : string_;
            return "\"" + shown + "\"";
        }
        case Type::Array:
            return "an array";
        case Type::Object:
            return "an object";
    }
    return "a value";
}

namespace {

constexpr int kMaxDepth = 32;

class Parser {
  public:
    explicit Parser(std::string_view text) : text_(text) {}

    JsonValue document() {
        skip_space();
        JsonValue value = parse_value(0);
        skip_space();
        if (pos_ != text_.size()) fail("expected the end of the text after the JSON value");
        return value;
    }

  private:
    [[noreturn]] void fail(const std::string& expected) const {
        throw Error("invalid JSON at byte " + std::to_string(pos_ + 1) + ": " + expected);
    }

    bool at_end() const { return pos_ >= text_.size(); }
    char peek() const { return at_end() ? '\0' : text_[pos_]; }

    void skip_space() {
        while (!at_end() && (peek() == ' ' || peek() == '\t' || peek() == '\n' || peek() == '\r'))
            ++pos_;
    }

    void expect_word(std::string_view word) {
        if (text_.substr(pos_, word.size()) != word)
            fail("expected a JSON value (an object, array, string, number, true, false or null)");
        pos_ += word.size();
    }

    JsonValue parse_value(int depth) {
        if (at_end()) fail("expected a JSON value, found the end of the text");
        switch (peek()) {
            case '{':
                return parse_object(depth + 1);
            case '[':
                return parse_array(depth + 1);
            case '"':
                return JsonValue::from_string(parse_string());
            case 't':
                expect_word("true");
                return JsonValue::from_boolean(true);
            case 'f':
                expect_word("false");
                return JsonValue::from_boolean(false);
            case 'n':
                expect_word("null");
                return JsonValue::null();
            default:
                if (peek() == '-' || (peek() >= '0' && peek() <= '9'))
                    return JsonValue::from_number(parse_number());
                fail(
                    "expected a JSON value (an object, array, string, number, true, false or "
                    "null)");
        }
    }

    JsonValue parse_object(int depth) {
        if (depth > kMaxDepth) fail("nesting deeper than " + std::to_string(kMaxDepth) + " levels");
        ++pos_;  // '{'
        std::vector<std::pair<std::string, JsonValue>> members;
        skip_space();
        if (peek() == '}') {
            ++pos_;
            return JsonValue::from_object(std::move(members));
        }
        while (true) {
            skip_space();
            if (peek() != '"') fail("expected a key in double quotes");
            std::size_t key_start = pos_;
            std::string key = parse_string();
            for (const auto& member : members) {
                if (member.first == key) {
                    pos_ = key_start;
                    fail("key \"" + key + "\" appears twice");
                }
            }
            skip_space();
            if (peek() != ':') fail("expected ':' after the key");
            ++pos_;
            skip_space();
            JsonValue value = parse_value(depth);
            members.emplace_back(std::move(key), std::move(value));
            skip_space();
            if (peek() == ',') {
                ++pos_;
                continue;
            }
            if (peek() == '}') {
                ++pos_;
                return JsonValue::from_object(std::move(members));
            }
            fail("expected ',' or '}' in an object");
        }
    }

    JsonValue parse_array(int depth) {
        if (depth > kMaxDepth) fail("nesting deeper than " + std::to_string(kMaxDepth) + " levels");
        ++pos_;  // '['
        std::vector<JsonValue> items;
        skip_space();
        if (peek() == ']') {
            ++pos_;
            return JsonValue::from_array(std::move(items));
        }
        while (true) {
            skip_space();
            items.push_back(parse_value(depth));
            skip_space();
            if (peek() == ',') {
                ++pos_;
                continue;
            }
            if (peek() == ']') {
                ++pos_;
                return JsonValue::from_array(std::move(items));
            }
            fail("expected ',' or ']' in an array");
        }
    }

    unsigned hex4() {
        unsigned value = 0;
        for (int k = 0; k < 4; ++k, ++pos_) {
            char c = peek();
            value <<= 4;
            if (c >= '0' && c <= '9')
                value |= unsigned(c - '0');
            else if (c >= 'a' && c <= 'f')
                value |= unsigned(c - 'a' + 10);
            else if (c >= 'A' && c <= 'F')
                value |= unsigned(c - 'A' + 10);
            else
                fail("expected four hexadecimal digits after \\u");
        }
        return value;
    }

    // Copies one well-formed UTF-8 sequence; JSON text must be Unicode.
    void copy_utf8(std::string& out) {
        std::uint32_t c;
        std::size_t length = utf8_decode(text_, pos_, c);
        if (length == 0) fail("expected UTF-8 text");
        out.append(text_.substr(pos_, length));
        pos_ += length;
    }

    std::string parse_string() {
        ++pos_;  // opening quote
        std::string out;
        while (true) {
            if (at_end()) fail("expected '\"' to close the string");
            char c = peek();
            if (c == '"') {
                ++pos_;
                return out;
            }
            if (static_cast<unsigned char>(c) < 0x20)
                fail("expected control characters in a string to be escaped (\\n, \\t, \\u00XX)");
            if (c != '\\') {
                copy_utf8(out);
                continue;
            }
            ++pos_;
            char e = peek();
            ++pos_;
            switch (e) {
                case '"':
                    out += '"';
                    break;
                case '\\':
                    out += '\\';
                    break;
                case '/':
                    out += '/';
                    break;
                case 'b':
                    out += '\b';
                    break;
                case 'f':
                    out += '\f';
                    break;
                case 'n':
                    out += '\n';
                    break;
                case 'r':
                    out += '\r';
                    break;
                case 't':
                    out += '\t';
                    break;
                case 'u': {
                    std::uint32_t unit = hex4();
                    if (unit >= 0xDC00 && unit <= 0xDFFF)
                        fail("expected a high surrogate before a low one");
                    if (unit >= 0xD800 && unit <= 0xDBFF) {
                        if (text_.substr(pos_, 2) != "\\u")
                            fail("expected a low surrogate (\\uDC00-\\uDFFF) after a high one");
                        pos_ += 2;
                        std::uint32_t low = hex4();
                        if (low < 0xDC00 || low > 0xDFFF)
                            fail("expected a low surrogate (\\uDC00-\\uDFFF) after a high one");
                        unit = 0x10000 + ((unit - 0xD800) << 10) + (low - 0xDC00);
                    }
                    utf8_append(out, unit);
                    break;
                }
                default:
                    --pos_;
                    fail("expected an escape: \\\" \\\\ \\/ \\b \\f \\n \\r \\t or \\uXXXX");
            }
        }
    }

    double parse_number() {
        std::size_t start = pos_;
        auto digits = [&] {
            std::size_t from = pos_;
            while (!at_end() && peek() >= '0' && peek() <= '9') ++pos_;
            return pos_ - from;
        };
        if (peek() == '-') ++pos_;
        if (peek() == '0') {
            ++pos_;
            if (peek() >= '0' && peek() <= '9') fail("expected no leading zeros in a number");
        } else if (digits() == 0) {
            fail("expected a digit");
        }
        if (peek() == '.') {
            ++pos_;
            if (digits() == 0) fail("expected a digit after the decimal point");
        }
        if (peek() == 'e' || peek() == 'E') {
            ++pos_;
            if (peek() == '+' || peek() == '-') ++pos_;
            if (digits() == 0) fail("expected a digit in the exponent");
        }
        auto value = parse_decimal(text_.substr(start, pos_ - start));
        if (!value || !std::isfinite(*value)) {
            pos_ = start;
            fail("expected a number within the range of a double");
        }
        return *value;
    }

    std::string_view text_;
    std::size_t pos_ = 0;
};

}  // namespace

JsonValue parse_json(std::string_view text) { return Parser(text).document(); }

}  // namespace almanac
