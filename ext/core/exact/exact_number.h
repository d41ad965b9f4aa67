// SPDX-License-Identifier: MIT
// An exact binary number of any size: ±(an integer) × 2^(32·scale).
// The accumulators keep their sums exactly; the final combinations of those
// sums (n·Σxy − Σx·Σy, Sxx·Syy − Sxy², ...) are products and differences of
// such numbers, computed here without any rounding, and rounded once at the
// end. Only the digits a sum actually uses take part, so for the data almanac
// sees (values of a few dozen significant bits) a product is a handful of
// 32-bit multiplications, not a 2000-bit one.
#pragma once

#include <cstdint>

#include "core/exact/correct_rounding.h"
#include "core/exact/digit_buffer.h"
#include "core/exact/scaled_double.h"

namespace almanac {

class ExactNumber {
  public:
    ExactNumber() = default;  // zero
    explicit ExactNumber(std::uint64_t integer);
    // digits: little-endian 32-bit magnitude; value = ±Σ digits[i]·2^(32·(i + scale)).
    ExactNumber(bool negative, DigitBuffer digits, std::int64_t scale);

    bool is_zero() const { return digits_.empty(); }
    int sign() const { return is_zero() ? 0 : (negative_ ? -1 : 1); }

    ExactNumber operator-() const;
    friend ExactNumber operator+(const ExactNumber& a, const ExactNumber& b);
    friend ExactNumber operator-(const ExactNumber& a, const ExactNumber& b);
    friend ExactNumber operator*(const ExactNumber& a, const ExactNumber& b);

    // Correctly rounded (half to even) to a double; ±inf beyond its range.
    double to_double() const;
    // Rounded to 53 significant bits, with an exponent that cannot overflow.
    ScaledDouble to_scaled() const;

  private:
    void trim();
    static int compare_magnitudes(const ExactNumber& a, const ExactNumber& b);
    static ExactNumber add_magnitudes(const ExactNumber& a, const ExactNumber& b, bool negative);
    // |a| - |b| with |a| >= |b|.
    static ExactNumber subtract_magnitudes(const ExactNumber& a, const ExactNumber& b,
                                           bool negative);
    RoundedBinary round(std::int64_t lowest_bit) const;

    bool negative_ = false;
    DigitBuffer digits_;  // no zero digit at either end
    std::int64_t scale_ = 0;
};

}  // namespace almanac
