// SPDX-License-Identifier: MIT
#include "core/exact/exact_total.h"

#include <limits>

namespace almanac {

std::optional<ExactTotal::Value> ExactTotal::value() const {
    if (count() == 0) return std::nullopt;
    constexpr auto kLeast = std::numeric_limits<std::int64_t>::min();
    constexpr auto kMost = std::numeric_limits<std::int64_t>::max();
    if (real_count_ == 0 && integers_ >= kLeast && integers_ <= kMost)
        return Value{true, static_cast<std::int64_t>(integers_), 0.0};
    return Value{false, 0, reals_.to_double()};
}

}  // namespace almanac
