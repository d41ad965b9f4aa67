// SPDX-License-Identifier: MIT
// STL's low-pass filter of the cycle-subseries (Cleveland et al. 1990, step
// 3 of the inner loop): a moving average of length period, another of length
// period, and one of length 3, which together take 2·period values off a
// series; loess of that result (the caller's step) finishes the filter. What
// passes is the slow part the subseries smoothing let through, which is then
// taken out of the season so that it does not carry the trend.
#pragma once

#include <cstddef>

namespace almanac {

// Means of each `length` consecutive values of x[0..n) into out[0..n − length + 1),
// by a running sum that adds the difference of the value entering and the
// one leaving, as statsmodels' STL computes them (the original program adds
// and takes off in two steps, which rounds differently).
void moving_average(const double* x, std::size_t n, std::size_t length, double* out);

// The three moving averages: n values of x in, n − 2·period out. out and
// scratch each hold n − period + 1 values (out keeps the first average on
// the way).
void low_pass_averages(const double* x, std::size_t n, std::size_t period, double* out,
                       double* scratch);

}  // namespace almanac
