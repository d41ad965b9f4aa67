#include "arguments.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {
void almanac_version(sqlite3_context* context, int, sqlite3_value**) {
    sqlite3_result_text(context, ALMANAC_VERSION, -1, SQLITE_STATIC);
}
void valid_time(sqlite3_context* context, int, sqlite3_value** argv) {
    if (sqlite3_value_type(argv[0]) == SQLITE_NULL) return sqlite3_result_null(context);
    sqlite3_result_int(context, is_valid_time(argv[0]) ? 1 : 0);
}
}  // namespace

int register_period_functions(sqlite3* db) {
    constexpr int kPure = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    int rc = sqlite3_create_function(db, "almanac_version", 0, kPure, nullptr, almanac_version, nullptr, nullptr);
    if (rc == SQLITE_OK) rc = sqlite3_create_function(db, "valid_time", 1, kPure, nullptr, valid_time, nullptr, nullptr);
    return rc;
}
}  // namespace almanac::sqlite
