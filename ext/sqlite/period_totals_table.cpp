// SPDX-License-Identifier: MIT
// period_totals(source, spec [, zone [, start [, stop]]]): a table-valued function.
//
//  1. Reads the table or view named `source` once, without sorting it
//     (source_reading.h): its columns ts and amount, and item, qty and
//     segment when it has them. `source` is 'name' or 'schema.name'
//     ('main.sales', 'shop2.sales' of an ATTACHed database); it is looked up
//     with bound parameters and quoted as an identifier in the one SELECT
//     that reads it, never pasted into SQL.
//  2. Columns: segment, all_segments, item, period_start, period_end, label,
//     serial, covered_start, covered_end, sales, qty, amount; the arguments
//     are the hidden columns source, spec, zone, start, stop.
//  3. Range: with start and/or stop (time values; a bare date is a local day
//     in the zone), only rows with start <= ts < stop count, and the periods
//     listed are all those that overlap [start, stop). A missing or NULL
//     bound is taken from the data: from the start of the local day of the
//     earliest row to the end of the local day of the latest (sub-day specs:
//     from the period of the earliest row to the end of the period of the
//     latest). covered_start and covered_end are the part of the period
//     inside the range.
//  4. Rows come rollup first (all_segments = 1, segment NULL: the totals over
//     every row), then, when the source has a segment column, one block per
//     segment (all_segments = 0) in SQLite's order of values, each over that
//     segment's own range where a bound is taken from the data; within each,
//     items in SQLite's order (NULL, numbers, TEXT, BLOBs), then periods.
//     Every item with a row in a block gets every period of its range.
//  5. sales is the number of rows; qty and amount are exact sums (as
//     exact_sum: INTEGER while every value is an INTEGER and the sum fits,
//     otherwise the correctly rounded REAL); 0 for an empty period, NULL for
//     a period whose rows hold only NULLs in that column. The rollup's are
//     one exact sum over all rows, not a sum of the segments' rounded sums.
//  6. A source without item is one group with item NULL; without qty, qty is
//     NULL. Rows whose ts is NULL are skipped.
//  7. period_start, period_end and covered_* are in the representation of the
//     earliest row's ts (TEXT, Unix seconds or Julian day), as period_floor
//     gives them; a covered bound inside a day is written as a date-time.
//  8. Memory is O((segments + 1) x items x periods): past kMaxCells
//     item-period rows is an error, raised before the memory is taken.
//  9. A NULL source, spec or zone gives no rows. A missing source or spec, a
//     name that is not a table or view, a source without ts or amount, a ts
//     that is not a time value, an amount or qty that is not a number (TEXT
//     that SQLite does not read as a number, a BLOB, an infinity), an invalid
//     start or stop, or a start after the stop is an error.
// 10. SQLITE_DIRECTONLY: not usable inside a view or trigger, because it
//     reads a table named by a value.
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "argument_table.h"
#include "arguments.h"
#include "core/stats/period_totals.h"
#include "core/text/error.h"
#include "core/time/period_range.h"
#include "period_context.h"
#include "registration.h"
#include "source_reading.h"
#include "totals_values.h"

namespace almanac::sqlite {
namespace {

constexpr const char* kName = "period_totals";

enum Column {
    kSegment,
    kAllSegments,
    kItem,
    kPeriodStart,
    kPeriodEnd,
    kLabel,
    kSerial,
    kCoveredStart,
    kCoveredEnd,
    kSales,
    kQty,
    kAmount,
    kSource,
    kSpec,
    kZone,
    kStart,
    kStop
};
// The first columns are every listing's (totals_values.h).
static_assert(kSerial + 1 == kSeriesColumns, "segment ... serial come first");
constexpr int kFirstArgument = kSource;
constexpr int kArguments = 5;
constexpr int kReadsQty = 1 << kArguments;  // an idxNum bit beside the argument bits

struct Table {
    sqlite3_vtab base{};
    sqlite3* db = nullptr;
};

struct Cursor {
    sqlite3_vtab_cursor base{};
    std::optional<PeriodCalendar> calendar;
    SourceReading reading;
    TimeValue like;
    std::size_t series = 0;  // position in reading.series
    Period current{};
    bool done = true;
    sqlite3_int64 row = 0;
    sqlite3_value* arguments[kArguments] = {nullptr, nullptr, nullptr, nullptr, nullptr};

