// SPDX-License-Identifier: MIT
// Period results in the type of the time argument they answer (a
// timestamptz for a timestamptz, a date for a date, text as the SQLite module
// writes it for text), and the datum made from them in the C part.
#pragma once

#include <cstdint>

#include "arguments.h"
#include "core/time/period_calendar.h"

namespace almanac::postgres {

struct PeriodResult {
    Datum datum;   // when !is_text
    bool is_text;  // the result is in result_text()
};

// A period boundary (floor or end) of calendar for the argument t that was read as `time`.
PeriodResult boundary_result(const Argument& t_arg, const TimeArgument& t, const TimeValue& time,
                             Instant boundary, const PeriodCalendar& calendar);
// t moved by n periods, in t's own type and (for text) its own written form.
PeriodResult shifted_result(const Argument& t_arg, const TimeArgument& t, const TimeValue& time,
                            std::int64_t n, const PeriodCalendar& calendar);

// C part: the datum (text results are copied into PostgreSQL memory).
inline Datum result_datum(const PeriodResult& result) {
    if (!result.is_text) return result.datum;
    return PointerGetDatum(
        cstring_to_text_with_len(result_text().data(), static_cast<int>(result_text().size())));
}

}  // namespace almanac::postgres
