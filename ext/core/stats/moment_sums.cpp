// SPDX-License-Identifier: MIT
#include "core/stats/moment_sums.h"

#include <algorithm>
#include <cmath>

namespace almanac {
namespace {

ScaledDouble scaled(std::int64_t n) { return ScaledDouble::from(static_cast<double>(n)); }

ExactNumber exact(std::int64_t n) { return ExactNumber(static_cast<std::uint64_t>(n)); }

// n·Σa·b − Σa·Σb from exact sums.
ExactNumber centred(std::int64_t n, const ExactSum& sum_ab, const ExactSum& sum_a,
                    const ExactSum& sum_b) {
    return exact(n) * sum_ab.value() - sum_a.value() * sum_b.value();
}

}  // namespace

void UnivariateMoments::add(double x) {
    ++n_;
    sum_.add(x);
    sum_of_squares_.add_product(x, x);
}

void UnivariateMoments::remove(double x) {
    --n_;
    sum_.subtract(x);
    sum_of_squares_.subtract_product(x, x);
}

std::optional<double> UnivariateMoments::variance(bool sample) const {
    if (n_ < (sample ? 2 : 1)) return std::nullopt;
    ExactNumber s = sum_.value();
    ExactNumber d = exact(n_) * sum_of_squares_.value() - s * s;  // n·Sxx, exact, >= 0
    if (d.is_zero()) return 0.0;
    ScaledDouble denominator = scaled(n_) * scaled(sample ? n_ - 1 : n_);
    return (d.to_scaled() / denominator).to_double();
}

std::optional<double> UnivariateMoments::standard_deviation(bool sample) const {
    if (n_ < (sample ? 2 : 1)) return std::nullopt;
    ExactNumber s = sum_.value();
    ExactNumber d = exact(n_) * sum_of_squares_.value() - s * s;
    if (d.is_zero()) return 0.0;
    ScaledDouble denominator = scaled(n_) * scaled(sample ? n_ - 1 : n_);
    return sqrt(d.to_scaled() / denominator).to_double();
}

void BivariateMoments::merge(const BivariateMoments& other) {
    n_ += other.n_;
    sum_x_.add(other.sum_x_, 0);
    sum_y_.add(other.sum_y_, 0);
    sum_xx_.add(other.sum_xx_, 0);
    sum_xy_.add(other.sum_xy_, 0);
    sum_yy_.add(other.sum_yy_, 0);
}

void BivariateMoments::write(ByteWriter& out) const {
    out.i64(n_);
    for (const ExactSum* sum : {&sum_x_, &sum_y_, &sum_xx_, &sum_xy_, &sum_yy_})
        out.exact_sum(*sum);
}

BivariateMoments BivariateMoments::read(ByteReader& in) {
    BivariateMoments moments;
    moments.n_ = in.count(INT64_MAX);
    for (ExactSum* sum :
         {&moments.sum_x_, &moments.sum_y_, &moments.sum_xx_, &moments.sum_xy_, &moments.sum_yy_})
        in.add_exact_sum(*sum);
    return moments;
}

void BivariateMoments::add(double y, double x) {
    ++n_;
    sum_x_.add(x);
    sum_y_.add(y);
    sum_xx_.add_product(x, x);
    sum_xy_.add_product(x, y);
    sum_yy_.add_product(y, y);
}

void BivariateMoments::remove(double y, double x) {
    --n_;
    sum_x_.subtract(x);
    sum_y_.subtract(y);
    sum_xx_.subtract_product(x, x);
    sum_xy_.subtract_product(x, y);
    sum_yy_.subtract_product(y, y);
}

ExactNumber BivariateMoments::n_times_sxx() const { return centred(n_, sum_xx_, sum_x_, sum_x_); }
ExactNumber BivariateMoments::n_times_syy() const { return centred(n_, sum_yy_, sum_y_, sum_y_); }
ExactNumber BivariateMoments::n_times_sxy() const { return centred(n_, sum_xy_, sum_x_, sum_y_); }

ExactNumber BivariateMoments::residual_numerator(const ExactNumber& dxx) const {
    ExactNumber dxy = n_times_sxy();
    return dxx * n_times_syy() - dxy * dxy;
}

std::optional<double> BivariateMoments::mean_x() const {
    if (n_ < 1) return std::nullopt;
    return sum_x_.to_double() / static_cast<double>(n_);
}

std::optional<double> BivariateMoments::mean_y() const {
    if (n_ < 1) return std::nullopt;
    return sum_y_.to_double() / static_cast<double>(n_);
}

std::optional<double> BivariateMoments::sxx() const {
    if (n_ < 1) return std::nullopt;
    return (n_times_sxx().to_scaled() / scaled(n_)).to_double();
}

std::optional<double> BivariateMoments::syy() const {
    if (n_ < 1) return std::nullopt;
    return (n_times_syy().to_scaled() / scaled(n_)).to_double();
}

std::optional<double> BivariateMoments::sxy() const {
    if (n_ < 1) return std::nullopt;
    return (n_times_sxy().to_scaled() / scaled(n_)).to_double();
}

std::optional<double> BivariateMoments::covariance(bool sample) const {
    if (n_ < (sample ? 2 : 1)) return std::nullopt;
    ScaledDouble denominator = scaled(n_) * scaled(sample ? n_ - 1 : n_);
    return (n_times_sxy().to_scaled() / denominator).to_double();
}

std::optional<double> BivariateMoments::correlation() const {
    if (n_ < 1) return std::nullopt;
    ExactNumber dxx = n_times_sxx(), dyy = n_times_syy();
    if (dxx.is_zero() || dyy.is_zero()) return std::nullopt;  // the standard's special case
    double r = (n_times_sxy().to_scaled() / sqrt((dxx * dyy).to_scaled())).to_double();
    // |Dxy| <= √(Dxx·Dyy) exactly (Cauchy–Schwarz); rounding must not step outside.
    return std::clamp(r, -1.0, 1.0);
}

std::optional<double> BivariateMoments::slope() const {
    if (n_ < 1) return std::nullopt;
    ExactNumber dxx = n_times_sxx();
    if (dxx.is_zero()) return std::nullopt;
    return (n_times_sxy().to_scaled() / dxx.to_scaled()).to_double();
}

std::optional<double> BivariateMoments::intercept() const {
    if (n_ < 1) return std::nullopt;
    ExactNumber dxx = n_times_sxx();
    if (dxx.is_zero()) return std::nullopt;
    ExactNumber numerator = sum_y_.value() * sum_xx_.value() - sum_x_.value() * sum_xy_.value();
    return (numerator.to_scaled() / dxx.to_scaled()).to_double();
}

std::optional<double> BivariateMoments::r_squared() const {
    if (n_ < 1) return std::nullopt;
    ExactNumber dxx = n_times_sxx();
    if (dxx.is_zero()) return std::nullopt;
    ExactNumber dyy = n_times_syy();
    if (dyy.is_zero()) return 1.0;  // the standard's special case: a horizontal line fits exactly
    ExactNumber dxy = n_times_sxy();
    double r2 = ((dxy * dxy).to_scaled() / (dxx * dyy).to_scaled()).to_double();
    return std::min(r2, 1.0);
}

std::optional<double> BivariateMoments::residual_sd() const {
    if (n_ < 3) return std::nullopt;
    ExactNumber dxx = n_times_sxx();
    if (dxx.is_zero()) return std::nullopt;
    ExactNumber e = residual_numerator(dxx);
    if (e.is_zero()) return 0.0;
    // SSE/(n−2) = E / (n·(n−2)·Dxx)
    ScaledDouble denominator = scaled(n_) * scaled(n_ - 2) * dxx.to_scaled();
    return sqrt(e.to_scaled() / denominator).to_double();
}

std::optional<double> BivariateMoments::slope_stderr() const {
    if (n_ < 3) return std::nullopt;
    ExactNumber dxx = n_times_sxx();
    if (dxx.is_zero()) return std::nullopt;
    ExactNumber e = residual_numerator(dxx);
    if (e.is_zero()) return 0.0;
    // SSE/((n−2)·Sxx) = E / ((n−2)·Dxx²)
    ScaledDouble d = dxx.to_scaled();
    return sqrt(e.to_scaled() / (scaled(n_ - 2) * d * d)).to_double();
}

}  // namespace almanac
