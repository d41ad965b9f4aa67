// SPDX-License-Identifier: MIT
#include "totals_values.h"

namespace almanac::sqlite {

void result_total(sqlite3_context* context, const PeriodCell* cell, const CompactTotal* total) {
    if (!cell) return sqlite3_result_int(context, 0);
    auto value = total ? total->value() : std::nullopt;
    if (!value) return sqlite3_result_null(context);
    if (value->is_integer) return sqlite3_result_int64(context, value->integer);
    sqlite3_result_double(context, value->real);
}

void result_value(sqlite3_context* context, const ValueKey& key) {
    switch (key.kind) {
        case ValueKey::Kind::Null:
            return sqlite3_result_null(context);
        case ValueKey::Kind::Integer:
            return sqlite3_result_int64(context, key.integer);
        case ValueKey::Kind::Real:
            return sqlite3_result_double(context, key.real);
        case ValueKey::Kind::Text:
            return sqlite3_result_text(context, key.bytes.data(),
                                       static_cast<int>(key.bytes.size()), SQLITE_TRANSIENT);
        case ValueKey::Kind::Blob:
            return sqlite3_result_blob(context, key.bytes.data(),
                                       static_cast<int>(key.bytes.size()), SQLITE_TRANSIENT);
    }
}

}  // namespace almanac::sqlite
