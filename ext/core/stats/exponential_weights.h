// SPDX-License-Identifier: MIT
// An exponentially weighted mean that slides: weights 0.5^((t_max − t_i)/h),
// with t_max the latest t among the rows present.
//
// Since 0.5^((t_max − t_i)/h) = 2^(t_i/h) / 2^(t_max/h), the factor of t_max
// cancels between numerator and denominator: the mean is Σ 2^(t_i/h)·x_i /
// Σ 2^(t_i/h). So each row's weight can be fixed when it arrives, without
// knowing which row will be the latest, and removed exactly when it leaves —
// the result does not depend on row order. What t_max does decide is the
// scale: 2^(t_i/h) over- or underflows any double long before t_i/h is large.
// So a row's position t_i/h is split into a whole number of half-lives q_i
// and a fraction f_i in [0, 1): the weight is the double 2^f_i in [1, 2)
// shifted by q_i bits, and both the weight and the exact product 2^f_i·x_i
// go into exact sums at that bit shift — the shift is an exponent, not a
// number that can overflow. Rows are kept in blocks of 64 half-lives (a
// block's sums span 64 more bits than one row's), so the sums stay short
// however far apart the rows lie; at read time the blocks near the latest one
// are merged, exactly, and the two sums rounded once each.
#pragma once

#include <cstdint>
#include <map>
#include <optional>

#include "core/exact/exact_sum.h"
#include "core/exact/state_bytes.h"

namespace almanac {

class ExponentialWeights {
  public:
    // t / half_life = whole + fraction, 0 <= fraction < 1 (or = 1 by rounding).
    struct Position {
        std::int64_t whole = 0;
        double fraction = 0.0;
    };
    // Times in milliseconds with a half-life in milliseconds (> 0): exact
    // integer division, so a row's weight does not lose precision with the
    // distance of its time from 1970.
    static Position position(std::int64_t t, std::int64_t half_life);
    // Plain numbers; throws Error when |t / half_life| is beyond 2^52, where
    // neighbouring values of t are more than a half-life apart.
    static Position position(double t, double half_life);

    void add(double x, Position p) { change(x, p, +1); }
    void remove(double x, Position p) { change(x, p, -1); }
    std::int64_t count() const { return rows_; }
    // Adds another group's rows: block by block, exactly.
    void merge(const ExponentialWeights& other);
    // The byte form (core/exact/state_bytes.h): the block count, then for each
    // block its key, its row count and its two sums (weighted, weights).
    void write(ByteWriter& out) const;
    static ExponentialWeights read(ByteReader& in);
    // nullopt when no rows are present.
    std::optional<double> mean() const;

  private:
    struct Block {
        ExactSum weighted;  // Σ 2^f·x·2^(q mod 64)
        ExactSum weights;   // Σ 2^f·2^(q mod 64)
        std::int64_t rows = 0;
    };
    void change(double x, Position p, int direction);

    std::map<std::int64_t, Block> blocks_;  // by floor(q / 64)
    std::int64_t rows_ = 0;
};

}  // namespace almanac
