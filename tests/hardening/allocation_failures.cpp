// SPDX-License-Identifier: MIT
// Allocation failures at every point. For each query of a representative set,
// SQLite's allocator (SQLITE_CONFIG_MALLOC) and the global operator new are
// made to fail at the 1st allocation, then the 2nd, the 3rd, ... until the
// query runs without reaching the failure. Twice: once failing only that
// allocation (later ones succeed, as after a transient shortage) and once
// failing it and every one after it (memory stays exhausted).
//
// Every run must end in the right answer (the rows of an undisturbed run) or
// in SQLITE_NOMEM; never another error, a crash, an exception through
// SQLite's C frames (that would terminate the program), or a leak: after the
// connection closes, the live allocations of both allocators are back to
// where they were before it opened.
//
// Global caches (the tz database, the zone cache) are filled by one
// undisturbed run of each query first: what is measured is the work of a
// query, and the one-time loading of the tz database is not retried here.
//
//   almanac_allocation_failures            prints the failure points exercised
#include <sqlite3.h>

#include <stdlib.h>  // mkdtemp
#include <unistd.h>  // rmdir

#include <algorithm>
#include <atomic>
#include <cstdio>
#include <cstdlib>
#include <new>
#include <string>
#include <string_view>
#include <vector>

#include "almanac.h"

namespace {

// One countdown for both allocators: the allocation that brings it to zero
// fails. Atomic, because a parallel read allocates on its helper threads too.
std::atomic<long> g_countdown{-1};  // negative: no failure planned
std::atomic<bool> g_persistent{false};
std::atomic<bool> g_failed{false};  // a planned failure happened in this run
std::atomic<long> g_live_sqlite{0};
std::atomic<long> g_live_new{0};

bool should_fail() {
    long count = g_countdown.load();
    while (count >= 0) {
        if (count == 0 && g_persistent) {
            g_failed = true;
            return true;
        }
        if (g_countdown.compare_exchange_weak(count, count == 0 ? -1 : count - 1)) {
            if (count > 0) return false;
            g_failed = true;
            return true;
        }
    }
    return false;
}

sqlite3_mem_methods g_default;

void* counting_malloc(int bytes) {
    if (should_fail()) return nullptr;
    void* p = g_default.xMalloc(bytes);
    if (p) ++g_live_sqlite;
    return p;
}
void counting_free(void* p) {
    if (p) --g_live_sqlite;
    g_default.xFree(p);
}
void* counting_realloc(void* p, int bytes) {
    if (should_fail()) return nullptr;
    return g_default.xRealloc(p, bytes);
}

void install_sqlite_allocator() {
    sqlite3_config(SQLITE_CONFIG_GETMALLOC, &g_default);
    sqlite3_mem_methods counting = g_default;
    counting.xMalloc = counting_malloc;
    counting.xFree = counting_free;
    counting.xRealloc = counting_realloc;
    sqlite3_config(SQLITE_CONFIG_MALLOC, &counting);
    // Without lookaside every small allocation of SQLite reaches the allocator.
    sqlite3_config(SQLITE_CONFIG_LOOKASIDE, 0, 0);
    sqlite3_initialize();
}

}  // namespace

// The global operator new, counted and failing on plan. The nothrow and array
// forms of the standard library call these.
void* operator new(std::size_t bytes) {
    if (should_fail()) throw std::bad_alloc();
    void* p = std::malloc(bytes ? bytes : 1);
    if (!p) throw std::bad_alloc();
    ++g_live_new;
    return p;
}
void operator delete(void* p) noexcept {
    if (p) --g_live_new;
    std::free(p);
}
void operator delete(void* p, std::size_t) noexcept { operator delete(p); }
void* operator new[](std::size_t bytes) { return operator new(bytes); }
void operator delete[](void* p) noexcept { operator delete(p); }
void operator delete[](void* p, std::size_t) noexcept { operator delete(p); }

