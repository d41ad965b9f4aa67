// SPDX-License-Identifier: MIT
#include "calendar_cache.h"

#include "core/text/error.h"
#include "core/time/calendar_from_text.h"

namespace almanac::postgres {
namespace {

[[noreturn]] void raise_spec_error(const Argument& arg, std::string_view text, const Error& error) {
    raise_argument_error(arg, shown_text(text), error.what(), ERRCODE_INVALID_PARAMETER_VALUE);
}

}  // namespace

bool CalendarCache::same(std::string_view spec, std::string_view cycle, const Argument* zone_arg,
                         std::string_view zone) const {
    return spec == spec_ && cycle == cycle_ && zoned_ == (zone_arg != nullptr) &&
           (!zone_arg || zone == zone_);
}

void CalendarCache::remember(std::string_view spec, std::string_view cycle,
                             const Argument* zone_arg, std::string_view zone) {
    spec_.assign(spec);
    cycle_.assign(cycle);
    zoned_ = zone_arg != nullptr;
    zone_.assign(zone_arg ? zone : std::string_view());
}

const PeriodCalendar& CalendarCache::calendar(const Argument& spec_arg, std::string_view spec,
                                              const Argument* zone_arg, std::string_view zone) {
    if (calendar_ && same(spec, {}, zone_arg, zone)) return *calendar_;
    calendar_.reset();
    try {
        calendar_.emplace(calendar_from_text(
            spec, zone_arg ? std::optional<std::string_view>(zone) : std::nullopt));
    } catch (const CalendarTextError& error) {
        if (error.culprit() == CalendarTextError::Culprit::Zone)
            raise_spec_error(*zone_arg, zone, error);
        raise_spec_error(spec_arg, spec, error);
    }
    remember(spec, {}, zone_arg, zone);
    return *calendar_;
}

const PeriodPosition& CalendarCache::position(const Argument& spec_arg, std::string_view spec,
                                              const Argument& cycle_arg, std::string_view cycle,
                                              const Argument* zone_arg, std::string_view zone) {
    if (position_ && same(spec, cycle, zone_arg, zone)) return *position_;
    position_.reset();
    try {
        position_.emplace(position_from_text(
            spec, cycle, zone_arg ? std::optional<std::string_view>(zone) : std::nullopt));
    } catch (const CalendarTextError& error) {
        switch (error.culprit()) {
            case CalendarTextError::Culprit::Spec:
                raise_spec_error(spec_arg, spec, error);
            case CalendarTextError::Culprit::Cycle:
                raise_spec_error(cycle_arg, cycle, error);
            case CalendarTextError::Culprit::Zone:
                raise_spec_error(*zone_arg, zone, error);
        }
        throw;
    }
    remember(spec, cycle, zone_arg, zone);
    return *position_;
}

CalendarCache* calendar_cache(FunctionCallInfo fcinfo) {
    if (fcinfo->flinfo->fn_extra) return static_cast<CalendarCache*>(fcinfo->flinfo->fn_extra);
    CalendarCache* cache = new_in_context<CalendarCache>(fcinfo->flinfo->fn_mcxt);
    fcinfo->flinfo->fn_extra = cache;
    return cache;
}

}  // namespace almanac::postgres
