// SPDX-License-Identifier: MIT
#include "core/exact/exact_sign.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>
#include <stdexcept>

#include "core/exact/wide_integer.h"

namespace almanac {
namespace {

using Wide = Uint128;

// ±mantissa · 2^exponent, exactly the double's value (subnormals included).
struct Dyadic {
    bool negative;
    std::uint64_t mantissa;
    int exponent;
};

Dyadic decompose(double value) {
    std::uint64_t bits;
    std::memcpy(&bits, &value, sizeof bits);
    Dyadic d;
    d.negative = (bits >> 63) != 0;
    int field = static_cast<int>((bits >> 52) & 0x7FF);
    std::uint64_t fraction = bits & ((std::uint64_t{1} << 52) - 1);
    if (field == 0x7FF) throw std::invalid_argument("exact_sign_of_sum: factor is not finite");
    if (field == 0) {
        d.mantissa = fraction;  // subnormal: no hidden bit, fixed exponent
        d.exponent = -1074;
    } else {
        d.mantissa = fraction | (std::uint64_t{1} << 52);
        d.exponent = field - 1075;
    }
    return d;
}

struct Term {
    bool negative;
    Wide magnitude;  // < 2^106
    int exponent;
};

// The widest possible spread: products of doubles lie between 2^-2148 and
// 2^2048, plus 106 mantissa bits, carries and the sign; 68 limbs hold it.
constexpr std::size_t kMaxLimbs = 68;
constexpr std::size_t kMaxTerms = 8;

// The fast way, when every product's rounding error is itself a double
// (no underflow below it, no overflow): each product becomes two doubles by
// fma, the sum a nonoverlapping expansion (Shewchuk 1997, Grow-Expansion,
// built from Knuth's TwoSum), whose largest nonzero component carries the
// sign. Returns false when the magnitudes leave that safe range.
bool sign_by_expansion(const Product* terms, std::size_t count, int& sign) {
    double expansion[2 * kMaxTerms];
    std::size_t length = 0;
    auto grow = [&](double value) {
        double carry = value;
        for (std::size_t i = 0; i < length; ++i) {
            const double sum = carry + expansion[i];
            const double virtual_b = sum - carry;
            const double virtual_a = sum - virtual_b;
            const double error = (carry - virtual_a) + (expansion[i] - virtual_b);
            expansion[i] = error;
            carry = sum;
        }
        expansion[length++] = carry;
    };
    for (std::size_t i = 0; i < count; ++i) {
        const double a = terms[i].a, b = terms[i].b;
        const double product = a * b;
        const double magnitude = std::fabs(product);
        if (!(magnitude <= 0x1p1000)) return false;
        double error = 0.0;
        if (b != 1.0 && a != 1.0 && a != 0.0 && b != 0.0) {
            if (magnitude < 0x1p-960) return false;
            error = std::fma(a, b, -product);
        }
        grow(error);
        grow(product);
    }
    sign = 0;
    for (std::size_t i = length; i-- > 0;)
        if (expansion[i] != 0.0) {
            sign = expansion[i] > 0 ? 1 : -1;
            break;
        }
    return true;
}

}  // namespace

int exact_sign_of_sum(const Product* terms, std::size_t count) {
    if (count > kMaxTerms) throw std::invalid_argument("exact_sign_of_sum: too many terms");
    int fast_sign;
    if (sign_by_expansion(terms, count, fast_sign)) return fast_sign;
    std::array<Term, kMaxTerms> parts;
    std::size_t used = 0;
    int lowest = std::numeric_limits<int>::max();
    int highest = std::numeric_limits<int>::min();
    for (std::size_t i = 0; i < count; ++i) {
        Dyadic a = decompose(terms[i].a);
        Dyadic b = decompose(terms[i].b);
        if (a.mantissa == 0 || b.mantissa == 0) continue;
        Term t{a.negative != b.negative, Wide{a.mantissa} * b.mantissa, a.exponent + b.exponent};
        parts[used++] = t;
        if (t.exponent < lowest) lowest = t.exponent;
        if (t.exponent > highest) highest = t.exponent;
    }
    if (used == 0) return 0;

    // Fixed point with its unit at 2^lowest, in two's complement, using only
    // as many limbs as these terms' spread needs.
    const std::size_t limbs = static_cast<std::size_t>(highest - lowest + 110) / 64 + 2;
    std::array<std::uint64_t, kMaxLimbs> sum;
    std::fill(sum.begin(), sum.begin() + limbs, 0);
    for (std::size_t i = 0; i < used; ++i) {
        const Term& t = parts[i];
        const unsigned shift = static_cast<unsigned>(t.exponent - lowest);
        const std::size_t at = shift / 64;
        const unsigned bit = shift % 64;
        const auto low = static_cast<std::uint64_t>(t.magnitude);
        const auto high = static_cast<std::uint64_t>(t.magnitude >> 64);
        std::uint64_t words[3] = {low << bit, (high << bit) | (bit ? low >> (64 - bit) : 0),
                                  bit ? high >> (64 - bit) : 0};
        if (!t.negative) {
            std::uint64_t carry = 0;
            for (std::size_t k = at; k < limbs; ++k) {
                std::uint64_t add = k - at < 3 ? words[k - at] : 0;
                if (add == 0 && carry == 0 && k - at >= 3) break;
                Wide s = Wide{sum[k]} + add + carry;
                sum[k] = static_cast<std::uint64_t>(s);
                carry = static_cast<std::uint64_t>(s >> 64);
            }
        } else {
            std::uint64_t borrow = 0;
            for (std::size_t k = at; k < limbs; ++k) {
                std::uint64_t sub = k - at < 3 ? words[k - at] : 0;
                if (sub == 0 && borrow == 0 && k - at >= 3) break;
                std::uint64_t before = sum[k];
                std::uint64_t after = before - sub - borrow;
                borrow = (Wide{sub} + borrow > before) ? 1 : 0;
                sum[k] = after;
            }
        }
    }
    if (sum[limbs - 1] >> 63) return -1;
    for (std::size_t k = 0; k < limbs; ++k)
        if (sum[k] != 0) return 1;
    return 0;
}

}  // namespace almanac
