// Placeholder until the report functions land; registers nothing.
#include "registration.h"

namespace almanac::sqlite {
int register_report_functions(sqlite3*) { return SQLITE_OK; }
}  // namespace almanac::sqlite
