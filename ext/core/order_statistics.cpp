#include "order_statistics.h"

#include <algorithm>
#include <cmath>

#include "error.h"

namespace almanac {

QuantilePosition quantile_position(std::size_t n, double p) {
    // numpy: virtual index (n − 1)·p in double, floor for the rank; at or
    // past the last rank it takes the last value.
    const double top = static_cast<double>(n - 1);
    const double h = top * p;
    if (h >= top) return {n - 1, 0.0};
    const double floor_h = std::floor(h);
    return {static_cast<std::size_t>(floor_h), h - floor_h};
}

double interpolate(double lower, double upper, double fraction) {
    // numpy's _lerp, operation for operation (no fused multiply-add).
    const double difference = upper - lower;
    if (fraction >= 0.5) return upper - difference * (1.0 - fraction);
    return lower + difference * fraction;
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

SlidingQuantile::SlidingQuantile(double p) : p_(p) {}

bool SlidingQuantile::above(bool lower_heap, Id a, Id b) const {
    return lower_heap ? slots_[a].value > slots_[b].value : slots_[a].value < slots_[b].value;
}

void SlidingQuantile::place(bool lower_heap, std::size_t position, Id id) {
    (lower_heap ? lower_ : upper_)[position] = id;
    slots_[id].position = static_cast<std::uint32_t>(position);
    slots_[id].in_lower = lower_heap;
}

void SlidingQuantile::sift_up(bool lower_heap, std::size_t position) {
    std::vector<Id>& heap = lower_heap ? lower_ : upper_;
    const Id moving = heap[position];
    while (position > 0) {
        const std::size_t parent = (position - 1) / 2;
        if (!above(lower_heap, moving, heap[parent])) break;
        place(lower_heap, position, heap[parent]);
        position = parent;
    }
    place(lower_heap, position, moving);
}

void SlidingQuantile::sift_down(bool lower_heap, std::size_t position) {
    std::vector<Id>& heap = lower_heap ? lower_ : upper_;
    const Id moving = heap[position];
    const std::size_t n = heap.size();
    for (;;) {
        std::size_t child = 2 * position + 1;
        if (child >= n) break;
        if (child + 1 < n && above(lower_heap, heap[child + 1], heap[child])) ++child;
        if (!above(lower_heap, heap[child], moving)) break;
        place(lower_heap, position, heap[child]);
        position = child;
    }
    place(lower_heap, position, moving);
}

void SlidingQuantile::push(bool lower_heap, Id id) {
    std::vector<Id>& heap = lower_heap ? lower_ : upper_;
    heap.push_back(id);
    sift_up(lower_heap, heap.size() - 1);
}

void SlidingQuantile::erase(Id id) {
    const bool lower_heap = slots_[id].in_lower;
    std::vector<Id>& heap = lower_heap ? lower_ : upper_;
    const std::size_t position = slots_[id].position;
    const Id last = heap.back();
    heap.pop_back();
    if (last == id) return;
    place(lower_heap, position, last);
    // The value moved into the hole may belong higher or lower.
    sift_up(lower_heap, position);
    sift_down(lower_heap, slots_[last].position);
}

void SlidingQuantile::rebalance() {
    const std::size_t n = lower_.size() + upper_.size();
    const std::size_t wanted = n == 0 ? 0 : quantile_position(n, p_).lower + 1;
    while (lower_.size() > wanted) {
        const Id moving = top(true);
        erase(moving);
        push(false, moving);
    }
    while (lower_.size() < wanted) {
        const Id moving = top(false);
        erase(moving);
        push(true, moving);
    }
}

void SlidingQuantile::insert(double value) {
    Id id;
    if (!free_slots_.empty()) {
        id = free_slots_.back();
        free_slots_.pop_back();
    } else {
        id = static_cast<Id>(slots_.size());
        slots_.push_back({});
    }
    slots_[id].value = value;
    // Below or at the lower heap's top it belongs to the lower part; the
    // rebalance then restores the sizes without breaking lower <= upper.
    const bool lower_heap = lower_.empty() || value <= slots_[top(true)].value;
    push(lower_heap, id);
    arrivals_.push_back(id);
    rebalance();
}

bool SlidingQuantile::remove(double value) {
    if (arrivals_.empty()) return false;
    Id id = arrivals_.front();
    if (slots_[id].value == value) {
        arrivals_.pop_front();
    } else {
        auto found = std::find_if(arrivals_.begin(), arrivals_.end(),
                                  [&](Id candidate) { return slots_[candidate].value == value; });
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
    const QuantilePosition at = quantile_position(n, p_);
    const double lower = slots_[top(true)].value;
    if (at.lower + 1 == n) return lower;
    return interpolate(lower, slots_[top(false)].value, at.fraction);
}

}  // namespace almanac
