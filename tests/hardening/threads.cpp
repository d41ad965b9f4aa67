// SPDX-License-Identifier: MIT
// Eight threads, each with its own connection, run a mix of zoned period
// queries, window statistics, charts and periods() for a bounded time; every
// result must equal the one a single thread got for the same query first.
// Built with ThreadSanitizer by tests/run.sh, which then also reports any data
// race on almanac's shared state (the zone cache, the tz database, statics).
//
// Two of the queries read a file database whose few rows are spread over
// 1,000,000 rowids, with almanac_threads(3): each of those reads is split
// over helper threads of its own (README "Reading in parallel"), so helpers
// of different statements run side by side with everything else.
//
//   almanac_threads [seconds]      default 20
#include <sqlite3.h>
#include <stdlib.h>  // mkdtemp
#include <unistd.h>  // rmdir

#include <atomic>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <thread>
#include <vector>

#include "almanac.h"

namespace {

const char* const kData =
    "CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL);"
    "WITH RECURSIVE d(n) AS (SELECT 0 UNION ALL SELECT n + 1 FROM d WHERE n < 399) "
    "INSERT INTO sales SELECT datetime('2026-01-01 06:00', '+' || (n * 7) || ' hours'), "
    "CASE n % 3 WHEN 0 THEN 'tea' WHEN 1 THEN 'cocoa' ELSE 'mate' END, 1 + n % 4, "
    "round(3 + (n * 13 % 17) * 0.75, 2) FROM d;";

// Zones are spread over the queries so threads meet in the zone cache.
const char* const kQueries[] = {
    "SELECT period_label(ts, 'hour', 'America/Denver'), period_floor(ts, 'day', "
    "'Europe/London') FROM sales",
    "SELECT period_serial(ts, 'week', 'Australia/Lord_Howe'), period_end(ts, 'half-month', "
    "'Asia/Kathmandu') FROM sales",
    "SELECT period_shift(ts, 3, 'month', 'America/Santiago'), period_label(ts, '15 minutes', "
    "'Pacific/Chatham') FROM sales",
    "SELECT * FROM periods('2026-01-01', '2026-06-01', 'day', 'America/Denver')",
    "SELECT * FROM periods('2025-01-01', '2027-01-01', 'week', 'Europe/Berlin')",
    "SELECT moving_mean(amount) OVER (PARTITION BY item ORDER BY ts ROWS 13 PRECEDING), "
    "median(amount) OVER (ORDER BY ts ROWS BETWEEN 10 PRECEDING AND 10 FOLLOWING) FROM sales",
    "SELECT item, var_samp(amount), regr_slope(amount, julianday(ts)), theil_sen_slope(amount, "
    "julianday(ts)) FROM sales GROUP BY item",
    "SELECT ewma(amount, ts, '2 days') OVER (ORDER BY ts ROWS 30 PRECEDING), "
    "percentile_cont(amount, 0.25) OVER (ORDER BY ts ROWS 20 PRECEDING) FROM sales",
    "SELECT item, sparkline(amount, ts) FROM sales GROUP BY item",
    "SELECT svg_line_chart(period_floor(ts, 'day', 'America/Denver'), amount, item, 'smooth', "
    "'{\"title\":\"Daily\"}') FROM sales",
    "SELECT to_time(strftime('%d/%m/%Y %H:%M', ts), '%d/%m/%Y %H:%M', 'America/Santiago'), "
    "period_of_serial(period_serial(ts, 'day', 'Asia/Kathmandu'), 'day', 'Asia/Kathmandu'), "
    "period_position(ts, 'hour', 'day', 'Europe/London') FROM sales",
    "SELECT item, exact_sum(amount), mad(amount), mann_kendall_p(amount, julianday(ts), "
    "strftime('%w', ts)) FROM sales GROUP BY item",
    "SELECT * FROM period_totals('sales', 'week')",
    "SELECT item, label, sales, amount FROM period_totals('sales', '3 hours', 'America/Denver')",
    "SELECT svg_bar_chart(label, amount, item) FROM period_totals('sales', 'month')",
    "SELECT * FROM period_totals('shop.sales', 'week')",
    "SELECT segment, item, label, sales, amount FROM period_totals('shop.sales', 'hour', "
    "'America/Denver')",
};

const char* const kFileData =
    "PRAGMA journal_mode=wal;"
    "CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL, segment);"
    "WITH RECURSIVE d(n) AS (SELECT 0 UNION ALL SELECT n + 1 FROM d WHERE n < 299) "
    "INSERT INTO sales(rowid, ts, item, qty, amount, segment) SELECT (n * 7919) % 300 * 3331 + 1, "
    "datetime('2026-03-01 06:00', '+' || (n * 7) || ' hours'), CASE n % 3 WHEN 0 THEN 'tea' "
    "WHEN 1 THEN 'cocoa' ELSE 'mate' END, 1 + n % 4, round(3 + (n * 13 % 17) * 0.75, 2), "
    "'shop ' || (n % 2) FROM d;";
std::string g_folder;
constexpr std::size_t kQueryCount = sizeof kQueries / sizeof kQueries[0];

sqlite3* open_connection() {
    sqlite3* db = nullptr;
    std::string attach = "ATTACH '" + g_folder + "/shop.db' AS shop; SELECT almanac_threads(3);";
    if (sqlite3_open(":memory:", &db) != SQLITE_OK || almanac_register(db) != SQLITE_OK ||
        sqlite3_exec(db, kData, nullptr, nullptr, nullptr) != SQLITE_OK ||
        sqlite3_exec(db, attach.c_str(), nullptr, nullptr, nullptr) != SQLITE_OK) {
        std::fprintf(stderr, "setting up a connection failed\n");
        std::exit(2);
    }
    return db;
}

std::string answer(sqlite3* db, const char* sql) {
    sqlite3_stmt* statement = nullptr;
    std::string out;
    if (sqlite3_prepare_v2(db, sql, -1, &statement, nullptr) != SQLITE_OK)
        return std::string("error: ") + sqlite3_errmsg(db);
    int rc;
    while ((rc = sqlite3_step(statement)) == SQLITE_ROW) {
        for (int i = 0; i < sqlite3_column_count(statement); ++i) {
            const unsigned char* text = sqlite3_column_text(statement, i);
            out += text ? reinterpret_cast<const char*>(text) : "NULL";
            out += '|';
        }
        out += '\n';
    }
    if (rc != SQLITE_DONE) out += std::string("error: ") + sqlite3_errmsg(db);
    sqlite3_finalize(statement);
    return out;
}

}  // namespace

