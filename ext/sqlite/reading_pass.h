// SPDX-License-Identifier: MIT
// The pass: one SELECT over the source whose only result column is the
// aggregate period_totals_pass(?1, ts, amount, item, qty, segment), so each
// row is handed to almanac inside SQLite's own loop (no sqlite3_step and no
// sqlite3_column_* call per row, each of which takes the connection's mutex).
// ?1 is bound to a Pass (sqlite3_bind_pointer): what the rows go into.
// The same pass runs on the calling connection and, for a parallel read
// (parallel_reading.h), on each helper connection over a range of rowids.
#pragma once

#include <string>

#include "core/stats/period_totals.h"
#include "core/time/period_calendar.h"
#include "sqlite_api.h"
#include "source_reading.h"

namespace almanac::sqlite {

constexpr const char* kPassName = "period_totals_pass";

// What the pass needs, handed to its aggregate as a bound pointer. Nothing
// in it belongs to another thread's connection, so passes on helper
// connections read only their own.
struct Pass {
    PeriodTotals* totals = nullptr;
    const PeriodCalendar* calendar = nullptr;
    RangeBounds bounds;
    bool reads_qty = false;
    // "fn(): argument 1 (source) = 'sales': ", written once, so a message
    // needs nothing from the calling statement's values.
    std::string source_prefix;
    std::string error;  // the first error, as the user sees it
};

// The outcome of running a pass statement.
struct PassResult {
    int rc = SQLITE_OK;  // SQLITE_OK, or the code of the failure
    std::string error;   // its message as the user sees it (fn(): ...)
};

// Prepares `sql` on `db`, binds the pass (and, when given, rowids ?2 and ?3)
// and runs it to the end; never throws for a failure of the statement.
PassResult run_pass(sqlite3* db, const char* function, const std::string& sql, Pass& pass,
                    const sqlite3_int64* rowid_range = nullptr);

// Throws what a failed pass means for the caller: std::bad_alloc for
// SQLITE_NOMEM, Interrupted for SQLITE_INTERRUPT, SqlError otherwise.
[[noreturn]] void raise_pass_failure(const PassResult& result);

// Registers the aggregate on a connection (the calling one, or a helper's).
int register_reading_pass(sqlite3* db);

}  // namespace almanac::sqlite
