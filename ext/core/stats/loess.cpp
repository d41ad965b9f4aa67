// SPDX-License-Identifier: MIT
#include "core/stats/loess.h"

#include <algorithm>
#include <cmath>

namespace almanac {

std::optional<double> loess_fit_at(const double* y, std::size_t n, std::size_t span, int degree,
                                   double x, std::size_t left, std::size_t right,
                                   const double* robustness, double* scratch) {
    double* w = scratch - 1;  // 1-based, as the positions
    const double range = static_cast<double>(n) - 1.0;
    double h = std::max(x - static_cast<double>(left), static_cast<double>(right) - x);
    if (span > n) h += static_cast<double>((span - n) / 2);
    // Points within 0.1 % of the half-width count fully, those beyond
    // 99.9 % not at all: the published cut-offs.
    const double h9 = 0.999 * h;
    const double h1 = 0.001 * h;
    double total = 0.0;
    for (std::size_t j = left; j <= right; ++j) {
        w[j] = 0.0;
        const double r = std::fabs(static_cast<double>(j) - x);
        if (r <= h9) {
            // std::pow, not r·r·r: the cube rounded once, as the reference computes it.
            w[j] = r <= h1 ? 1.0 : std::pow(1.0 - std::pow(r / h, 3.0), 3.0);
            if (robustness) w[j] = robustness[j - 1] * w[j];
            total = total + w[j];
        }
    }
    if (total <= 0.0) return std::nullopt;
    for (std::size_t j = left; j <= right; ++j) w[j] = w[j] / total;
    if (h > 0.0 && degree > 0) {
        // The local line, folded into the weights: ŷ(x) = Σ w_j (1 + b (j − a)) y_j
        // with a the weighted mean position and b = (x − a)/Σ w_j (j − a)².
        double mean = 0.0;
        for (std::size_t j = left; j <= right; ++j) mean = mean + w[j] * static_cast<double>(j);
        double b = x - mean;
        double spread = 0.0;
        for (std::size_t j = left; j <= right; ++j) {
            const double d = static_cast<double>(j) - mean;
            spread = spread + w[j] * (d * d);
        }
        // Positions too close together to carry a slope: the weighted mean stands.
        if (std::sqrt(spread) > 0.001 * range) {
            b = b / spread;
            for (std::size_t j = left; j <= right; ++j)
                w[j] = w[j] * (b * (static_cast<double>(j) - mean) + 1.0);
        }
    }
    double fit = 0.0;
    for (std::size_t j = left; j <= right; ++j) fit = fit + w[j] * y[j - 1];
    return fit;
}

void loess_smooth(const double* y, std::size_t n, std::size_t span, int degree,
                  const double* robustness, double* out, double* scratch) {
    if (n < 2) {
        if (n == 1) out[0] = y[0];
        return;
    }
    std::size_t left = 1;
    std::size_t right = std::min(span, n);
    const std::size_t half = (span + 1) / 2;
    for (std::size_t i = 1; i <= n; ++i) {
        if (span < n && i > half && right != n) {
            ++left;
            ++right;
        }
        const auto fit = loess_fit_at(y, n, span, degree, static_cast<double>(i), left, right,
                                      robustness, scratch);
        out[i - 1] = fit ? *fit : y[i - 1];
    }
}

}  // namespace almanac
