// SPDX-License-Identifier: MIT
// An exact sum of doubles and of products of two doubles, with removal.
//
// Technique: a fixed-point superaccumulator (in the manner of Kulisch's long
// accumulator and Neal's "superaccumulators"). Every double is an integer
// m < 2^53 times 2^e with -1074 <= e <= 971, and the product of two doubles is
// an integer m_a*m_b < 2^106 times 2^(e_a+e_b): both are added, without any
// rounding, into 64-bit signed limbs that each carry a 32-bit digit of one
// long binary number. The 32 spare bits of each limb absorb carries, so an
// addition touches three limbs and never propagates a carry; carries are
// resolved only when the value is read, or every 2^29 additions. Removal is
// the addition of the negated term, so a sliding frame's sum is exactly the
// sum of the values in the frame, whatever has passed through it before — a
// 1e15 spike that leaves the frame leaves no trace.
//
// Only the limbs between the lowest and highest digit in use are stored and
// visited, so values of similar magnitude cost a few limbs, and reading the
// sum (carry resolution plus rounding) is a handful of operations.
//
// A faster form comes first: while the terms are doubles whose exponents lie
// within about 70 bits of each other (a series of prices, with its spikes),
// the sum is one exact 128-bit integer times 2^e, so adding is a shift and an
// add and reading is one rounding. The first term that does not fit (an
// overflow, a far smaller or larger exponent, or any product) moves the sum
// into the limbs, where it stays until it is exactly zero again.
#pragma once

#include <cstdint>
#include <cstring>
#include <vector>

#include "core/exact/correct_rounding.h"
#include "core/exact/exact_number.h"
#include "core/exact/floor_division.h"
#include "core/exact/narrow_sum.h"
#include "core/exact/wide_integer.h"

namespace almanac {

class ExactSum {
  public:
    void add(double x) { add_double(x, 0, false); }
    void subtract(double x) { add_double(x, 0, true); }
    // x * 2^shift, exactly; shift moves the term by whole bits.
    void add_scaled(double x, std::int64_t shift) { add_double(x, shift, false); }
    void subtract_scaled(double x, std::int64_t shift) { add_double(x, shift, true); }
    // a * b * 2^shift, exactly (no fused rounding, no overflow, no underflow).
    void add_product(double a, double b, std::int64_t shift = 0) { add_prod(a, b, shift, false); }
    void subtract_product(double a, double b, std::int64_t shift = 0) {
        add_prod(a, b, shift, true);
    }
    // Adds other * 2^(32*limb_shift) exactly.
    void add(const ExactSum& other, std::int64_t limb_shift);

    // Readers are const: the value they read never changes. They resolve
    // pending carries in place (the limbs are mutable for that), so one sum
    // must not be read from two threads at once.
    bool is_zero() const;
    int sign() const;
    // Correctly rounded, half to even: the double nearest the exact sum,
    // which is what Python's math.fsum returns for the same terms.
    double to_double() const { return rounded(kDoubleLowestBit).to_double(); }
    RoundedBinary rounded(std::int64_t lowest_bit) const;
    ExactNumber value() const;

  private:
    // Bit position 0 of the long number is 2^-kBitOffset; a multiple of 32 at
    // or below the last bit of a product of two subnormals (2^-2148).
    static constexpr std::int64_t kBitOffset = 2176;
    static constexpr std::uint32_t kNormalizeEvery = 1u << 29;

    void add_double(double x, std::int64_t shift, bool negate) {
        DoubleParts parts = split_double(x);
        if (!parts.finite) throw_not_finite();
        if (parts.mantissa == 0) return;
        bool negative = negate != parts.negative;
        if (!wide_ && add_narrow(parts.mantissa, parts.exponent + shift, negative)) return;
        add_bits(parts.mantissa, parts.exponent + shift, negative);
    }
    // Adds ±mantissa * 2^exponent to the 128-bit form; false (having moved
    // the sum into the limbs) when it does not fit.
    bool add_narrow(std::uint64_t mantissa, std::int64_t exponent, bool negative) {
        return add_to_narrow(narrow_, narrow_exponent_, mantissa, exponent, negative) || widen();
    }
    // Moves the 128-bit form into the limbs; returns false for add_narrow.
    bool widen();
    void add_prod(double a, double b, std::int64_t shift, bool negate);
    // Adds ±magnitude * 2^bit_exponent.
    void add_bits(std::uint64_t magnitude, std::int64_t bit_exponent, bool negative) {
        std::int64_t position = bit_exponent + kBitOffset;
        std::int64_t k = floor_div_by<32>(position);
        unsigned s = static_cast<unsigned>(position - 32 * k);
        // Three 32-bit digits of magnitude << s (at most 64 + 31 bits).
        std::uint64_t low = magnitude << s;
        std::uint64_t high = s ? magnitude >> (64 - s) : 0;
        std::int64_t c0 = static_cast<std::int64_t>(low & 0xffffffffu);
        std::int64_t c1 = static_cast<std::int64_t>(low >> 32);
        std::int64_t c2 = static_cast<std::int64_t>(high);
        // One spare limb above the digits, so the top limb only ever takes carries.
        if (k < lo_ || k + 4 > hi_) extend(k, k + 4);
        std::int64_t* p = limbs_.data() + (k - base_);
        if (negative) {
            p[0] -= c0;
            p[1] -= c1;
            p[2] -= c2;
        } else {
            p[0] += c0;
            p[1] += c1;
            p[2] += c2;
        }
        if (++pending_ >= kNormalizeEvery) normalize();
    }
    [[noreturn]] static void throw_not_finite();
    // Makes [lo, hi) part of the active range, allocating as needed.
    void extend(std::int64_t lo, std::int64_t hi) const;
    // Resolves carries: every limb but the top becomes a digit in [0, 2^32),
    // the top a signed value in [-2^32, 2^32); zero limbs leave the range.
    void normalize() const;
    // normalize(), then back to the fast form when the sum is exactly zero.
    void settle() const;

    // How the value is held changes under a reader (carries resolved, an
    // exact zero back to the fast form); the value itself does not.
    mutable std::vector<std::int64_t> limbs_;  // limbs_[i] is limb number base_ + i
    mutable std::int64_t base_ = 0;
    mutable std::int64_t lo_ = 0, hi_ = 0;  // active limbs [lo_, hi_); all others are zero
    mutable std::uint32_t pending_ = 0;     // additions since the last normalize()
    mutable bool wide_ = false;             // the sum is in the limbs, not in narrow_
    Int128 narrow_ = 0;                     // otherwise the sum is narrow_ * 2^narrow_exponent_
    std::int64_t narrow_exponent_ = 0;
};

}  // namespace almanac
