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
#include "core/time/period_position.h"

namespace almanac::sqlite {

// A spec read and parsed, a zone read and found: errors name the argument.
PeriodSpec read_spec(const ArgumentRef& arg, sqlite3_value* value);
ZoneClock read_zone(const ArgumentRef& arg, sqlite3_value* value);

// spec periods within a cycle, as period_position numbers them: the spec
// must give positions (no 'from') and nest in the cycle, in the zone (UTC
// when zone_arg is nullptr). Errors name the argument: the spec's own, the
// cycle's for a pair that does not nest (saying which pairs do).
struct SpecInCycle {
    PeriodSpec spec, cycle;
    PeriodPosition position;
};
SpecInCycle read_spec_in_cycle(const ArgumentRef& spec_arg, sqlite3_value* spec,
                               const ArgumentRef& cycle_arg, sqlite3_value* cycle,
                               const ArgumentRef* zone_arg, sqlite3_value* zone);

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
