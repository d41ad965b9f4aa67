// SPDX-License-Identifier: MIT
// period_totals(source, spec [, zone]): a table-valued function.
//
//  1. Reads the table or view named `source` once, without sorting it: its
//     columns ts and amount, and item and qty when it has them. `source` is
//     'name' or 'schema.name' ('main.sales', 'shop2.sales' of an ATTACHed
//     database); it is looked up with bound parameters and quoted as an
//     identifier in the one SELECT that reads it, never pasted into SQL.
//  2. Returns one row per item per period of `spec` (in `zone`, when given),
//     from the period of the earliest row to that of the latest, empty
//     periods included, in item order (SQLite's: NULL, numbers, TEXT, BLOBs)
//     then period order. Columns: item, period_start, period_end, label,
//     serial, sales, qty, amount; the arguments are the hidden columns
//     source, spec, zone.
//  3. sales is the number of rows; qty and amount are exact sums (as
//     exact_sum: INTEGER while every value is an INTEGER and the sum fits,
//     otherwise the correctly rounded REAL); 0 for an empty period, NULL for
//     a period whose rows hold only NULLs in that column.
//  4. A source without item is one group with item NULL; without qty, qty is
//     NULL. Rows whose ts is NULL are skipped.
//  5. period_start and period_end are in the representation of the earliest
//     row's ts (TEXT, Unix seconds or Julian day), as period_floor gives them.
//  6. Memory is O(items x periods): more than kMaxCells item-period rows is an
//     error, raised before the memory is taken.
//  7. A NULL source, spec or zone gives no rows. A missing source or spec, a
//     name that is not a table or view, a source without ts or amount, a ts
//     that is not a time value, an amount or qty that is not a number (TEXT
//     that SQLite does not read as a number, a BLOB, an infinity) is an error.
//  8. SQLITE_DIRECTONLY: not usable inside a view or trigger, because it
//     reads a table named by a value.
#include <cmath>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "arguments.h"
#include "core/stats/period_totals.h"
#include "core/text/error.h"
#include "core/time/common_form.h"
#include "period_context.h"
#include "registration.h"
#include "summand.h"

namespace almanac::sqlite {
namespace {

constexpr const char* kName = "period_totals";
constexpr const char* kPassName = "period_totals_pass";  // its reading step, an aggregate
// 48 bytes per item-period cell while it adds up (32 more when qty is
// read), with room to grow to at most twice that: about 1 GiB at the limit.
// Reports hold items x days, so the limit is set for a shop's catalogue:
// 5,000 items over five and a half years.
constexpr std::uint64_t kMaxCells = 10000000;

enum Column {
    kItem,
    kPeriodStart,
    kPeriodEnd,
    kLabel,
    kSerial,
    kSales,
    kQty,
    kAmount,
    kSource,
    kSpec,
    kZone
};
constexpr int kFirstArgument = kSource;
constexpr int kArguments = 3;
constexpr int kReadsQty = 1 << kArguments;  // an idxNum bit beside the argument bits

struct Table {
    sqlite3_vtab base{};
    sqlite3* db = nullptr;
};

struct Cursor {
    sqlite3_vtab_cursor base{};
    std::optional<PeriodCalendar> calendar;
    std::unique_ptr<PeriodTotals> totals;
    std::vector<std::size_t> order;
    bool has_qty = false;
    bool reads_qty = false;  // the query uses qty, so the pass read it
    TimeValue like;
    std::size_t item = 0;  // position in order
    Period current{};
    bool done = true;
    sqlite3_int64 row = 0;
    sqlite3_value* arguments[kArguments] = {nullptr, nullptr, nullptr};

