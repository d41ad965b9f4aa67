// SPDX-License-Identifier: MIT
// Which series of period totals are listed, in what order, over what range
// (README "period_totals"): the rollup first (all segments), then each
// segment in SQLite's order of values; within each, every item that has a
// row there, in that order; each series over its group's range — the
// caller's [start, stop) where given, the group's own data otherwise — with
// every period of that range, empty ones included (zero fill).
//
// A series is walked serial by serial from range.first_serial to
// range.last_serial: the period is calendar.period_by_serial(serial) (or
// calendar.next() of the one before), its cell group->at(item, serial)
// (nullptr: no row, totals 0), its coverage coverage_of(period, range).
#pragma once

#include <cstddef>
#include <functional>
#include <vector>

#include "core/stats/period_totals.h"
#include "core/time/period_range.h"

namespace almanac {

struct ListedSeries {
    const TotalsGroup* group;  // a segment's totals, or the rollup's
    bool all_segments;         // the rollup: segment is NULL in the output
    std::size_t item;          // an index for PeriodTotals::item()
    PeriodRange range;
};

// A group's range from the earliest and latest instant of its rows: the
// caller's bounds where given, covering_range (core/time/period_range.h)
// on the calendar otherwise.
using RangeOfRows = std::function<PeriodRange(Instant earliest, Instant latest)>;

// The series of finished totals; checks the limit against the widest range
// listed (explicit bounds may reach beyond the data).
std::vector<ListedSeries> list_series(const PeriodTotals& totals, const RangeOfRows& range_of);

}  // namespace almanac
