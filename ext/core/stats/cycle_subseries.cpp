// SPDX-License-Identifier: MIT
#include "core/stats/cycle_subseries.h"

#include <algorithm>

namespace almanac {

void CycleSubseriesSmoother::smooth(Loess& loess, const double* y, std::size_t n,
                                    std::size_t period, std::size_t span, int degree,
                                    const double* robustness, double* out) {
    const std::size_t longest = (n + period - 1) / period;
    values_.resize(longest);
    weights_.resize(longest);
    fit_.resize(longest + 2);
    for (std::size_t p = 0; p < period; ++p) {
        const std::size_t k = (n - p - 1) / period + 1;  // cycles that reach position p
        for (std::size_t i = 0; i < k; ++i) values_[i] = y[i * period + p];
        const double* weights = nullptr;
        if (robustness) {
            for (std::size_t i = 0; i < k; ++i) weights_[i] = robustness[i * period + p];
            weights = weights_.data();
        }
        loess.smooth(values_.data(), k, span, degree, weights, fit_.data() + 1);
        // One cycle before the first and one after the last, each from the
        // span's worth of cycles nearest to it; where no weight reaches it,
        // the neighbouring fit is repeated.
        const auto before =
            loess.fit_at(values_.data(), k, span, degree, 0.0, 1, std::min(span, k), weights);
        fit_[0] = before ? *before : fit_[1];
        const std::size_t left = k > span ? k - span + 1 : 1;
        const auto after = loess.fit_at(values_.data(), k, span, degree, static_cast<double>(k + 1),
                                        left, k, weights);
        fit_[k + 1] = after ? *after : fit_[k];
        for (std::size_t m = 0; m < k + 2; ++m) out[m * period + p] = fit_[m];
    }
}

}  // namespace almanac
