// SPDX-License-Identifier: MIT
#include "core/exact/exact_sum.h"

#include <algorithm>

#include "core/text/error.h"

namespace almanac {

void ExactSum::throw_not_finite() { throw Error("expected a finite number"); }

bool ExactSum::widen() {
    Int128 value = narrow_;
    if (value != 0) {
        // The limbs for both halves are allocated before anything changes: if
        // memory runs out, the sum is still the 128-bit one, intact.
        std::int64_t position = narrow_exponent_ + kBitOffset;
        extend(floor_div_by<32>(position), floor_div_by<32>(position + 64) + 4);
        bool negative = value < 0;
        Uint128 magnitude = negative ? Uint128(0) - Uint128(value) : Uint128(value);
        auto low = static_cast<std::uint64_t>(magnitude);
        auto high = static_cast<std::uint64_t>(magnitude >> 64);
        if (low) add_bits(low, narrow_exponent_, negative);
        if (high) add_bits(high, narrow_exponent_ + 64, negative);
    }
    wide_ = true;
    narrow_ = 0;
    return false;
}

void ExactSum::add_prod(double a, double b, std::int64_t shift, bool negate) {
    DoubleParts pa = split_double(a), pb = split_double(b);
    if (!pa.finite || !pb.finite) throw_not_finite();
    if (pa.mantissa == 0 || pb.mantissa == 0) return;
    if (!wide_) widen();
    Uint128 product = Uint128(pa.mantissa) * pb.mantissa;  // exact: < 2^106
    bool negative = negate != (pa.negative != pb.negative);
    std::int64_t exponent = pa.exponent + pb.exponent + shift;
    auto low = static_cast<std::uint64_t>(product);
    auto high = static_cast<std::uint64_t>(product >> 64);
    if (low) add_bits(low, exponent, negative);
    if (high) add_bits(high, exponent + 64, negative);
}

void ExactSum::extend(std::int64_t lo, std::int64_t hi) const {
    // The active range changes only once its limbs exist: an allocation that
    // fails leaves the sum as it was (found by the allocation-failure test).
    std::int64_t new_lo = lo_ == hi_ ? lo : std::min(lo_, lo);
    std::int64_t new_hi = lo_ == hi_ ? hi : std::max(hi_, hi);
    std::int64_t size = static_cast<std::int64_t>(limbs_.size());
    if (new_lo >= base_ && new_hi <= base_ + size) {
        lo_ = new_lo;
        hi_ = new_hi;
        return;
    }
    // Reallocate around the active range with some room on both sides, so a
    // sum that drifts slowly does not reallocate on every term. Limbs outside
    // the old active range are zero, so only the active ones move.
    constexpr std::int64_t kSlack = 4;
    std::int64_t new_base = new_lo - kSlack;
    std::int64_t new_size = (new_hi - new_lo) + 2 * kSlack;
    std::vector<std::int64_t> fresh(static_cast<std::size_t>(new_size), 0);
    for (std::int64_t k = std::max(base_, new_base);
         k < std::min(base_ + size, new_base + new_size); ++k)
        fresh[k - new_base] = limbs_[k - base_];
    limbs_.swap(fresh);
    base_ = new_base;
    lo_ = new_lo;
    hi_ = new_hi;
}

void ExactSum::normalize() const {
    pending_ = 0;
    if (lo_ == hi_) return;
    constexpr std::int64_t kDigit = std::int64_t(1) << 32;
    std::int64_t* p = limbs_.data() + (lo_ - base_);
    std::int64_t n = hi_ - lo_;
    std::int64_t carry = 0;
    for (std::int64_t i = 0; i + 1 < n; ++i) {
        std::int64_t v = p[i] + carry;
        carry = v >> 32;  // arithmetic shift: floor division by 2^32
        p[i] = v & (kDigit - 1);
    }
    p[n - 1] += carry;
    // A top limb outside [-2^32, 2^32) spills into a new limb above it.
    while (p[n - 1] >= kDigit || p[n - 1] <= -kDigit) {
        extend(lo_, hi_ + 1);
        p = limbs_.data() + (lo_ - base_);
        std::int64_t v = p[n - 1];
        p[n - 1] = v & (kDigit - 1);
        p[n] += v >> 32;
        ++n;
    }
    // Drop zero limbs at the top (and a top of -1, folded into a nonzero digit below).
    while (n > 1) {
        if (p[n - 1] == 0) {
            --n;
        } else if (p[n - 1] == -1 && p[n - 2] != 0) {
            p[n - 1] = 0;
            p[n - 2] -= kDigit;
            --n;
        } else {
            break;
        }
    }
    hi_ = lo_ + n;
    if (n == 1 && p[0] == 0) {
        lo_ = hi_ = 0;
        return;
    }
    while (p[0] == 0) {
        ++p;
        ++lo_;
    }
}

void ExactSum::add(const ExactSum& other, std::int64_t limb_shift) {
    if (!wide_) widen();
    if (!other.wide_) {
        if (other.narrow_ == 0) return;
        bool negative = other.narrow_ < 0;
        Uint128 magnitude = negative ? Uint128(0) - Uint128(other.narrow_) : Uint128(other.narrow_);
        std::int64_t exponent = other.narrow_exponent_ + 32 * limb_shift;
        auto low = static_cast<std::uint64_t>(magnitude);
        auto high = static_cast<std::uint64_t>(magnitude >> 64);
        if (low) add_bits(low, exponent, negative);
        if (high) add_bits(high, exponent + 64, negative);
        return;
    }
    other.normalize();
    if (other.lo_ == other.hi_) return;
    std::int64_t lo = other.lo_ + limb_shift, hi = other.hi_ + limb_shift;
    extend(lo, hi + 1);
    const std::int64_t* source = other.limbs_.data() + (other.lo_ - other.base_);
    std::int64_t* target = limbs_.data() + (lo - base_);
    for (std::int64_t i = 0; i < hi - lo; ++i) target[i] += source[i];
    if (++pending_ >= kNormalizeEvery) normalize();
}

void ExactSum::settle() const {
    normalize();
    // Exactly zero: the next terms may fit the fast form again. (Only readers
    // do this; normalize() also runs in the middle of an addition.)
    if (lo_ == hi_) wide_ = false;
}

bool ExactSum::is_zero() const {
    if (!wide_) return narrow_ == 0;
    settle();
    return !wide_;
}

int ExactSum::sign() const {
    if (!wide_) return narrow_ == 0 ? 0 : (narrow_ < 0 ? -1 : 1);
    settle();
    if (lo_ == hi_) return 0;
    return limbs_[hi_ - 1 - base_] < 0 ? -1 : 1;
}

RoundedBinary ExactSum::rounded(std::int64_t lowest_bit) const {
    if (!wide_) {
        if (narrow_ == 0) return RoundedBinary{};
        bool negative = narrow_ < 0;
        Uint128 magnitude = negative ? Uint128(0) - Uint128(narrow_) : Uint128(narrow_);
        std::uint32_t digits[4];
        for (int i = 0; i < 4; ++i) digits[i] = static_cast<std::uint32_t>(magnitude >> (32 * i));
        int lead = 3;
        while (digits[lead] == 0) --lead;
        auto at = [&](int i) { return i >= 0 ? digits[i] : 0u; };
        bool sticky = false;
        for (int i = 0; i < lead - 2; ++i) sticky = sticky || digits[i] != 0;
        return round_top_digits(negative, digits[lead], at(lead - 1), at(lead - 2),
                                narrow_exponent_ + 32 * (lead - 2), sticky, lowest_bit);
    }
    settle();
    if (lo_ == hi_) return RoundedBinary{};
    const std::int64_t* p = limbs_.data() + (lo_ - base_);
    std::int64_t n = hi_ - lo_;
    std::int64_t top = p[n - 1];
    bool negative = top < 0;
    // Digit i of the magnitude. For a negative sum, the magnitude's digits are
    // those of the two's complement, read without copying: the lowest digit
    // (nonzero after normalize) becomes 2^32 - d, the middle ones 2^32-1 - d,
    // and the top -top - 1, which can be 0 (then the next digit leads).
    auto digit = [&](std::int64_t i) -> std::uint32_t {
        if (i < 0) return 0;
        if (!negative) return static_cast<std::uint32_t>(p[i]);
        if (n == 1) return static_cast<std::uint32_t>(-top);
        if (i == 0) return static_cast<std::uint32_t>((std::int64_t(1) << 32) - p[0]);
        if (i == n - 1) return static_cast<std::uint32_t>(-top - 1);
        return static_cast<std::uint32_t>(0xffffffffu - static_cast<std::uint32_t>(p[i]));
    };
    std::int64_t lead = digit(n - 1) != 0 ? n - 1 : n - 2;
    // The magnitude's lowest digit is nonzero too, so any digit below the
    // three that are kept makes the rest nonzero.
    std::int64_t exponent_of_d0 = 32 * (lo_ + lead - 2) - kBitOffset;
    return round_top_digits(negative, digit(lead), digit(lead - 1), digit(lead - 2), exponent_of_d0,
                            lead > 2, lowest_bit);
}

ExactNumber ExactSum::value() const {
    if (!wide_) {
        if (narrow_ == 0) return ExactNumber();
        bool negative = narrow_ < 0;
        Uint128 magnitude = negative ? Uint128(0) - Uint128(narrow_) : Uint128(narrow_);
        // ExactNumber counts its scale in 32-bit digits: align the exponent.
        std::int64_t digit = floor_div(narrow_exponent_, 32);
        unsigned s = static_cast<unsigned>(narrow_exponent_ - 32 * digit);
        Uint128 low = magnitude << s;
        std::uint32_t top = s ? static_cast<std::uint32_t>(magnitude >> (128 - s)) : 0;
        DigitBuffer digits(5);
        for (int i = 0; i < 4; ++i) digits[i] = static_cast<std::uint32_t>(low >> (32 * i));
        digits[4] = top;
        return ExactNumber(negative, std::move(digits), digit);
    }
    settle();
    if (lo_ == hi_) return ExactNumber();
    const std::int64_t* p = limbs_.data() + (lo_ - base_);
    std::int64_t n = hi_ - lo_;
    bool negative = p[n - 1] < 0;
    DigitBuffer digits(static_cast<std::size_t>(n));
    if (!negative) {
        for (std::int64_t i = 0; i < n; ++i) digits[i] = static_cast<std::uint32_t>(p[i]);
    } else if (n == 1) {
        digits[0] = static_cast<std::uint32_t>(-p[0]);
    } else {
        digits[0] = static_cast<std::uint32_t>((std::int64_t(1) << 32) - p[0]);
        for (std::int64_t i = 1; i + 1 < n; ++i)
            digits[i] = 0xffffffffu - static_cast<std::uint32_t>(p[i]);
        digits[n - 1] = static_cast<std::uint32_t>(-p[n - 1] - 1);
    }
    // The long number's bit 0 is 2^-kBitOffset, and kBitOffset is 68 digits.
    return ExactNumber(negative, std::move(digits), lo_ - kBitOffset / 32);
}

}  // namespace almanac
