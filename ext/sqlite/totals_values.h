// SPDX-License-Identifier: MIT
// Period totals written back as SQL values, as the table functions that read
// a source list them (period_totals, period_decomposition): an item or a
// segment as the value it was, a total as exact_sum gives it.
#pragma once

#include "core/stats/period_totals.h"
#include "sqlite_api.h"

namespace almanac::sqlite {

// The key's own value: NULL, INTEGER, REAL, TEXT or BLOB.
void result_value(sqlite3_context* context, const ValueKey& key);

// A cell's total: 0 for a period without rows (cell nullptr), NULL when its
// rows held only NULLs there (total nullptr or empty), else INTEGER while
// every value was an INTEGER and the sum fits, or the correctly rounded REAL.
void result_total(sqlite3_context* context, const PeriodCell* cell, const CompactTotal* total);

}  // namespace almanac::sqlite
