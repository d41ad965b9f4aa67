// SPDX-License-Identifier: MIT
#include "core/exact/compact_total.h"

#include <limits>

namespace almanac {

namespace {
constexpr std::int64_t kLargestExactInteger = std::int64_t{1} << 53;
}  // namespace

void CompactTotal::add_narrow_into(ExactSum& sum) const {
    if (narrow_ == 0) return;
    bool negative = narrow_ < 0;
    Uint128 magnitude = negative ? Uint128(0) - Uint128(narrow_) : Uint128(narrow_);
    // 32-bit digits are exact doubles.
    for (int i = 0; i < 4; ++i) {
        auto digit = static_cast<double>(static_cast<std::uint32_t>(magnitude >> (32 * i)));
        if (digit != 0) sum.add_scaled(negative ? -digit : digit, exponent_ + 32 * i);
    }
}

void CompactTotal::spill() {
    auto spilled = std::make_unique<Spilled>();
    add_narrow_into(spilled->reals);
    if (!has_real_) spilled->integers = narrow_;  // integers only: exponent 0
    spilled_ = std::move(spilled);
    narrow_ = 0;
}

void CompactTotal::add_integer(std::int64_t v) {
    if (!spilled_) {
        // Up to 2^53 an integer is its own double, so one exact sum serves
        // both the INTEGER total and the REAL one.
        if (v >= -kLargestExactInteger && v <= kLargestExactInteger) {
            bool negative = v < 0;
            auto magnitude = negative ? std::uint64_t{0} - static_cast<std::uint64_t>(v)
                                      : static_cast<std::uint64_t>(v);
            if (add_to_narrow(narrow_, exponent_, magnitude, 0, negative)) {
                has_value_ = true;
                return;
            }
        }
        spill();
    }
    // The REAL total first: it is the one that can run out of memory, and a
    // failed add must leave the total as it was.
    spilled_->reals.add(static_cast<double>(v));
    spilled_->integers += Int128(v);
    has_value_ = true;
}

void CompactTotal::add_real(double v) {
    if (!spilled_) {
        DoubleParts parts = split_double(v);
        // ±0 adds nothing but still makes the total a REAL one.
        if (parts.finite &&
            (parts.mantissa == 0 ||
             add_to_narrow(narrow_, exponent_, parts.mantissa, parts.exponent, parts.negative))) {
            has_value_ = has_real_ = true;
            return;
        }
        spill();
    }
    spilled_->reals.add(v);  // throws for a non-finite v, as ExactSum does
    has_value_ = has_real_ = true;
}

void CompactTotal::add(const CompactTotal& other) {
    if (!other.has_value_) return;
    if (!spilled_ && !other.spilled_) {
        // Both in the fast form: one term when the other's integer has at most 64 bits.
        bool negative = other.narrow_ < 0;
        Uint128 magnitude = negative ? Uint128(0) - Uint128(other.narrow_) : Uint128(other.narrow_);
        if (magnitude >> 64 == 0 &&
            (magnitude == 0 || add_to_narrow(narrow_, exponent_, static_cast<std::uint64_t>(magnitude),
                                             other.exponent_, negative))) {
            has_value_ = true;
            has_real_ = has_real_ || other.has_real_;
            return;
        }
    }
    if (!spilled_) spill();
    // The REAL total first, as in add_integer: it is the one that can run out of memory.
    if (other.spilled_) {
        spilled_->reals.add(other.spilled_->reals, 0);
    } else {
        other.add_narrow_into(spilled_->reals);
    }
    // The integer total means something only while no REAL came, on either side.
    if (!other.has_real_) spilled_->integers += other.spilled_ ? other.spilled_->integers : other.narrow_;
    has_value_ = true;
    has_real_ = has_real_ || other.has_real_;
}

std::optional<ExactTotal::Value> CompactTotal::value() const {
    if (!has_value_) return std::nullopt;
    constexpr auto kLeast = std::numeric_limits<std::int64_t>::min();
    constexpr auto kMost = std::numeric_limits<std::int64_t>::max();
    if (!has_real_) {
        Int128 integers = spilled_ ? spilled_->integers : narrow_;
        if (integers >= kLeast && integers <= kMost)
            return ExactTotal::Value{true, static_cast<std::int64_t>(integers), 0.0};
    }
    if (spilled_) return ExactTotal::Value{false, 0, spilled_->reals.to_double()};
    ExactSum sum;
    add_narrow_into(sum);
    return ExactTotal::Value{false, 0, sum.to_double()};
}

}  // namespace almanac
