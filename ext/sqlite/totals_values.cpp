// SPDX-License-Identifier: MIT
#include "totals_values.h"

#include <string>

#include "period_context.h"

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

TimeValue boundary_form(const PeriodTotals& totals) {
    TimeValue like;
    like.representation = totals.representation();
    like.integer_input = totals.integer_input();
    return like;
}

void result_series_column(sqlite3_context* context, int index, const ListedSeries& series,
                          const PeriodTotals& totals, const Period& period,
                          const PeriodCalendar& calendar, const TimeValue& like) {
    switch (index) {
        case 0:  // segment
            if (series.all_segments) return sqlite3_result_null(context);
            return result_value(context, series.group->key());
        case 1:  // all_segments
            return sqlite3_result_int(context, series.all_segments ? 1 : 0);
        case 2:  // item
            return result_value(context, totals.item(series.item));
        case 3:  // period_start
            return result_boundary(context, like, period.start, calendar);
        case 4:  // period_end
            return result_boundary(context, like, period.end, calendar);
        case 5: {  // label
            std::string label = calendar.label(period);
            return sqlite3_result_text(context, label.c_str(), static_cast<int>(label.size()),
                                       SQLITE_TRANSIENT);
        }
        default:  // serial
            return sqlite3_result_int64(context, period.serial);
    }
}

}  // namespace almanac::sqlite
