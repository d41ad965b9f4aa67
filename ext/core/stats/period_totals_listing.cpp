// SPDX-License-Identifier: MIT
#include "core/stats/period_totals_listing.h"

namespace almanac {

namespace {

void list_group(std::vector<ListedSeries>& listed, const std::vector<std::size_t>& items, const TotalsGroup& group, bool all_segments,
                const PeriodRange& range) {
    if (range.empty()) return;
    for (std::size_t item : items) {
        if (group.has_item(item)) listed.push_back(ListedSeries{&group, all_segments, item, range});
    }
}

}  // namespace

std::vector<ListedSeries> list_series(const PeriodTotals& totals, const RangeOfRows& range_of) {
    std::vector<ListedSeries> listed;
    const TotalsGroup& rollup = totals.rollup();
    if (rollup.empty()) return listed;
    // The rollup's range holds every segment's, so it is the widest listed.
    PeriodRange widest = range_of(rollup.earliest(), rollup.latest());
    totals.check_listing(widest.first_serial, widest.last_serial);
    std::vector<std::size_t> items = totals.items_in_order();
    list_group(listed, items, rollup, true, widest);
    for (std::size_t index : totals.segments_in_order()) {
        const TotalsGroup& segment = totals.segment(index);
        list_group(listed, items, segment, false, range_of(segment.earliest(), segment.latest()));
    }
    return listed;
}

}  // namespace almanac
