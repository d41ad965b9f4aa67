#include "registration.h"
namespace almanac::sqlite {
int register_periods_table(sqlite3*) { return SQLITE_OK; }
}  // namespace almanac::sqlite
