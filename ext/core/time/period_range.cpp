// SPDX-License-Identifier: MIT
#include "core/time/period_range.h"

#include "core/text/error.h"

namespace almanac {

PeriodRange::PeriodRange(const PeriodCalendar& calendar, Instant start, Instant stop)
    : calendar_(&calendar), stop_(stop) {
    if (start >= stop) return;
    current_ = calendar.period_of(start);
    // The limit is met when the periods are read, not when the range is set,
    // so a LIMIT that takes the first periods of a huge range still works.
    periods_in_range_ = calendar.period_of(stop - Millis(1)).serial - current_.serial + 1;
    done_ = false;
}

void PeriodRange::advance() {
    if (current_.end >= stop_ || current_.end >= latest_supported_instant()) {
        done_ = true;
        return;
    }
    try {
        current_ = calendar_->next(current_);
    } catch (const Error&) {
        done_ = true;  // the calendar's end, year 9999
        return;
    }
    if (++row_ < kMostPeriods) return;
    throw Error("the range holds " + std::to_string(periods_in_range_) + " periods; at most " +
                std::to_string(kMostPeriods) + " per call: narrow the range or use a longer spec");
}

}  // namespace almanac
