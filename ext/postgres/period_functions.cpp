// SPDX-License-Identifier: MIT
// Calendar period functions, for PostgreSQL. The same contract as the SQLite
// module's (ext/sqlite/period_functions.cpp), over PostgreSQL's types:
//
//  1. period_floor(t, spec [, zone]), period_end(t, spec [, zone]),
//     period_shift(t, n, spec [, zone]): t and the result are both
//     timestamptz, timestamp, date or text (arguments.h says what each means).
//     A date result is the local calendar day a period starts on; specs whose
//     periods do not start at a midnight (sub-day units, a `from` with a time
//     of day) take no date: 22023, give a timestamp or timestamptz.
//  2. period_label(t, spec [, zone]) text; period_serial(t, spec [, zone]) bigint.
//  3. period_of_serial(serial bigint, spec [, zone]) text.
//  4. period_position(t, spec, cycle [, zone]) integer.
//  5. valid_time(t) boolean, never raises; almanac_version(), almanac_tz_version() text.
//  spec and cycle are period_spec, zone is zone_name (text types of this
//  extension, read when a function uses them, so a bad literal fails with
//  the SQLite module's message). Every function is STRICT: NULL in, NULL out.
//  Errors: 22007 a text that is not a time value, 22008 a time or result
//  outside years 0000-9999, 22023 a bad spec, zone, n or serial.
#include <cstdint>
#include <string>

#include "almanac_version.h"
#include "arguments.h"
#include "boundary.h"
#include "calendar_cache.h"
#include "core/text/error.h"
#include "core/time/zone_database.h"
#include "period_results.h"

namespace almanac::postgres {
namespace {

enum class Question { Floor, End, Label, Serial };

const char* question_name(Question question) {
    switch (question) {
        case Question::Floor:
            return "period_floor";
        case Question::End:
            return "period_end";
        case Question::Label:
            return "period_label";
        case Question::Serial:
            return "period_serial";
    }
    return "period_floor";
}

// Core errors that name no argument get the function's name, as in SQLite.
template <typename Body>
void with_function_name(const char* function, Body&& body) {
    try {
        body();
    } catch (const Error& error) {
        std::string what = error.what();
        raise_function_error(function, what,
                             time_error_state(what) == ERRCODE_DATETIME_VALUE_OUT_OF_RANGE
                                 ? ERRCODE_DATETIME_VALUE_OUT_OF_RANGE
                                 : ERRCODE_INVALID_PARAMETER_VALUE);
    }
}

// The zone argument's bytes, or nothing for the form without one.
std::string_view zone_argument(FunctionCallInfo fcinfo, int index) {
    return PG_NARGS() > index ? text_argument(fcinfo, index) : std::string_view();
}

template <TimeKind Kind>
Datum period_question(FunctionCallInfo fcinfo, Question question) {
    // C part: arguments.
    const char* name = question_name(question);
    TimeArgument t = time_argument(fcinfo, 0, Kind);
    std::string_view spec = text_argument(fcinfo, 1);
    bool zoned = PG_NARGS() > 2;
    std::string_view zone = zone_argument(fcinfo, 2);
    CalendarCache* cache = calendar_cache(fcinfo);
    if (!cache) report_failure();
    PeriodResult result{};
    // C++ part.
    bool ok = guarded([&] {
        Argument t_arg{name, 1, "t"}, spec_arg{name, 2, "spec"}, zone_arg{name, 3, "zone"};
        with_function_name(name, [&] {
            TimeValue time = read_time(t_arg, t);
            const PeriodCalendar& calendar =
                cache->calendar(spec_arg, spec, zoned ? &zone_arg : nullptr, zone);
            Instant instant = calendar.place_on_time_line(time);
            switch (question) {
                case Question::Floor:
                    result = boundary_result(t_arg, t, time, calendar.floor(instant), calendar);
                    return;
                case Question::End:
                    result =
                        boundary_result(t_arg, t, time, calendar.period_of(instant).end, calendar);
                    return;
                case Question::Label:
                    result_text() = calendar.label(calendar.period_of(instant));
                    result.is_text = true;
                    return;
                case Question::Serial:
                    result.datum = Int64GetDatum(calendar.period_of(instant).serial);
                    return;
            }
        });
    });
    // C part: the result.
    if (!ok) report_failure();
    return result_datum(result);
}

template <TimeKind Kind>
Datum period_shift(FunctionCallInfo fcinfo) {
    const char* name = "period_shift";
    TimeArgument t = time_argument(fcinfo, 0, Kind);
    int64 n = PG_GETARG_INT64(1);
    std::string_view spec = text_argument(fcinfo, 2);
    bool zoned = PG_NARGS() > 3;
    std::string_view zone = zone_argument(fcinfo, 3);
    CalendarCache* cache = calendar_cache(fcinfo);
    if (!cache) report_failure();
    PeriodResult result{};
    bool ok = guarded([&] {
        Argument t_arg{name, 1, "t"}, n_arg{name, 2, "n"}, spec_arg{name, 3, "spec"},
            zone_arg{name, 4, "zone"};
        with_function_name(name, [&] {
            TimeValue time = read_time(t_arg, t);
            constexpr std::int64_t kFarthest = 100000000;
            if (n < -kFarthest || n > kFarthest)
                raise_argument_error(n_arg, std::to_string(n),
                                     "expected a whole number from -100000000 to 100000000",
                                     ERRCODE_INVALID_PARAMETER_VALUE);
            const PeriodCalendar& calendar =
                cache->calendar(spec_arg, spec, zoned ? &zone_arg : nullptr, zone);
            result = shifted_result(t_arg, t, time, n, calendar);
        });
    });
    if (!ok) report_failure();
    return result_datum(result);
}

Datum period_of_serial(FunctionCallInfo fcinfo) {
    const char* name = "period_of_serial";
    int64 serial = PG_GETARG_INT64(0);
    std::string_view spec = text_argument(fcinfo, 1);
    bool zoned = PG_NARGS() > 2;
    std::string_view zone = zone_argument(fcinfo, 2);
    CalendarCache* cache = calendar_cache(fcinfo);
    if (!cache) report_failure();
    bool ok = guarded([&] {
        Argument serial_arg{name, 1, "serial"}, spec_arg{name, 2, "spec"},
            zone_arg{name, 3, "zone"};
        with_function_name(name, [&] {
            const PeriodCalendar& calendar =
                cache->calendar(spec_arg, spec, zoned ? &zone_arg : nullptr, zone);
            auto [lowest, highest] = calendar.supported_serials();
            if (serial < lowest || serial > highest)
                raise_argument_error(serial_arg, std::to_string(serial),
                                     "expected a whole number from " + std::to_string(lowest) +
                                         " to " + std::to_string(highest),
                                     ERRCODE_INVALID_PARAMETER_VALUE);
            result_text() = calendar.format_boundary(calendar.period_by_serial(serial).start);
        });
    });
    if (!ok) report_failure();
    PG_RETURN_TEXT_P(cstring_to_text_with_len(result_text().data(), int(result_text().size())));
}

template <TimeKind Kind>
Datum period_position(FunctionCallInfo fcinfo) {
    const char* name = "period_position";
    TimeArgument t = time_argument(fcinfo, 0, Kind);
    std::string_view spec = text_argument(fcinfo, 1);
    std::string_view cycle = text_argument(fcinfo, 2);
    bool zoned = PG_NARGS() > 3;
    std::string_view zone = zone_argument(fcinfo, 3);
    CalendarCache* cache = calendar_cache(fcinfo);
    if (!cache) report_failure();
    std::int64_t position = 0;
    bool ok = guarded([&] {
        Argument t_arg{name, 1, "t"}, spec_arg{name, 2, "spec"}, cycle_arg{name, 3, "cycle"},
            zone_arg{name, 4, "zone"};
        TimeValue time = read_time(t_arg, t);
        const PeriodPosition& positions =
            cache->position(spec_arg, spec, cycle_arg, cycle, zoned ? &zone_arg : nullptr, zone);
        try {
            position = positions.position(positions.cycle_calendar().place_on_time_line(time));
        } catch (const Error& error) {
            std::string what = error.what();
            raise_argument_error(t_arg, shown_time(t), what, time_error_state(what));
        }
    });
    if (!ok) report_failure();
    PG_RETURN_INT32(static_cast<int32>(position));
}

template <TimeKind Kind>
Datum valid_time(FunctionCallInfo fcinfo) {
    TimeArgument t = time_argument(fcinfo, 0, Kind);
    bool valid = false;
    if (!guarded([&] { valid = is_valid_time(t); })) report_failure();
    PG_RETURN_BOOL(valid);
}

}  // namespace
}  // namespace almanac::postgres

