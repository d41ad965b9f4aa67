// SPDX-License-Identifier: MIT
// Time values as almanac reads them: the TEXT forms SQLite's date functions
// accept, and numbers by SQLite's `auto` rule (a Julian day when
// 0 <= v < 5373484.5, Unix seconds otherwise). Three different meanings get
// three different types, in the spirit of the date library:
//   Instant    a point on the UTC time line, in milliseconds;
//   LocalTime  a reading of some wall clock (a zone's or UTC's);
//   date::local_days  a calendar day, not yet placed in any zone.
// A parsed value also remembers how it was written, so results can be given
// back in the caller's own representation.
#pragma once

#include <date/date.h>

#include <chrono>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <variant>

#include "core/text/number_text.h"
#include "core/time/civil_days.h"

namespace almanac {

using Millis = std::chrono::duration<std::int64_t, std::milli>;
using Instant = date::sys_time<Millis>;
using LocalTime = date::local_time<Millis>;

// How a value was written, which decides how a result is written back.
enum class Representation {
    Text,         // TEXT in, TEXT out
    UnixSeconds,  // number read as Unix seconds
    JulianDay,    // number read as a Julian day number; results are REAL
};

// The shape of a TEXT time value, kept so period_shift can answer in it.
struct TextForm {
    enum class Precision { Date, Minutes, Seconds, Fraction };
    enum class Suffix { None, Z, Offset };
    Precision precision = Precision::Date;
    bool t_separator = false;
    Suffix suffix = Suffix::None;
    std::chrono::seconds offset{0};  // when suffix == Offset
};

struct TimeValue {
    // A bare YYYY-MM-DD is a calendar day: it is placed in a zone only when
    // the caller has one. Every other value is an instant.
    std::variant<date::local_days, Instant> when;
    Representation representation = Representation::Text;
    bool integer_input = false;  // an INTEGER Unix time gives INTEGER results
    TextForm form;

    bool is_calendar_day() const { return std::holds_alternative<date::local_days>(when); }
    // The calendar day; only when is_calendar_day().
    date::local_days day() const { return std::get<date::local_days>(when); }
    // The instant; only when !is_calendar_day().
    Instant instant() const { return std::get<Instant>(when); }
    // The instant, a calendar day taken at its UTC midnight: how a bare date
    // reads where no zone is given (README "Time values").
    Instant utc_instant() const;
};

// Parsers throw almanac::Error saying what was expected. They accept exactly
// what valid_time() accepts.
TimeValue parse_time_text(std::string_view text);
// The general reader behind parse_time_text, without its fixed-place
// shortcut for the common forms; the test of the shortcut compares the two.
TimeValue parse_time_text_in_full(std::string_view text);
TimeValue parse_time_real(double value);
TimeValue parse_time_integer(std::int64_t value);

// The instant a wall-clock reading names when the clock was `offset` ahead
// of UTC: the one local-minus-offset step of every reader.
inline Instant instant_at_offset(LocalTime reading, std::chrono::seconds offset) {
    return Instant{reading.time_since_epoch()} - offset;
}

// Limits of the supported calendar, years 0000 through 9999.
Instant earliest_supported_instant();
Instant latest_supported_instant();  // exclusive
bool in_supported_range(Instant t);
bool in_supported_range(LocalTime t);

// Conversions between the numeric representations and instants.
double to_julian_day(Instant t);
double to_unix_seconds_real(Instant t);
std::int64_t to_unix_seconds_integer(Instant t);  // floor to the second

// Text writers. A local reading with an offset gets it appended as ±HH:MM.
std::string format_date(date::local_days day);
// Writes YYYY-MM-DD (10 bytes) at out and returns the end; no allocation,
// and inline: period keys write one per row.
inline char* write_date(char* out, date::local_days day) {
    CivilDate civil =
        civil_from_day_number(static_cast<std::int32_t>(day.time_since_epoch().count()));
    out = write_padded(out, static_cast<unsigned>(civil.year), 4);
    *out++ = '-';
    out = write_padded(out, civil.month, 2);
    *out++ = '-';
    return write_padded(out, civil.day, 2);
}
std::string format_date_time(LocalTime t, TextForm::Precision precision, bool t_separator);
std::string format_offset(std::chrono::seconds offset);

}  // namespace almanac
