// SPDX-License-Identifier: MIT
// Reading a source table into period totals: the one reading that
// period_totals() and period_decomposition() share, so both see the same
// columns, segments, range and zero fill (README "period_totals").
//
// How a table function uses it (period_totals_table.cpp is the model):
//
//   PeriodCalendar calendar = make_calendar(spec_arg, spec, &zone_arg, zone);
//   RangeBounds bounds = read_range(start_arg, start, stop_arg, stop, calendar);
//                                              // or RangeBounds{} for the data's range
//   SourceRequest request{"period_decomposition", source_arg, source, &calendar, bounds,
//                         /*wants_qty=*/false};
//   SourceReading reading = read_source(db, request);
//   for (const ListedSeries& series : reading.series) {
//       // series.all_segments, series.group->key() (the segment value),
//       // reading.totals->item(series.item) (the item value), series.range
//       for (std::int64_t serial = series.range.first_serial;
//            serial <= series.range.last_serial; ++serial) {
//           const PeriodCell* cell = series.group->at(series.item, serial);  // nullptr: 0
//           ...
//       }
//   }
//
// What read_source does:
//  1. Looks the source up ('name' or 'schema.name' of an ATTACHed database)
//     with bound parameters and reads it with one SELECT in which every name
//     is quoted as an identifier: never pasted into SQL. Columns ts and amount
//     are required; item, qty and segment are read when the source has them
//     (case-insensitive names). qty is read only when wants_qty.
//  2. One pass, no sort: each row goes into its (segment, item, period) cell
//     through the aggregate period_totals_pass, inside SQLite's own loop.
//     Rows whose ts is NULL are skipped; rows outside [start, stop) are not
//     counted. With segments, the rollup is the exact merge of the segments.
//  3. Errors are SqlError with the calling function's name:
//     "fn(): argument 1 (source) = 'sales': column ts holds ...: ...".
//     Out of memory is std::bad_alloc (the caller returns SQLITE_NOMEM).
//  4. Memory: (segments + 1) x items x periods cells at most kMaxCells.
//  5. The listing (reading.series) is in period_totals' row order: the rollup
//     first, then each segment, then item, over each group's range.
#pragma once

#include <memory>
#include <optional>
#include <vector>

#include "arguments.h"
#include "core/stats/period_totals.h"
#include "core/stats/period_totals_listing.h"
#include "core/time/period_calendar.h"

namespace almanac::sqlite {

// 48 bytes per cell while it adds up (32 more when qty is read), with room
// to grow to at most twice that: about 1 GiB at the limit. Reports hold
// items x days, so the limit is set for a shop's catalogue: 5,000 items
// over five and a half years, or fewer when the rows have segments.
constexpr std::uint64_t kMaxCells = 10000000;

// The calling connection was interrupted (sqlite3_interrupt): the table
// function returns SQLITE_INTERRUPT with this message.
class Interrupted : public SqlError {
  public:
    using SqlError::SqlError;
};

// Called inside a catch (...) of a table function reading a source (its
// filter, its next): the exception in flight as SQLite's answer. Out of
// memory stays SQLITE_NOMEM, an interrupt SQLITE_INTERRUPT, an SqlError keeps
// its message, any other failure is prefixed with the function's name. One
// place, so every table that reads a source answers the same way.
int scan_failure(sqlite3_vtab* table, const char* function_name);

// The caller's range; a missing bound is taken from the data.
struct RangeBounds {
    std::optional<Instant> start, stop;
};

// Reads start and stop arguments (either may be absent or NULL: from the
// data). A bare date is a day in the calendar's zone. An invalid time, or a
// start after the stop, is an error naming the argument.
RangeBounds read_range(const ArgumentRef& start_arg, sqlite3_value* start,
                       const ArgumentRef& stop_arg, sqlite3_value* stop,
                       const PeriodCalendar& calendar);

struct SourceRequest {
    const char* function;  // the SQL function, for messages
    ArgumentRef source_arg;
    sqlite3_value* source;
    const PeriodCalendar* calendar;
    RangeBounds bounds;
    bool wants_qty = false;
};

struct SourceReading {
    std::unique_ptr<PeriodTotals> totals;  // finished (rollup built)
    bool has_item = false, has_qty = false, has_segment = false;
    bool reads_qty = false;  // the cells hold qty totals
    std::vector<ListedSeries> series;  // pointers into *totals
};

SourceReading read_source(sqlite3* db, const SourceRequest& request);

// Registers period_totals_pass, the reading step (an aggregate), and
// almanac_threads() with almanac_last_read_threads() (reading_threads.h).
int register_source_reading(sqlite3* db);

}  // namespace almanac::sqlite
