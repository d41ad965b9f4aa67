// SPDX-License-Identifier: MIT
#include "arguments.h"

#include <cmath>

#include "core/text/character_position.h"
#include "core/text/error.h"
#include "core/text/error_message.h"
#include "core/text/number_text.h"

namespace almanac::sqlite {

std::string describe_value(sqlite3_value* value) {
    switch (sqlite3_value_type(value)) {
        case SQLITE_NULL:
            return "NULL";
        case SQLITE_INTEGER:
            return std::to_string(sqlite3_value_int64(value));
        case SQLITE_FLOAT: {
            // As a user would have typed it: 0.9, not 0.90000000000000002.
            return readable_double(sqlite3_value_double(value));
        }
        case SQLITE_BLOB: {
            int bytes = sqlite3_value_bytes(value);
            return "a BLOB of " + std::to_string(bytes) + (bytes == 1 ? " byte" : " bytes");
        }
        default: {
            const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
            // All of the value's bytes: a NUL inside it is part of what was refused.
            return quoted_for_message(
                std::string_view(text ? text : "", text ? sqlite3_value_bytes(value) : 0));
        }
    }
}

void raise_argument_error(const ArgumentRef& arg, sqlite3_value* value,
                          const std::string& what_was_expected) {
    throw SqlError(argument_error_message(arg.function, arg.position, arg.name,
                                          describe_value(value), what_was_expected));
}

void raise_function_error(const char* function, const std::string& message) {
    throw SqlError(std::string(function) + "(): " + message);
}

std::optional<double> read_number(const ArgumentRef& arg, sqlite3_value* value) {
    double number;
    switch (sqlite3_value_type(value)) {
        case SQLITE_NULL:
            return std::nullopt;
        case SQLITE_INTEGER:
            return static_cast<double>(sqlite3_value_int64(value));
        case SQLITE_FLOAT:
            number = sqlite3_value_double(value);
            break;
        case SQLITE_TEXT: {
            const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
            // Every byte counts: '1' NUL '2' is not the number 1.
            auto parsed = numeric_text(text ? std::string_view(text, sqlite3_value_bytes(value))
                                            : std::string_view());
            if (!parsed) raise_argument_error(arg, value, "expected a number");
            number = *parsed;
            break;
        }
        default:
            raise_argument_error(arg, value, "expected a number, not a BLOB");
    }
    if (!std::isfinite(number)) raise_argument_error(arg, value, "expected a finite number");
    return number;
}

std::optional<std::int64_t> read_integer(const ArgumentRef& arg, sqlite3_value* value,
                                         std::int64_t minimum, std::int64_t maximum) {
    auto number = read_number(arg, value);
    if (!number) return std::nullopt;
    std::string range = "expected a whole number from " + std::to_string(minimum) + " to " +
                        std::to_string(maximum);
    if (std::floor(*number) != *number || *number < double(minimum) || *number > double(maximum))
        raise_argument_error(arg, value, range);
    if (sqlite3_value_type(value) == SQLITE_INTEGER) return sqlite3_value_int64(value);
    return static_cast<std::int64_t>(*number);
}

std::optional<std::string> read_text(const ArgumentRef& arg, sqlite3_value* value) {
    switch (sqlite3_value_type(value)) {
        case SQLITE_NULL:
            return std::nullopt;
        case SQLITE_TEXT: {
            const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
            return std::string(text ? text : "", sqlite3_value_bytes(value));
        }
        case SQLITE_BLOB:
            raise_argument_error(arg, value, "expected TEXT, not a BLOB");
        default:
            raise_argument_error(arg, value, "expected TEXT, not a number");
    }
}

TimeValue time_value_of(sqlite3_value* value) {
    switch (sqlite3_value_type(value)) {
        case SQLITE_INTEGER:
            return parse_time_integer(sqlite3_value_int64(value));
        case SQLITE_FLOAT:
            return parse_time_real(sqlite3_value_double(value));
        case SQLITE_TEXT: {
            const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
            return parse_time_text(std::string_view(text ? text : "", sqlite3_value_bytes(value)));
        }
        default:
            throw Error("expected a time value, not a BLOB");
    }
}

std::optional<TimeValue> read_time(const ArgumentRef& arg, sqlite3_value* value) {
    if (sqlite3_value_type(value) == SQLITE_NULL) return std::nullopt;
    try {
        return time_value_of(value);
    } catch (const Error& error) {
        raise_argument_error(arg, value, error.what());
    }
}

bool is_valid_time(sqlite3_value* value) {
    try {
        time_value_of(value);
        return true;
    } catch (const Error&) {
        return false;
    }
}

}  // namespace almanac::sqlite
