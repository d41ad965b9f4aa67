// SPDX-License-Identifier: MIT
// Public entry for applications that embed SQLite and link almanac's static
// library: registers every almanac SQL function on one connection.
#pragma once

#include <sqlite3.h>

// ALMANAC_VERSION and ALMANAC_VERSION_NUMBER, the version compiled against.
#include "almanac_version.h"

#ifdef __cplusplus
extern "C" {
#endif

#if defined(__GNUC__)
#define ALMANAC_EXPORT __attribute__((visibility("default")))
#else
#define ALMANAC_EXPORT
#endif

// Returns SQLITE_OK, or the SQLite error code of the first registration that failed.
ALMANAC_EXPORT int almanac_register(sqlite3* db);

#ifdef __cplusplus
}
#endif
