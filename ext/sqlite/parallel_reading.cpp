// SPDX-License-Identifier: MIT
#include "parallel_reading.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <condition_variable>
#include <cstring>
#include <memory>
#include <mutex>
#include <optional>
#include <thread>

#include "arguments.h"
#include "core/text/error.h"
#include "sql_identifier.h"

namespace almanac::sqlite {
namespace {

// Each thread takes ranges one at a time, so a thread slowed by a denser
// range (gaps in the rowids) or by the machine is helped by the others.
constexpr std::uint64_t kRangesPerThread = 4;
// How often the calling thread looks for sqlite3_interrupt while it waits.
constexpr std::chrono::milliseconds kInterruptCheck{10};

// A prepared statement that is finalized however the scope is left.
struct Statement {
    sqlite3_stmt* handle = nullptr;
    Statement() = default;
    Statement(const Statement&) = delete;
    Statement& operator=(const Statement&) = delete;
    ~Statement() { sqlite3_finalize(handle); }
    bool prepare(sqlite3* db, const std::string& sql) {
        sqlite3_finalize(handle);
        handle = nullptr;
        return sqlite3_prepare_v2(db, sql.c_str(), static_cast<int>(sql.size()), &handle,
                                  nullptr) == SQLITE_OK;
    }
};

// The first column of the first row of `sql`, as text; nothing on failure.
std::optional<std::string> text_of(sqlite3* db, const std::string& sql) {
    Statement query;
    if (!query.prepare(db, sql) || sqlite3_step(query.handle) != SQLITE_ROW) return std::nullopt;
    const char* text = reinterpret_cast<const char*>(sqlite3_column_text(query.handle, 0));
    return std::string(text ? text : "");
}

// Where an unqualified name is found: temp, then main, then attached
// databases in order; the database must hold an ordinary table of that
// name (not a view, not a virtual table). Empty when it does not.
std::string schema_of_table(sqlite3* db, const TableToSplit& table) {
    std::vector<std::string> schemas;
    if (!table.schema.empty()) {
        schemas.push_back(table.schema);
    } else {
        Statement list;
        if (!list.prepare(db, "SELECT name FROM pragma_database_list ORDER BY seq = 1 DESC, seq"))
            return {};
        while (sqlite3_step(list.handle) == SQLITE_ROW) {
            const char* name = reinterpret_cast<const char*>(sqlite3_column_text(list.handle, 0));
            schemas.emplace_back(name ? name : "");
        }
    }
    for (const std::string& schema : schemas) {
        Statement query;
        std::string catalogue = schema == "temp" ? "sqlite_temp_schema" : "sqlite_schema";
        if (!query.prepare(db, "SELECT type, sql FROM " + quote_identifier(schema) + "." +
                                   catalogue + " WHERE name = ?1 COLLATE NOCASE AND type IN "
                                               "('table', 'view')"))
            return {};
        sqlite3_bind_text(query.handle, 1, table.name.data(), static_cast<int>(table.name.size()),
                          SQLITE_TRANSIENT);
        if (sqlite3_step(query.handle) != SQLITE_ROW) continue;
        const char* type = reinterpret_cast<const char*>(sqlite3_column_text(query.handle, 0));
        const char* sql = reinterpret_cast<const char*>(sqlite3_column_text(query.handle, 1));
        if (!type || std::strcmp(type, "table") != 0) return {};
        std::string head(sql ? sql : "");
        head = head.substr(0, 14);
        if (same_identifier(head, "CREATE VIRTUAL")) return {};
        return schema;
    }
    return {};
}

// A name for the rowid that no column of the table takes.
std::string rowid_name(const TableToSplit& table) {
    for (const char* name : {"rowid", "_rowid_", "oid"}) {
        bool taken = std::any_of(table.columns.begin(), table.columns.end(),
                                 [&](const std::string& column) { return same_identifier(column, name); });
        if (!taken) return name;
    }
    return {};
}

// A helper connection: read-only, same file, same VFS.
sqlite3* open_helper(const char* file, const char* vfs) {
    sqlite3* helper = nullptr;
    if (sqlite3_open_v2(file, &helper, SQLITE_OPEN_READONLY, vfs) != SQLITE_OK ||
        register_reading_pass(helper) != SQLITE_OK) {
        sqlite3_close(helper);
        return nullptr;
    }
    return helper;
}

std::optional<sqlite3_int64> data_version(sqlite3* witness) {
    Statement query;
    if (!query.prepare(witness, "PRAGMA data_version") || sqlite3_step(query.handle) != SQLITE_ROW)
        return std::nullopt;
    return sqlite3_column_int64(query.handle, 0);
}

struct Range {
    sqlite3_int64 rowids[2];  // first and last rowid, inclusive
};

// [first, last] cut into `count` consecutive ranges, in unsigned arithmetic
// so that no subtraction overflows.
std::vector<Range> cut(sqlite3_int64 first, sqlite3_int64 last, std::uint64_t count) {
    std::uint64_t span = static_cast<std::uint64_t>(last) - static_cast<std::uint64_t>(first);
    std::uint64_t step = span / count + 1;
    std::vector<Range> ranges;
    for (std::uint64_t i = 0; i < count; ++i) {
        std::uint64_t low = i * step;
        if (low > span) break;
        std::uint64_t high = low + step - 1 > span || i + 1 == count ? span : low + step - 1;
        ranges.push_back(Range{{static_cast<sqlite3_int64>(static_cast<std::uint64_t>(first) + low),
                                static_cast<sqlite3_int64>(static_cast<std::uint64_t>(first) + high)}});
    }
    return ranges;
}

// One thread's share: its connection (the caller's for the calling
// thread), its totals and calendar, its pass.
struct Reader {
    sqlite3* db = nullptr;  // owned for a helper: closed with it
    bool helper = false;
    Reader() = default;
    Reader(const Reader&) = delete;
    Reader& operator=(const Reader&) = delete;
    ~Reader() {
        if (helper) sqlite3_close(db);
    }
    std::string sql;        // the pass over one range of rowids
    std::unique_ptr<PeriodTotals> own_totals;
    std::optional<PeriodCalendar> calendar;
    Pass pass;
    std::thread thread;
    bool began = false;  // its read transaction is open (a helper)
};

// What the readers share: the next range to take, the first failure, and
// the count of helpers still at work.
struct Crew {
    std::vector<Range> ranges;
    std::atomic<std::size_t> next{0};
    std::atomic<bool> stop{false};
    std::mutex mutex;
    std::condition_variable changed;
    std::size_t failed_range = ~std::size_t{0};  // the lowest range that failed
    PassResult failure;
    int helpers_starting = 0;
    int helpers_running = 0;

