// SPDX-License-Identifier: MIT
// The season key: which `spec` period of its `cycle` an instant falls in,
// counted from 1 — the weekday in a week, the day of a month, the month of a
// (fiscal) year, the week number, the hour of a local day.
//
// Pairs that nest (see kNestingRule) are answered on the wall clock of the
// cycle's zone; sub-day specs count elapsed periods from the cycle's first
// instant, so a 25-hour local day has hour positions 1–25. A week within a
// year is numbered in the week-numbering year that holds the majority of
// its days (four of seven): for Monday weeks and calendar years that is
// exactly the ISO 8601 week number.
#pragma once

#include <cstdint>
#include <optional>

#include "core/time/period_calendar.h"
#include "core/time/period_spec.h"
#include "core/time/zone_clock.h"

namespace almanac {

// What nests in what, as error messages state it.
extern const char* const kNestingRule;
// The same for retail calendars.
extern const char* const kRetailNestingRule;

// Throws Error when the spec itself cannot give positions (it has a `from`).
void check_position_spec(const PeriodSpec& spec);

class PeriodPosition {
  public:
    // Throws Error saying which pairs are allowed when spec does not nest in
    // cycle (the spec is assumed to have passed check_position_spec), and
    // the cycle calendar's own errors.
    PeriodPosition(const PeriodSpec& spec, const PeriodSpec& cycle, ZoneClock clock);

    // The cycle's calendar: it places bare dates on the time line too.
    const PeriodCalendar& cycle_calendar() const { return cycle_; }

    std::int64_t position(Instant t) const;

  private:
    enum class Kind { Elapsed, Day, Week, HalfMonth, Months, Retail };

    date::local_days local_day(Instant t) const;

    PeriodCalendar cycle_;
    std::optional<PeriodCalendar> retail_periods_;  // Retail: the spec's own calendar
    Kind kind_ = Kind::Day;
    std::int64_t length_ms_ = 0;      // Elapsed: the spec's length
    std::int64_t length_months_ = 0;  // Months: the spec's length
    date::weekday week_start_ = date::Monday;
    date::month year_start_ = date::January;  // Week: the cycle's first month
};

}  // namespace almanac
