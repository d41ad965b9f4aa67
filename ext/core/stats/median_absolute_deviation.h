// SPDX-License-Identifier: MIT
// The median absolute deviation: the median of |x − median(x)|, unscaled
// (times 1.4826 it estimates a normal distribution's standard deviation).
// Medians are numpy.median's (the mean of the two middle values for an even
// count), so the result is the double scipy.stats.median_abs_deviation(x)
// gives, bit for bit.
#pragma once

#include <optional>
#include <vector>

namespace almanac {

// nullopt when empty. Values must be finite.
std::optional<double> median_absolute_deviation(std::vector<double> values);

}  // namespace almanac