int main(int argc, char** argv) {
    double seconds = argc > 1 ? std::atof(argv[1]) : 20.0;
    constexpr int kThreads = 8;
    char folder[] = "/tmp/almanac_threads_XXXXXX";
    if (!mkdtemp(folder)) return 2;
    g_folder = folder;
    {
        sqlite3* db = nullptr;
        if (sqlite3_open((g_folder + "/shop.db").c_str(), &db) != SQLITE_OK ||
            sqlite3_exec(db, kFileData, nullptr, nullptr, nullptr) != SQLITE_OK) {
            std::fprintf(stderr, "making the shop database failed\n");
            return 2;
        }
        sqlite3_close(db);
    }

    // A fresh process: the first thread to ask for a zone may race the
    // others into the tz database, so the threads start before anything is
    // loaded, and the single-threaded answers come from a second pass.
    std::atomic<bool> go{false};
    std::atomic<long> runs{0}, mismatches{0};
    std::vector<std::vector<std::string>> first(kThreads);
    std::vector<std::thread> threads;
    auto deadline = std::chrono::steady_clock::now() +
                    std::chrono::milliseconds(static_cast<long>(seconds * 1000));
    for (int t = 0; t < kThreads; ++t) {
        threads.emplace_back([&, t] {
            sqlite3* db = open_connection();
            while (!go.load()) std::this_thread::yield();
            std::vector<std::string> answers;
            // Each thread walks the queries from its own starting point.
            for (std::size_t i = 0; answers.size() < kQueryCount; ++i)
                answers.push_back(answer(db, kQueries[(i + t) % kQueryCount]));
            // Rotate back so answers[q] belongs to kQueries[q].
            first[t].resize(kQueryCount);
            for (std::size_t i = 0; i < kQueryCount; ++i)
                first[t][(i + t) % kQueryCount] = answers[i];
            std::size_t i = t;
            while (std::chrono::steady_clock::now() < deadline) {
                std::size_t q = i++ % kQueryCount;
                if (answer(db, kQueries[q]) != first[t][q]) ++mismatches;
                ++runs;
            }
            sqlite3_close(db);
        });
    }
    go = true;
    for (auto& thread : threads) thread.join();

    sqlite3* db = open_connection();
    long differ = 0;
    for (std::size_t q = 0; q < kQueryCount; ++q) {
        std::string single = answer(db, kQueries[q]);
        if (single.rfind("error: ", 0) == 0 || single.find("\nerror: ") != std::string::npos) {
            std::printf("FAIL: query %zu fails single-threaded: %s\n", q, single.c_str());
            ++differ;
        }
        for (int t = 0; t < kThreads; ++t)
            if (first[t][q] != single) {
                std::printf("FAIL: thread %d's first answer to query %zu differs\n", t, q);
                ++differ;
            }
    }
    // The shop's reads were split, or they test nothing new.
    answer(db, "SELECT count(*) FROM period_totals('shop.sales', 'week')");
    if (answer(db, "SELECT almanac_last_read_threads()") != "3|\n") {
        std::printf("FAIL: the shop's read was not split over 3 threads\n");
        ++differ;
    }
    sqlite3_close(db);
    for (const char* name : {"shop.db", "shop.db-wal", "shop.db-shm"})
        std::remove((g_folder + "/" + name).c_str());
    rmdir(g_folder.c_str());
    std::printf(
        "%d threads, %.0f s: %ld queries run, %ld answers differed from the first, %ld "
        "first answers differed from a single-threaded run\n",
        kThreads, seconds, runs.load(), mismatches.load(), differ);
    return mismatches == 0 && differ == 0 ? 0 : 1;
}
