// SPDX-License-Identifier: MIT
// Which colour each series of a chart gets, and where it stands in the legend.
// The same names in the same order always get the same colours: names listed
// in a chart's series_order take the palette slot of their place in that list
// (so an item keeps its colour in a chart that lacks the items before it), and
// the others follow in sorted (byte) order of their names.
#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <map>
#include <string>
#include <string_view>
#include <vector>

namespace almanac {

struct SeriesRanking {
    // By legend position (0, 1, ...: ascending palette slot).
    std::vector<std::string> names;
    std::vector<std::size_t> slots;  // palette slot, for series_style()
    // Legend position of the series with id i (ids count in order of first appearance).
    std::vector<std::size_t> position_of_id;
};

// The id of `series` (ids count in order of first appearance), registered on
// first sight; throws almanac::Error when that would exceed max_series.
std::uint32_t series_id_of(std::map<std::string, std::uint32_t, std::less<>>& ids,
                           std::string_view series, std::size_t max_series);

// Throws almanac::Error when a chart already holds max_rows rows.
void check_row_limit(std::size_t rows, std::size_t max_rows);

SeriesRanking rank_series(const std::map<std::string, std::uint32_t, std::less<>>& ids,
                          const std::vector<std::string>& series_order);

}  // namespace almanac
