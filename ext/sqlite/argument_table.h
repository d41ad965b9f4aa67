// SPDX-License-Identifier: MIT
// The plumbing every eponymous table-valued function with hidden-column
// arguments shares (periods(), period_totals(), period_decomposition()):
// declaring the table, telling SQLite which arguments a scan was given,
// keeping them for the hidden columns, cursors, errors and the module.
// A table function supplies its schema, its Cursor (with a `base` member
// first and a `row` counter) and its filter, next, eof and column.
#pragma once

#include <new>
#include <string>

#include "sqlite_api.h"

namespace almanac::sqlite {

// The table object: SQLite's part and the connection it belongs to.
struct ArgumentTable {
    sqlite3_vtab base{};
    sqlite3* db = nullptr;
};
inline sqlite3* table_connection(sqlite3_vtab* table) {
    return reinterpret_cast<ArgumentTable*>(table)->db;
}

// Sets the table's error message; returns SQLITE_ERROR.
int set_table_error(sqlite3_vtab* table, const std::string& message);

// Declares `schema` and makes the table object. direct_only for a function
// that reads a table named by a value: a view or trigger must not be able to
// hide that from the user who runs it.
int connect_argument_table(sqlite3* db, const char* schema, bool direct_only, sqlite3_vtab** out);
int disconnect_argument_table(sqlite3_vtab* table);

// xBestIndex: the hidden columns first_argument .. first_argument + count − 1
// given as equality constraints become filter arguments, in column order,
// with one idxNum bit each (bit i: argument i was given). A full scan:
// expensive, so SQLite runs it once. extra_bits are or-ed into idxNum.
int best_index_for_arguments(sqlite3_index_info* info, int first_argument, int count,
                             int extra_bits = 0);

// The arguments of one scan, by position (nullptr: not given), kept as
// copies for the hidden columns.
template <int Count>
struct ScanArguments {
    sqlite3_value* given[Count] = {};  // the filter's own values, valid during filter
    sqlite3_value* kept[Count] = {};

    ScanArguments() = default;
    ScanArguments(const ScanArguments&) = delete;
    ScanArguments& operator=(const ScanArguments&) = delete;
    ~ScanArguments() { release(); }
    void release() {
        for (auto*& value : kept) {
            sqlite3_value_free(value);
            value = nullptr;
        }
    }
    // From xFilter's idxNum bits and argv.
    void take(int mask, int argc, sqlite3_value** argv) {
        release();
        for (int argument = 0, used = 0; argument < Count; ++argument) {
            given[argument] = nullptr;
            if (used < argc && (mask & (1 << argument))) given[argument] = argv[used++];
            if (given[argument]) kept[argument] = sqlite3_value_dup(given[argument]);
        }
    }
    // The hidden column's value: the argument as given, NULL when not given.
    void result(sqlite3_context* context, int argument) const {
        if (kept[argument]) sqlite3_result_value(context, kept[argument]);
    }
};

template <typename Cursor>
int open_cursor(sqlite3_vtab*, sqlite3_vtab_cursor** out) {
    auto* cursor = new (std::nothrow) Cursor();
    if (!cursor) return SQLITE_NOMEM;
    *out = &cursor->base;
    return SQLITE_OK;
}

template <typename Cursor>
int close_cursor(sqlite3_vtab_cursor* base) {
    delete reinterpret_cast<Cursor*>(base);
    return SQLITE_OK;
}

template <typename Cursor>
int cursor_rowid(sqlite3_vtab_cursor* base, sqlite3_int64* out) {
    *out = reinterpret_cast<Cursor*>(base)->row + 1;
    return SQLITE_OK;
}

// An eponymous-only module (no CREATE VIRTUAL TABLE) of those pieces.
template <typename Cursor>
sqlite3_module argument_table_module(decltype(sqlite3_module::xConnect) connect,
                                     decltype(sqlite3_module::xBestIndex) best_index,
                                     decltype(sqlite3_module::xFilter) filter,
                                     decltype(sqlite3_module::xNext) next,
                                     decltype(sqlite3_module::xEof) eof,
                                     decltype(sqlite3_module::xColumn) column) {
    sqlite3_module module{};
    module.iVersion = 0;
    module.xCreate = nullptr;
    module.xConnect = connect;
    module.xBestIndex = best_index;
    module.xDisconnect = disconnect_argument_table;
    module.xOpen = open_cursor<Cursor>;
    module.xClose = close_cursor<Cursor>;
    module.xFilter = filter;
    module.xNext = next;
    module.xEof = eof;
    module.xColumn = column;
    module.xRowid = cursor_rowid<Cursor>;
    return module;
}

}  // namespace almanac::sqlite