    void fail(std::size_t range, PassResult result) {
        std::lock_guard<std::mutex> lock(mutex);
        if (range < failed_range) {
            failed_range = range;
            failure = std::move(result);
        }
    }
    // Ranges are read in order of their index; after a failure, only ranges
    // before it are still read (one of them may fail first in rowid order).
    std::optional<std::size_t> take() {
        if (stop.load()) return std::nullopt;
        std::size_t range = next.fetch_add(1);
        std::lock_guard<std::mutex> lock(mutex);
        if (range >= ranges.size() || range > failed_range) return std::nullopt;
        return range;
    }
};

// Reads ranges until none is left or one fails; returns SQLITE_OK or the failure's code.
int read_ranges(Crew& crew, Reader& reader, const char* function) {
    while (auto range = crew.take()) {
        PassResult result =
            run_pass(reader.db, function, reader.sql, reader.pass, crew.ranges[*range].rowids);
        if (result.rc != SQLITE_OK) {
            int rc = result.rc;
            crew.fail(*range, std::move(result));
            return rc;
        }
    }
    return SQLITE_OK;
}

// A helper's life: begin a read transaction (while the caller's is held),
// say so, read ranges until none is left, end it.
void helper_main(Crew& crew, Reader& reader, const char* function) {
    bool began = false;
    try {
        began = sqlite3_exec(reader.db, "BEGIN", nullptr, nullptr, nullptr) == SQLITE_OK &&
                sqlite3_exec(reader.db, "SELECT count(*) FROM main.sqlite_schema", nullptr,
                             nullptr, nullptr) == SQLITE_OK;
    } catch (...) {
        began = false;
    }
    {
        std::lock_guard<std::mutex> lock(crew.mutex);
        reader.began = began;
        --crew.helpers_starting;
    }
    crew.changed.notify_all();
    if (began) {
        try {
            read_ranges(crew, reader, function);
        } catch (...) {
            // run_pass builds messages: a failed allocation there is out of memory.
            PassResult nomem;
            nomem.rc = SQLITE_NOMEM;
            crew.fail(0, nomem);
        }
        sqlite3_exec(reader.db, "COMMIT", nullptr, nullptr, nullptr);
    }
    {
        std::lock_guard<std::mutex> lock(crew.mutex);
        --crew.helpers_running;
    }
    crew.changed.notify_all();
}

// The helpers of one read, stopped, joined and closed however the read
// ends: no thread outlives the statement.
struct Helpers {
    Crew crew;
    std::vector<std::unique_ptr<Reader>> readers;

