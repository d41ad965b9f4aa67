// SPDX-License-Identifier: MIT
// A period calendar, or a spec's position in a cycle, from the texts a user
// writes: specs and, optionally, an IANA zone name. Errors say which text was
// wrong, so each binding can name that argument in its message.
#pragma once

#include <optional>
#include <string_view>

#include "core/text/error.h"
#include "core/time/period_calendar.h"
#include "core/time/period_position.h"

namespace almanac {

class CalendarTextError : public Error {
  public:
    enum class Culprit { Spec, Cycle, Zone };
    CalendarTextError(Culprit culprit, const std::string& what_was_expected)
        : Error(what_was_expected), culprit_(culprit) {}
    Culprit culprit() const { return culprit_; }

  private:
    Culprit culprit_;
};

// Throws CalendarTextError: a spec that does not parse or contradicts itself
// (Culprit::Spec), a zone not in the tz database (Culprit::Zone).
PeriodCalendar calendar_from_text(std::string_view spec, std::optional<std::string_view> zone);

// period_position's pair, checked in this order: the spec, whether it can
// give positions, the cycle, the zone, whether the two nest (Culprit::Cycle).
PeriodPosition position_from_text(std::string_view spec, std::string_view cycle,
                                  std::optional<std::string_view> zone);

}  // namespace almanac
