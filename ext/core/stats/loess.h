// SPDX-License-Identifier: MIT
// Loess (Cleveland 1979) as STL uses it: at each point, a weighted
// least-squares line (degree 1) or constant (degree 0) through the `span`
// nearest points, weighted by the tricube of their distance and, in STL's
// robust passes, by a robustness weight per point.
//
// Positions are 1, 2, ..., n and every quantity is computed in the order and
// the precision of the published procedure (Cleveland, Cleveland, McRae &
// Terpenning 1990, its appendix), as statsmodels' STL computes it, so the
// fits agree with that implementation to the last bits, not only to a
// tolerance: STL's passes feed each fit into the next, and a different
// rounding early on would be carried through all of them.
#pragma once

#include <cstddef>
#include <optional>
#include <vector>

namespace almanac {

class Loess {
  public:
    // The fit at position x (need not be inside [1, n]) from the points
    // left..right (1-based, inclusive) of y[0..n). The tricube's half-width
    // is the distance to the farther end of that window, widened by
    // (span − n)/2 when the span is longer than the series. `robustness`
    // (n values, or nullptr for none) multiplies the tricube weights.
    // nullopt when every weight is 0.
    std::optional<double> fit_at(const double* y, std::size_t n, std::size_t span, int degree,
                                 double x, std::size_t left, std::size_t right,
                                 const double* robustness);

    // The fit at every position 1..n into out[0..n): the window of `span`
    // points slides along with the position, centred where it can be. A
    // point whose weights are all 0 keeps its own value.
    void smooth(const double* y, std::size_t n, std::size_t span, int degree,
                const double* robustness, double* out);

  private:
    // The tricube (1 − (r/h)³)³ of the distances 0, 1, ..., h. STL asks for
    // it at whole-number positions and half-widths only, over and over
    // (thirty-odd passes of every point), so those are computed once and
    // looked up: the very same doubles. nullptr for other h or x.
    const double* tricube_row(double h, double x);

    std::vector<double> weights_;
    std::vector<std::vector<double>> tricube_by_half_width_;  // [h][r]
};

}  // namespace almanac
