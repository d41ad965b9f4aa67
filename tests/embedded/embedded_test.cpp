// SPDX-License-Identifier: MIT
// Proves the static library serves an application that embeds SQLite: the
// functions are registered with almanac_register, nothing is loaded.
#define CATCH_CONFIG_MAIN
#include <catch2/catch.hpp>
#include <string>

#include "almanac.h"

namespace {
std::string query_text(sqlite3* db, const char* sql) {
    sqlite3_stmt* statement = nullptr;
    REQUIRE(sqlite3_prepare_v2(db, sql, -1, &statement, nullptr) == SQLITE_OK);
    REQUIRE(sqlite3_step(statement) == SQLITE_ROW);
    const unsigned char* text = sqlite3_column_text(statement, 0);
    std::string result = text ? reinterpret_cast<const char*>(text) : "NULL";
    sqlite3_finalize(statement);
    return result;
}
}  // namespace

TEST_CASE("an embedding application registers almanac without loading an extension") {
    sqlite3* db = nullptr;
    REQUIRE(sqlite3_open(":memory:", &db) == SQLITE_OK);
    // Loading stays disabled: the functions must come from the linked library.
    REQUIRE(sqlite3_db_config(db, SQLITE_DBCONFIG_ENABLE_LOAD_EXTENSION, 0, nullptr) == SQLITE_OK);
    REQUIRE(almanac_register(db) == SQLITE_OK);
    CHECK(query_text(db, "SELECT almanac_version()") == ALMANAC_TEST_VERSION);
    // 2026-03-05 is a Thursday; its ISO week starts Monday 2026-03-02 (common practice).
    CHECK(query_text(db, "SELECT period_floor('2026-03-05 10:00', 'week')") == "2026-03-02");
    sqlite3_close(db);
}
