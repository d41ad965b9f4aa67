// SPDX-License-Identifier: MIT
#include "core/time/period_cursor.h"

#include "core/text/error.h"

namespace almanac {

PeriodCursor::PeriodCursor(const PeriodCalendar& calendar, Instant start, Instant stop)
    : calendar_(&calendar), range_(covering_range(calendar, start, stop)) {
    if (range_.empty()) return;
    // The limit is met when the periods are read, not when the range is set,
    // so a LIMIT that takes the first periods of a huge range still works.
    current_ = calendar.period_of(start);
    done_ = false;
}

void PeriodCursor::advance() {
    if (current_.end >= range_.stop || current_.end >= latest_supported_instant()) {
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
    throw Error("the range holds " + std::to_string(range_.periods()) + " periods; at most " +
                std::to_string(kMostPeriods) + " per call: narrow the range or use a longer spec");
}

}  // namespace almanac
