// SPDX-License-Identifier: MIT
// STL's robustness weights (Cleveland et al. 1990, the outer loop): the
// bisquare B(u) = (1 − u²)² of each remainder |y − fit| over six times the
// median remainder, 1 below 0.1 % of that scale and 0 from 99.9 % of it. A
// promotion day or a closure gets a weight near 0, so the next pass fits the
// trend and the season as if it were not there.
//
// The median is the true one (the mean of the two middle values for an even
// count), as statsmodels' STL computes it, not the partial sort of the
// original program, which could pick a wrong middle value.
#pragma once

#include <cstddef>
#include <vector>

namespace almanac {

class RobustnessWeights {
  public:
    // weights[i] for y[i] against fit[i], i < n.
    void compute(const double* y, const double* fit, std::size_t n, double* weights);

  private:
    std::vector<double> remainders_;
};

}  // namespace almanac
