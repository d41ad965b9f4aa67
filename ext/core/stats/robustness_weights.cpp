// SPDX-License-Identifier: MIT
#include "core/stats/robustness_weights.h"

#include <algorithm>
#include <cmath>

namespace almanac {

void RobustnessWeights::compute(const double* y, const double* fit, std::size_t n,
                                double* weights) {
    if (n == 0) return;
    remainders_.resize(n);
    for (std::size_t i = 0; i < n; ++i) remainders_[i] = std::fabs(y[i] - fit[i]);
    const auto upper = remainders_.begin() + static_cast<std::ptrdiff_t>(n / 2);
    std::nth_element(remainders_.begin(), upper, remainders_.end());
    const double high = *upper;
    const double low = n % 2 == 1 ? high : *std::max_element(remainders_.begin(), upper);
    const double scale = 3.0 * (low + high);  // six times the median
    // Half the fit exact or better: no remainder can tell the unusual from
    // the usual, so every point keeps its full weight.
    if (scale == 0.0) {
        std::fill(weights, weights + n, 1.0);
        return;
    }
    const double c9 = 0.999 * scale;
    const double c1 = 0.001 * scale;
    for (std::size_t i = 0; i < n; ++i) {
        const double r = std::fabs(y[i] - fit[i]);
        if (r <= c1) {
            weights[i] = 1.0;
        } else if (r <= c9) {
            const double u = r / scale;
            const double v = 1.0 - u * u;
            weights[i] = v * v;
        } else {
            weights[i] = 0.0;
        }
    }
}

}  // namespace almanac