    ~Cursor() { release_arguments(); }
    void release_arguments() {
        for (auto*& value : arguments) {
            sqlite3_value_free(value);
            value = nullptr;
        }
    }
};

// Finalizes a statement however the scope is left.
struct Statement {
    sqlite3_stmt* handle = nullptr;
    ~Statement() { sqlite3_finalize(handle); }
};

int set_error(sqlite3_vtab* table, const std::string& message) {
    sqlite3_free(table->zErrMsg);
    table->zErrMsg = sqlite3_mprintf("%s", message.c_str());
    return SQLITE_ERROR;
}

int connect(sqlite3* db, void*, int, const char* const*, sqlite3_vtab** out, char**) {
    int rc = sqlite3_declare_vtab(
        db,
        "CREATE TABLE x(item, period_start, period_end, label TEXT, serial INTEGER,"
        " sales INTEGER, qty, amount, source HIDDEN, spec HIDDEN, zone HIDDEN)");
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
    int where[kArguments] = {-1, -1, -1};
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
[[noreturn]] void raise_database_error(sqlite3* db) {
    if (sqlite3_errcode(db) == SQLITE_NOMEM) throw std::bad_alloc();
    throw SqlError(std::string(kName) + "(): " + sqlite3_errmsg(db));
}

// The columns of `name` in `schema` (any database, searched as SQLite
// searches, when schema is empty); empty when there is no such table or view.
std::vector<std::string> columns_of(sqlite3* db, const std::string& schema,
                                    const std::string& name) {
    Statement query;
    if (sqlite3_prepare_v2(db, "SELECT name FROM pragma_table_xinfo(?1, ?2)", -1, &query.handle,
                           nullptr) != SQLITE_OK)
        raise_database_error(db);
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
    if (rc != SQLITE_DONE) raise_database_error(db);
    return columns;
}

// The canonical name of an attached schema, or empty.
std::string schema_named(sqlite3* db, const std::string& name) {
    Statement query;
    if (sqlite3_prepare_v2(db,
                           "SELECT name FROM pragma_database_list WHERE name = ?1 COLLATE NOCASE",
                           -1, &query.handle, nullptr) != SQLITE_OK)
        raise_database_error(db);
    sqlite3_bind_text(query.handle, 1, name.data(), static_cast<int>(name.size()),
                      SQLITE_TRANSIENT);
    int rc = sqlite3_step(query.handle);
    if (rc == SQLITE_DONE) return {};
    if (rc != SQLITE_ROW) raise_database_error(db);
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

// The one SELECT that reads the source; which of item and qty it has.
struct SourceQuery {
    std::string sql;
    bool has_item = false;
    bool has_qty = false;
};

SourceQuery source_query(sqlite3* db, const ArgumentRef& source_arg, sqlite3_value* source,
                         bool wants_qty) {
    std::string text = *read_text(source_arg, source);
    // 'schema.name' when the part before the first dot is an attached
    // database holding such a table; otherwise the whole text is the name, so
    // a table whose name has a dot in it stays reachable.
    std::string schema, name = text;
    std::vector<std::string> columns;
    std::size_t dot = text.find('.');
    if (dot != std::string::npos) {
        std::string found = schema_named(db, text.substr(0, dot));
        if (!found.empty()) {
            columns = columns_of(db, found, text.substr(dot + 1));
            if (!columns.empty()) {
                schema = found;
                name = text.substr(dot + 1);
            }
        }
    }
    if (columns.empty()) columns = columns_of(db, "", text);
    if (columns.empty()) {
        raise_argument_error(source_arg, source,
                             "no table or view of that name (expected 'name' or 'schema.name')");
    }
    const char* wanted[] = {"ts", "amount", "item", "qty"};
    std::string found[4];
    for (const auto& column : columns) {
        for (int i = 0; i < 4; ++i) {
            if (found[i].empty() && same_word(column, wanted[i])) found[i] = column;
        }
    }
    for (int i = 0; i < 2; ++i) {
        if (found[i].empty()) {
            raise_argument_error(source_arg, source,
                                 std::string("the source has no column ") + wanted[i] +
                                     " (expected columns ts, amount, and optionally item, qty)");
        }
    }
    SourceQuery query;
    query.has_item = !found[2].empty();
    query.has_qty = !found[3].empty();
    // One aggregate call per row inside SQLite's own loop (see accumulate).
    query.sql = std::string("SELECT ") + kPassName + "(?1, " + quote_identifier(found[0]) + ", " +
                quote_identifier(found[1]) + ", " +
                (query.has_item ? quote_identifier(found[2]) : "NULL") + ", " +
                (query.has_qty && wants_qty ? quote_identifier(found[3]) : "NULL") + ") FROM ";
    if (!schema.empty()) query.sql += quote_identifier(schema) + ".";
    query.sql += quote_identifier(name);
    return query;
}

[[noreturn]] void raise_cell_error(const ArgumentRef& source_arg, sqlite3_value* source,
                                   const char* column, sqlite3_value* cell,
                                   const std::string& what_was_expected) {
    raise_argument_error(source_arg, source,
                         std::string("column ") + column + " holds " + describe_value(cell) + ": " +
                             what_was_expected);
}

// Adds one qty or amount value with exact_sum's rules (summand.h).
void add_value(CompactTotal& total, sqlite3_value* cell, const ArgumentRef& source_arg,
               sqlite3_value* source, const char* column) {
    Summand summand = read_summand(cell);
    switch (summand.kind) {
        case Summand::Kind::Null:
            return;
        case Summand::Kind::Integer:
            return total.add_integer(summand.integer);
        case Summand::Kind::Real:
            return total.add_real(summand.real);
        case Summand::Kind::Refused:
            raise_cell_error(source_arg, source, column, cell, summand.expected);
    }
}

// The item of one source row as PeriodTotals keys it.
struct ItemOfRow {
    ItemKey::Kind kind = ItemKey::Kind::Null;
    std::int64_t integer = 0;
    double real = 0;
    std::string_view bytes;
};

ItemOfRow item_of(sqlite3_value* item) {
    ItemOfRow read;
    switch (sqlite3_value_type(item)) {
        case SQLITE_INTEGER:
            read.kind = ItemKey::Kind::Integer;
            read.integer = sqlite3_value_int64(item);
            break;
        case SQLITE_FLOAT:
            read.kind = ItemKey::Kind::Real;
            read.real = sqlite3_value_double(item);
            break;
        case SQLITE_TEXT: {
            read.kind = ItemKey::Kind::Text;
            const char* text = reinterpret_cast<const char*>(sqlite3_value_text(item));
            read.bytes = std::string_view(text ? text : "",
                                          static_cast<std::size_t>(sqlite3_value_bytes(item)));
            break;
        }
        case SQLITE_BLOB: {
            read.kind = ItemKey::Kind::Blob;
            const char* blob = static_cast<const char*>(sqlite3_value_blob(item));
            read.bytes = std::string_view(blob ? blob : "",
                                          static_cast<std::size_t>(sqlite3_value_bytes(item)));
            break;
        }
        default:
            break;
    }
    return read;
}

// The period serial of a TEXT time in a common form on a calendar of UTC
// midnights, by day numbers alone (PeriodCalendar::utc_period_serial_of_day);
// nothing when the general path must answer.
std::optional<std::int64_t> serial_by_day_number(const PeriodCalendar& calendar,
                                                 sqlite3_value* ts) {
    if (!calendar.has_utc_midnights() || sqlite3_value_type(ts) != SQLITE_TEXT) return std::nullopt;
    const char* text = reinterpret_cast<const char*>(sqlite3_value_text(ts));
    auto day = common_form_day(
        std::string_view(text ? text : "", static_cast<std::size_t>(sqlite3_value_bytes(ts))));
    if (!day) return std::nullopt;
    return calendar.utc_period_serial_of_day(*day);
}

// What the pass needs, handed to its aggregate as a bound pointer.
struct Pass {
    Cursor* cursor = nullptr;
    const ArgumentRef* source_arg = nullptr;
    sqlite3_value* source = nullptr;
    bool reads_qty = false;
    bool have_like = false;
    std::int64_t like_serial = 0;
    std::string error;  // the first error, as the user sees it
};

// One source row (argv: the pass, ts, amount, item, qty) into the totals.
void add_row(Pass& pass, sqlite3_value** argv) {
    sqlite3_value* ts = argv[1];
    if (sqlite3_value_type(ts) == SQLITE_NULL) return;
    Cursor& cursor = *pass.cursor;
    const PeriodCalendar& calendar = *cursor.calendar;
    std::int64_t serial;
    try {
        auto quick = serial_by_day_number(calendar, ts);
        serial =
            quick ? *quick : calendar.serial_of(calendar.place_on_time_line(time_value_of(ts)));
        // Results are written like the earliest row's ts (period_floor's rule).
        if (!pass.have_like || serial < pass.like_serial) {
            cursor.like = time_value_of(ts);
            pass.like_serial = serial;
            pass.have_like = true;
        }
    } catch (const Error& error) {
        raise_cell_error(*pass.source_arg, pass.source, "ts", ts, error.what());
    }
    ItemOfRow item = item_of(argv[3]);
    PeriodCell* cell;
    try {
        cell = &cursor.totals->cell(item.kind, item.integer, item.real, item.bytes, serial);
    } catch (const Error& error) {
        raise_argument_error(*pass.source_arg, pass.source, error.what());
    }
    ++cell->rows;
    add_value(cell->amount, argv[2], *pass.source_arg, pass.source, "amount");
    if (pass.reads_qty) add_value(cell->qty_total(), argv[4], *pass.source_arg, pass.source, "qty");
}

constexpr const char* kPassPointer = "almanac.period_totals.pass";

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
        std::string message = std::string(kName) + "(): " + error.what();
        if (pass) pass->error = message;
        sqlite3_result_error(context, message.c_str(), -1);
    }
}

void pass_final(sqlite3_context* context) { sqlite3_result_null(context); }

// The one pass: every row of the source into the totals, by one aggregate
// query over the source (see pass_step).
void accumulate(sqlite3* db, Cursor& cursor, const ArgumentRef& source_arg, sqlite3_value* source,
                bool wants_qty) {
    SourceQuery query = source_query(db, source_arg, source, wants_qty);
    Statement statement;
    if (sqlite3_prepare_v2(db, query.sql.c_str(), static_cast<int>(query.sql.size()),
                           &statement.handle, nullptr) != SQLITE_OK)
        raise_database_error(db);
    cursor.has_qty = query.has_qty;
    cursor.reads_qty = wants_qty;
    Pass pass;
    pass.cursor = &cursor;
    pass.source_arg = &source_arg;
    pass.source = source;
    pass.reads_qty = query.has_qty && wants_qty;
    if (sqlite3_bind_pointer(statement.handle, 1, &pass, kPassPointer, nullptr) != SQLITE_OK)
        raise_database_error(db);
    int rc = sqlite3_step(statement.handle);
    if (rc == SQLITE_ROW) return;
    if (!pass.error.empty()) throw SqlError(pass.error);
    if (rc == SQLITE_NOMEM) throw std::bad_alloc();
    raise_database_error(db);
}

int filter(sqlite3_vtab_cursor* base, int mask, const char*, int argc, sqlite3_value** argv) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    auto* table = reinterpret_cast<Table*>(base->pVtab);
    cursor->release_arguments();
    cursor->totals.reset();
    cursor->order.clear();
    cursor->done = true;
    cursor->row = 0;
    sqlite3_value* given[kArguments] = {nullptr, nullptr, nullptr};
    for (int argument = 0, used = 0; argument < kArguments && used < argc; ++argument) {
        if (mask & (1 << argument)) given[argument] = argv[used++];
    }
    for (int argument = 0; argument < kArguments; ++argument) {
        if (given[argument]) cursor->arguments[argument] = sqlite3_value_dup(given[argument]);
    }
    static const char* names[kArguments] = {"source", "spec", "zone"};
    for (int argument = 0; argument < 2; ++argument) {
        if (!given[argument]) {
            return set_error(base->pVtab,
                             std::string(kName) + "(): " + names[argument] +
                                 " is missing; expected period_totals(source, spec [, zone])");
        }
    }
    try {
        for (int argument = 0; argument < kArguments; ++argument) {
            if (given[argument] && sqlite3_value_type(given[argument]) == SQLITE_NULL)
                return SQLITE_OK;
        }
        ArgumentRef source_arg{kName, 1, "source"}, spec_arg{kName, 2, "spec"},
            zone_arg{kName, 3, "zone"};
        cursor->calendar.emplace(
            make_calendar(spec_arg, given[1], given[2] ? &zone_arg : nullptr, given[2]));
        cursor->totals = std::make_unique<PeriodTotals>(kMaxCells);
        accumulate(table->db, *cursor, source_arg, given[0], (mask & kReadsQty) != 0);
        if (cursor->totals->empty()) return SQLITE_OK;
        cursor->order = cursor->totals->items_in_order();
        cursor->item = 0;
        cursor->current = cursor->calendar->period_by_serial(cursor->totals->first_serial());
        cursor->done = false;
        return SQLITE_OK;
    } catch (const std::bad_alloc&) {
        return SQLITE_NOMEM;
    } catch (const SqlError& error) {
        return set_error(base->pVtab, error.what());
    } catch (const std::exception& error) {
        return set_error(base->pVtab, std::string(kName) + "(): " + error.what());
    }
}

int next(sqlite3_vtab_cursor* base) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    ++cursor->row;
    try {
        if (cursor->current.serial < cursor->totals->last_serial()) {
            cursor->current = cursor->calendar->next(cursor->current);
            return SQLITE_OK;
        }
        if (++cursor->item >= cursor->order.size()) {
            cursor->done = true;
            return SQLITE_OK;
        }
        cursor->current = cursor->calendar->period_by_serial(cursor->totals->first_serial());
        return SQLITE_OK;
    } catch (const std::bad_alloc&) {
        return SQLITE_NOMEM;
    } catch (const std::exception& error) {
        return set_error(base->pVtab, std::string(kName) + "(): " + error.what());
    }
}

