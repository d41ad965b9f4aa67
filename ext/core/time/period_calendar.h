// SPDX-License-Identifier: MIT
// Calendar periods: which period holds an instant, where it ends, its serial
// number, its label, and moving by whole periods. Works on a ZoneClock, so
// the same code serves UTC and every IANA zone.
#pragma once

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <utility>

#include "core/time/period_spec.h"
#include "core/time/time_value.h"
#include "core/time/zone_clock.h"

namespace almanac {

class CalendarGrid;
class SubDayGrid;

struct Period {
    Instant start;        // inclusive
    Instant end;          // exclusive: the start of the next period
    std::int64_t serial;  // 0 holds 1970-01-01 00:00 on the clock; neighbours differ by 1
};

class PeriodCalendar {
  public:
    // Throws Error when the spec's `from` contradicts its `starting`.
    PeriodCalendar(PeriodSpec spec, ZoneClock clock);

    const PeriodSpec& spec() const { return spec_; }
    const ZoneClock& clock() const { return clock_; }

    Period period_of(Instant t) const;
    // The start of period_of(t), by a shorter path where there is one.
    Instant floor(Instant t) const;
    // period_of(t).serial, without working out the period's end.
    std::int64_t serial_of(Instant t) const;
    // A calendar day (bare YYYY-MM-DD) begins at the clock's first instant of that day.
    Instant start_of_day(date::local_days day) const;
    // A parsed time value as an instant: a calendar day at its start on this
    // calendar's clock, any other value as it is.
    Instant place_on_time_line(const TimeValue& value) const;
    Period period_by_serial(std::int64_t serial) const;
    // The first and last serial of the periods that start in years 0000 through 9999.
    std::pair<std::int64_t, std::int64_t> supported_serials() const;
    Period next(const Period& period) const { return period_by_serial(period.serial + 1); }

    // t moved by n whole periods. Calendar units keep t's wall-clock offset
    // from the start of its period (clamped to the target period's length in
    // days, e.g. Jan 31 + 1 month = Feb 28/29); sub-day units move by elapsed time.
    Instant shift(Instant t, std::int64_t n) const;
    // The same, for a calendar day: the result is a calendar day.
    date::local_days shift_day(date::local_days day, std::int64_t n) const;

    // The period's label for reports (README section "Labels"). Months, quarters
    // and years counted `from` a date show their days: 2026-02-15..03-14.
    std::string label(const Period& period) const;

    // Results as text: a bare local date for day and longer units, otherwise a
    // wall-clock date-time (with ±HH:MM when the clock is a zone).
    std::string format_boundary(Instant t) const;
    // The same text written at out (room for kBoundaryTextSize bytes); returns its end.
    static constexpr std::size_t kBoundaryTextSize = 40;
    char* write_boundary(Instant t, char* out) const;
    // t as TEXT in the form `like` was written in: a date-time keeps its
    // precision, its separator and its kind of suffix (Z, or an offset: the
    // written one on UTC, the zone's at t otherwise).
    std::string format_like(const TextForm& like, Instant t) const;
    // Whether format_boundary writes bare dates (calendar units whose
    // boundaries fall at midnight) or date-times.
    bool writes_dates() const { return writes_dates_; }

    // The shortcut of the period keys for the common case, a calendar whose
    // periods all start at a UTC midnight (no zone, a unit of a day or
    // longer, no time of day in `from`): the period holding the UTC day
    // `day` by day numbers alone. Nothing for other calendars, and for a
    // start before year 0000 (the general path then gives the error).
    bool has_utc_midnights() const { return utc_midnights_; }
    std::optional<date::local_days> utc_period_start_day(date::local_days day) const;
    std::optional<std::int64_t> utc_period_serial_of_day(date::local_days day) const;

  private:
    LocalTime shift_reading(LocalTime local, std::int64_t n) const;

    PeriodSpec spec_;
    ZoneClock clock_;
    // Immutable after construction, so copies may share them.
    std::shared_ptr<const CalendarGrid> grid_;
    std::shared_ptr<const SubDayGrid> sub_day_;
    bool writes_dates_ = false;   // decided once: write_boundary runs per row
    bool utc_midnights_ = false;  // the shortcut above applies
};

}  // namespace almanac
