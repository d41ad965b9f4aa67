// SPDX-License-Identifier: MIT
// Correct rounding of an exact binary number to double precision.
// Both exact representations in the core (ExactSum's limbs and ExactNumber's
// digits) hand their three most significant 32-bit digits and a sticky flag
// to this one routine, so there is a single place where round-half-to-even,
// subnormals and overflow are decided — the same rules IEEE 754 division
// and Python's math.fsum use.
#pragma once

#include <cstdint>

namespace almanac {

// sign * mantissa * 2^exponent, mantissa < 2^54 (it is 2^53 after a carry).
struct RoundedBinary {
    bool negative = false;
    std::uint64_t mantissa = 0;
    std::int64_t exponent = 0;

    // ldexp of the mantissa: exact, because the mantissa was already rounded
    // at the position the double's format needs (when rounded with
    // kDoubleLowestBit); infinity beyond the largest double.
    double to_double() const;
};

// The exponent of the last bit of the smallest subnormal double, 2^-1074.
constexpr std::int64_t kDoubleLowestBit = -1074;
// No lower limit: keep 53 significant bits whatever the magnitude.
constexpr std::int64_t kUnboundedLowestBit = INT64_MIN / 4;

// Rounds (d2*2^64 + d1*2^32 + d0 + a fraction that is nonzero when sticky)
// * 2^exponent_of_d0 to 53 significant bits, half to even, never keeping a
// bit below 2^lowest_bit. d2 must be nonzero.
RoundedBinary round_top_digits(bool negative, std::uint32_t d2, std::uint32_t d1, std::uint32_t d0,
                               std::int64_t exponent_of_d0, bool sticky,
                               std::int64_t lowest_bit = kDoubleLowestBit);

}  // namespace almanac
