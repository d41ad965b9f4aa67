// SPDX-License-Identifier: MIT
#include "core/chart/series_ranking.h"

#include <algorithm>
#include <string_view>

#include "core/text/error.h"

namespace almanac {

std::uint32_t series_id_of(std::map<std::string, std::uint32_t, std::less<>>& ids,
                           std::string_view series, std::size_t max_series) {
    auto found = ids.find(series);
    if (found != ids.end()) return found->second;
    if (ids.size() >= max_series)
        throw Error("more than " + std::to_string(max_series) + " series; a chart holds at most " +
                    std::to_string(max_series) +
                    " (8 colours x 8 dash patterns): chart the top items only");
    return ids.emplace(std::string(series), std::uint32_t(ids.size())).first->second;
}

void check_row_limit(std::size_t rows, std::size_t max_rows) {
    if (rows >= max_rows)
        throw Error("more than " + std::to_string(max_rows) + " points; a chart holds at most " +
                    std::to_string(max_rows) +
                    " rows: aggregate first (e.g. one row per series and day)");
}

SeriesRanking rank_series(const std::map<std::string, std::uint32_t, std::less<>>& ids,
                          const std::vector<std::string>& series_order) {
    // A name listed twice keeps its first place.
    std::map<std::string_view, std::size_t> listed;
    for (std::size_t i = 0; i < series_order.size(); ++i) listed.emplace(series_order[i], i);

    struct Entry {
        std::size_t slot;
        const std::string* name;
        std::uint32_t id;
    };
    std::vector<Entry> entries;
    std::size_t unlisted = 0;
    for (const auto& [name, id] : ids) {  // std::map iterates in sorted order
        auto found = listed.find(name);
        std::size_t slot = found != listed.end() ? found->second : series_order.size() + unlisted++;
        entries.push_back({slot, &name, id});
    }
    std::sort(entries.begin(), entries.end(),
              [](const Entry& a, const Entry& b) { return a.slot < b.slot; });

    SeriesRanking ranking;
    ranking.position_of_id.resize(ids.size());
    for (std::size_t position = 0; position < entries.size(); ++position) {
        ranking.names.push_back(*entries[position].name);
        ranking.slots.push_back(entries[position].slot);
        ranking.position_of_id[entries[position].id] = position;
    }
    return ranking;
}

}  // namespace almanac
