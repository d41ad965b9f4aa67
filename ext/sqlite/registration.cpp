// SPDX-License-Identifier: MIT
#include "registration.h"

#include <initializer_list>

#include "almanac.h"

extern "C" int almanac_register(sqlite3* db) {
    using namespace almanac::sqlite;
    for (auto step :
         {register_period_functions, register_periods_table, register_period_totals_table,
          register_statistics_functions, register_order_statistics_functions,
          register_report_functions, register_export_functions, register_season_functions,
          register_name_functions, register_data_range_functions, register_data_check_functions,
          register_period_decomposition_table}) {
        int rc = step(db);
        if (rc != SQLITE_OK) return rc;
    }
    return SQLITE_OK;
}
