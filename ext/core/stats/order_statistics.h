// SPDX-License-Identifier: MIT
// Quantiles by linear interpolation between order statistics: the value at
// h = (n−1)·p of the sorted values, Hyndman & Fan (1996), definition 7.
// The arithmetic is numpy's own (numpy.percentile(..., method="linear")), so
// results are bit-identical to it, not merely close.
//
// SlidingQuantile keeps a window of values that grows and shrinks one value
// at a time, as a SQL window frame slides, and answers the quantile in
// O(log w) per change with O(w) memory.
#pragma once

#include <cstddef>
#include <cstdint>
#include <deque>
#include <optional>
#include <vector>

namespace almanac {

// Where quantile p of n sorted values lies: `fraction` of the way from the
// value of 0-based rank `lower` to the next one. At the top rank (p = 1, or
// n = 1) lower = n − 1 and fraction = 0.
struct QuantilePosition {
    std::size_t lower;
    double fraction;
};
QuantilePosition quantile_position(std::size_t n, double p);  // n >= 1, p in [0, 1]

// numpy's interpolation between two neighbouring order statistics. Its two
// branches (from below for fraction < 0.5, from above otherwise) keep the
// result exactly on `upper` when fraction = 1 would be reached by rounding.
double interpolate(double lower, double upper, double fraction);

// Throws almanac::Error unless 0 <= p <= 1.
void check_quantile_probability(double p);

// The most values one group or window frame of an order statistic keeps
// (median, percentile_cont, theil_sen_slope, mad, mann_kendall_p): a few
// hundred MB at the limit, so a runaway query stops with an error instead of
// taking the machine's memory. README "Limits".
constexpr std::size_t kMostFrameValues = 10'000'000;
// Throws almanac::Error when a frame holding `held` values would take one more.
void check_frame_room(std::size_t held);

// The quantile of values in any order (a copy is partially sorted); nullopt
// when empty. For plain aggregates and as the definition the window must meet.
std::optional<double> quantile_of(std::vector<double> values, double p);

// A multiset of the values in a sliding window, split at the quantile's rank
// into two indexed binary heaps: a max-heap holding the lowest `lower + 1`
// values and a min-heap holding the rest, so the two order statistics the
// interpolation needs are the two heap tops. Every value remembers its place
// in its heap, so the value leaving a frame is taken out directly
// (O(log w)) instead of being marked and skipped later, which keeps memory
// at O(w) however long the series. After each change at most one value
// crosses between the heaps, because the rank moves by at most one.
class SlidingQuantile {
  public:
    explicit SlidingQuantile(double p);  // p already checked

    void insert(double value);
    // Removes one value equal to `value`; false if there is none. Values
    // leave SQL frames in the order they entered, which is the O(log w) path;
    // any other order is still correct, at O(w) to find the value.
    bool remove(double value);

    std::size_t size() const { return arrivals_.size(); }
    std::optional<double> value() const;  // nullopt when empty
    double p() const { return p_; }

  private:
    using Id = std::uint32_t;
    struct Entry {  // a heap element: the value, beside it for fast comparisons
        double value;
        Id id;
    };
    struct Slot {  // where a value is, by the id it keeps while in the window
        std::uint32_t position;
        bool in_lower;
    };

    void push(bool lower_heap, Entry entry);
    Entry erase(Id id);
    void rebalance();
    double value_of(Id id) const;

    double p_;
    std::vector<Slot> slots_;
    std::vector<Id> free_slots_;
    std::vector<Entry> lower_;  // max-heap
    std::vector<Entry> upper_;  // min-heap
    std::deque<Id> arrivals_;   // oldest first
};

}  // namespace almanac
