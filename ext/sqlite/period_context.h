// SPDX-License-Identifier: MIT
// What the period functions and the periods() table share: turning a spec
// and an optional zone into a PeriodCalendar (cached per statement), placing
// a time value on the time line, and writing instants back in the caller's
// representation.
#pragma once

#include <optional>
#include <string>

#include "arguments.h"
#include "core/time/period_calendar.h"

namespace almanac::sqlite {

// Builds the calendar for (spec, zone); zone may be absent. Errors name the
// argument that caused them.
PeriodCalendar make_calendar(const ArgumentRef& spec_arg, sqlite3_value* spec,
                             const ArgumentRef* zone_arg, sqlite3_value* zone);

// The same, cached on the spec argument with sqlite3_get_auxdata, so a
// constant spec is parsed once per statement. Returns nullptr when spec or
// zone is NULL.
const PeriodCalendar* cached_calendar(sqlite3_context* context, int spec_index,
                                      const ArgumentRef& spec_arg, sqlite3_value** argv,
                                      int zone_index, const ArgumentRef* zone_arg);

// Sets the result to t in the representation `like` was given in. TEXT
// follows the calendar's writing rule (bare dates for calendar units).
void result_boundary(sqlite3_context* context, const TimeValue& like, Instant t,
                     const PeriodCalendar& calendar);

}  // namespace almanac::sqlite
