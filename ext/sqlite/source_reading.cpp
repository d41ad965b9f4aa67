// SPDX-License-Identifier: MIT
#include "source_reading.h"

#include <new>
#include <string>

#include "argument_table.h"
#include "core/text/error.h"
#include "core/time/period_range.h"
#include "parallel_reading.h"
#include "reading_pass.h"
#include "sql_identifier.h"
#include "reading_threads.h"

namespace almanac::sqlite {
namespace {

// Finalizes a statement however the scope is left.
struct Statement {
    sqlite3_stmt* handle = nullptr;
    ~Statement() { sqlite3_finalize(handle); }
};

// A failed call on the connection: out of memory stays SQLITE_NOMEM for the
// caller (as every other function reports it), anything else is named.
[[noreturn]] void raise_database_error(sqlite3* db, const char* function) {
    if (sqlite3_errcode(db) == SQLITE_NOMEM) throw std::bad_alloc();
    throw SqlError(std::string(function) + "(): " + sqlite3_errmsg(db));
}

// The columns of `name` in `schema` (any database, searched as SQLite
// searches, when schema is empty); empty when there is no such table or view.
std::vector<std::string> columns_of(sqlite3* db, const char* function, const std::string& schema,
                                    const std::string& name) {
    Statement query;
    if (sqlite3_prepare_v2(db, "SELECT name FROM pragma_table_xinfo(?1, ?2)", -1, &query.handle,
                           nullptr) != SQLITE_OK)
        raise_database_error(db, function);
    sqlite3_bind_text(query.handle, 1, name.data(), static_cast<int>(name.size()),
                      SQLITE_TRANSIENT);
    if (!schema.empty()) {
        sqlite3_bind_text(query.handle, 2, schema.data(), static_cast<int>(schema.size()),
                          SQLITE_TRANSIENT);
    }
    std::vector<std::string> columns;
    int rc;
    while ((rc = sqlite3_step(query.handle)) == SQLITE_ROW) {
        const char* column = reinterpret_cast<const char*>(sqlite3_column_text(query.handle, 0));
        columns.emplace_back(column ? column : "");
    }
    if (rc != SQLITE_DONE) raise_database_error(db, function);
    return columns;
}

// The canonical name of an attached schema, or empty.
std::string schema_named(sqlite3* db, const char* function, const std::string& name) {
    Statement query;
    if (sqlite3_prepare_v2(db,
                           "SELECT name FROM pragma_database_list WHERE name = ?1 COLLATE NOCASE",
                           -1, &query.handle, nullptr) != SQLITE_OK)
        raise_database_error(db, function);
    sqlite3_bind_text(query.handle, 1, name.data(), static_cast<int>(name.size()),
                      SQLITE_TRANSIENT);
    int rc = sqlite3_step(query.handle);
    if (rc == SQLITE_DONE) return {};
    if (rc != SQLITE_ROW) raise_database_error(db, function);
    const char* found = reinterpret_cast<const char*>(sqlite3_column_text(query.handle, 0));
    return found ? found : "";
}

// The source as found: its schema (empty: SQLite's search order), its name,
// and the columns it has of those period totals read.
struct Source {
    std::string schema, name;
    enum { kTs, kAmount, kItem, kQty, kSegment, kWanted };
    std::string column[kWanted];  // empty: the source has no such column
    std::vector<std::string> all_columns;
};

Source find_source(sqlite3* db, const SourceRequest& request) {
    std::string text = *read_text(request.source_arg, request.source);
    // 'schema.name' when the part before the first dot is an attached
    // database holding such a table; otherwise the whole text is the name, so
    // a table whose name has a dot in it stays reachable.
    Source source;
    source.name = text;
    std::vector<std::string> columns;
    std::size_t dot = text.find('.');
    if (dot != std::string::npos) {
        std::string found = schema_named(db, request.function, text.substr(0, dot));
        if (!found.empty()) {
            columns = columns_of(db, request.function, found, text.substr(dot + 1));
            if (!columns.empty()) {
                source.schema = found;
                source.name = text.substr(dot + 1);
            }
        }
    }
    if (columns.empty()) columns = columns_of(db, request.function, "", text);
    if (columns.empty()) {
        raise_argument_error(request.source_arg, request.source,
                             "no table or view of that name (expected 'name' or 'schema.name')");
    }
    source.all_columns = columns;
    const char* wanted[Source::kWanted] = {"ts", "amount", "item", "qty", "segment"};
    for (const auto& column : columns) {
        for (int i = 0; i < Source::kWanted; ++i) {
            if (source.column[i].empty() && same_identifier(column, wanted[i])) source.column[i] = column;
        }
    }
    for (int i = 0; i < 2; ++i) {
        if (source.column[i].empty()) {
            raise_argument_error(
                request.source_arg, request.source,
                std::string("the source has no column ") + wanted[i] +
                    " (expected columns ts, amount, and optionally item, qty, segment)");
        }
    }
    return source;
}

// The SELECT that reads the source `from` (quoted): one aggregate call per
// row inside SQLite's own loop (reading_pass.h).
std::string pass_select(const Source& source, bool reads_qty, const std::string& from) {
    auto column = [&](int which, bool wanted) {
        return wanted && !source.column[which].empty() ? quote_identifier(source.column[which])
                                                       : std::string("NULL");
    };
    return std::string("SELECT ") + kPassName + "(?1, " + column(Source::kTs, true) + ", " +
           column(Source::kAmount, true) + ", " + column(Source::kItem, true) + ", " +
           column(Source::kQty, reads_qty) + ", " + column(Source::kSegment, true) + ") FROM " +
           from;
}

std::string quoted_source(const Source& source) {
    return (source.schema.empty() ? std::string() : quote_identifier(source.schema) + ".") +
           quote_identifier(source.name);
}

std::string source_prefix(const SourceRequest& request) {
    return std::string(request.source_arg.function) + "(): argument " +
           std::to_string(request.source_arg.position) + " (" + request.source_arg.name +
           ") = " + describe_value(request.source) + ": ";
}

}  // namespace

RangeBounds read_range(const ArgumentRef& start_arg, sqlite3_value* start,
                       const ArgumentRef& stop_arg, sqlite3_value* stop,
                       const PeriodCalendar& calendar) {
    RangeBounds bounds;
    auto start_value = start ? read_time(start_arg, start) : std::nullopt;
    auto stop_value = stop ? read_time(stop_arg, stop) : std::nullopt;
    auto place = [&](const ArgumentRef& arg, sqlite3_value* value,
                     const std::optional<TimeValue>& time) -> std::optional<Instant> {
        if (!time) return std::nullopt;
        try {
            return calendar.place_on_time_line(*time);
        } catch (const Error& error) {
            raise_argument_error(arg, value, error.what());
        }
    };
    bounds.start = place(start_arg, start, start_value);
    bounds.stop = place(stop_arg, stop, stop_value);
    if (bounds.start && bounds.stop && *bounds.stop < *bounds.start) {
        raise_argument_error(start_arg, start,
                             "expected a time not after stop (argument " +
                                 std::to_string(stop_arg.position) + " = " + describe_value(stop) +
                                 ")");
    }
    return bounds;
}

SourceReading read_source(sqlite3* db, const SourceRequest& request) {
    int threads = reading_threads(db);
    // Before anything reads the source's database (parallel_reading.h, WAL).
    SnapshotWitness witness;
    if (sqlite3_value_type(request.source) == SQLITE_TEXT) {
        const char* text = reinterpret_cast<const char*>(sqlite3_value_text(request.source));
        witness = watch_before_reading(db, text ? text : "", threads);
    }
    Source source = find_source(db, request);
    SourceReading reading;
    reading.has_item = !source.column[Source::kItem].empty();
    reading.has_qty = !source.column[Source::kQty].empty();
    reading.has_segment = !source.column[Source::kSegment].empty();
    reading.reads_qty = reading.has_qty && request.wants_qty;
    reading.totals = std::make_unique<PeriodTotals>(kMaxCells, reading.has_segment);
    Pass pass;
    pass.totals = reading.totals.get();
    pass.calendar = request.calendar;
    pass.bounds = request.bounds;
    pass.reads_qty = reading.reads_qty;
    pass.source_prefix = source_prefix(request);
    TableToSplit table{source.schema, source.name, source.all_columns,
                       [&](const std::string& from) {
                           return pass_select(source, reading.reads_qty, from);
                       }};
    int used = read_in_parallel(db, request.function, table, pass, threads, witness);
    if (used == 0) {
        PassResult result =
            run_pass(db, request.function, pass_select(source, reading.reads_qty, quoted_source(source)), pass);
        if (result.rc != SQLITE_OK) raise_pass_failure(result);
        used = 1;
    }
    note_threads_used(db, used);
    reading.totals->finish();
    try {
        reading.series = list_series(*reading.totals, [&](Instant earliest, Instant latest) {
            return covering_range(*request.calendar, request.bounds.start, request.bounds.stop,
                                  earliest, latest);
        });
    } catch (const Error& error) {
        throw SqlError(pass.source_prefix + error.what());
    }
    return reading;
}

int register_source_reading(sqlite3* db) {
    int rc = register_reading_pass(db);
    return rc == SQLITE_OK ? register_reading_threads(db) : rc;
}

int scan_failure(sqlite3_vtab* table, const char* function_name) {
    try {
        throw;
    } catch (const std::bad_alloc&) {
        return SQLITE_NOMEM;
    } catch (const Interrupted& error) {
        set_table_error(table, error.what());
        return SQLITE_INTERRUPT;
    } catch (const SqlError& error) {
        return set_table_error(table, error.what());
    } catch (const std::exception& error) {
        return set_table_error(table, std::string(function_name) + "(): " + error.what());
    }
}

}  // namespace almanac::sqlite
