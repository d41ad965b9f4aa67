// SPDX-License-Identifier: MIT
// periods(start, stop, spec [, zone]): a set-returning function.
//
//  1. One row per period of `spec` that overlaps [start, stop), in order:
//     period_start, period_end (in the type of start and stop, as
//     period_floor gives them), label text, serial bigint. start and stop
//     are timestamptz, timestamp, date or text.
//  2. Rows are made one per call (value-per-call mode); nothing is
//     materialised, so a LIMIT stops the work.
//  3. stop <= start gives no rows; NULL arguments give none (STRICT). A bad
//     argument is an error naming it; reading past the 10,000,000th period of
//     one call is an error that says how many the range holds.
#include <optional>
#include <string>

#include "arguments.h"
#include "boundary.h"
#include "calendar_cache.h"
#include "core/text/error.h"
#include "core/time/period_cursor.h"
#include "period_results.h"

namespace almanac::postgres {
namespace {

constexpr const char* kName = "periods";
constexpr Argument kStart{kName, 1, "start"}, kStop{kName, 2, "stop"}, kSpec{kName, 3, "spec"},
    kZone{kName, 4, "zone"};

// One call's walk over its range, kept in the call's multi-call context.
struct PeriodWalk {
    CalendarCache cache;
    const PeriodCalendar* calendar = nullptr;
    std::optional<PeriodCursor> range;
    TimeArgument like{};  // start, for the results' type (its bytes are not kept)
    TimeValue like_time;
    // The current row, for the C part.
    PeriodResult start{}, end{};
    std::string start_text, end_text, label;
    std::int64_t serial = 0;
};

// Core errors that name no argument: a time past year 9999 (22008), or the
// limit of periods per call (54000).
template <typename Body>
void with_name(Body&& body) {
    try {
        body();
    } catch (const Error& error) {
        std::string what = error.what();
        raise_function_error(kName, what,
                             time_error_state(what) == ERRCODE_DATETIME_VALUE_OUT_OF_RANGE
                                 ? ERRCODE_DATETIME_VALUE_OUT_OF_RANGE
                                 : ERRCODE_PROGRAM_LIMIT_EXCEEDED);
    }
}

void begin(PeriodWalk& walk, const TimeArgument& start, const TimeArgument& stop,
           std::string_view spec, bool zoned, std::string_view zone) {
    with_name([&] {
        TimeValue first = read_time(kStart, start);
        TimeValue last = read_time(kStop, stop);
        walk.calendar = &walk.cache.calendar(kSpec, spec, zoned ? &kZone : nullptr, zone);
        walk.like = start;
        walk.like.text = {};
        walk.like_time = first;
        walk.range.emplace(*walk.calendar, walk.calendar->place_on_time_line(first),
                           walk.calendar->place_on_time_line(last));
    });
}

// Makes the current period the row; false when the range is done.
bool next_row(PeriodWalk& walk, bool first_row) {
    bool has_row = false;
    with_name([&] {
        if (!first_row && !walk.range->done()) walk.range->advance();
        if (walk.range->done()) return;
        const Period& period = walk.range->current();
        const PeriodCalendar& calendar = *walk.calendar;
        walk.start = boundary_result(kStart, walk.like, walk.like_time, period.start, calendar);
        if (walk.start.is_text) walk.start_text = result_text();
        walk.end = boundary_result(kStart, walk.like, walk.like_time, period.end, calendar);
        if (walk.end.is_text) walk.end_text = result_text();
        walk.label = calendar.label(period);
        walk.serial = period.serial;
        has_row = true;
    });
    return has_row;
}

Datum text_datum(const std::string& text) {
    return PointerGetDatum(cstring_to_text_with_len(text.data(), static_cast<int>(text.size())));
}

template <TimeKind Kind>
Datum periods(FunctionCallInfo fcinfo) {
    bool first_row = false;
    if (SRF_IS_FIRSTCALL()) {
        FuncCallContext* call = SRF_FIRSTCALL_INIT();
        TupleDesc shape;
        if (get_call_result_type(fcinfo, nullptr, &shape) != TYPEFUNC_COMPOSITE)
            ereport(ERROR, (errcode(ERRCODE_FEATURE_NOT_SUPPORTED),
                            errmsg_internal("periods(): called where no row type is known")));
        MemoryContext before = MemoryContextSwitchTo(call->multi_call_memory_ctx);
        call->tuple_desc = BlessTupleDesc(shape);
        MemoryContextSwitchTo(before);
        TimeArgument start = time_argument(fcinfo, 0, Kind);
        TimeArgument stop = time_argument(fcinfo, 1, Kind);
        std::string_view spec = text_argument(fcinfo, 2);
        bool zoned = PG_NARGS() > 3;
        std::string_view zone = zoned ? text_argument(fcinfo, 3) : std::string_view();
        auto* walk = new_in_context<PeriodWalk>(call->multi_call_memory_ctx);
        if (!walk) report_failure();
        if (!guarded([&] { begin(*walk, start, stop, spec, zoned, zone); })) report_failure();
        call->user_fctx = walk;
        first_row = true;
    }
    FuncCallContext* call = SRF_PERCALL_SETUP();
    auto* walk = static_cast<PeriodWalk*>(call->user_fctx);
    bool has_row = false;
    if (!guarded([&] { has_row = next_row(*walk, first_row); })) report_failure();
    if (!has_row) SRF_RETURN_DONE(call);
    Datum values[4];
    bool nulls[4] = {false, false, false, false};
    values[0] = walk->start.is_text ? text_datum(walk->start_text) : walk->start.datum;
    values[1] = walk->end.is_text ? text_datum(walk->end_text) : walk->end.datum;
    values[2] = text_datum(walk->label);
    values[3] = Int64GetDatum(walk->serial);
    HeapTuple row = heap_form_tuple(call->tuple_desc, values, nulls);
    SRF_RETURN_NEXT(call, HeapTupleGetDatum(row));
}

}  // namespace
}  // namespace almanac::postgres

using almanac::postgres::TimeKind;

ALMANAC_PG_FUNCTION(almanac_periods_timestamptz) {
    return almanac::postgres::periods<TimeKind::Timestamptz>(fcinfo);
}
ALMANAC_PG_FUNCTION(almanac_periods_timestamp) {
    return almanac::postgres::periods<TimeKind::Timestamp>(fcinfo);
}
ALMANAC_PG_FUNCTION(almanac_periods_date) {
    return almanac::postgres::periods<TimeKind::Date>(fcinfo);
}
ALMANAC_PG_FUNCTION(almanac_periods_text) {
    return almanac::postgres::periods<TimeKind::Text>(fcinfo);
}
