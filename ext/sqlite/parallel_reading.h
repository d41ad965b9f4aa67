// SPDX-License-Identifier: MIT
// Reading a source table on several threads at once, with exactly the
// answer of a one-thread read (README "Reading in parallel").
//
// Each helper thread has its own read-only connection to the same database
// file (the same VFS, the file name sqlite3_db_filename gives) and reads
// ranges of rowids into its own PeriodTotals; the calling thread reads ranges
// too, on the calling connection, and merges the helpers' totals into its
// own. Totals are exact, so the merge gives the same bits whatever the number
// of threads and whichever thread read which range.
//
// It only does so when every helper provably reads the statement's own
// snapshot; otherwise it reads nothing and the caller reads on one thread:
//  - a view, a virtual table, a table without rowids, a table of the temp
//    database, an in-memory database (no file name, or the memdb VFS), a
//    database opened with nolock=1;
//  - uncommitted changes of the calling connection in that database (its
//    transaction is a write transaction), or read_uncommitted (shared cache);
//  - locking_mode=exclusive on the calling connection;
//  - a rollback journal (DELETE, TRUNCATE, PERSIST, MEMORY, OFF): the calling
//    connection holds its SHARED lock from the moment it began reading until
//    every helper is done (a statement of its own keeps the read transaction
//    open), and no connection can commit while a SHARED lock is held, so the
//    file the helpers read is the file the statement read. A helper that
//    cannot get its SHARED lock (a writer is waiting for its EXCLUSIVE lock)
//    reads nothing; its ranges are read by the others.
//  - WAL: each reader sees the last commit before its own read transaction
//    began, so another connection may commit between the statement's start
//    and a helper's. A statement holds a read transaction on main from its
//    first step (SQLite checks the schema there), and on any database it has
//    read: when it began is unknown, so almanac falls back. For an ATTACHed
//    database named in the source ('shop2.sales') that the statement has
//    not read yet, a witness connection reads PRAGMA data_version before
//    anything of the statement reads that database and again once every
//    helper has begun its read transaction; the same value proves that
//    nobody committed in between, so all share one snapshot. A different
//    value: the helpers' totals are dropped and the caller reads on one
//    thread. (sqlite3_snapshot_get would compare snapshots directly, but
//    Debian's SQLite is built without SQLITE_ENABLE_SNAPSHOT.)
//  - fewer than kMinRowidsPerThread rowids per thread between the table's
//    first and last rowid (min(rowid) and max(rowid): two b-tree descents,
//    no count): the source is too small to gain.
//
// The statement owns its helpers: sqlite3_interrupt on the calling
// connection stops them (the caller checks while it waits), an error or an
// out-of-memory in a helper becomes the statement's error (SQLITE_NOMEM
// stays SQLITE_NOMEM; of several errors, the one of the lowest rowid range,
// which a one-thread read in rowid order would meet first), every thread is
// joined and every connection closed before it returns, and an allocation
// failure at any point leaves nothing running.
#pragma once

#include <cstdint>
#include <functional>
#include <memory>
#include <string>
#include <vector>

#include "reading_pass.h"

namespace almanac::sqlite {

constexpr std::uint64_t kMinRowidsPerThread = 50000;

struct TableToSplit {
    std::string schema;  // as the caller named it; empty: SQLite's search order
    std::string name;
    std::vector<std::string> columns;  // every column name (to name the rowid unambiguously)
    // The pass SELECT reading `from` (a quoted schema.table), without a WHERE clause.
    std::function<std::string(const std::string& from)> pass_select;
};

// WAL's witness: a connection of its own that read PRAGMA data_version of
// an ATTACHed database named in the source ('shop2.sales') before anything
// of this statement read that database. Empty otherwise (no WAL, main, ...).
struct SnapshotWitness {
    std::unique_ptr<sqlite3, int (*)(sqlite3*)> connection{nullptr, sqlite3_close};
    std::string schema;
    sqlite3_int64 version = 0;
};
// Called first, before the source is looked up (which reads its database).
SnapshotWitness watch_before_reading(sqlite3* db, const std::string& source, int threads);

// Reads every row of the table into *prototype.totals on up to `threads`
// threads and returns the number used; returns 0, having read nothing, when
// the caller must read on one thread. Throws as run_pass's failures do.
int read_in_parallel(sqlite3* db, const char* function, const TableToSplit& table,
                     const Pass& prototype, int threads, const SnapshotWitness& witness);

}  // namespace almanac::sqlite
