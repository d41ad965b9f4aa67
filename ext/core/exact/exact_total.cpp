// SPDX-License-Identifier: MIT
#include "core/exact/exact_total.h"

#include <limits>

namespace almanac {

void ExactTotal::merge(const ExactTotal& other) {
    reals_.add(other.reals_, 0);
    integers_ += other.integers_;
    integer_count_ += other.integer_count_;
    real_count_ += other.real_count_;
}

void ExactTotal::write(ByteWriter& out) const {
    out.i64(integer_count_);
    out.i64(real_count_);
    auto bits = static_cast<Uint128>(integers_);
    out.i64(static_cast<std::int64_t>(static_cast<std::uint64_t>(bits >> 64)));
    out.i64(static_cast<std::int64_t>(static_cast<std::uint64_t>(bits)));
    out.exact_sum(reals_);
}

ExactTotal ExactTotal::read(ByteReader& in) {
    ExactTotal total;
    total.integer_count_ = in.count(INT64_MAX);
    total.real_count_ = in.count(INT64_MAX);
    auto high = static_cast<std::uint64_t>(in.i64());
    auto low = static_cast<std::uint64_t>(in.i64());
    total.integers_ = static_cast<Int128>((Uint128(high) << 64) | Uint128(low));
    in.add_exact_sum(total.reals_);
    return total;
}

std::optional<ExactTotal::Value> ExactTotal::value() const {
    if (count() == 0) return std::nullopt;
    constexpr auto kLeast = std::numeric_limits<std::int64_t>::min();
    constexpr auto kMost = std::numeric_limits<std::int64_t>::max();
    if (real_count_ == 0 && integers_ >= kLeast && integers_ <= kMost)
        return Value{true, static_cast<std::int64_t>(integers_), 0.0};
    return Value{false, 0, reals_.to_double()};
}

}  // namespace almanac
