// SPDX-License-Identifier: MIT
// STL's cycle-subseries smoothing (Cleveland et al. 1990, step 2 of the
// inner loop): the values at the same position of every cycle (every first
// Monday, every week 47) form a subseries, and each subseries is smoothed by
// loess on its own, then extended by one fitted value before its first and
// after its last cycle. Those extensions are what the low-pass filter's
// moving averages eat at the two ends.
#pragma once

#include <cstddef>
#include <vector>

#include "core/stats/loess.h"

namespace almanac {

class CycleSubseriesSmoother {
  public:
    // y and robustness (nullptr for none) hold n values; out receives
    // n + 2·period: out[k·period + p] is subseries p's value at cycle k − 1,
    // so out[period + i] is the smoothed value at i.
    void smooth(Loess& loess, const double* y, std::size_t n, std::size_t period, std::size_t span,
                int degree, const double* robustness, double* out);

  private:
    // Per subseries, reused: its values, robustness weights, and the fit
    // with room for the two extensions.
    std::vector<double> values_, weights_, fit_;
};

}  // namespace almanac
