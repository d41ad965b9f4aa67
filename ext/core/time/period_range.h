// SPDX-License-Identifier: MIT
// The range a table of period totals covers, and how much of each period
// lies inside it (README "period_totals"): [start, stop) given by the caller,
// or taken from the data — from the start of the local day of the earliest
// row to the end of the local day of the latest, or, for sub-day units, from
// the period of the earliest row to the end of the period of the latest. The
// periods listed are every period that overlaps the range.
#pragma once

#include <cstdint>
#include <optional>
#include <string>

#include "core/time/period_calendar.h"

namespace almanac {

struct PeriodRange {
    Instant start;              // inclusive
    Instant stop;               // exclusive; start < stop unless empty()
    std::int64_t first_serial;  // the period holding start
    std::int64_t last_serial;   // the period holding the last instant before stop
    bool empty() const { return !(start < stop); }
    std::int64_t periods() const { return empty() ? 0 : last_serial - first_serial + 1; }
};

// The range from optional bounds, each missing one taken from the data's
// earliest and latest instant (the data must then have rows). Bounds are
// used as given, so start >= stop gives an empty range.
PeriodRange covering_range(const PeriodCalendar& calendar, std::optional<Instant> start,
                           std::optional<Instant> stop, Instant earliest, Instant latest);
// The same with both bounds given.
PeriodRange covering_range(const PeriodCalendar& calendar, Instant start, Instant stop);

// The part of `period` inside `range`: [max(starts), min(ends)).
struct Coverage {
    Instant start;
    Instant end;
};
inline Coverage coverage_of(const Period& period, const PeriodRange& range) {
    return Coverage{period.start < range.start ? range.start : period.start,
                    period.end < range.stop ? period.end : range.stop};
}

// A bound of a range as TEXT, as the calendar writes its boundaries (a bare
// local date for day and longer units) when it falls on one of the clock's
// day starts; otherwise a date-time with seconds (milliseconds when it has
// them) and, in a zone, the offset, so it reads back as the same instant.
std::string format_range_bound(const PeriodCalendar& calendar, Instant t);

}  // namespace almanac
