// SPDX-License-Identifier: MIT
#include "core/chart/axis_kind.h"

#include <cmath>

#include "core/text/error.h"
#include "core/text/number_text.h"

namespace almanac {

double time_axis_value(const TimeValue& value) {
    return static_cast<double>(value.utc_instant().time_since_epoch().count());
}

double time_axis_value(const TimeValue& value, const ZoneClock& zone) {
    if (value.is_calendar_day()) return time_axis_value(value);
    return static_cast<double>(zone.to_local(value.instant()).time_since_epoch().count());
}

Instant instant_from_axis_value(double value) {
    return Instant{Millis{static_cast<std::int64_t>(std::llround(value))}};
}

AxisValue axis_value_of_text(std::string_view text, const ZoneClock* zone, bool categories) {
    if (auto number = numeric_text(text)) {
        if (!std::isfinite(*number)) throw Error("expected a finite number");
        return AxisValue{AxisKind::Number, *number};
    }
    try {
        TimeValue time = parse_time_text(text);
        return AxisValue{AxisKind::Time,
                         zone ? time_axis_value(time, *zone) : time_axis_value(time)};
    } catch (const Error& error) {
        if (categories && !looks_like_a_date(text)) return AxisValue{AxisKind::Category, 0};
        // A period label ('2024-W05', '2024-Q1') is the usual mistake: say what orders.
        // (A bar chart takes labels as categories; its error is the date's own.)
        if (categories) throw;
        throw Error(std::string(error.what()) +
                    "; x orders the rows, so for periods give period_floor() or "
                    "period_serial(), not period_label()");
    }
}

bool looks_like_a_date(std::string_view text) {
    auto digit = [&](std::size_t i) { return i < text.size() && text[i] >= '0' && text[i] <= '9'; };
    return digit(0) && digit(1) && digit(2) && digit(3) && text.size() > 4 && text[4] == '-' &&
           digit(5) && digit(6) && text.size() > 7 && text[7] == '-';
}

const char* describe_axis_kind(AxisKind kind) {
    switch (kind) {
        case AxisKind::Number:
            return "a number";
        case AxisKind::Time:
            return "a time value";
        case AxisKind::Category:
            break;
    }
    return "a category (TEXT that is neither a number nor a time value)";
}

void AxisKindGuard::accept(AxisKind kind) {
    if (!kind_) {
        kind_ = kind;
        return;
    }
    if (*kind_ != kind)
        throw Error(std::string("expected ") + describe_axis_kind(*kind_) +
                    " like the earlier x values of this group; one axis cannot mix numbers, "
                    "time values and categories");
}

}  // namespace almanac
