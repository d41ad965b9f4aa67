// SPDX-License-Identifier: MIT
// One registration function per binding file; almanac_register calls them all.
#pragma once

#include "sqlite_api.h"

namespace almanac::sqlite {

int register_period_functions(sqlite3* db);
int register_periods_table(sqlite3* db);
int register_period_totals_table(sqlite3* db);
int register_statistics_functions(sqlite3* db);
int register_order_statistics_functions(sqlite3* db);
int register_report_functions(sqlite3* db);
int register_export_functions(sqlite3* db);
int register_season_functions(sqlite3* db);
int register_name_functions(sqlite3* db);
int register_data_range_functions(sqlite3* db);
int register_data_check_functions(sqlite3* db);
int register_period_decomposition_table(sqlite3* db);

}  // namespace almanac::sqlite
