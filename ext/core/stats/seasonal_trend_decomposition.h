// SPDX-License-Identifier: MIT
// STL, the seasonal-trend decomposition by loess (Cleveland, Cleveland,
// McRae & Terpenning 1990, "STL: A Seasonal-Trend Decomposition Procedure
// Based on Loess", Journal of Official Statistics 6(1)): a series is split
// into trend + season + remainder (the noise) by alternating
//   1. detrend, 2. smooth each cycle-subseries (cycle_subseries.h),
//   3. low-pass filter the result (low_pass_filter.h) and take it out of the
//      season, 4. deseasonalise, 5. smooth the trend by loess (loess.h),
// `inner` times per outer pass; each outer pass but the last sets the
// robustness weights (robustness_weights.h) from the remainder.
//
// The settings are those of statsmodels' STL, whose defaults follow the
// paper's suggestions; the numerics are the published procedure's, step for
// step (see loess.h for why that matters).
#pragma once

#include <cstddef>
#include <vector>

#include "core/stats/cycle_subseries.h"
#include "core/stats/loess.h"
#include "core/stats/robustness_weights.h"

namespace almanac {

struct StlSettings {
    std::size_t period = 2;    // n_p, values per cycle, at least 2
    std::size_t seasonal = 7;  // n_s, the subseries smoother's span: odd, at least 3
    std::size_t trend = 0;     // n_t, odd, greater than period
    std::size_t low_pass = 0;  // n_l, odd, greater than period
    int seasonal_degree = 1, trend_degree = 1, low_pass_degree = 1;
    bool robust = false;
    int inner = 5;  // passes per outer pass
    int outer = 0;  // robust re-fits

    // The defaults for a period and a seasonal span: n_t the smallest odd
    // integer not below 1.5·n_p/(1 − 1.5/n_s) (computed in double precision,
    // as statsmodels computes it), n_l the smallest odd integer greater than
    // n_p, degree 1 everywhere; robust: 2 inner and 15 outer passes, else 5
    // and 0. Throws Error for a period below 2 or a seasonal span that is
    // even or below 3.
    static StlSettings defaults(std::size_t period, std::size_t seasonal, bool robust);
};

// The parts of a series of n values, each n long; weight is the robustness
// weight of the last pass, in [0, 1] (all 1 when not robust).
struct StlParts {
    std::vector<double> trend, season, remainder, weight;
};

// Decomposes one series after another, reusing its working memory: O(n)
// for a series of n values.
class SeasonalTrendDecomposition {
  public:
    // Needs at least two whole cycles (n ≥ 2·period); throws Error otherwise.
    // Values must be finite.
    void decompose(const std::vector<double>& y, const StlSettings& settings, StlParts& parts);

  private:
    void inner_pass(const std::vector<double>& y, bool use_weights, StlParts& parts);

    StlSettings settings_;
    Loess loess_;
    CycleSubseriesSmoother subseries_;
    RobustnessWeights robustness_;
    std::vector<double> detrended_, cycles_, averaged_, low_pass_, scratch_;
};

}  // namespace almanac
