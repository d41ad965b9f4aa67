// SPDX-License-Identifier: MIT
#include "core/exact/correct_rounding.h"

#include <algorithm>
#include <cmath>
#include <cstring>

#include "core/exact/wide_integer.h"

namespace almanac {

double RoundedBinary::to_double() const {
    // A normal double is assembled from its bits directly (this runs once per
    // window row); everything else goes through ldexp.
    if (mantissa >= (std::uint64_t(1) << 52) && mantissa <= (std::uint64_t(1) << 53)) {
        std::uint64_t m = mantissa;
        std::int64_t e = exponent;
        if (m == (std::uint64_t(1) << 53)) {
            m >>= 1;
            ++e;
        }
        std::int64_t biased = e + 52 + 1023;
        if (biased >= 1 && biased <= 2046) {
            std::uint64_t bits = (std::uint64_t(negative) << 63) | (std::uint64_t(biased) << 52) |
                                 (m & ((std::uint64_t(1) << 52) - 1));
            double result;
            std::memcpy(&result, &bits, sizeof result);
            return result;
        }
    }
    // Exponents far outside the double range saturate; ldexp then gives
    // infinity or zero, as the value deserves.
    std::int64_t e = std::clamp<std::int64_t>(exponent, -4000, 4000);
    double magnitude = std::ldexp(static_cast<double>(mantissa), static_cast<int>(e));
    return negative ? -magnitude : magnitude;
}

RoundedBinary round_top_digits(bool negative, std::uint32_t d2, std::uint32_t d1, std::uint32_t d0,
                               std::int64_t exponent_of_d0, bool sticky, std::int64_t lowest_bit) {
    RoundedBinary result;
    result.negative = negative;
    Uint128 acc = (Uint128(d2) << 64) | (Uint128(d1) << 32) | Uint128(d0);
    int top_bit = 64 + 31 - __builtin_clz(d2);  // index in acc of the leading 1
    std::int64_t leading_exponent = exponent_of_d0 + top_bit;
    // Bits to keep: 53, fewer when the value is subnormal at lowest_bit.
    std::int64_t keep = 53;
    if (leading_exponent - 52 < lowest_bit) keep = leading_exponent - lowest_bit + 1;
    if (keep < 0) {
        // Below half of 2^lowest_bit: rounds to zero.
        result.exponent = lowest_bit;
        return result;
    }
    int shift = top_bit + 1 - static_cast<int>(keep);  // >= 13: acc holds at least 65 bits
    std::uint64_t mantissa = static_cast<std::uint64_t>(acc >> shift);
    bool round_bit = ((acc >> (shift - 1)) & 1) != 0;
    bool below = sticky || (acc & ((Uint128(1) << (shift - 1)) - 1)) != 0;
    if (round_bit && (below || (mantissa & 1))) ++mantissa;
    result.mantissa = mantissa;
    result.exponent = exponent_of_d0 + shift;
    return result;
}

}  // namespace almanac
