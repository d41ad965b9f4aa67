// SPDX-License-Identifier: MIT
// periods(start, stop, spec [, zone]): a table-valued function.
//
//  1. One row per period of `spec` that overlaps [start, stop), in order,
//     with columns period_start, period_end, label, serial. The arguments are
//     the hidden columns start, stop, spec, zone.
//  2. period_start and period_end are in the representation of `start`
//     (TEXT, Unix seconds or Julian day), as period_floor would give them.
//  3. Rows are produced one at a time as the cursor advances; nothing is
//     materialised, so a LIMIT stops the work.
//  4. A NULL start, stop, spec or zone gives no rows; stop <= start gives
//     no rows. A missing start, stop or spec, or a bad one, is an error
//     naming the argument.
//  5. Reading past the 10,000,000th row of one call is an error that says
//     how many periods the range holds (a mistyped range would otherwise run
//     for hours); a LIMIT below that never meets it.
#include <memory>
#include <optional>

#include "argument_table.h"
#include "arguments.h"
#include "core/text/error.h"
#include "core/time/period_cursor.h"
#include "period_context.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

constexpr const char* kName = "periods";

enum Column { kPeriodStart, kPeriodEnd, kLabel, kSerial, kStart, kStop, kSpec, kZone };
constexpr int kFirstArgument = kStart;
constexpr int kArguments = 4;

struct Cursor {
    sqlite3_vtab_cursor base{};
    std::optional<PeriodCalendar> calendar;
    TimeValue like;
    std::optional<PeriodCursor> range;  // walks *calendar; none when there are no rows
    sqlite3_int64 row = 0;
    sqlite3_value* arguments[kArguments] = {nullptr, nullptr, nullptr, nullptr};

    ~Cursor() { release_arguments(); }
    void release_arguments() {
        for (auto*& value : arguments) {
            sqlite3_value_free(value);
            value = nullptr;
        }
    }
};

int connect(sqlite3* db, void*, int, const char* const*, sqlite3_vtab** out, char**) {
    int rc =
        sqlite3_declare_vtab(db,
                             "CREATE TABLE x(period_start, period_end, label TEXT, serial INTEGER,"
                             " start HIDDEN, stop HIDDEN, spec HIDDEN, zone HIDDEN)");
    if (rc != SQLITE_OK) return rc;
    auto* table = static_cast<sqlite3_vtab*>(sqlite3_malloc(sizeof(sqlite3_vtab)));
    if (!table) return SQLITE_NOMEM;
    *table = sqlite3_vtab{};
    *out = table;
    sqlite3_vtab_config(db, SQLITE_VTAB_INNOCUOUS);
    return SQLITE_OK;
}

int disconnect(sqlite3_vtab* table) {
    sqlite3_free(table);
    return SQLITE_OK;
}

