// Placeholder until the order statistics land; registers nothing.
#include "registration.h"

namespace almanac::sqlite {
int register_order_statistics_functions(sqlite3*) { return SQLITE_OK; }
}  // namespace almanac::sqlite