    ~Cursor() { release_arguments(); }
    void release_arguments() {
        for (auto*& value : arguments) {
            sqlite3_value_free(value);
            value = nullptr;
        }
    }
    const ListedSeries& listed() const { return reading.series[series]; }
};

int connect(sqlite3* db, void*, int, const char* const*, sqlite3_vtab** out, char**) {
    int rc = sqlite3_declare_vtab(
        db,
        "CREATE TABLE x(segment, all_segments INTEGER, item, period_start, period_end,"
        " label TEXT, serial INTEGER, covered_start, covered_end, sales INTEGER, qty, amount,"
        " source HIDDEN, spec HIDDEN, zone HIDDEN, start HIDDEN, stop HIDDEN)");
    if (rc != SQLITE_OK) return rc;
    auto* table = static_cast<Table*>(sqlite3_malloc(sizeof(Table)));
    if (!table) return SQLITE_NOMEM;
    *table = Table{};
    table->db = db;
    *out = &table->base;
    // It reads whatever table its argument names: a view or trigger must not
    // be able to hide that from the user who runs it.
    sqlite3_vtab_config(db, SQLITE_VTAB_DIRECTONLY);
    return SQLITE_OK;
}

int disconnect(sqlite3_vtab* table) {
    sqlite3_free(table);
    return SQLITE_OK;
}

// idxNum has one bit per argument given as an equality constraint.
int best_index(sqlite3_vtab*, sqlite3_index_info* info) {
    int where[kArguments] = {-1, -1, -1, -1, -1};
    for (int i = 0; i < info->nConstraint; ++i) {
        const auto& constraint = info->aConstraint[i];
        int argument = constraint.iColumn - kFirstArgument;
        if (argument < 0 || argument >= kArguments) continue;
        if (constraint.op != SQLITE_INDEX_CONSTRAINT_EQ) continue;
        if (!constraint.usable) return SQLITE_CONSTRAINT;
        where[argument] = i;
    }
    int mask = 0, next = 1;
    for (int argument = 0; argument < kArguments; ++argument) {
        if (where[argument] < 0) continue;
        info->aConstraintUsage[where[argument]].argvIndex = next++;
        info->aConstraintUsage[where[argument]].omit = 1;
        mask |= 1 << argument;
    }
    // qty is read from the source only when the query uses it: its column
    // costs a read and an exact add per row (README "Performance").
    if (info->colUsed & (sqlite3_uint64{1} << kQty)) mask |= kReadsQty;
    info->idxNum = mask;
    // A full scan of the source: expensive, so SQLite runs it once.
    info->estimatedCost = 1e6;
    info->estimatedRows = 10000;
    return SQLITE_OK;
}

int open(sqlite3_vtab*, sqlite3_vtab_cursor** out) {
    auto* cursor = new (std::nothrow) Cursor();
    if (!cursor) return SQLITE_NOMEM;
    *out = &cursor->base;
    return SQLITE_OK;
}

int close(sqlite3_vtab_cursor* base) {
    delete reinterpret_cast<Cursor*>(base);
    return SQLITE_OK;
}

int filter(sqlite3_vtab_cursor* base, int mask, const char*, int argc, sqlite3_value** argv) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    auto* table = reinterpret_cast<Table*>(base->pVtab);
    cursor->release_arguments();
    cursor->reading = SourceReading{};
    cursor->done = true;
    cursor->row = 0;
    sqlite3_value* given[kArguments] = {nullptr, nullptr, nullptr, nullptr, nullptr};
    for (int argument = 0, used = 0; argument < kArguments && used < argc; ++argument) {
        if (mask & (1 << argument)) given[argument] = argv[used++];
    }
    for (int argument = 0; argument < kArguments; ++argument) {
        if (given[argument]) cursor->arguments[argument] = sqlite3_value_dup(given[argument]);
    }
    static const char* names[kArguments] = {"source", "spec", "zone", "start", "stop"};
    for (int argument = 0; argument < 2; ++argument) {
        if (!given[argument]) {
            return set_table_error(base->pVtab,
                             std::string(kName) + "(): " + names[argument] +
                                 " is missing; expected period_totals(source, spec [, zone [,"
                                 " start [, stop]]])");
        }
    }
    try {
        ArgumentRef source_arg{kName, 1, "source"}, spec_arg{kName, 2, "spec"},
            zone_arg{kName, 3, "zone"}, start_arg{kName, 4, "start"}, stop_arg{kName, 5, "stop"};
        // A bad start or stop is an error even where a NULL elsewhere gives no rows.
        if (given[3]) read_time(start_arg, given[3]);
        if (given[4]) read_time(stop_arg, given[4]);
        for (int argument = 0; argument < 3; ++argument) {
            if (given[argument] && sqlite3_value_type(given[argument]) == SQLITE_NULL)
                return SQLITE_OK;
        }
        cursor->calendar.emplace(
            make_calendar(spec_arg, given[1], given[2] ? &zone_arg : nullptr, given[2]));
        SourceRequest request{kName,
                              source_arg,
                              given[0],
                              &*cursor->calendar,
                              read_range(start_arg, given[3], stop_arg, given[4], *cursor->calendar),
                              (mask & kReadsQty) != 0};
        cursor->reading = read_source(table->db, request);
        if (cursor->reading.series.empty()) return SQLITE_OK;
        cursor->like = boundary_form(*cursor->reading.totals);
        cursor->series = 0;
        cursor->current = cursor->calendar->period_by_serial(cursor->listed().range.first_serial);
        cursor->done = false;
        return SQLITE_OK;
    } catch (...) {
        return scan_failure(base->pVtab, kName);
    }
}

int next(sqlite3_vtab_cursor* base) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    ++cursor->row;
    try {
        if (cursor->current.serial < cursor->listed().range.last_serial) {
            cursor->current = cursor->calendar->next(cursor->current);
            return SQLITE_OK;
        }
        if (++cursor->series >= cursor->reading.series.size()) {
            cursor->done = true;
            return SQLITE_OK;
        }
        cursor->current = cursor->calendar->period_by_serial(cursor->listed().range.first_serial);
        return SQLITE_OK;
    } catch (...) {
        return scan_failure(base->pVtab, kName);
    }
}

