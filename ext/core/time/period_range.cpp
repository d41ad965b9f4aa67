// SPDX-License-Identifier: MIT
#include "core/time/period_range.h"

namespace almanac {

namespace {

date::local_days local_day_of(const PeriodCalendar& calendar, Instant t) {
    return date::floor<date::days>(calendar.clock().to_local(t));
}

// Where the data's range begins and ends: local days for calendar units
// (a week's first row on a Wednesday covers the week from that Wednesday),
// whole periods for sub-day units (an hour is never cut at a day boundary).
Instant data_start(const PeriodCalendar& calendar, Instant earliest) {
    if (calendar.spec().is_sub_day()) return calendar.period_of(earliest).start;
    return calendar.start_of_day(local_day_of(calendar, earliest));
}

Instant data_stop(const PeriodCalendar& calendar, Instant latest) {
    if (calendar.spec().is_sub_day()) return calendar.period_of(latest).end;
    return calendar.start_of_day(local_day_of(calendar, latest) + date::days{1});
}

}  // namespace

PeriodRange covering_range(const PeriodCalendar& calendar, Instant start, Instant stop) {
    PeriodRange range{start, stop, 0, -1};
    if (range.empty()) return range;
    range.first_serial = calendar.serial_of(start);
    range.last_serial = calendar.serial_of(stop - Millis(1));
    return range;
}

PeriodRange covering_range(const PeriodCalendar& calendar, std::optional<Instant> start,
                           std::optional<Instant> stop, Instant earliest, Instant latest) {
    return covering_range(calendar, start ? *start : data_start(calendar, earliest),
                          stop ? *stop : data_stop(calendar, latest));
}

std::string format_range_bound(const PeriodCalendar& calendar, Instant t) {
    if (!calendar.writes_dates() || calendar.start_of_day(local_day_of(calendar, t)) == t)
        return calendar.format_boundary(t);
    TextForm form;
    form.precision = t.time_since_epoch().count() % 1000 == 0 ? TextForm::Precision::Seconds
                                                              : TextForm::Precision::Fraction;
    form.suffix = calendar.clock().is_utc() ? TextForm::Suffix::None : TextForm::Suffix::Offset;
    return calendar.format_like(form, t);
}

}  // namespace almanac
