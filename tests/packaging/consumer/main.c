// SPDX-License-Identifier: MIT
// An application that embeds SQLite and links almanac, built against the
// installed files only (pkg-config or find_package). It registers almanac on a
// connection, runs two queries and checks the compile-time version header
// against the library it runs with.
#include <almanac.h>
#include <almanac_version.h>
#include <sqlite3.h>
#include <stdio.h>
#include <string.h>

static int print_row(void* unused, int columns, char** values, char** names) {
    (void)unused;
    (void)names;
    for (int i = 0; i < columns; ++i) printf(i ? "|%s" : "%s", values[i] ? values[i] : "NULL");
    printf("\n");
    return 0;
}

static int version_matches(void* unused, int columns, char** values, char** names) {
    (void)unused;
    (void)names;
    return columns == 1 && values[0] && strcmp(values[0], ALMANAC_VERSION) == 0 ? 0 : 1;
}

int main(void) {
    sqlite3* db = NULL;
    if (sqlite3_open(":memory:", &db) != SQLITE_OK) return 2;
    if (almanac_register(db) != SQLITE_OK) return 3;
#if ALMANAC_VERSION_NUMBER < 1000
#error "ALMANAC_VERSION_NUMBER is MAJOR * 1000000 + MINOR * 1000 + PATCH"
#endif
    char* error = NULL;
    if (sqlite3_exec(db, "SELECT almanac_version()", version_matches, NULL, &error) != SQLITE_OK) {
        fprintf(stderr, "almanac_version() is not %s: %s\n", ALMANAC_VERSION, error ? error : "");
        return 4;
    }
    if (sqlite3_exec(db,
                     "SELECT period_floor('2026-03-05 14:20', 'week'), "
                     "period_label('2026-03-05', 'quarter starting april')",
                     print_row, NULL, &error) != SQLITE_OK) {
        fprintf(stderr, "query failed: %s\n", error ? error : "");
        return 5;
    }
    sqlite3_close(db);
    return 0;
}