namespace {

// Rows a report would hold: two items, daily across a daylight-saving change.
const char* const kData =
    "CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL);"
    "WITH RECURSIVE d(n) AS (SELECT 0 UNION ALL SELECT n + 1 FROM d WHERE n < 24) "
    "INSERT INTO sales SELECT datetime('2026-03-01 10:00', '+' || n || ' days', '+' || (n % 5) "
    "|| ' hours'), CASE n % 2 WHEN 0 THEN 'tea' ELSE 'cocoa' END, 1 + n % 4, "
    "round(2.5 + (n * 7 % 11) * 1.25, 2) FROM d;"
    // Totals far apart in magnitude, so period_totals' compact totals spill.
    "CREATE VIEW spread AS SELECT ts, item, qty, CASE WHEN rowid % 3 = 0 THEN amount * 1e300 "
    "ELSE amount * 1e-300 END AS amount FROM sales;";

// One query per function family: scalar and zoned periods, periods(),
// aggregates and sliding windows, order statistics, exponential weights, charts.
std::vector<std::string> queries() {
    return {
        "SELECT period_floor(ts, 'week'), period_end(ts, 'month'), period_label(ts, "
        "'half-month'), period_serial(ts, 'quarter starting april') FROM sales",
        "SELECT period_floor(ts, 'hour', 'America/Denver'), period_label(ts, '3 hours', "
        "'Europe/London'), period_shift(ts, 1, 'month', 'Australia/Lord_Howe') FROM sales",
        "SELECT valid_time(ts), valid_time('2026-02-30') FROM sales",
        "SELECT * FROM periods('2026-03-01', '2026-04-15', 'week', 'America/Denver')",
        "SELECT var_samp(amount), corr(amount, qty), regr_slope(amount, qty), "
        "slope_stderr(amount, qty) FROM sales GROUP BY item",
        "SELECT moving_mean(amount) OVER (ORDER BY ts ROWS 6 PRECEDING), "
        "stddev_samp(amount) OVER (PARTITION BY item ORDER BY ts ROWS BETWEEN 2 PRECEDING AND "
        "2 FOLLOWING) FROM sales",
        "SELECT median(amount) OVER (ORDER BY ts ROWS 7 PRECEDING), percentile_cont(amount, "
        "0.9) OVER (ORDER BY ts ROWS BETWEEN 3 PRECEDING AND CURRENT ROW EXCLUDE CURRENT ROW) "
        "FROM sales",
        "SELECT theil_sen_slope(amount, julianday(ts)), median(qty) FROM sales GROUP BY item",
        "SELECT ewma(amount, ts, '3 days') OVER (ORDER BY ts ROWS 10 PRECEDING) FROM sales",
        "SELECT sparkline(amount, ts) FROM sales GROUP BY item",
        "SELECT svg_line_chart(ts, amount, item, 'raw', '{\"title\":\"Sales <daily>\"}') FROM "
        "sales",
        "SELECT period_of_serial(period_serial(ts, 'week', 'America/Denver'), 'week', "
        "'America/Denver'), period_position(ts, 'day', 'week') FROM sales",
        "SELECT to_time(strftime('%d/%m/%Y %H:%M', ts), '%d/%m/%Y %H:%M', 'Europe/London'), "
        "to_time('45000.25', 'excel'), to_amount(printf('$%,.2f', amount * 1000)) FROM sales",
        "SELECT exact_sum(amount) OVER (ORDER BY ts ROWS 5 PRECEDING), exact_sum(qty) OVER "
        "(PARTITION BY item) FROM sales",
        "SELECT mann_kendall_p(amount, julianday(ts)), mann_kendall_p(amount, julianday(ts), "
        "strftime('%w', ts)), theil_sen_slope(amount, julianday(ts), strftime('%w', ts)), "
        "mad(amount) FROM sales",
        "SELECT mad(amount) OVER (ORDER BY ts ROWS 6 PRECEDING) FROM sales",
        "SELECT * FROM period_totals('sales', 'week')",
        "SELECT item, label, amount FROM period_totals('main.spread', 'day', 'America/Denver')",
        // Parallel reads (almanac_threads(3) on every connection): a WAL file, with its
        // witness, and a rollback-journal file with segments, zoned.
        "SELECT * FROM period_totals('wal.sales', 'week')",
        "SELECT segment, item, label, sales, amount FROM period_totals('journal.sales', 'day', "
        "'America/Denver')",
    };
}

// Two database files whose few rows are spread over 1,000,000 rowids, so that
// a read of them is split over threads (README: at least 50,000 rowids each).
std::string g_folder;
const char* const kFileData =
    "CREATE TABLE IF NOT EXISTS sales(ts TEXT, item TEXT, qty INTEGER, amount REAL, segment);"
    "WITH RECURSIVE d(n) AS (SELECT 0 UNION ALL SELECT n + 1 FROM d WHERE n < 59) "
    "INSERT INTO sales(rowid, ts, item, qty, amount, segment) SELECT (n * 7919) % 60 * 16661 + "
    "1, datetime('2026-03-01 10:00', '+' || (n * 11 % 30) || ' days', '+' || (n % 7) || "
    "' hours'), CASE n % 3 WHEN 0 THEN 'tea' WHEN 1 THEN 'cocoa' ELSE 'mate' END, 1 + n % 4, "
    "round(2.5 + (n * 7 % 11) * 1.25, 2), CASE n % 4 WHEN 0 THEN NULL ELSE 'shop ' || (n % 2) "
    "END FROM d;";

void make_files() {
    char folder[] = "/tmp/almanac_allocation_XXXXXX";
    if (!mkdtemp(folder)) std::exit(2);
    g_folder = folder;
    for (const char* name : {"wal", "journal"}) {
        sqlite3* db = nullptr;
        std::string path = g_folder + "/" + name + ".db";
        std::string mode = std::string("PRAGMA journal_mode=") + (name[0] == 'w' ? "wal;" : "delete;");
        if (sqlite3_open(path.c_str(), &db) != SQLITE_OK ||
            sqlite3_exec(db, (mode + kFileData).c_str(), nullptr, nullptr, nullptr) != SQLITE_OK) {
            std::fprintf(stderr, "making %s failed\n", path.c_str());
            std::exit(2);
        }
        sqlite3_close(db);
    }
}

void remove_files() {
    for (const char* name : {"wal.db", "journal.db", "wal.db-wal", "wal.db-shm"})
        std::remove((g_folder + "/" + name).c_str());
    rmdir(g_folder.c_str());
}

// The harness itself must not allocate while failures are planned (its own
// allocations would fail and be counted), so rows are written into a fixed buffer.
struct Outcome {
    int code = SQLITE_OK;
    char text[1 << 16];  // every row, columns separated by '|', rows by '\n'
    std::size_t length = 0;
    bool overflow = false;

