// SPDX-License-Identifier: MIT
// How many threads almanac's table functions may read a source on, per
// connection (README "Reading in parallel"):
//
//  1. almanac_threads() returns that number; almanac_threads(n) sets it first.
//     n = 1: only the calling thread; n = 0: one per core of the machine, at
//     most 16 (the default). n from 0 to 64; NULL returns NULL and sets
//     nothing; anything else is an error naming the argument.
//  2. almanac_last_read_threads() returns how many threads the last read of
//     a source on this connection used: 1 when it read on the calling thread
//     alone (the source or its database did not allow more, or it was small),
//     NULL before the first read.
//  3. Both are SQLITE_DIRECTONLY: a setting of the connection, not for views
//     or triggers.
#pragma once

#include "sqlite_api.h"

namespace almanac::sqlite {

int register_reading_threads(sqlite3* db);

// The number of threads a read on `db` may use now (1 or more).
int reading_threads(sqlite3* db);
// Records what the last read used, for almanac_last_read_threads().
void note_threads_used(sqlite3* db, int threads);

}  // namespace almanac::sqlite
