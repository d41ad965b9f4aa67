// SPDX-License-Identifier: MIT
#include "core/text/name_distance.h"

#include <algorithm>
#include <cstdint>
#include <utility>

#include "core/text/utf8.h"

namespace almanac {
namespace {

using Pair = std::pair<std::uint32_t, std::uint32_t>;

std::uint32_t fold(std::uint32_t c) { return c >= 'A' && c <= 'Z' ? c - 'A' + 'a' : c; }

// The distinct pairs of adjacent characters, sorted.
std::vector<Pair> pairs_of(std::string_view name) {
    std::vector<std::uint32_t> characters;
    for (std::size_t i = 0; i < name.size();) {
        std::uint32_t c = 0;
        std::size_t length = utf8_decode(name, i, c);
        if (length == 0) {  // not UTF-8: the byte stands for itself
            c = static_cast<unsigned char>(name[i]);
            length = 1;
        }
        characters.push_back(fold(c));
        i += length;
    }
    std::vector<Pair> pairs;
    for (std::size_t k = 1; k < characters.size(); ++k) pairs.emplace_back(characters[k - 1], characters[k]);
    std::sort(pairs.begin(), pairs.end());
    pairs.erase(std::unique(pairs.begin(), pairs.end()), pairs.end());
    return pairs;
}

double similarity(const std::vector<Pair>& a, const std::vector<Pair>& b) {
    if (a.empty() && b.empty()) return 0.0;
    std::size_t shared = 0;
    for (auto i = a.begin(), j = b.begin(); i != a.end() && j != b.end();) {
        if (*i < *j) {
            ++i;
        } else if (*j < *i) {
            ++j;
        } else {
            ++shared, ++i, ++j;
        }
    }
    return 2.0 * static_cast<double>(shared) / static_cast<double>(a.size() + b.size());
}

}  // namespace

double pair_similarity(std::string_view a, std::string_view b) { return similarity(pairs_of(a), pairs_of(b)); }

std::optional<std::string> closest_name(std::string_view wanted, const std::vector<std::string>& names) {
    const auto wanted_pairs = pairs_of(wanted);
    const std::string* best = nullptr;
    double best_score = -1.0;
    for (const auto& name : names) {
        double score = similarity(wanted_pairs, pairs_of(name));
        if (score > best_score || (score == best_score && name < *best)) {
            best = &name;
            best_score = score;
        }
    }
    if (!best) return std::nullopt;
    return *best;
}

}  // namespace almanac
