// SPDX-License-Identifier: MIT
// The binding is compiled twice: into the loadable module, where every call
// into SQLite goes through the API table SQLite hands the entry point, and
// into the static library, which links against SQLite directly.
#pragma once

#ifdef ALMANAC_LOADABLE
#include <sqlite3ext.h>
SQLITE_EXTENSION_INIT3
#else
#include <sqlite3.h>
#endif
