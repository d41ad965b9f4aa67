// SPDX-License-Identifier: MIT
#include "summand.h"

#include <cmath>
#include <string_view>

#include "core/text/ascii.h"
#include "core/text/number_text.h"
#include "core/time/time_value.h"

namespace almanac::sqlite {
namespace {

// The whole-number TEXT that SQLite's own sum() counts as an INTEGER ('12',
// ' -3 '); false for anything with a point or an exponent, or out of range.
bool whole_number_text(std::string_view text, std::int64_t& out) {
    auto whole = parse_int64(trim_ascii_space(text));
    if (whole) out = *whole;
    return whole.has_value();
}

Summand refused(const char* expected) {
    Summand summand;
    summand.kind = Summand::Kind::Refused;
    summand.expected = expected;
    return summand;
}

Summand real(double v) {
    if (!std::isfinite(v)) return refused("expected a finite number");
    Summand summand;
    summand.kind = Summand::Kind::Real;
    summand.real = v;
    return summand;
}

}  // namespace

Summand read_summand(sqlite3_value* x) {
    Summand summand;
    switch (sqlite3_value_type(x)) {
        case SQLITE_NULL:
            return summand;
        case SQLITE_INTEGER:
            summand.kind = Summand::Kind::Integer;
            summand.integer = sqlite3_value_int64(x);
            return summand;
        case SQLITE_FLOAT:
            return real(sqlite3_value_double(x));
        case SQLITE_TEXT: {
            const char* raw = reinterpret_cast<const char*>(sqlite3_value_text(x));
            std::string_view text(raw ? raw : "", sqlite3_value_bytes(x));
            if (whole_number_text(text, summand.integer)) {
                summand.kind = Summand::Kind::Integer;
                return summand;
            }
            auto number = numeric_text(text);
            if (!number)
                return refused(
                    "expected a number; money or quantities written as text must be read "
                    "with to_amount() in the view that maps your table (README: \"Your data\")");
            return real(*number);
        }
        default:
            return refused("expected a number, not a BLOB");
    }
}

}  // namespace almanac::sqlite
