// SPDX-License-Identifier: MIT
// A double with its own 64-bit exponent, for combining exact sums whose
// magnitudes a plain double cannot hold (sums of squares of values near
// 1e200, exponentially weighted sums thousands of half-lives from their
// origin). Only the final result is brought back into the double range.
#pragma once

#include <cmath>
#include <cstdint>

#include "core/exact/correct_rounding.h"

namespace almanac {

struct ScaledDouble {
    double significand = 0.0;  // 0 or in [0.5, 1) in magnitude, as frexp gives
    std::int64_t exponent = 0;

    static ScaledDouble make(double significand, std::int64_t exponent) {
        int e = 0;
        double m = std::frexp(significand, &e);
        return ScaledDouble{m, m == 0.0 ? 0 : exponent + e};
    }
    static ScaledDouble from(double value) { return make(value, 0); }
    static ScaledDouble from(const RoundedBinary& r) {
        double m = static_cast<double>(r.mantissa);  // exact: mantissa <= 2^53
        return make(r.negative ? -m : m, r.exponent);
    }

    bool is_zero() const { return significand == 0.0; }
    double to_double() const {
        if (significand == 0.0) return significand;
        std::int64_t e = exponent < -4000 ? -4000 : (exponent > 4000 ? 4000 : exponent);
        return std::ldexp(significand, static_cast<int>(e));
    }

    friend ScaledDouble operator*(ScaledDouble a, ScaledDouble b) {
        return make(a.significand * b.significand, a.exponent + b.exponent);
    }
    friend ScaledDouble operator/(ScaledDouble a, ScaledDouble b) {
        return make(a.significand / b.significand, a.exponent - b.exponent);
    }
    // For a non-negative value.
    friend ScaledDouble sqrt(ScaledDouble a) {
        if (a.significand == 0.0) return a;
        double m = a.significand;
        std::int64_t e = a.exponent;
        if (e % 2 != 0) {
            m *= 2.0;
            e -= 1;
        }
        return make(std::sqrt(m), e / 2);
    }
};

}  // namespace almanac