int eof(sqlite3_vtab_cursor* base) { return reinterpret_cast<Cursor*>(base)->done ? 1 : 0; }

void result_total(sqlite3_context* context, const PeriodCell* cell, const CompactTotal* total) {
    if (!cell) return sqlite3_result_int(context, 0);
    auto value = total ? total->value() : std::nullopt;
    if (!value) return sqlite3_result_null(context);
    if (value->is_integer) return sqlite3_result_int64(context, value->integer);
    sqlite3_result_double(context, value->real);
}

void result_item(sqlite3_context* context, const ItemKey& key) {
    switch (key.kind) {
        case ItemKey::Kind::Null:
            return sqlite3_result_null(context);
        case ItemKey::Kind::Integer:
            return sqlite3_result_int64(context, key.integer);
        case ItemKey::Kind::Real:
            return sqlite3_result_double(context, key.real);
        case ItemKey::Kind::Text:
            return sqlite3_result_text(context, key.bytes.data(),
                                       static_cast<int>(key.bytes.size()), SQLITE_TRANSIENT);
        case ItemKey::Kind::Blob:
            return sqlite3_result_blob(context, key.bytes.data(),
                                       static_cast<int>(key.bytes.size()), SQLITE_TRANSIENT);
    }
}

int column(sqlite3_vtab_cursor* base, sqlite3_context* context, int index) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    guarded(context, [&] {
        try {
            std::size_t item = cursor->order[cursor->item];
            switch (index) {
                case kItem:
                    return result_item(context, cursor->totals->item(item));
                case kPeriodStart:
                    return result_boundary(context, cursor->like, cursor->current.start,
                                           *cursor->calendar);
                case kPeriodEnd:
                    return result_boundary(context, cursor->like, cursor->current.end,
                                           *cursor->calendar);
                case kLabel: {
                    std::string label = cursor->calendar->label(cursor->current);
                    return sqlite3_result_text(context, label.c_str(),
                                               static_cast<int>(label.size()), SQLITE_TRANSIENT);
                }
                case kSerial:
                    return sqlite3_result_int64(context, cursor->current.serial);
                case kSales: {
                    PeriodCell* cell = cursor->totals->at(item, cursor->current.serial);
                    return sqlite3_result_int64(context, cell ? cell->rows : 0);
                }
                case kQty:
                    if (!cursor->has_qty) return sqlite3_result_null(context);
                    // SQLite names every column a scan reads in colUsed.
                    if (!cursor->reads_qty) throw Error("qty was not read for this query");
                    {
                        PeriodCell* cell = cursor->totals->at(item, cursor->current.serial);
                        return result_total(context, cell, cell ? cell->qty.get() : nullptr);
                    }
                case kAmount: {
                    PeriodCell* cell = cursor->totals->at(item, cursor->current.serial);
                    return result_total(context, cell, cell ? &cell->amount : nullptr);
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
    int rc = sqlite3_create_function(db, kPassName, 5, SQLITE_UTF8 | SQLITE_DIRECTONLY, nullptr,
                                     nullptr, pass_step, pass_final);
    if (rc != SQLITE_OK) return rc;
    return sqlite3_create_module(db, kName, &kModule, nullptr);
}

}  // namespace almanac::sqlite
