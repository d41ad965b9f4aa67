// SPDX-License-Identifier: MIT
// How close two names are, for "did you mean": the share of adjacent
// character pairs they have in common (Dice's coefficient of the two sets of
// pairs), ASCII letters compared without case. A typo or a missing word keeps
// most pairs, so 'Pumpkin lof' is closest to 'Pumpkin loaf', not to 'Pie'.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace almanac {

// 2 * |pairs(a) & pairs(b)| / (|pairs(a)| + |pairs(b)|), in [0, 1]; pairs are
// of UTF-8 characters. 0 when neither name has a pair (one character or none).
double pair_similarity(std::string_view a, std::string_view b);

// The name of `names` closest to `wanted`: the highest pair_similarity, ties
// to the first in byte order. Nothing when `names` is empty.
std::optional<std::string> closest_name(std::string_view wanted, const std::vector<std::string>& names);

}  // namespace almanac
