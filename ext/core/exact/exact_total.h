// SPDX-License-Identifier: MIT
// The total of a column of numbers as SQL users expect it: INTEGER while every
// value is an integer and the total fits in 64 bits, otherwise the exactly
// rounded sum of the values (bit-identical to Python's math.fsum over the same
// values, each integer taken as the nearest double as fsum does). Values can
// be removed again, so a sliding frame is always the exact total of its rows.
#pragma once

#include <cstdint>
#include <optional>

#include "core/exact/exact_sum.h"
#include "core/exact/state_bytes.h"
#include "core/exact/wide_integer.h"

namespace almanac {

class ExactTotal {
  public:
    struct Value {
        bool is_integer;
        std::int64_t integer;  // when is_integer
        double real;           // otherwise
    };

    void add_integer(std::int64_t v) { integer_step(v, +1); }
    void remove_integer(std::int64_t v) { integer_step(v, -1); }
    // v must be finite (the reader refuses infinities first; ExactSum throws otherwise).
    void add_real(double v) {
        reals_.add(v);
        ++real_count_;
    }
    void remove_real(double v) {
        reals_.subtract(v);
        --real_count_;
    }

    std::int64_t count() const { return integer_count_ + real_count_; }
    // Adds another group's values, exactly.
    void merge(const ExactTotal& other);
    // The byte form (core/exact/state_bytes.h): the integer count, the real
    // count, the integers' total as two i64 halves (high, then low bits), the sum.
    void write(ByteWriter& out) const;
    static ExactTotal read(ByteReader& in);
    // Nothing when no value is present (SQL's sum of no rows is NULL).
    std::optional<Value> value() const;

  private:
    void integer_step(std::int64_t v, int sign) {
        // The integers are kept twice: exactly, for the INTEGER result, and as
        // the doubles math.fsum would see, for the REAL one.
        integers_ += sign * Int128(v);
        integer_count_ += sign;
        if (sign > 0)
            reals_.add(static_cast<double>(v));
        else
            reals_.subtract(static_cast<double>(v));
    }

    ExactSum reals_;
    Int128 integers_ = 0;
    std::int64_t integer_count_ = 0;
    std::int64_t real_count_ = 0;
};

}  // namespace almanac