    void append(const char* s) {
        for (; *s; ++s) {
            if (length + 1 >= sizeof text) {
                overflow = true;
                return;
            }
            text[length++] = *s;
        }
    }
    std::string_view rows() const { return std::string_view(text, length); }
};

// Opens a connection with the data, without planned failures.
sqlite3* open_connection() {
    sqlite3* db = nullptr;
    std::string attach = "ATTACH '" + g_folder + "/wal.db' AS wal; ATTACH '" + g_folder +
                         "/journal.db' AS journal; SELECT almanac_threads(3);";
    if (sqlite3_open(":memory:", &db) != SQLITE_OK || almanac_register(db) != SQLITE_OK ||
        sqlite3_exec(db, kData, nullptr, nullptr, nullptr) != SQLITE_OK ||
        sqlite3_exec(db, attach.c_str(), nullptr, nullptr, nullptr) != SQLITE_OK) {
        std::fprintf(stderr, "setting up a connection failed\n");
        std::exit(2);
    }
    return db;
}

// Whether the last read on db was split over threads.
bool read_in_parallel(sqlite3* db) {
    sqlite3_stmt* statement = nullptr;
    bool split = sqlite3_prepare_v2(db, "SELECT almanac_last_read_threads() > 1", -1, &statement,
                                    nullptr) == SQLITE_OK &&
                 sqlite3_step(statement) == SQLITE_ROW && sqlite3_column_int(statement, 0) == 1;
    sqlite3_finalize(statement);
    return split;
}

void run(sqlite3* db, const std::string& sql, Outcome& out) {
    out.length = 0;
    out.overflow = false;
    sqlite3_stmt* statement = nullptr;
    out.code = sqlite3_prepare_v2(db, sql.c_str(), -1, &statement, nullptr);
    if (out.code == SQLITE_OK) {
        while ((out.code = sqlite3_step(statement)) == SQLITE_ROW) {
            for (int i = 0; i < sqlite3_column_count(statement); ++i) {
                const unsigned char* text = sqlite3_column_text(statement, i);
                // NULL for a value that is not NULL: converting it ran out of memory.
                if (!text && sqlite3_column_type(statement, i) != SQLITE_NULL) {
                    out.code = SQLITE_NOMEM;
                    break;
                }
                out.append(text ? reinterpret_cast<const char*>(text) : "NULL");
                out.append("|");
            }
            if (out.code == SQLITE_NOMEM) break;
            out.append("\n");
        }
        if (out.code == SQLITE_DONE) out.code = SQLITE_OK;
    }
    if (out.code != SQLITE_OK) {
        out.length = 0;
        out.append(sqlite3_errmsg(db));
    }
    sqlite3_finalize(statement);
}

}  // namespace

