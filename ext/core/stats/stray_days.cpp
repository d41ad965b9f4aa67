// SPDX-License-Identifier: MIT
#include "core/stats/stray_days.h"

#include "core/text/error.h"

namespace almanac {

DaySplit split_stray_days(const std::vector<DayRows>& days, std::int64_t min_gap) {
    if (days.empty()) throw Error("at least one day with rows");
    const std::int64_t span = days.back().day - days.front().day + 1;
    std::vector<DayRun> runs;
    DayRun run{days.front().day, days.front().day, 0};
    for (std::size_t i = 0; i < days.size(); ++i) {
        if (i > 0) {
            std::int64_t empty_days = days[i].day - days[i - 1].day - 1;
            // Compared in quarters, so a span that is not a multiple of 4 is not rounded.
            if (empty_days > min_gap && 4 * empty_days > span) {
                runs.push_back(run);
                run = DayRun{days[i].day, days[i].day, 0};
            }
        }
        run.last = days[i].day;
        run.rows += days[i].rows;
    }
    runs.push_back(run);
    std::size_t kept = 0;
    for (std::size_t i = 1; i < runs.size(); ++i) {
        if (runs[i].rows >= runs[kept].rows) kept = i;
    }
    DaySplit split;
    split.kept = runs[kept];
    for (std::size_t i = 0; i < runs.size(); ++i) {
        if (i != kept) split.strays.push_back(runs[i]);
    }
    return split;
}

}  // namespace almanac
