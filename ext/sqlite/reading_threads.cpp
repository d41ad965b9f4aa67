// SPDX-License-Identifier: MIT
#include "reading_threads.h"

#include <algorithm>
#include <map>
#include <mutex>
#include <thread>

#include "arguments.h"

namespace almanac::sqlite {
namespace {

constexpr int kMostThreads = 64;
constexpr int kMostCores = 16;

struct Setting {
    int threads = 0;    // 0: one per core
    int last_used = 0;  // 0: no read yet
};

// The settings of every connection that registered almanac, by connection:
// the table functions find theirs from the connection alone. An entry lives
// as long as the connection's almanac_threads function (its destructor).
std::mutex g_mutex;
std::map<sqlite3*, Setting>& settings() {
    static std::map<sqlite3*, Setting> all;  // an empty map holds no memory
    return all;
}

int effective(int threads) {
    if (threads > 0) return threads;
    unsigned cores = std::thread::hardware_concurrency();
    return std::clamp(static_cast<int>(cores), 1, kMostCores);
}

void threads_function(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        sqlite3* db = sqlite3_context_db_handle(context);
        if (argc == 1) {
            auto n = read_integer(ArgumentRef{"almanac_threads", 1, "n"}, argv[0], 0, kMostThreads);
            if (!n) return sqlite3_result_null(context);
            std::lock_guard<std::mutex> lock(g_mutex);
            settings()[db].threads = static_cast<int>(*n);
        }
        sqlite3_result_int(context, reading_threads(db));
    });
}

void last_read_function(sqlite3_context* context, int, sqlite3_value**) {
    sqlite3* db = sqlite3_context_db_handle(context);
    int used;
    {
        std::lock_guard<std::mutex> lock(g_mutex);
        auto found = settings().find(db);
        used = found == settings().end() ? 0 : found->second.last_used;
    }
    if (used == 0) return sqlite3_result_null(context);
    sqlite3_result_int(context, used);
}

void forget_connection(void* db) {
    std::lock_guard<std::mutex> lock(g_mutex);
    settings().erase(static_cast<sqlite3*>(db));
}

}  // namespace

int register_reading_threads(sqlite3* db) {
    try {
        std::lock_guard<std::mutex> lock(g_mutex);
        settings()[db] = Setting{};
    } catch (const std::bad_alloc&) {
        return SQLITE_NOMEM;
    }
    // The one-argument form owns the entry: its destructor runs when the
    // connection closes (or the function is replaced).
    int rc = sqlite3_create_function_v2(db, "almanac_threads", 1, SQLITE_UTF8 | SQLITE_DIRECTONLY,
                                        db, threads_function, nullptr, nullptr, forget_connection);
    if (rc != SQLITE_OK) return rc;
    rc = sqlite3_create_function(db, "almanac_threads", 0, SQLITE_UTF8 | SQLITE_DIRECTONLY, nullptr,
                                 threads_function, nullptr, nullptr);
    if (rc != SQLITE_OK) return rc;
    return sqlite3_create_function(db, "almanac_last_read_threads", 0,
                                   SQLITE_UTF8 | SQLITE_DIRECTONLY, nullptr, last_read_function,
                                   nullptr, nullptr);
}

int reading_threads(sqlite3* db) {
    std::lock_guard<std::mutex> lock(g_mutex);
    auto found = settings().find(db);
    return effective(found == settings().end() ? 1 : found->second.threads);
}

void note_threads_used(sqlite3* db, int threads) {
    std::lock_guard<std::mutex> lock(g_mutex);
    auto found = settings().find(db);
    if (found != settings().end()) found->second.last_used = threads;
}

}  // namespace almanac::sqlite
