// SPDX-License-Identifier: MIT
// Where the bulk of a table's rows lies in time, and which days stand apart:
// a till with a reset clock writes a row dated years before the rest, and a
// report that trusts min(ts) then spreads its periods over twenty empty
// years. The days with rows fall into runs separated by long empty gaps; the
// run with the most rows is the data, the others are stray.
#pragma once

#include <cstdint>
#include <vector>

namespace almanac {

// Rows on one day (any day numbering whose neighbours differ by 1).
struct DayRows {
    std::int64_t day;
    std::int64_t rows;
};

// Consecutive days with rows: first and last day, and the rows between them.
struct DayRun {
    std::int64_t first = 0;
    std::int64_t last = 0;
    std::int64_t rows = 0;
};

struct DaySplit {
    DayRun kept;                  // the run with the most rows (the later one on a tie)
    std::vector<DayRun> strays;   // every other run, in day order
};

// A gap separates two runs when more than `min_gap` days without rows lie
// between them and more than a quarter of the whole span (first to last day)
// too: a 100-day refit in ten years of sales is a closure, not a break, and a
// week without sales in a month of data is neither. `days` is sorted by day,
// each day once, rows > 0, and not empty.
DaySplit split_stray_days(const std::vector<DayRows>& days, std::int64_t min_gap = 90);

}  // namespace almanac
