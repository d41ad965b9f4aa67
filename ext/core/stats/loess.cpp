// SPDX-License-Identifier: MIT
#include "core/stats/loess.h"

#include <algorithm>
#include <cmath>

namespace almanac {
namespace {

// Rows of the tricube table up to this half-width: a series longer than
// that is rare, and a longer seasonal span's subseries need few rows.
constexpr double kLongestTabledHalfWidth = 4096;

double tricube_of(double r, double h) {
    // std::pow, not r·r·r: each cube rounded once, as the reference computes it.
    return std::pow(1.0 - std::pow(r / h, 3.0), 3.0);
}

}  // namespace

const double* Loess::tricube_row(double h, double x) {
    if (!(h <= kLongestTabledHalfWidth) || std::floor(h) != h || std::floor(x) != x) return nullptr;
    const auto half_width = static_cast<std::size_t>(h);
    if (tricube_by_half_width_.size() <= half_width) tricube_by_half_width_.resize(half_width + 1);
    std::vector<double>& row = tricube_by_half_width_[half_width];
    if (row.empty()) {
        row.resize(half_width + 1);
        for (std::size_t d = 0; d <= half_width; ++d)
            row[d] = tricube_of(static_cast<double>(d), h);
    }
    return row.data();
}

std::optional<double> Loess::fit_at(const double* y, std::size_t n, std::size_t span, int degree,
                                    double x, std::size_t left, std::size_t right,
                                    const double* robustness) {
    if (weights_.size() < n + 1) weights_.resize(n + 1);
    double* w = weights_.data();  // 1-based, as the positions
    const double range = static_cast<double>(n) - 1.0;
    double h = std::max(x - static_cast<double>(left), static_cast<double>(right) - x);
    if (span > n) h += static_cast<double>((span - n) / 2);
    // Points within 0.1 % of the half-width count fully, those beyond
    // 99.9 % not at all: the published cut-offs.
    const double h9 = 0.999 * h;
    const double h1 = 0.001 * h;
    const double* tabled = tricube_row(h, x);
    double total = 0.0;
    for (std::size_t j = left; j <= right; ++j) {
        w[j] = 0.0;
        const double r = std::fabs(static_cast<double>(j) - x);
        if (r <= h9) {
            w[j] = r <= h1 ? 1.0 : tabled ? tabled[static_cast<std::size_t>(r)] : tricube_of(r, h);
            if (robustness) w[j] = robustness[j - 1] * w[j];
            total = total + w[j];
        }
    }
    if (total <= 0.0) return std::nullopt;
    // The loops are fused where one only reads what the one before wrote for
    // the same j: each value is still computed, and each sum added up, in the
    // published order.
    double fit = 0.0;
    if (h > 0.0 && degree > 0) {
        // The local line, folded into the weights: ŷ(x) = Σ w_j (1 + b (j − a)) y_j
        // with a the weighted mean position and b = (x − a)/Σ w_j (j − a)².
        double mean = 0.0;
        for (std::size_t j = left; j <= right; ++j) {
            w[j] = w[j] / total;
            mean = mean + w[j] * static_cast<double>(j);
        }
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
                fit = fit + w[j] * (b * (static_cast<double>(j) - mean) + 1.0) * y[j - 1];
            return fit;
        }
    } else {
        for (std::size_t j = left; j <= right; ++j) w[j] = w[j] / total;
    }
    for (std::size_t j = left; j <= right; ++j) fit = fit + w[j] * y[j - 1];
    return fit;
}

void Loess::smooth(const double* y, std::size_t n, std::size_t span, int degree,
                   const double* robustness, double* out) {
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
        const auto fit =
            fit_at(y, n, span, degree, static_cast<double>(i), left, right, robustness);
        out[i - 1] = fit ? *fit : y[i - 1];
    }
}

}  // namespace almanac
