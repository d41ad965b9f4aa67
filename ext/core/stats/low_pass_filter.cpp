// SPDX-License-Identifier: MIT
#include "core/stats/low_pass_filter.h"

namespace almanac {

void moving_average(const double* x, std::size_t n, std::size_t length, double* out) {
    const std::size_t count = n - length + 1;
    const double divisor = static_cast<double>(length);
    double sum = 0.0;
    for (std::size_t i = 0; i < length; ++i) sum = sum + x[i];
    out[0] = sum / divisor;
    for (std::size_t j = 1; j < count; ++j) {
        sum = sum + (x[j + length - 1] - x[j - 1]);
        out[j] = sum / divisor;
    }
}

void low_pass_averages(const double* x, std::size_t n, std::size_t period, double* out,
                       double* scratch) {
    moving_average(x, n, period, out);
    moving_average(out, n - period + 1, period, scratch);
    moving_average(scratch, n - 2 * period + 2, 3, out);
}

}  // namespace almanac
