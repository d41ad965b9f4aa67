// SPDX-License-Identifier: MIT
#include "core/stats/seasonal_trend_decomposition.h"

#include <cmath>

#include "core/stats/low_pass_filter.h"
#include "core/text/error.h"

namespace almanac {
namespace {

std::size_t odd_at_least(double bound) {
    auto value = static_cast<std::size_t>(std::ceil(bound));
    return value % 2 == 0 ? value + 1 : value;
}

}  // namespace

StlSettings StlSettings::defaults(std::size_t period, std::size_t seasonal, bool robust) {
    if (period < 2) throw Error("expected a period of at least 2 values");
    if (seasonal < 3 || seasonal % 2 == 0)
        throw Error("expected an odd seasonal span of at least 3");
    StlSettings settings;
    settings.period = period;
    settings.seasonal = seasonal;
    const double p = static_cast<double>(period);
    settings.trend = odd_at_least(1.5 * p / (1.0 - 1.5 / static_cast<double>(seasonal)));
    settings.low_pass = period % 2 == 0 ? period + 1 : period + 2;
    settings.robust = robust;
    settings.inner = robust ? 2 : 5;
    settings.outer = robust ? 15 : 0;
    return settings;
}

void SeasonalTrendDecomposition::inner_pass(const std::vector<double>& y, bool use_weights,
                                            StlParts& parts) {
    const std::size_t n = y.size();
    const std::size_t np = settings_.period;
    const double* weights = use_weights ? parts.weight.data() : nullptr;
    for (std::size_t i = 0; i < n; ++i) detrended_[i] = y[i] - parts.trend[i];
    subseries_.smooth(loess_, detrended_.data(), n, np, settings_.seasonal,
                      settings_.seasonal_degree, weights, cycles_.data());
    low_pass_averages(cycles_.data(), n + 2 * np, np, averaged_.data(), scratch_.data());
    loess_.smooth(averaged_.data(), n, settings_.low_pass, settings_.low_pass_degree, nullptr,
                  low_pass_.data());
    for (std::size_t i = 0; i < n; ++i) parts.season[i] = cycles_[np + i] - low_pass_[i];
    for (std::size_t i = 0; i < n; ++i) detrended_[i] = y[i] - parts.season[i];
    loess_.smooth(detrended_.data(), n, settings_.trend, settings_.trend_degree, weights,
                  parts.trend.data());
}

void SeasonalTrendDecomposition::decompose(const std::vector<double>& y,
                                           const StlSettings& settings, StlParts& parts) {
    settings_ = settings;
    const std::size_t n = y.size();
    const std::size_t np = settings_.period;
    if (n < 2 * np) throw Error("expected at least two whole cycles of values");
    detrended_.resize(n);
    cycles_.resize(n + 2 * np);
    averaged_.resize(n + np + 1);
    low_pass_.resize(n);
    scratch_.resize(n + np + 1);
    parts.trend.assign(n, 0.0);
    parts.season.assign(n, 0.0);
    parts.weight.assign(n, 1.0);
    parts.remainder.resize(n);
    for (int pass = 0;; ++pass) {
        for (int i = 0; i < settings_.inner; ++i) inner_pass(y, pass > 0, parts);
        if (pass >= settings_.outer) break;
        for (std::size_t i = 0; i < n; ++i) parts.remainder[i] = parts.trend[i] + parts.season[i];
        robustness_.compute(y.data(), parts.remainder.data(), n, parts.weight.data());
    }
    if (settings_.outer <= 0) parts.weight.assign(n, 1.0);
    for (std::size_t i = 0; i < n; ++i)
        parts.remainder[i] = y[i] - parts.season[i] - parts.trend[i];
}

}  // namespace almanac