    ~Helpers() { stop_all(); }
    void stop_all() {
        crew.stop = true;
        for (auto& reader : readers) {
            if (reader->thread.joinable()) sqlite3_interrupt(reader->db);
        }
        for (auto& reader : readers) {
            if (reader->thread.joinable()) reader->thread.join();
        }
        for (auto& reader : readers) {
            sqlite3_close(reader->db);
            reader->db = nullptr;
        }
    }
    // Waits until `done` holds, looking for an interrupt of the calling
    // connection meanwhile; false when it was interrupted.
    template <typename Done>
    bool wait(Statement& probe, Done done) {
        std::unique_lock<std::mutex> lock(crew.mutex);
        while (!done()) {
            if (crew.changed.wait_for(lock, kInterruptCheck, done)) break;
            lock.unlock();
            // A statement of the caller's stops with SQLITE_INTERRUPT while
            // the connection is interrupted (SQLite checks before it runs).
            int rc = sqlite3_step(probe.handle);
            sqlite3_reset(probe.handle);
            lock.lock();
            if (rc == SQLITE_INTERRUPT) return false;
        }
        return true;
    }
};

[[noreturn]] void raise_interrupted(const char* function) {
    throw Interrupted(std::string(function) + "(): interrupted");
}

}  // namespace

SnapshotWitness watch_before_reading(sqlite3* db, const std::string& source, int threads) {
    SnapshotWitness witness;
    std::size_t dot = source.find('.');
    if (threads < 2 || dot == std::string::npos) return witness;
    // Only an attached database named in the source: the statement's read
    // transaction on main began with the statement.
    std::string named = source.substr(0, dot);
    auto found = [&]() -> std::optional<std::string> {
        Statement list;
        if (!list.prepare(db, "SELECT name FROM pragma_database_list WHERE seq > 1 AND name = ?1"
                              " COLLATE NOCASE"))
            return std::nullopt;
        sqlite3_bind_text(list.handle, 1, named.data(), static_cast<int>(named.size()),
                          SQLITE_TRANSIENT);
        if (sqlite3_step(list.handle) != SQLITE_ROW) return std::nullopt;
        const char* name = reinterpret_cast<const char*>(sqlite3_column_text(list.handle, 0));
        return std::string(name ? name : "");
    }();
    if (!found || sqlite3_txn_state(db, found->c_str()) != SQLITE_TXN_NONE) return witness;
    const char* file = sqlite3_db_filename(db, found->c_str());
    sqlite3_vfs* vfs = nullptr;
    if (!file || !*file ||
        sqlite3_file_control(db, found->c_str(), SQLITE_FCNTL_VFS_POINTER, &vfs) != SQLITE_OK || !vfs)
        return witness;
    witness.connection.reset(open_helper(file, vfs->zName));
    if (!witness.connection) return witness;
    // WAL is recorded in the file itself, so the witness sees it too.
    auto journal = text_of(witness.connection.get(), "PRAGMA journal_mode");
    auto version = data_version(witness.connection.get());
    if (!journal || *journal != "wal" || !version) {
        witness.connection.reset();
        return witness;
    }
    witness.schema = *found;
    witness.version = *version;
    return witness;
}

int read_in_parallel(sqlite3* db, const char* function, const TableToSplit& table,
                     const Pass& prototype, int threads, const SnapshotWitness& witness) {
    if (threads < 2) return 0;
    std::string schema = schema_of_table(db, table);
    if (schema.empty() || same_identifier(schema, "temp")) return 0;
    const char* file = sqlite3_db_filename(db, schema.c_str());
    if (!file || !*file || sqlite3_uri_boolean(file, "nolock", 0)) return 0;
    sqlite3_vfs* vfs = nullptr;
    if (sqlite3_file_control(db, schema.c_str(), SQLITE_FCNTL_VFS_POINTER, &vfs) != SQLITE_OK ||
        !vfs || std::strcmp(vfs->zName, "memdb") == 0)
        return 0;
    int transaction = sqlite3_txn_state(db, schema.c_str());
    if (transaction == SQLITE_TXN_WRITE) return 0;
    std::string quoted_schema = quote_identifier(schema);
    auto journal = text_of(db, "PRAGMA " + quoted_schema + ".journal_mode");
    auto locking = text_of(db, "PRAGMA " + quoted_schema + ".locking_mode");
    auto uncommitted = text_of(db, "PRAGMA read_uncommitted");
    if (!journal || !locking || !uncommitted || *locking == "exclusive" || *uncommitted != "0")
        return 0;
    bool wal = *journal == "wal";
    // WAL: only with a witness that read the version before anything of
    // this statement read the database.
    if (wal && (!witness.connection || !same_identifier(witness.schema, schema))) return 0;
    std::string rowid = rowid_name(table);
    if (rowid.empty()) return 0;

    // The table's first and last rowid, each one descent of the b-tree (SQLite
    // answers a lone min() or max() of the rowid that way; both in one SELECT
    // would scan the table). The second is the pin: kept stepped until every
    // helper is done, it holds the caller's read transaction (and so, in
    // rollback mode, its SHARED lock).
    std::string from = quoted_schema + "." + quote_identifier(table.name);
    Statement lowest, pin;
    if (!lowest.prepare(db, "SELECT min(" + rowid + ") FROM " + from) ||
        !pin.prepare(db, "SELECT max(" + rowid + ") FROM " + from))
        return 0;  // a table without rowids
    if (sqlite3_step(pin.handle) != SQLITE_ROW || sqlite3_step(lowest.handle) != SQLITE_ROW ||
        sqlite3_column_type(pin.handle, 0) != SQLITE_INTEGER)
        return 0;  // empty, or a failure the one-thread read will meet and name
    sqlite3_int64 first = sqlite3_column_int64(lowest.handle, 0);
    sqlite3_int64 last = sqlite3_column_int64(pin.handle, 0);
    std::uint64_t span = static_cast<std::uint64_t>(last) - static_cast<std::uint64_t>(first);
    std::uint64_t wanted = std::min<std::uint64_t>(static_cast<std::uint64_t>(threads),
                                                   span / kMinRowidsPerThread);
    if (wanted < 2) return 0;
    Statement probe;
    if (!probe.prepare(db, "SELECT 1")) return 0;

    Helpers helpers;
    helpers.crew.ranges = cut(first, last, wanted * kRangesPerThread);
    std::string where = " WHERE " + rowid + " BETWEEN ?2 AND ?3";
    for (std::uint64_t i = 1; i < wanted; ++i) {
        auto reader = std::make_unique<Reader>();
        reader->helper = true;
        reader->db = open_helper(file, vfs->zName);
        if (!reader->db) break;  // the others read its share
        reader->sql = table.pass_select("main." + quote_identifier(table.name)) + where;
        reader->own_totals = std::make_unique<PeriodTotals>(kMaxCells, prototype.totals->has_segments());
        reader->calendar.emplace(*prototype.calendar);
        reader->pass = prototype;
        reader->pass.totals = reader->own_totals.get();
        reader->pass.calendar = &*reader->calendar;
        helpers.readers.push_back(std::move(reader));
    }
    if (helpers.readers.empty()) return 0;
    for (auto& reader : helpers.readers) {
        {
            std::lock_guard<std::mutex> lock(helpers.crew.mutex);
            ++helpers.crew.helpers_starting;
            ++helpers.crew.helpers_running;
        }
        try {
            reader->thread = std::thread(helper_main, std::ref(helpers.crew), std::ref(*reader), function);
        } catch (const std::system_error&) {
            std::lock_guard<std::mutex> lock(helpers.crew.mutex);
            --helpers.crew.helpers_starting;
            --helpers.crew.helpers_running;
        }
    }
    Crew& crew = helpers.crew;
    if (!helpers.wait(probe, [&] { return crew.helpers_starting == 0; }))
        raise_interrupted(function);
    if (wal) {
        auto version_after = data_version(witness.connection.get());
        if (!version_after || *version_after != witness.version) {
            // Somebody committed meanwhile: the snapshots may differ.
            helpers.stop_all();
            return 0;
        }
    }
    int used = 1;
    for (auto& reader : helpers.readers) used += reader->began ? 1 : 0;

    Reader caller;
    caller.db = db;
    caller.sql = table.pass_select(from) + where;
    caller.pass = prototype;
    // The caller's own ranges stop with SQLITE_INTERRUPT at the user's
    // sqlite3_interrupt; the helpers are stopped on the way out.
    if (read_ranges(crew, caller, function) == SQLITE_INTERRUPT) raise_interrupted(function);
    if (!helpers.wait(probe, [&] { return crew.helpers_running == 0; }))
        raise_interrupted(function);
    helpers.stop_all();
    if (crew.failed_range != ~std::size_t{0}) raise_pass_failure(crew.failure);
    try {
        for (auto& reader : helpers.readers) {
            if (reader->began) prototype.totals->merge(std::move(*reader->own_totals));
        }
    } catch (const Error& error) {
        throw SqlError(prototype.source_prefix + error.what());
    }
    return used;
}

}  // namespace almanac::sqlite
