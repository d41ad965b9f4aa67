// SPDX-License-Identifier: MIT
// Reading PostgreSQL arguments into the core's types, and the errors that
// name them. Messages have the SQLite module's shape and text,
//     fn(): argument N (name) = <value>: <what was expected>
// (core/text/error_message.h), each with a SQLSTATE that fits it.
//
// A time argument arrives as one of four PostgreSQL types. Each keeps its
// meaning from the SQLite module's time values:
//   timestamptz  an instant;
//   timestamp    a reading of the UTC clock, as SQLite's text without an offset;
//   date         a calendar day (in the zone when one is given), as a bare YYYY-MM-DD;
//   text         any time value SQLite's functions read.
// Results come back in the argument's own type. The core keeps milliseconds,
// so a timestamp's microseconds are taken to the millisecond below (a time
// stays in the period that holds it); period_shift adds them back.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

#include "boundary.h"
#include "core/time/time_value.h"

namespace almanac::postgres {

struct Argument {
    const char* function;  // SQL name, e.g. "period_floor"
    int position;          // 1-based
    const char* name;      // e.g. "t", "spec", "zone"
};

[[noreturn]] void raise_argument_error(const Argument& arg, const std::string& shown_value,
                                       const std::string& what_was_expected, int sqlstate);
// "fn(): message" for errors that belong to no one argument.
[[noreturn]] void raise_function_error(const char* function, const std::string& message,
                                       int sqlstate = ERRCODE_INVALID_PARAMETER_VALUE);

// How values are shown in messages, as the SQLite module shows them.
std::string shown_text(std::string_view text);
std::string shown_number(double value);

// A text argument's bytes. C part only: detoasting allocates and may raise.
inline std::string_view text_argument(FunctionCallInfo fcinfo, int index) {
    text* value = PG_GETARG_TEXT_PP(index);
    return std::string_view(VARDATA_ANY(value), VARSIZE_ANY_EXHDR(value));
}

// A finite float8 argument (NaN and infinities are refused as in SQLite).
double finite_number(const Argument& arg, double value);

enum class TimeKind { Timestamptz, Timestamp, Date, Text };

// A time argument as the C part read it: the datum, or a text argument's bytes.
struct TimeArgument {
    TimeKind kind;
    Datum datum;
    std::string_view text;  // TimeKind::Text
};
TimeArgument time_argument(FunctionCallInfo fcinfo, int index, TimeKind kind);

// The argument as messages show it (text quoted, timestamps in ISO form).
std::string shown_time(const TimeArgument& value);

// The time value it holds; errors name the argument (22007 for text that is
// not a time value, 22008 for a time outside years 0000 through 9999).
TimeValue read_time(const Argument& arg, const TimeArgument& value);
// The same, never raising (valid_time): false where read_time would raise.
bool is_valid_time(const TimeArgument& value);
// The microseconds below the millisecond that read_time dropped (0 for date and text).
std::int64_t sub_millisecond(const TimeArgument& value);

// Instants and days as PostgreSQL keeps them.
Instant instant_of_timestamp(Timestamp t);  // t finite
Timestamp timestamp_of_instant(Instant t);  // plus extra microseconds, if any
date::local_days day_of_date(DateADT d);    // d finite
DateADT date_of_day(date::local_days day);

// SQLSTATE of a time value's error message from the core.
int time_error_state(const std::string& message);

}  // namespace almanac::postgres
