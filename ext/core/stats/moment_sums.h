// SPDX-License-Identifier: MIT
// Exact moment sums for variance, covariance and least-squares regression.
//
// n, Σx, Σy, Σx², Σxy, Σy² are kept exactly (ExactSum: the squares and
// cross products enter as exact products of doubles), so adding and removing
// rows never loses anything, and a sliding frame's statistics are those of a
// fresh computation over the frame. The centred sums are then combined
// exactly as
//     n·Sxx = n·Σx² − (Σx)²,  n·Sxy = n·Σxy − Σx·Σy,  n·Syy = n·Σy² − (Σy)²
// and every statistic is a ratio of such exact numbers (below, D means the
// n·S form), rounded once per exact operand:
//     slope     = Dxy / Dxx
//     intercept = (Σy·Σx² − Σx·Σxy) / Dxx
//     SSE       = (Dxx·Dyy − Dxy²) / (n·Dxx)
//     r²        = Dxy² / (Dxx·Dyy)
// so none of them suffers the cancellation of the textbook streaming
// formulas (Syy − Sxy²/Sxx in doubles, or Σx² − n·x̄²).
#pragma once

#include <cstdint>
#include <optional>

#include "core/exact/exact_number.h"
#include "core/exact/exact_sum.h"
#include "core/exact/state_bytes.h"

namespace almanac {

class UnivariateMoments {
  public:
    void add(double x);
    void remove(double x);
    std::int64_t count() const { return n_; }

    // Population (divide by n) or sample (n − 1); nullopt when n is too small.
    std::optional<double> variance(bool sample) const;
    std::optional<double> standard_deviation(bool sample) const;

  private:
    std::int64_t n_ = 0;
    ExactSum sum_, sum_of_squares_;
};

class BivariateMoments {
  public:
    // Argument order y, x, as in the SQL standard's regr_* functions.
    void add(double y, double x);
    void remove(double y, double x);
    std::int64_t count() const { return n_; }
    // Adds another group's rows: its sums, exactly.
    void merge(const BivariateMoments& other);
    // The byte form (core/exact/state_bytes.h): n, then the sums Σx, Σy, Σx², Σxy, Σy².
    void write(ByteWriter& out) const;
    static BivariateMoments read(ByteReader& in);

    std::optional<double> mean_x() const;
    std::optional<double> mean_y() const;
    std::optional<double> sxx() const;  // Σ(x − x̄)²
    std::optional<double> syy() const;
    std::optional<double> sxy() const;
    std::optional<double> covariance(bool sample) const;
    std::optional<double> correlation() const;
    std::optional<double> slope() const;
    std::optional<double> intercept() const;
    std::optional<double> r_squared() const;
    // √(SSE/(n − 2)): nullopt for n < 3 or Sxx = 0.
    std::optional<double> residual_sd() const;
    // residual_sd / √Sxx: nullopt for n < 3 or Sxx = 0.
    std::optional<double> slope_stderr() const;

  private:
    ExactNumber n_times_sxx() const;
    ExactNumber n_times_syy() const;
    ExactNumber n_times_sxy() const;
    // Dxx·Dyy − Dxy² = n²·Sxx·SSE, never negative.
    ExactNumber residual_numerator(const ExactNumber& dxx) const;

    std::int64_t n_ = 0;
    ExactSum sum_x_, sum_y_, sum_xx_, sum_xy_, sum_yy_;
};

}  // namespace almanac
