// Placeholder until the statistics functions land; registers nothing.
#include "registration.h"

namespace almanac::sqlite {
int register_statistics_functions(sqlite3*) { return SQLITE_OK; }
}  // namespace almanac::sqlite
