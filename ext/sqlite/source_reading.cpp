// SPDX-License-Identifier: MIT
#include "source_reading.h"

#include <string>

#include "core/text/error.h"
#include "core/time/common_form.h"
#include "core/time/period_range.h"
#include "summand.h"

namespace almanac::sqlite {
namespace {

constexpr const char* kPassName = "period_totals_pass";
constexpr const char* kPassPointer = "almanac.period_totals.pass";

// Finalizes a statement however the scope is left.
struct Statement {
    sqlite3_stmt* handle = nullptr;
    ~Statement() { sqlite3_finalize(handle); }
};

std::string quote_identifier(const std::string& name) {
    std::string quoted = "\"";
    for (char c : name) {
        if (c == '"') quoted += '"';
        quoted += c;
    }
    return quoted + "\"";
}

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

bool same_word(const std::string& a, const char* b) {
    std::size_t i = 0;
    for (; i < a.size() && b[i]; ++i) {
        char x = a[i], y = b[i];
        if (x >= 'A' && x <= 'Z') x = static_cast<char>(x - 'A' + 'a');
        if (x != y) return false;
    }
    return i == a.size() && !b[i];
}

// The source as found: its schema (empty: SQLite's search order), its name,
// and the columns it has of those period totals read.
struct Source {
    std::string schema, name;
    enum { kTs, kAmount, kItem, kQty, kSegment, kWanted };
    std::string column[kWanted];  // empty: the source has no such column
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
    const char* wanted[Source::kWanted] = {"ts", "amount", "item", "qty", "segment"};
    for (const auto& column : columns) {
        for (int i = 0; i < Source::kWanted; ++i) {
            if (source.column[i].empty() && same_word(column, wanted[i])) source.column[i] = column;
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

// The one SELECT that reads the source: one aggregate call per row inside
// SQLite's own loop (see pass_step).
std::string pass_query(const Source& source, bool reads_qty) {
    auto column = [&](int which, bool wanted) {
        return wanted && !source.column[which].empty() ? quote_identifier(source.column[which])
                                                       : std::string("NULL");
    };
    std::string sql = std::string("SELECT ") + kPassName + "(?1, " + column(Source::kTs, true) +
                      ", " + column(Source::kAmount, true) + ", " + column(Source::kItem, true) +
                      ", " + column(Source::kQty, reads_qty) + ", " +
                      column(Source::kSegment, true) + ") FROM ";
    if (!source.schema.empty()) sql += quote_identifier(source.schema) + ".";
    return sql + quote_identifier(source.name);
}

// What the pass needs, handed to its aggregate as a bound pointer.
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

// Runs the pass statement `sql` on `db` into pass.totals.
void run_pass(sqlite3* db, const char* function, const std::string& sql, Pass& pass) {
    Statement statement;
    if (sqlite3_prepare_v2(db, sql.c_str(), static_cast<int>(sql.size()), &statement.handle,
                           nullptr) != SQLITE_OK)
        raise_database_error(db, function);
    if (sqlite3_bind_pointer(statement.handle, 1, &pass, kPassPointer, nullptr) != SQLITE_OK)
        raise_database_error(db, function);
    int rc = sqlite3_step(statement.handle);
    if (rc == SQLITE_ROW) return;
    if (!pass.error.empty()) throw SqlError(pass.error);
    if (rc == SQLITE_NOMEM) throw std::bad_alloc();
    raise_database_error(db, function);
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
    run_pass(db, request.function, pass_query(source, reading.reads_qty), pass);
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
    return sqlite3_create_function(db, kPassName, 6, SQLITE_UTF8 | SQLITE_DIRECTONLY, nullptr,
                                   nullptr, pass_step, pass_final);
}

}  // namespace almanac::sqlite
