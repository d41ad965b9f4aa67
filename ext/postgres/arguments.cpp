// SPDX-License-Identifier: MIT
#include "arguments.h"

#include <cmath>

#include "core/exact/floor_division.h"
#include "core/text/error.h"
#include "core/text/error_message.h"
#include "core/text/number_text.h"

namespace almanac::postgres {
namespace {

// PostgreSQL counts from 2000-01-01 00:00 UTC, the core from 1970-01-01.
constexpr std::int64_t kEpochDays = 10957;
constexpr std::int64_t kEpochMicros = kEpochDays * 86400 * std::int64_t(1000000);

const char* const kYears = "expected a time in years 0000 through 9999";

std::string shown_timestamp(Timestamp t, TimeKind kind) {
    if (TIMESTAMP_IS_NOBEGIN(t)) return "'-infinity'";
    if (TIMESTAMP_IS_NOEND(t)) return "'infinity'";
    Instant instant = instant_of_timestamp(t);
    LocalTime reading{instant.time_since_epoch()};
    if (!in_supported_range(reading))
        return instant < earliest_supported_instant() ? "a time before year 0000"
                                                      : "a time after year 9999";
    return shown_text(format_date_time(reading, TextForm::Precision::Seconds, false) +
                      (kind == TimeKind::Timestamptz ? "+00" : ""));
}

std::string shown_date(DateADT d) {
    if (DATE_IS_NOBEGIN(d)) return "'-infinity'";
    if (DATE_IS_NOEND(d)) return "'infinity'";
    date::local_days day = day_of_date(d);
    LocalTime reading{day.time_since_epoch()};
    if (!in_supported_range(reading))
        return reading < LocalTime{earliest_supported_instant().time_since_epoch()}
                   ? "a date before year 0000"
                   : "a date after year 9999";
    return shown_text(format_date(day));
}

}  // namespace

void raise_argument_error(const Argument& arg, const std::string& shown_value,
                          const std::string& what_was_expected, int sqlstate) {
    throw PgError(sqlstate, argument_error_message(arg.function, arg.position, arg.name,
                                                   shown_value, what_was_expected));
}

void raise_function_error(const char* function, const std::string& message, int sqlstate) {
    throw PgError(sqlstate, std::string(function) + "(): " + message);
}

std::string shown_text(std::string_view text) { return quoted_for_message(text); }

std::string shown_number(double value) { return readable_double(value); }

double finite_number(const Argument& arg, double value) {
    if (!std::isfinite(value))
        raise_argument_error(arg, shown_number(value), "expected a finite number",
                             ERRCODE_INVALID_PARAMETER_VALUE);
    return value;
}

TimeArgument time_argument(FunctionCallInfo fcinfo, int index, TimeKind kind) {
    TimeArgument value{kind, PG_GETARG_DATUM(index), {}};
    if (kind == TimeKind::Text) value.text = text_argument(fcinfo, index);
    return value;
}

int time_error_state(const std::string& message) {
    return message.find("0000 through 9999") != std::string::npos
               ? ERRCODE_DATETIME_VALUE_OUT_OF_RANGE
               : ERRCODE_INVALID_DATETIME_FORMAT;
}

std::string shown_time(const TimeArgument& value) {
    switch (value.kind) {
        case TimeKind::Text:
            return shown_text(value.text);
        case TimeKind::Date:
            return shown_date(DatumGetDateADT(value.datum));
        default:
            return shown_timestamp(DatumGetTimestamp(value.datum), value.kind);
    }
}

TimeValue read_time(const Argument& arg, const TimeArgument& value) {
    TimeValue time;
    switch (value.kind) {
        case TimeKind::Text:
            try {
                return parse_time_text(value.text);
            } catch (const Error& error) {
                raise_argument_error(arg, shown_text(value.text), error.what(),
                                     time_error_state(error.what()));
            }
        case TimeKind::Timestamptz:
        case TimeKind::Timestamp: {
            Timestamp t = DatumGetTimestamp(value.datum);
            if (TIMESTAMP_NOT_FINITE(t) || !in_supported_range(instant_of_timestamp(t)))
                raise_argument_error(arg, shown_timestamp(t, value.kind), kYears,
                                     ERRCODE_DATETIME_VALUE_OUT_OF_RANGE);
            time.when = instant_of_timestamp(t);
            // Written back as a date-time with seconds, like SQLite's text without an offset.
            time.form.precision = TextForm::Precision::Seconds;
            return time;
        }
        case TimeKind::Date: {
            DateADT d = DatumGetDateADT(value.datum);
            if (DATE_NOT_FINITE(d) ||
                !in_supported_range(LocalTime{day_of_date(d).time_since_epoch()}))
                raise_argument_error(arg, shown_date(d), kYears,
                                     ERRCODE_DATETIME_VALUE_OUT_OF_RANGE);
            time.when = day_of_date(d);
            return time;
        }
    }
    throw PgError(ERRCODE_INTERNAL_ERROR, "almanac: unknown time kind");
}

bool is_valid_time(const TimeArgument& value) {
    try {
        read_time({"valid_time", 1, "t"}, value);
        return true;
    } catch (const PgError&) {
        return false;
    }
}

std::int64_t sub_millisecond(const TimeArgument& value) {
    if (value.kind != TimeKind::Timestamptz && value.kind != TimeKind::Timestamp) return 0;
    Timestamp t = DatumGetTimestamp(value.datum);
    return t - floor_div_by<1000>(t) * 1000;
}

Instant instant_of_timestamp(Timestamp t) {
    return Instant{Millis{floor_div_by<1000>(t) + kEpochMicros / 1000}};
}

Timestamp timestamp_of_instant(Instant t) {
    return t.time_since_epoch().count() * 1000 - kEpochMicros;
}

date::local_days day_of_date(DateADT d) {
    return date::local_days{date::days{static_cast<std::int64_t>(d) + kEpochDays}};
}

DateADT date_of_day(date::local_days day) {
    return static_cast<DateADT>(day.time_since_epoch().count() - kEpochDays);
}

}  // namespace almanac::postgres
