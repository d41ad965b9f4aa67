// SPDX-License-Identifier: MIT
#include "core/stats/median_absolute_deviation.h"

#include <algorithm>
#include <cmath>

namespace almanac {
namespace {

// numpy.median: the middle value, or (a + b)/2 of the two middle ones. Not
// the quantile interpolation a + (b − a)/2, which can differ in the last bit.
double median_in_place(std::vector<double>& values) {
    const std::size_t n = values.size();
    auto upper = values.begin() + static_cast<std::ptrdiff_t>(n / 2);
    std::nth_element(values.begin(), upper, values.end());
    if (n % 2 == 1) return *upper;
    const double lower = *std::max_element(values.begin(), upper);
    return (lower + *upper) / 2.0;
}

}  // namespace

std::optional<double> median_absolute_deviation(std::vector<double> values) {
    if (values.empty()) return std::nullopt;
    const double center = median_in_place(values);
    for (double& v : values) v = std::abs(v - center);
    return median_in_place(values);
}

}  // namespace almanac
