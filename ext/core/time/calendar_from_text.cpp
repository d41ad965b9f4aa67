// SPDX-License-Identifier: MIT
#include "core/time/calendar_from_text.h"

namespace almanac {
namespace {

using Culprit = CalendarTextError::Culprit;

PeriodSpec spec_from_text(std::string_view text, Culprit culprit) {
    try {
        return parse_period_spec(text);
    } catch (const Error& error) {
        throw CalendarTextError(culprit, error.what());
    }
}

ZoneClock clock_from_text(std::optional<std::string_view> zone) {
    if (!zone) return ZoneClock::utc();
    try {
        return ZoneClock::named(*zone);
    } catch (const Error& error) {
        throw CalendarTextError(Culprit::Zone, error.what());
    }
}

}  // namespace

PeriodCalendar calendar_from_text(std::string_view spec, std::optional<std::string_view> zone) {
    PeriodSpec parsed = spec_from_text(spec, Culprit::Spec);
    ZoneClock clock = clock_from_text(zone);
    try {
        return PeriodCalendar(parsed, clock);
    } catch (const Error& error) {
        throw CalendarTextError(Culprit::Spec, error.what());
    }
}

PeriodPosition position_from_text(std::string_view spec, std::string_view cycle,
                                  std::optional<std::string_view> zone) {
    const PeriodSpec parsed_spec = spec_from_text(spec, Culprit::Spec);
    try {
        check_position_spec(parsed_spec);
    } catch (const Error& error) {
        throw CalendarTextError(Culprit::Spec, error.what());
    }
    const PeriodSpec parsed_cycle = spec_from_text(cycle, Culprit::Cycle);
    ZoneClock clock = clock_from_text(zone);
    try {
        return PeriodPosition(parsed_spec, parsed_cycle, clock);
    } catch (const Error& error) {
        throw CalendarTextError(Culprit::Cycle, error.what());
    }
}

}  // namespace almanac