int eof(sqlite3_vtab_cursor* base) { return reinterpret_cast<Cursor*>(base)->done ? 1 : 0; }

// A covered bound: as a period boundary, except that TEXT inside a day is a
// date-time (core/time/period_range.h).
void result_covered(sqlite3_context* context, const TimeValue& like, Instant t,
                    const PeriodCalendar& calendar) {
    if (like.representation != Representation::Text)
        return result_boundary(context, like, t, calendar);
    if (!in_supported_range(t)) throw Error("the result falls outside years 0000 through 9999");
    std::string text = format_range_bound(calendar, t);
    sqlite3_result_text(context, text.c_str(), static_cast<int>(text.size()), SQLITE_TRANSIENT);
}

int column(sqlite3_vtab_cursor* base, sqlite3_context* context, int index) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    guarded(context, [&] {
        try {
            const ListedSeries& series = cursor->listed();
            const PeriodCalendar& calendar = *cursor->calendar;
            const Period& period = cursor->current;
            auto cell = [&] { return series.group->at(series.item, period.serial); };
            if (index < kSeriesColumns) {
                return result_series_column(context, index, series, *cursor->reading.totals, period,
                                            calendar, cursor->like);
            }
            switch (index) {
                case kCoveredStart:
                    return result_covered(context, cursor->like,
                                          coverage_of(period, series.range).start, calendar);
                case kCoveredEnd:
                    return result_covered(context, cursor->like,
                                          coverage_of(period, series.range).end, calendar);
                case kSales: {
                    const PeriodCell* found = cell();
                    return sqlite3_result_int64(context, found ? found->rows : 0);
                }
                case kQty: {
                    if (!cursor->reading.has_qty) return sqlite3_result_null(context);
                    // SQLite names every column a scan reads in colUsed.
                    if (!cursor->reading.reads_qty) throw Error("qty was not read for this query");
                    const PeriodCell* found = cell();
                    return result_total(context, found, found ? found->qty.get() : nullptr);
                }
                case kAmount: {
                    const PeriodCell* found = cell();
                    return result_total(context, found, found ? &found->amount : nullptr);
                }
                default: {
                    sqlite3_value* argument = cursor->arguments[index - kFirstArgument];
                    if (argument) sqlite3_result_value(context, argument);
                    return;
                }
            }
        } catch (const Error& error) {
            std::string message = std::string(kName) + "(): " + error.what();
            sqlite3_result_error(context, message.c_str(), -1);
        }
    });
    return SQLITE_OK;
}

int rowid(sqlite3_vtab_cursor* base, sqlite3_int64* out) {
    *out = reinterpret_cast<Cursor*>(base)->row + 1;
    return SQLITE_OK;
}

sqlite3_module make_module() {
    sqlite3_module module{};
    module.iVersion = 0;
    module.xCreate = nullptr;  // eponymous only: no CREATE VIRTUAL TABLE
    module.xConnect = connect;
    module.xBestIndex = best_index;
    module.xDisconnect = disconnect;
    module.xOpen = open;
    module.xClose = close;
    module.xFilter = filter;
    module.xNext = next;
    module.xEof = eof;
    module.xColumn = column;
    module.xRowid = rowid;
    return module;
}

const sqlite3_module kModule = make_module();

}  // namespace

int register_period_totals_table(sqlite3* db) {
    int rc = register_source_reading(db);
    if (rc != SQLITE_OK) return rc;
    return sqlite3_create_module(db, kName, &kModule, nullptr);
}

}  // namespace almanac::sqlite
