// SPDX-License-Identifier: MIT
// Reading one value that is to be added into an exact total, with
// exact_sum's rules, shared by exact_sum() and period_totals() so that both
// accept and refuse exactly the same values.
#pragma once

#include <cstdint>

#include "sqlite_api.h"

namespace almanac::sqlite {

struct Summand {
    enum class Kind { Null, Integer, Real, Refused };
    Kind kind = Kind::Null;
    std::int64_t integer = 0;        // Kind::Integer
    double real = 0;                 // Kind::Real
    const char* expected = nullptr;  // Kind::Refused: what was expected
};

// NULL is skipped; an INTEGER, or TEXT that SQLite reads as a whole number, is
// an integer; a finite REAL, or other TEXT that SQLite reads as a number, is
// a real; anything else (TEXT money such as '1,050.00', BLOBs, infinities) is
// refused with the words the error message needs.
Summand read_summand(sqlite3_value* x);

}  // namespace almanac::sqlite