int main() {
    install_sqlite_allocator();
    make_files();
    static Outcome expected, got;
    long points = 0, nomem = 0, right_answers = 0, problems = 0, parallel = 0;
    for (const std::string& sql : queries()) {
        // An undisturbed run fills the global caches and gives the right answer.
        sqlite3* db = open_connection();
        run(db, sql, expected);
        parallel += read_in_parallel(db);
        sqlite3_close(db);
        if (expected.code != SQLITE_OK || expected.overflow) {
            std::fprintf(stderr, "undisturbed run failed: %.*s\n  %s\n",
                         static_cast<int>(expected.length), expected.text, sql.c_str());
            return 2;
        }
        for (bool persistent : {false, true}) {
            for (long k = 0;; ++k) {
                long sqlite_before = g_live_sqlite, new_before = g_live_new;
                db = open_connection();
                g_persistent = persistent;
                g_failed = false;
                g_countdown = k;
                run(db, sql, got);
                g_countdown = -1;
                if (sqlite3_close(db) != SQLITE_OK) {
                    std::printf("close failed: %s\n", sqlite3_errmsg(db));
                    for (sqlite3_stmt* s = sqlite3_next_stmt(db, nullptr); s; s = sqlite3_next_stmt(db, s))
                        std::printf("  open statement: %s\n", sqlite3_sql(s));
                }
                ++points;
                const char* trouble = nullptr;
                if (got.code == SQLITE_OK) {
                    if (got.rows() != expected.rows())
                        trouble = "a wrong answer";
                    else
                        ++right_answers;
                } else if ((got.code & 0xff) == SQLITE_NOMEM && g_failed) {
                    ++nomem;
                } else {
                    trouble = "an error other than SQLITE_NOMEM";
                }
                long leaked_sqlite = g_live_sqlite - sqlite_before;
                long leaked_new = g_live_new - new_before;
                if (trouble || leaked_sqlite || leaked_new) {
                    ++problems;
                    std::printf(
                        "FAIL at allocation %ld (%s): %s; code %d: %.*s; live after close: "
                        "%ld SQLite, %ld operator new\n  %s\n",
                        k + 1, persistent ? "and every one after" : "only that one",
                        trouble ? trouble : "a leak", got.code,
                        static_cast<int>(std::min<std::size_t>(got.length, 300)), got.text,
                        leaked_sqlite, leaked_new, sql.c_str());
                }
                if (!g_failed) break;  // the query ran past every allocation it makes
            }
        }
    }
    remove_files();
    std::printf(
        "allocation failure points exercised: %ld (%ld ended in SQLITE_NOMEM, %ld in the "
        "right answer), problems: %ld; queries read in parallel: %ld\n",
        points, nomem, right_answers, problems, parallel);
    // The two parallel queries must really have been split, or they test nothing new.
    if (parallel != 2) std::printf("FAIL: %ld queries read in parallel, expected 2\n", parallel);
    return problems == 0 && parallel == 2 ? 0 : 1;
}
