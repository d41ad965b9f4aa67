// SPDX-License-Identifier: MIT
// The loadable module's entry point. SQLite derives the name
// sqlite3_almanac_init from the file name almanac.so, so `.load build/almanac`
// needs no entry-point argument.
#include <sqlite3ext.h>
SQLITE_EXTENSION_INIT1

#include "almanac.h"

extern "C" ALMANAC_EXPORT int sqlite3_almanac_init(sqlite3* db, char** error_message,
                                                   const sqlite3_api_routines* api) {
    SQLITE_EXTENSION_INIT2(api);
    int rc = almanac_register(db);
    if (rc != SQLITE_OK && error_message) {
        *error_message =
            sqlite3_mprintf("almanac: registering its functions failed (%s)", sqlite3_errstr(rc));
    }
    return rc;
}
