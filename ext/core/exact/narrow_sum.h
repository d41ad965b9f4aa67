// SPDX-License-Identifier: MIT
// The two pieces every exact sum in almanac is built from: a double taken
// apart into an integer and a power of two, and the fast form of a sum — one
// 128-bit integer times 2^exponent, exact while the terms lie within about
// 70 bits of each other (a run of prices, with its spikes). ExactSum starts
// in that form and CompactTotal lives in it; both move to a long accumulator
// when a term does not fit.
#pragma once

#include <cstdint>
#include <cstring>

#include "core/exact/wide_integer.h"

namespace almanac {

// x as ±mantissa * 2^exponent, mantissa < 2^53 (0 for ±0); finite is false
// for infinities and NaN, whose other fields mean nothing.
struct DoubleParts {
    std::uint64_t mantissa;
    std::int64_t exponent;
    bool negative;
    bool finite;
};

inline DoubleParts split_double(double x) {
    std::uint64_t bits;
    std::memcpy(&bits, &x, sizeof bits);
    int biased = static_cast<int>((bits >> 52) & 0x7ff);
    DoubleParts parts{bits & ((std::uint64_t(1) << 52) - 1), -1074, bits >> 63 != 0,
                      biased != 0x7ff};
    if (biased != 0) {
        parts.mantissa |= std::uint64_t(1) << 52;
        parts.exponent = biased - 1075;
    }
    return parts;
}

// Adds ±magnitude * 2^exponent to value * 2^value_exponent, exactly. False
// when the sum would not fit — it must stay below 2^125 with the term within
// 72 bits of its lowest bit — and then the sum is as it was (its integer
// perhaps rescaled to a lower exponent: the same number).
template <typename Exponent>
inline bool add_to_narrow(Int128& value, Exponent& value_exponent, std::uint64_t magnitude,
                          std::int64_t exponent, bool negative) {
    if (value == 0) {
        value_exponent = static_cast<Exponent>(exponent);
        value = negative ? -Int128(magnitude) : Int128(magnitude);
        return true;
    }
    if (exponent < value_exponent) {
        std::int64_t up = value_exponent - exponent;
        if (up > 72) return false;
        Int128 limit = Int128(1) << (125 - up);
        if (value >= limit || value <= -limit) return false;
        value *= Int128(1) << up;  // exact: |value| < 2^125 afterwards
        value_exponent = static_cast<Exponent>(exponent);
    }
    std::int64_t d = exponent - value_exponent;
    if (d > 72) return false;  // the term would need more than 125 bits
    Int128 term = Int128(magnitude) << d;
    Int128 sum;
    if (add_overflows(value, negative ? -term : term, &sum)) return false;
    value = sum;
    return true;
}

}  // namespace almanac
