// SPDX-License-Identifier: MIT
// The calendar of one call site, kept in fn_extra: a spec and zone that stay
// the same from row to row (the usual constant arguments) are parsed once per
// query, and the calendar is rebuilt only when their text changes.
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "arguments.h"
#include "core/time/period_calendar.h"
#include "core/time/period_position.h"

namespace almanac::postgres {

class CalendarCache {
  public:
    // The calendar of (spec, zone); zone_arg is nullptr for the form without
    // a zone. Errors name the argument that caused them (22023).
    const PeriodCalendar& calendar(const Argument& spec_arg, std::string_view spec,
                                   const Argument* zone_arg, std::string_view zone);
    // period_position's pair of spec and cycle in a zone, the same way.
    const PeriodPosition& position(const Argument& spec_arg, std::string_view spec,
                                   const Argument& cycle_arg, std::string_view cycle,
                                   const Argument* zone_arg, std::string_view zone);

  private:
    bool same(std::string_view spec, std::string_view cycle, const Argument* zone_arg,
              std::string_view zone) const;
    void remember(std::string_view spec, std::string_view cycle, const Argument* zone_arg,
                  std::string_view zone);

    std::string spec_, cycle_, zone_;
    bool zoned_ = false;
    std::optional<PeriodCalendar> calendar_;
    std::optional<PeriodPosition> position_;
};

// The call site's cache, made in fn_mcxt on the first call. C part only;
// nullptr after keeping the failure (then report_failure()).
CalendarCache* calendar_cache(FunctionCallInfo fcinfo);

}  // namespace almanac::postgres