using almanac::postgres::TimeKind;
namespace pg = almanac::postgres;

// One C symbol per SQL signature: the argument's type picks the template.
#define ALMANAC_PERIOD_FUNCTIONS(suffix, kind)                                                    \
    ALMANAC_PG_FUNCTION(almanac_period_floor_##suffix) {                                          \
        return pg::period_question<kind>(fcinfo, pg::Question::Floor);                            \
    }                                                                                             \
    ALMANAC_PG_FUNCTION(almanac_period_end_##suffix) {                                            \
        return pg::period_question<kind>(fcinfo, pg::Question::End);                              \
    }                                                                                             \
    ALMANAC_PG_FUNCTION(almanac_period_label_##suffix) {                                          \
        return pg::period_question<kind>(fcinfo, pg::Question::Label);                            \
    }                                                                                             \
    ALMANAC_PG_FUNCTION(almanac_period_serial_##suffix) {                                         \
        return pg::period_question<kind>(fcinfo, pg::Question::Serial);                           \
    }                                                                                             \
    ALMANAC_PG_FUNCTION(almanac_period_shift_##suffix) { return pg::period_shift<kind>(fcinfo); } \
    ALMANAC_PG_FUNCTION(almanac_period_position_##suffix) {                                       \
        return pg::period_position<kind>(fcinfo);                                                 \
    }                                                                                             \
    ALMANAC_PG_FUNCTION(almanac_valid_time_##suffix) { return pg::valid_time<kind>(fcinfo); }

ALMANAC_PERIOD_FUNCTIONS(timestamptz, TimeKind::Timestamptz)
ALMANAC_PERIOD_FUNCTIONS(timestamp, TimeKind::Timestamp)
ALMANAC_PERIOD_FUNCTIONS(date, TimeKind::Date)
ALMANAC_PERIOD_FUNCTIONS(text, TimeKind::Text)

ALMANAC_PG_FUNCTION(almanac_period_of_serial) { return pg::period_of_serial(fcinfo); }

ALMANAC_PG_FUNCTION(almanac_version) { PG_RETURN_TEXT_P(cstring_to_text(ALMANAC_VERSION)); }

ALMANAC_PG_FUNCTION(almanac_tz_version) {
    (void)fcinfo;
    if (!pg::guarded([] { pg::result_text() = almanac::zone_data_description(); }))
        pg::report_failure();
    PG_RETURN_TEXT_P(
        cstring_to_text_with_len(pg::result_text().data(), int(pg::result_text().size())));
}
