// SPDX-License-Identifier: MIT
#include "period_results.h"

#include "core/text/error.h"
#include "core/text/number_text.h"

namespace almanac::postgres {
namespace {

void check_range(Instant t) {
    if (!in_supported_range(t)) throw Error("the result falls outside years 0000 through 9999");
}

// A number read from text comes back as the number's text, in its representation.
void write_number(const TimeValue& like, Instant t) {
    if (like.representation == Representation::JulianDay) {
        result_text() = shortest_double(to_julian_day(t));
    } else if (like.integer_input) {
        result_text() = std::to_string(to_unix_seconds_integer(t));
    } else {
        result_text() = shortest_double(to_unix_seconds_real(t));
    }
}

PeriodResult text_result() { return PeriodResult{Datum(0), true}; }

PeriodResult date_result(date::local_days day) {
    return PeriodResult{DateADTGetDatum(date_of_day(day)), false};
}

}  // namespace

PeriodResult boundary_result(const Argument& t_arg, const TimeArgument& t, const TimeValue& time,
                             Instant boundary, const PeriodCalendar& calendar) {
    check_range(boundary);
    switch (t.kind) {
        case TimeKind::Text:
            if (time.representation == Representation::Text) {
                char text[PeriodCalendar::kBoundaryTextSize];
                char* end = calendar.write_boundary(boundary, text);
                result_text().assign(text, end);
            } else {
                write_number(time, boundary);
            }
            return text_result();
        case TimeKind::Date:
            if (!calendar.writes_dates())
                raise_argument_error(t_arg, shown_time(t),
                                     "a date takes only periods that start at midnight; give a "
                                     "timestamp or timestamptz for these periods",
                                     ERRCODE_INVALID_PARAMETER_VALUE);
            return date_result(date::floor<date::days>(calendar.clock().to_local(boundary)));
        default:
            return PeriodResult{TimestampGetDatum(timestamp_of_instant(boundary)), false};
    }
}

PeriodResult shifted_result(const Argument& t_arg, const TimeArgument& t, const TimeValue& time,
                            std::int64_t n, const PeriodCalendar& calendar) {
    if (time.is_calendar_day()) {
        if (calendar.spec().is_sub_day())
            raise_argument_error(t_arg, shown_time(t),
                                 t.kind == TimeKind::Date
                                     ? "a date cannot move by sub-day periods; give a timestamp"
                                     : "a bare date cannot move by sub-day periods; give a "
                                       "date-time such as 'YYYY-MM-DD 00:00'",
                                 ERRCODE_INVALID_PARAMETER_VALUE);
        date::local_days day = calendar.shift_day(time.day(), n);
        if (t.kind == TimeKind::Date) return date_result(day);
        result_text() = format_date(day);
        return text_result();
    }
    Instant moved = calendar.shift(time.instant(), n);
    check_range(moved);
    switch (t.kind) {
        case TimeKind::Text:
            if (time.representation == Representation::Text)
                result_text() = calendar.format_like(time.form, moved);
            else
                write_number(time, moved);
            return text_result();
        default:
            return PeriodResult{TimestampGetDatum(timestamp_of_instant(moved) + sub_millisecond(t)),
                                false};
    }
}

}  // namespace almanac::postgres