// idxNum has one bit per argument given as an equality constraint.
int best_index(sqlite3_vtab*, sqlite3_index_info* info) {
    int where[kArguments] = {-1, -1, -1, -1};
    for (int i = 0; i < info->nConstraint; ++i) {
        const auto& constraint = info->aConstraint[i];
        int argument = constraint.iColumn - kFirstArgument;
        if (argument < 0 || argument >= kArguments) continue;
        if (constraint.op != SQLITE_INDEX_CONSTRAINT_EQ) continue;
        // An argument that exists but cannot be used yet (it comes from a
        // table joined later) makes this plan unusable; SQLite tries another.
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
    info->idxNum = mask;
    info->estimatedCost = 1000;
    info->estimatedRows = 1000;
    // Rows come out in period order.
    if (info->nOrderBy == 1 && !info->aOrderBy[0].desc &&
        (info->aOrderBy[0].iColumn == kPeriodStart || info->aOrderBy[0].iColumn == kSerial)) {
        info->orderByConsumed = 1;
    }
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
    cursor->release_arguments();
    cursor->range.reset();
    cursor->row = 0;
    sqlite3_value* given[kArguments] = {nullptr, nullptr, nullptr, nullptr};
    for (int argument = 0, used = 0; argument < kArguments && used < argc; ++argument) {
        if (mask & (1 << argument)) given[argument] = argv[used++];
    }
    for (int argument = 0; argument < kArguments; ++argument) {
        if (given[argument]) cursor->arguments[argument] = sqlite3_value_dup(given[argument]);
    }
    static const char* names[kArguments] = {"start", "stop", "spec", "zone"};
    for (int argument = 0; argument < 3; ++argument) {
        if (!given[argument]) {
            return set_table_error(cursor->base.pVtab,
                                   std::string(kName) + "(): " + names[argument] +
                                       " is missing; expected periods(start, stop, spec [, zone])");
        }
    }
    try {
        ArgumentRef start_arg{kName, 1, "start"}, stop_arg{kName, 2, "stop"},
            spec_arg{kName, 3, "spec"}, zone_arg{kName, 4, "zone"};
        auto start = read_time(start_arg, given[0]);
        auto stop = read_time(stop_arg, given[1]);
        for (int argument = 2; argument < kArguments; ++argument) {
            if (given[argument] && sqlite3_value_type(given[argument]) == SQLITE_NULL)
                return SQLITE_OK;
        }
        cursor->range.reset();
        cursor->calendar.emplace(
            make_calendar(spec_arg, given[2], given[3] ? &zone_arg : nullptr, given[3]));
        if (!start || !stop) return SQLITE_OK;
        cursor->like = *start;
        cursor->range.emplace(*cursor->calendar, cursor->calendar->place_on_time_line(*start),
                              cursor->calendar->place_on_time_line(*stop));
        return SQLITE_OK;
    } catch (const std::bad_alloc&) {
        return SQLITE_NOMEM;
    } catch (const SqlError& error) {
        return set_table_error(cursor->base.pVtab, error.what());
    } catch (const std::exception& error) {
        return set_table_error(cursor->base.pVtab, std::string(kName) + "(): " + error.what());
    }
}

// Column values are computed as they are read; a failure there (a label past
// year 9999) must carry the table's name like every other message.
void result_column_error(sqlite3_context* context, const std::exception& error) {
    std::string message = std::string(kName) + "(): " + error.what();
    sqlite3_result_error(context, message.c_str(), -1);
}

int next(sqlite3_vtab_cursor* base) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    try {
        cursor->range->advance();
        ++cursor->row;
        return SQLITE_OK;
    } catch (const std::bad_alloc&) {
        return SQLITE_NOMEM;
    } catch (const Error& error) {
        // Past the limit of periods per call (core/time/period_cursor.h).
        try {
            return set_table_error(base->pVtab, std::string(kName) + "(): " + error.what());
        } catch (const std::bad_alloc&) {
            return SQLITE_NOMEM;
        }
    }
}

int eof(sqlite3_vtab_cursor* base) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    return !cursor->range || cursor->range->done() ? 1 : 0;
}

int column(sqlite3_vtab_cursor* base, sqlite3_context* context, int index) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    guarded(context, [&] {
        try {
            switch (index) {
                case kPeriodStart:
                    return result_boundary(context, cursor->like, cursor->range->current().start,
                                           *cursor->calendar);
                case kPeriodEnd:
                    return result_boundary(context, cursor->like, cursor->range->current().end,
                                           *cursor->calendar);
                case kLabel: {
                    std::string label = cursor->calendar->label(cursor->range->current());
                    return sqlite3_result_text(context, label.c_str(),
                                               static_cast<int>(label.size()), SQLITE_TRANSIENT);
                }
                case kSerial:
                    return sqlite3_result_int64(context, cursor->range->current().serial);
                default: {
                    sqlite3_value* argument = cursor->arguments[index - kFirstArgument];
                    if (argument) sqlite3_result_value(context, argument);
                    return;
                }
            }
        } catch (const Error& error) {
            result_column_error(context, error);
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

int register_periods_table(sqlite3* db) {
    return sqlite3_create_module(db, kName, &kModule, nullptr);
}

}  // namespace almanac::sqlite
