// SPDX-License-Identifier: MIT
// ExactTotal's answer (exact_sum's rules: INTEGER while every value is an
// integer and the total fits in 64 bits, otherwise the correctly rounded sum
// of the values, each integer taken as the nearest double) in 32 bytes, for
// totals that only grow: period_totals keeps one per item and period.
//
// Why: period_totals adds each row into the cell of its item and period, in
// the rows' order, so cells are touched at random. ExactTotal is 128 bytes
// and a cell held two of them; the cells of a weekly table then outgrew the
// processor's caches and the pass spent its time waiting for memory. Here a
// total is one 128-bit integer times a power of two (exact for a run of
// prices, as ExactSum's own fast form), and moves into a full ExactSum kept
// aside only when a term does not fit: a far larger or smaller magnitude,
// an overflow, or an integer beyond 2^53 (whose double differs from it).
#pragma once

#include <cstdint>
#include <memory>
#include <optional>

#include "core/exact/exact_sum.h"
#include "core/exact/exact_total.h"
#include "core/exact/narrow_sum.h"
#include "core/exact/wide_integer.h"

namespace almanac {

class CompactTotal {
  public:
    void add_integer(std::int64_t v);
    // v must be finite (the reader refuses infinities first).
    void add_real(double v);
    // Adds every value `other` holds, exactly: afterwards value() is what one
    // total over both runs of values gives, so totals read in parts (by
    // segment, by thread) merge without a rounding.
    void add(const CompactTotal& other);
    // The same as ExactTotal::value() over the same values.
    std::optional<ExactTotal::Value> value() const;

  private:
    // The total once a term did not fit: the exact sum of every value as a
    // double, and the exact sum of the integers (meaningful while no REAL came).
    struct Spilled {
        ExactSum reals;
        Int128 integers = 0;
    };
    void spill();
    // Adds narrow_ * 2^exponent_ into `sum`, exactly.
    void add_narrow_into(ExactSum& sum) const;

    // Every value so far, exactly: narrow_ * 2^exponent_. While no REAL has
    // come, all terms are integers at exponent 0, so narrow_ is also their
    // exact integer total.
    Int128 narrow_ = 0;
    std::unique_ptr<Spilled> spilled_;
    std::int32_t exponent_ = 0;
    bool has_value_ = false;
    bool has_real_ = false;
};

}  // namespace almanac
