// SPDX-License-Identifier: MIT
#include "core/stats/order_statistics.h"

#include <algorithm>
#include <cmath>
#include <string>

#include "core/text/error.h"

namespace almanac {

namespace {
// Internal copies of the two formulas, so that the sliding window's calls
// are inlined rather than made through the shared library's symbol table.
QuantilePosition position_at(std::size_t n, double p) {
    // numpy: virtual index (n − 1)·p in double, floor for the rank; at or
    // past the last rank it takes the last value.
    const double top = static_cast<double>(n - 1);
    const double h = top * p;
    if (h >= top) return {n - 1, 0.0};
    const double floor_h = std::floor(h);
    return {static_cast<std::size_t>(floor_h), h - floor_h};
}

double lerp(double lower, double upper, double fraction) {
    // numpy's _lerp, operation for operation (no fused multiply-add).
    const double difference = upper - lower;
    if (fraction >= 0.5) return upper - difference * (1.0 - fraction);
    return lower + difference * fraction;
}
}  // namespace

QuantilePosition quantile_position(std::size_t n, double p) { return position_at(n, p); }

double interpolate(double lower, double upper, double fraction) {
    return lerp(lower, upper, fraction);
}

void check_quantile_probability(double p) {
    if (!(p >= 0.0 && p <= 1.0)) throw Error("expected a number from 0 to 1");
}

std::optional<double> quantile_of(std::vector<double> values, double p) {
    if (values.empty()) return std::nullopt;
    const QuantilePosition at = quantile_position(values.size(), p);
    auto lower = values.begin() + static_cast<std::ptrdiff_t>(at.lower);
    std::nth_element(values.begin(), lower, values.end());
    if (at.lower + 1 == values.size()) return *lower;
    const double upper = *std::min_element(lower + 1, values.end());
    return interpolate(*lower, upper, at.fraction);
}

namespace {

// The heap operations, kept out of the class (internal linkage) so that the
// compiler inlines them into the few callers: they run once or twice per
// row of a sliding frame. Max selects a max-heap; every move updates the
// moved value's slot, which is how a value is found again to be removed.
template <bool Max, typename Entry>
bool above(const Entry& a, const Entry& b) {
    return Max ? a.value > b.value : a.value < b.value;
}

template <bool Max, typename Entry, typename Slot>
void sift_up(std::vector<Entry>& heap, std::vector<Slot>& slots, std::size_t position) {
    const Entry moving = heap[position];
    while (position > 0) {
        const std::size_t parent = (position - 1) / 2;
        if (!above<Max>(moving, heap[parent])) break;
        heap[position] = heap[parent];
        slots[heap[position].id].position = static_cast<std::uint32_t>(position);
        position = parent;
    }
    heap[position] = moving;
    slots[moving.id].position = static_cast<std::uint32_t>(position);
}

template <bool Max, typename Entry, typename Slot>
void sift_down(std::vector<Entry>& heap, std::vector<Slot>& slots, std::size_t position) {
    const Entry moving = heap[position];
    const std::size_t n = heap.size();
    for (;;) {
        std::size_t child = 2 * position + 1;
        if (child >= n) break;
        if (child + 1 < n && above<Max>(heap[child + 1], heap[child])) ++child;
        if (!above<Max>(heap[child], moving)) break;
        heap[position] = heap[child];
        slots[heap[position].id].position = static_cast<std::uint32_t>(position);
        position = child;
    }
    heap[position] = moving;
    slots[moving.id].position = static_cast<std::uint32_t>(position);
}

template <bool Max, typename Entry, typename Slot>
void heap_push(std::vector<Entry>& heap, std::vector<Slot>& slots, Entry entry) {
    heap.push_back(entry);
    sift_up<Max>(heap, slots, heap.size() - 1);
}

template <bool Max, typename Entry, typename Slot>
Entry heap_erase(std::vector<Entry>& heap, std::vector<Slot>& slots, std::size_t position) {
    const Entry removed = heap[position];
    const Entry last = heap.back();
    heap.pop_back();
    if (position < heap.size()) {
        // The last value fills the hole; it may belong higher or lower.
        heap[position] = last;
        slots[last.id].position = static_cast<std::uint32_t>(position);
        sift_up<Max>(heap, slots, position);
        sift_down<Max>(heap, slots, slots[last.id].position);
    }
    return removed;
}

}  // namespace

void check_frame_room(std::size_t held) {
    if (held >= kMostFrameValues)
        throw Error("a group or window frame holds at most " + std::to_string(kMostFrameValues) +
                    " values; narrow the frame (ROWS n PRECEDING) or split the group");
}

SlidingQuantile::SlidingQuantile(double p) : p_(p) {}

double SlidingQuantile::value_of(Id id) const {
    const Slot& slot = slots_[id];
    return (slot.in_lower ? lower_ : upper_)[slot.position].value;
}

void SlidingQuantile::push(bool lower_heap, Entry entry) {
    slots_[entry.id].in_lower = lower_heap;
    if (lower_heap) {
        heap_push<true>(lower_, slots_, entry);
    } else {
        heap_push<false>(upper_, slots_, entry);
    }
}

SlidingQuantile::Entry SlidingQuantile::erase(Id id) {
    const Slot slot = slots_[id];
    return slot.in_lower ? heap_erase<true>(lower_, slots_, slot.position)
                         : heap_erase<false>(upper_, slots_, slot.position);
}

void SlidingQuantile::rebalance() {
    const std::size_t n = lower_.size() + upper_.size();
    const std::size_t wanted = n == 0 ? 0 : position_at(n, p_).lower + 1;
    while (lower_.size() > wanted) push(false, heap_erase<true>(lower_, slots_, 0));
    while (lower_.size() < wanted) push(true, heap_erase<false>(upper_, slots_, 0));
}

namespace {

// Room for one more element, taken before anything changes: with every
// allocation done up front, running out of memory leaves the window intact
// (found by the allocation-failure test: a half-done insert broke xFinal).
template <typename Vector>
void make_room(Vector& v) {
    if (v.size() == v.capacity()) v.reserve(v.capacity() < 8 ? 8 : 2 * v.capacity());
}

}  // namespace

void SlidingQuantile::insert(double value) {
    check_frame_room(size());
    if (free_slots_.empty()) make_room(slots_);
    make_room(lower_);
    make_room(upper_);
    arrivals_.push_back(0);  // the deque's one allocation; its id is set below
    Id id;
    if (!free_slots_.empty()) {
        id = free_slots_.back();
        free_slots_.pop_back();
    } else {
        id = static_cast<Id>(slots_.size());
        slots_.push_back({});
    }
    arrivals_.back() = id;
    // At or below the lower heap's top it belongs to the lower part; the
    // rebalance then restores the sizes without breaking lower <= upper.
    const bool lower_heap = lower_.empty() || value <= lower_.front().value;
    push(lower_heap, Entry{value, id});
    rebalance();
}

bool SlidingQuantile::remove(double value) {
    if (arrivals_.empty()) return false;
    make_room(free_slots_);
    make_room(lower_);  // the rebalance moves one value from heap to heap
    make_room(upper_);
    Id id = arrivals_.front();
    if (value_of(id) == value) {
        arrivals_.pop_front();
    } else {
        auto found = std::find_if(arrivals_.begin(), arrivals_.end(),
                                  [&](Id candidate) { return value_of(candidate) == value; });
        if (found == arrivals_.end()) return false;
        id = *found;
        arrivals_.erase(found);
    }
    erase(id);
    free_slots_.push_back(id);
    rebalance();
    return true;
}

std::optional<double> SlidingQuantile::value() const {
    const std::size_t n = size();
    if (n == 0) return std::nullopt;
    const QuantilePosition at = position_at(n, p_);
    const double lower = lower_.front().value;
    if (at.lower + 1 == n) return lower;
    return lerp(lower, upper_.front().value, at.fraction);
}

}  // namespace almanac
