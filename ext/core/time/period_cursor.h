// SPDX-License-Identifier: MIT
// The periods of a calendar that overlap a range [start, stop), one at a
// time, in order: what periods() lists in every binding (the range itself,
// and how many periods it holds, are period_range.h's). Nothing is held but
// the current period, so a caller that stops early (a LIMIT) does no more work.
#pragma once

#include <cstdint>
#include <string>

#include "core/time/period_calendar.h"
#include "core/time/period_range.h"

namespace almanac {

class PeriodCursor {
  public:
    // The most periods one range gives (README "Limits"): a mistyped range
    // (seconds over centuries) stops with an error instead of running for hours.
    static constexpr std::int64_t kMostPeriods = 10000000;

    // Empty when stop <= start. The calendar must outlive the range.
    PeriodCursor(const PeriodCalendar& calendar, Instant start, Instant stop);

    bool done() const { return done_; }
    const Period& current() const { return current_; }  // when !done()
    // Moves to the next period; throws Error past kMostPeriods, saying how
    // many periods the range holds.
    void advance();

  private:
    const PeriodCalendar* calendar_;
    Period current_{};
    PeriodRange range_;
    bool done_ = true;
    std::int64_t row_ = 0;
};

}  // namespace almanac
