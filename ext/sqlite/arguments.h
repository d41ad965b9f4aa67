// SPDX-License-Identifier: MIT
// Reading SQL arguments into core types, and the one shape every error
// message takes:  fn(): argument N (name) = <value>: <what was expected>
// Readers return std::nullopt for SQL NULL, so each function decides what
// NULL means for it (usually: the result is NULL, or the row is skipped).
#pragma once

#include <cstdint>
#include <optional>
#include <stdexcept>
#include <string>

#include "core/text/number_text.h"
#include "core/time/time_value.h"
#include "sqlite_api.h"

namespace almanac::sqlite {

// Thrown inside a callback; the guard turns it into sqlite3_result_error.
class SqlError : public std::runtime_error {
  public:
    explicit SqlError(const std::string& message) : std::runtime_error(message) {}
};

// Names one argument of one SQL function, for messages.
struct ArgumentRef {
    const char* function;  // SQL name, e.g. "period_floor"
    int position;          // 1-based
    const char* name;      // e.g. "t", "spec", "zone"
};

// A value as a message shows it: 'text' (quoted, shortened), 12.5, NULL, a BLOB of 3 bytes.
std::string describe_value(sqlite3_value* value);

[[noreturn]] void raise_argument_error(const ArgumentRef& arg, sqlite3_value* value,
                                       const std::string& what_was_expected);
[[noreturn]] void raise_function_error(const char* function, const std::string& message);

// A finite number: INTEGER, REAL, or TEXT that SQLite itself reads as a
// number. Other TEXT, BLOBs and infinities are errors.
std::optional<double> read_number(const ArgumentRef& arg, sqlite3_value* value);
// A whole number in [minimum, maximum].
std::optional<std::int64_t> read_integer(const ArgumentRef& arg, sqlite3_value* value,
                                         std::int64_t minimum, std::int64_t maximum);
// Any TEXT (numbers are not accepted where words are expected).
std::optional<std::string> read_text(const ArgumentRef& arg, sqlite3_value* value);
// A time value (see core/time_value.h).
std::optional<TimeValue> read_time(const ArgumentRef& arg, sqlite3_value* value);
// The same rules for a value that is not an argument (a column a table
// function reads): throws almanac::Error saying what was expected; not NULL.
TimeValue time_value_of(sqlite3_value* value);
// Same rules, never raises: valid_time(). The caller handles NULL.
bool is_valid_time(sqlite3_value* value);

// A REAL result, or NULL when there is none (too few rows, no slope, ...).
inline void result_optional_double(sqlite3_context* context, const std::optional<double>& value) {
    if (value) {
        sqlite3_result_double(context, *value);
    } else {
        sqlite3_result_null(context);
    }
}

// Runs a callback body, turning exceptions into SQL errors: a C++ exception
// must never unwind through SQLite's C frames.
template <typename Body>
void guarded(sqlite3_context* context, Body&& body) noexcept {
    try {
        body();
    } catch (const std::bad_alloc&) {
        sqlite3_result_error_nomem(context);
    } catch (const std::exception& error) {
        sqlite3_result_error(context, error.what(), -1);
    } catch (...) {
        sqlite3_result_error(context, "almanac: unexpected internal error", -1);
    }
}

}  // namespace almanac::sqlite
