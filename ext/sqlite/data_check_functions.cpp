// SPDX-License-Identifier: MIT
// valid_number(x): 1 when x is a number every almanac aggregate adds (an
// INTEGER, a finite REAL, or TEXT that SQLite itself reads as a number, such
// as ' 12.5'), 0 when it is not ('1,050.00', '', a word, a BLOB, an
// infinity), NULL for NULL. Never raises, as valid_time(), so a user (and
// sql/data_check.sql) can list the rows that would stop a report:
//   SELECT rowid, amount FROM sales WHERE NOT valid_number(amount)
#include <cmath>
#include <string_view>

#include "arguments.h"
#include "core/text/number_text.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

bool is_valid_number(sqlite3_value* value) {
    switch (sqlite3_value_type(value)) {
        case SQLITE_INTEGER:
            return true;
        case SQLITE_FLOAT:
            return std::isfinite(sqlite3_value_double(value));
        case SQLITE_TEXT: {
            const auto* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
            if (!text) return false;
            auto number = numeric_text(std::string_view(text, static_cast<std::size_t>(sqlite3_value_bytes(value))));
            return number && std::isfinite(*number);
        }
        default:
            return false;
    }
}

void valid_number(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        if (sqlite3_value_type(argv[0]) == SQLITE_NULL) return sqlite3_result_null(context);
        sqlite3_result_int(context, is_valid_number(argv[0]) ? 1 : 0);
    });
}

}  // namespace

int register_data_check_functions(sqlite3* db) {
    return sqlite3_create_function(db, "valid_number", 1, SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS,
                                   nullptr, valid_number, nullptr, nullptr);
}

}  // namespace almanac::sqlite
