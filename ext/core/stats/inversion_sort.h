// SPDX-License-Identifier: MIT
// Bottom-up merge sort that reports inversions as it merges: the pairs that
// are out of order are exactly those where an element of a right run goes
// ahead of the rest of its left run. Counting them is how Kendall's S and
// the Theil–Sen slope avoid looking at all n(n−1)/2 pairs (Knight 1966).
#pragma once

#include <algorithm>
#include <cstddef>
#include <utility>
#include <vector>

namespace almanac {

// Sorts items[0, n) so that `goes_before(b, a)` never holds for a before b
// (stable: equal elements keep their order). Whenever an element of a right
// run goes ahead of the elements [first, last) left in its left run, calls
// on_inversions(element, first, last); a false return stops the sort (the
// items are then in no particular order) and the function returns false.
template <typename T, typename GoesBefore, typename OnInversions>
bool inversion_sort(T* items, std::size_t n, std::vector<T>& buffer, GoesBefore&& goes_before,
                    OnInversions&& on_inversions) {
    buffer.resize(n);
    T* from = items;
    T* to = buffer.data();
    for (std::size_t width = 1; width < n; width *= 2) {
        for (std::size_t start = 0; start < n; start += 2 * width) {
            const std::size_t middle = std::min(start + width, n);
            const std::size_t end = std::min(start + 2 * width, n);
            std::size_t i = start, j = middle, k = start;
            while (i < middle && j < end) {
                if (goes_before(from[j], from[i])) {
                    if (!on_inversions(from[j], from + i, from + middle)) return false;
                    to[k++] = from[j++];
                } else {
                    to[k++] = from[i++];
                }
            }
            while (i < middle) to[k++] = from[i++];
            while (j < end) to[k++] = from[j++];
        }
        std::swap(from, to);
    }
    if (from != items) std::copy(from, from + n, items);
    return true;
}

}  // namespace almanac
