// SPDX-License-Identifier: MIT
#include "core/exact/exact_number.h"

#include <algorithm>
#include <utility>

namespace almanac {

ExactNumber::ExactNumber(std::uint64_t integer) {
    if (integer & 0xffffffffu)
        digits_.push_back(static_cast<std::uint32_t>(integer));
    else if (integer)
        scale_ = 1;
    if (integer >> 32) digits_.push_back(static_cast<std::uint32_t>(integer >> 32));
}

ExactNumber::ExactNumber(bool negative, DigitBuffer digits, std::int64_t scale)
    : negative_(negative), digits_(std::move(digits)), scale_(scale) {
    trim();
}

void ExactNumber::trim() {
    while (!digits_.empty() && digits_.back() == 0) digits_.pop_back();
    std::size_t low = 0;
    while (low < digits_.size() && digits_[low] == 0) ++low;
    if (low > 0) {
        digits_.erase_front(low);
        scale_ += static_cast<std::int64_t>(low);
    }
    if (digits_.empty()) {
        negative_ = false;
        scale_ = 0;
    }
}

ExactNumber ExactNumber::operator-() const {
    ExactNumber result = *this;
    if (!result.is_zero()) result.negative_ = !negative_;
    return result;
}

int ExactNumber::compare_magnitudes(const ExactNumber& a, const ExactNumber& b) {
    if (a.is_zero() || b.is_zero()) return int(!a.is_zero()) - int(!b.is_zero());
    // With no leading zero digit, the number whose top digit sits higher is larger.
    std::int64_t top_a = a.scale_ + static_cast<std::int64_t>(a.digits_.size());
    std::int64_t top_b = b.scale_ + static_cast<std::int64_t>(b.digits_.size());
    if (top_a != top_b) return top_a > top_b ? 1 : -1;
    std::int64_t bottom = std::min(a.scale_, b.scale_);
    for (std::int64_t position = top_a - 1; position >= bottom; --position) {
        auto digit = [position](const ExactNumber& n) -> std::uint32_t {
            std::int64_t i = position - n.scale_;
            return (i >= 0 && i < static_cast<std::int64_t>(n.digits_.size())) ? n.digits_[i] : 0;
        };
        std::uint32_t da = digit(a), db = digit(b);
        if (da != db) return da > db ? 1 : -1;
    }
    return 0;
}

ExactNumber ExactNumber::add_magnitudes(const ExactNumber& a, const ExactNumber& b, bool negative) {
    std::int64_t bottom = std::min(a.scale_, b.scale_);
    std::int64_t top = std::max(a.scale_ + std::int64_t(a.digits_.size()),
                                b.scale_ + std::int64_t(b.digits_.size()));
    DigitBuffer sum(static_cast<std::size_t>(top - bottom + 1));
    std::uint64_t carry = 0;
    for (std::size_t i = 0; i + 1 < sum.size(); ++i) {
        std::int64_t position = bottom + std::int64_t(i);
        std::uint64_t s = carry;
        std::int64_t ia = position - a.scale_, ib = position - b.scale_;
        if (ia >= 0 && ia < std::int64_t(a.digits_.size())) s += a.digits_[ia];
        if (ib >= 0 && ib < std::int64_t(b.digits_.size())) s += b.digits_[ib];
        sum[i] = static_cast<std::uint32_t>(s);
        carry = s >> 32;
    }
    sum[sum.size() - 1] = static_cast<std::uint32_t>(carry);
    return ExactNumber(negative, std::move(sum), bottom);
}

ExactNumber ExactNumber::subtract_magnitudes(const ExactNumber& a, const ExactNumber& b,
                                             bool negative) {
    std::int64_t bottom = std::min(a.scale_, b.scale_);
    std::int64_t top = a.scale_ + std::int64_t(a.digits_.size());  // |a| >= |b|
    DigitBuffer difference(static_cast<std::size_t>(top - bottom));
    std::int64_t borrow = 0;
    for (std::size_t i = 0; i < difference.size(); ++i) {
        std::int64_t position = bottom + std::int64_t(i);
        std::int64_t d = -borrow;
        std::int64_t ia = position - a.scale_, ib = position - b.scale_;
        if (ia >= 0 && ia < std::int64_t(a.digits_.size())) d += a.digits_[ia];
        if (ib >= 0 && ib < std::int64_t(b.digits_.size())) d -= b.digits_[ib];
        borrow = d < 0 ? 1 : 0;
        difference[i] = static_cast<std::uint32_t>(d + (borrow << 32));
    }
    return ExactNumber(negative, std::move(difference), bottom);
}

ExactNumber operator+(const ExactNumber& a, const ExactNumber& b) {
    if (a.is_zero()) return b;
    if (b.is_zero()) return a;
    if (a.negative_ == b.negative_) return ExactNumber::add_magnitudes(a, b, a.negative_);
    int order = ExactNumber::compare_magnitudes(a, b);
    if (order == 0) return ExactNumber();
    return order > 0 ? ExactNumber::subtract_magnitudes(a, b, a.negative_)
                     : ExactNumber::subtract_magnitudes(b, a, b.negative_);
}

ExactNumber operator-(const ExactNumber& a, const ExactNumber& b) { return a + (-b); }

ExactNumber operator*(const ExactNumber& a, const ExactNumber& b) {
    if (a.is_zero() || b.is_zero()) return ExactNumber();
    DigitBuffer product(a.digits_.size() + b.digits_.size());
    for (std::size_t i = 0; i < a.digits_.size(); ++i) {
        std::uint64_t carry = 0;
        std::uint64_t ai = a.digits_[i];
        for (std::size_t j = 0; j < b.digits_.size(); ++j) {
            // (2^32-1)^2 + 2(2^32-1) = 2^64-1: never overflows.
            std::uint64_t t = ai * b.digits_[j] + product[i + j] + carry;
            product[i + j] = static_cast<std::uint32_t>(t);
            carry = t >> 32;
        }
        product[i + b.digits_.size()] = static_cast<std::uint32_t>(carry);
    }
    return ExactNumber(a.negative_ != b.negative_, std::move(product), a.scale_ + b.scale_);
}

RoundedBinary ExactNumber::round(std::int64_t lowest_bit) const {
    if (is_zero()) return RoundedBinary{};
    std::size_t n = digits_.size();
    std::uint32_t d2 = digits_[n - 1];
    std::uint32_t d1 = n >= 2 ? digits_[n - 2] : 0;
    std::uint32_t d0 = n >= 3 ? digits_[n - 3] : 0;
    // The lowest digit is nonzero, so anything below the top three is a nonzero rest.
    bool sticky = n > 3;
    std::int64_t exponent_of_d0 = 32 * (scale_ + std::int64_t(n) - 3);
    return round_top_digits(negative_, d2, d1, d0, exponent_of_d0, sticky, lowest_bit);
}

double ExactNumber::to_double() const { return round(kDoubleLowestBit).to_double(); }

ScaledDouble ExactNumber::to_scaled() const {
    return ScaledDouble::from(round(kUnboundedLowestBit));
}

}  // namespace almanac
