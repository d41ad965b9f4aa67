// SPDX-License-Identifier: MIT
#include "reading_pass.h"

#include <memory>
#include <string>

#include "arguments.h"
#include "core/text/error.h"
#include "core/time/common_form.h"
#include "summand.h"

namespace almanac::sqlite {
namespace {

constexpr const char* kPassPointer = "almanac.period_totals.pass";

[[noreturn]] void raise_cell_error(const Pass& pass, const char* column, sqlite3_value* cell,
                                   const std::string& what_was_expected) {
    throw SqlError(pass.source_prefix + "column " + column + " holds " + describe_value(cell) +
                   ": " + what_was_expected);
}

// Adds one qty or amount value with exact_sum's rules (summand.h).
void add_value(CompactTotal& total, sqlite3_value* cell, const Pass& pass, const char* column) {
    Summand summand = read_summand(cell);
    switch (summand.kind) {
        case Summand::Kind::Null:
            return;
        case Summand::Kind::Integer:
            return total.add_integer(summand.integer);
        case Summand::Kind::Real:
            return total.add_real(summand.real);
        case Summand::Kind::Refused:
            raise_cell_error(pass, column, cell, summand.expected);
    }
}

// An item or segment of one source row as PeriodTotals keys it.
ValueView value_view_of(sqlite3_value* value) {
    ValueView read;
    switch (sqlite3_value_type(value)) {
        case SQLITE_INTEGER:
            read.kind = ValueKey::Kind::Integer;
            read.integer = sqlite3_value_int64(value);
            break;
        case SQLITE_FLOAT:
            read.kind = ValueKey::Kind::Real;
            read.real = sqlite3_value_double(value);
            break;
        case SQLITE_TEXT: {
            read.kind = ValueKey::Kind::Text;
            const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
            read.bytes = std::string_view(text ? text : "",
                                          static_cast<std::size_t>(sqlite3_value_bytes(value)));
            break;
        }
        case SQLITE_BLOB: {
            read.kind = ValueKey::Kind::Blob;
            const char* blob = static_cast<const char*>(sqlite3_value_blob(value));
            read.bytes = std::string_view(blob ? blob : "",
                                          static_cast<std::size_t>(sqlite3_value_bytes(value)));
            break;
        }
        default:
            break;
    }
    return read;
}

// A row's time: its instant, its period serial and how it was written.
struct RowTime {
    Instant t;
    std::int64_t serial;
};

// The common TEXT forms at fixed places (core/time/common_form.h); on a
// calendar of UTC midnights the serial by day numbers alone. Nothing when
// the general reader must answer.
bool read_common_time(const PeriodCalendar& calendar, sqlite3_value* ts, RowTime& row) {
    if (sqlite3_value_type(ts) != SQLITE_TEXT) return false;
    const char* text = reinterpret_cast<const char*>(sqlite3_value_text(ts));
    CommonForm form;
    if (!read_common_form(
            std::string_view(text ? text : "", static_cast<std::size_t>(sqlite3_value_bytes(ts))),
            form))
        return false;
    date::local_days day{date::days{form.day}};
    // A bare date is a day on the calendar's clock; a date-time without an
    // offset is UTC (README "Time values").
    if (form.precision == TextForm::Precision::Date && !calendar.clock().is_utc()) {
        row.t = calendar.start_of_day(day);
    } else {
        row.t = Instant{Millis{form.day * 86400000 + form.millis_of_day}};
    }
    if (calendar.has_utc_midnights()) {
        auto serial = calendar.utc_period_serial_of_day(day);
        if (!serial) return false;
        row.serial = *serial;
    } else {
        row.serial = calendar.serial_of(row.t);
    }
    return true;
}

// One source row (argv: the pass, ts, amount, item, qty, segment) into the totals.
void add_row(Pass& pass, sqlite3_value** argv) {
    sqlite3_value* ts = argv[1];
    if (sqlite3_value_type(ts) == SQLITE_NULL) return;
    const PeriodCalendar& calendar = *pass.calendar;
    RowTime row;
    bool common = false;
    try {
        common = read_common_time(calendar, ts, row);
        TimeValue value;
        if (!common) {
            value = time_value_of(ts);
            row.t = calendar.place_on_time_line(value);
            row.serial = calendar.serial_of(row.t);
        }
        if (pass.bounds.start && row.t < *pass.bounds.start) return;
        if (pass.bounds.stop && row.t >= *pass.bounds.stop) return;
        // Results are written like the earliest row's ts (period_floor's rule).
        if (pass.totals->is_new_earliest(row.t)) {
            if (common) {
                pass.totals->set_earliest_form(row.t, Representation::Text, false);
            } else {
                pass.totals->set_earliest_form(row.t, value.representation, value.integer_input);
            }
        }
    } catch (const Error& error) {
        raise_cell_error(pass, "ts", ts, error.what());
    }
    PeriodCell* cell;
    try {
        cell = &pass.totals->cell(value_view_of(argv[5]), value_view_of(argv[3]), row.serial,
                                  row.t);
    } catch (const Error& error) {
        throw SqlError(pass.source_prefix + error.what());
    }
    ++cell->rows;
    add_value(cell->amount, argv[2], pass, "amount");
    if (pass.reads_qty) add_value(cell->qty_total(), argv[4], pass, "qty");
}

// The pass's aggregate step. Running inside SQLite's loop, it gets each
// row's values directly: no sqlite3_step and no sqlite3_column_* call (each
// takes the connection's mutex) per row. Called from SQL by anybody else,
// it finds no pass pointer (SQL cannot make one) and refuses.
void pass_step(sqlite3_context* context, int, sqlite3_value** argv) {
    auto* pass = static_cast<Pass*>(sqlite3_value_pointer(argv[0], kPassPointer));
    try {
        if (!pass) {
            raise_argument_error(ArgumentRef{kPassName, 1, "pass"}, argv[0],
                                 "expected the pass of a running period_totals(), whose own "
                                 "reading step this is; call period_totals() instead");
        }
        add_row(*pass, argv);
    } catch (const std::bad_alloc&) {
        sqlite3_result_error_nomem(context);
    } catch (const SqlError& error) {
        if (pass) pass->error = error.what();
        sqlite3_result_error(context, error.what(), -1);
    } catch (const std::exception& error) {
        std::string message = pass ? pass->source_prefix + error.what()
                                   : std::string(kPassName) + "(): " + error.what();
        if (pass) pass->error = message;
        sqlite3_result_error(context, message.c_str(), -1);
    }
}

void pass_final(sqlite3_context* context) { sqlite3_result_null(context); }

}  // namespace

PassResult run_pass(sqlite3* db, const char* function, const std::string& sql, Pass& pass,
                    const sqlite3_int64* rowid_range) {
    PassResult result;
    // Finalized however this is left: a message that cannot be allocated
    // must not leave the statement (and so the connection) open.
    std::unique_ptr<sqlite3_stmt, int (*)(sqlite3_stmt*)> statement(nullptr, sqlite3_finalize);
    sqlite3_stmt* prepared = nullptr;
    int rc = sqlite3_prepare_v2(db, sql.c_str(), static_cast<int>(sql.size()), &prepared, nullptr);
    statement.reset(prepared);
    if (rc == SQLITE_OK) rc = sqlite3_bind_pointer(prepared, 1, &pass, kPassPointer, nullptr);
    if (rc == SQLITE_OK && rowid_range) rc = sqlite3_bind_int64(prepared, 2, rowid_range[0]);
    if (rc == SQLITE_OK && rowid_range) rc = sqlite3_bind_int64(prepared, 3, rowid_range[1]);
    if (rc == SQLITE_OK) {
        rc = sqlite3_step(prepared);
        if (rc == SQLITE_ROW) rc = SQLITE_OK;
    }
    if (rc == SQLITE_OK) return result;
    result.rc = rc;
    try {
        if (!pass.error.empty()) {
            result.error = pass.error;
        } else {
            // The connection's message, before finalize can change it.
            if (sqlite3_errcode(db) == SQLITE_NOMEM) result.rc = SQLITE_NOMEM;
            result.error = std::string(function) + "(): " + sqlite3_errmsg(db);
        }
    } catch (const std::bad_alloc&) {
        result.rc = SQLITE_NOMEM;
        result.error.clear();
    }
    return result;
}

void raise_pass_failure(const PassResult& result) {
    if (result.rc == SQLITE_NOMEM) throw std::bad_alloc();
    if (result.rc == SQLITE_INTERRUPT) throw Interrupted(result.error);
    throw SqlError(result.error);
}

int register_reading_pass(sqlite3* db) {
    return sqlite3_create_function(db, kPassName, 6, SQLITE_UTF8 | SQLITE_DIRECTONLY, nullptr,
                                   nullptr, pass_step, pass_final);
}

}  // namespace almanac::sqlite
