// SPDX-License-Identifier: MIT
// Loess (Cleveland 1979) as STL uses it: at each point, a weighted
// least-squares line (degree 1) or constant (degree 0) through the `span`
// nearest points, weighted by the tricube of their distance and, in STL's
// robust passes, by a robustness weight per point.
//
// Positions are 1, 2, ..., n and every quantity is computed in the order and
// the precision of the published procedure (Cleveland, Cleveland, McRae &
// Terpenning 1990, its appendix; statsmodels' STL follows it line by line),
// so the fits agree with that implementation to the last bits, not only to a
// tolerance: STL's passes feed each fit into the next, and a different
// rounding early on would be carried through all of them.
#pragma once

#include <cstddef>
#include <optional>

namespace almanac {

// The fit at position x (need not be a whole number, nor inside [1, n]) from
// the points left..right (1-based, inclusive) of y[0..n). The tricube's
// half-width is the distance to the farther end of that window, widened by
// (span − n)/2 when the span is longer than the series. `robustness` (n
// values, or nullptr for none) multiplies the tricube weights. `scratch`
// holds n doubles. nullopt when every weight is 0.
std::optional<double> loess_fit_at(const double* y, std::size_t n, std::size_t span, int degree,
                                   double x, std::size_t left, std::size_t right,
                                   const double* robustness, double* scratch);

// The fit at every position 1..n into out[0..n): the window of `span`
// points slides along with the position, centred where it can be. A point
// whose weights are all 0 keeps its own value. `scratch` holds n doubles.
void loess_smooth(const double* y, std::size_t n, std::size_t span, int degree,
                  const double* robustness, double* out, double* scratch);

}  // namespace almanac
