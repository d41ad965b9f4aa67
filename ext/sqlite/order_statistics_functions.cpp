// SPDX-License-Identifier: MIT
// Order statistics as SQL aggregates that are also window functions.
//
// 1. median(x) — the same as percentile_cont(x, 0.5). Aggregate and window
//    function; a sliding frame costs O(log w) per row.
// 2. percentile_cont(x, p) — the quantile p of the group's x by linear
//    interpolation at h = (n−1)·p between the sorted values (Hyndman & Fan
//    definition 7), bit-identical to numpy.percentile(x, 100·p,
//    method="linear"). Aggregate and window function; a sliding frame costs
//    O(log w) per row, memory O(w).
//    Raises: p not a number in [0, 1]; p different from the group's first p
//    (for a window: the partition's).
// 3. theil_sen_slope(y, x) — the median of the slopes (y_j − y_i)/(x_j − x_i)
//    over all pairs with distinct x, the mean of the two middle ones when
//    their count is even; exactly the double scipy.stats.theilslopes gives.
//    Aggregate and window function (each frame is recomputed from its rows,
//    O(w log² w) time, O(w) memory). NULL when fewer than two distinct x.
//    Raises: two x, or two y, whose difference overflows a double.
// For all: rows where any argument is NULL are skipped, and no rows left
// gives NULL. x, y and p are INTEGER, REAL, or TEXT that SQLite reads as a
// number (' 12.5' yes, '1,234.50' no); other TEXT, BLOBs and infinities
// raise "fn(): argument N (name) = <value>: expected ...".
#include <algorithm>
#include <deque>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "aggregate_state.h"
#include "arguments.h"
#include "core/stats/order_statistics.h"
#include "core/stats/theil_sen.h"
#include "core/text/error.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

// ---- median, percentile_cont ----------------------------------------------

struct QuantileState {
    std::optional<SlidingQuantile> values;  // made when the first p arrives
};

constexpr ArgumentRef kMedianX{"median", 1, "x"};
constexpr ArgumentRef kPercentileX{"percentile_cont", 1, "x"};
constexpr ArgumentRef kPercentileP{"percentile_cont", 2, "p"};

void median_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto x = read_number(kMedianX, argv[0]);
        auto& state = aggregate_state<QuantileState>(context);
        if (!state.values) state.values.emplace(0.5);
        if (!x) return;
        ensure_frame_room("median", state.values->size());
        state.values->insert(*x);
    });
}

void median_inverse(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto x = read_number(kMedianX, argv[0]);
        auto* state = existing_state<QuantileState>(context);
        if (x && state && state->values) state->values->remove(*x);
    });
}

void percentile_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto x = read_number(kPercentileX, argv[0]);
        auto p = read_number(kPercentileP, argv[1]);
        auto& state = aggregate_state<QuantileState>(context);
        if (p) {
            try {
                check_quantile_probability(*p);
            } catch (const Error& error) {
                raise_argument_error(kPercentileP, argv[1], error.what());
            }
            // The interpolation rank depends on p, so one structure serves
            // one p; a p that changes within a group is almost always a
            // mistake in the query, so it is refused rather than guessed at.
            if (!state.values) {
                state.values.emplace(*p);
            } else if (*p != state.values->p()) {
                raise_argument_error(kPercentileP, argv[1],
                                     "expected the same p on every row of the group (the first "
                                     "row's was " +
                                         readable_double(state.values->p()) + ")");
            }
        }
        if (!x || !p) return;
        ensure_frame_room("percentile_cont", state.values->size());
        state.values->insert(*x);
    });
}

void percentile_inverse(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto x = read_number(kPercentileX, argv[0]);
        auto p = read_number(kPercentileP, argv[1]);
        auto* state = existing_state<QuantileState>(context);
        if (x && p && state && state->values) state->values->remove(*x);
    });
}

void quantile_value(sqlite3_context* context) {
    guarded(context, [&] {
        auto* state = existing_state<QuantileState>(context);
        result_optional_double(context,
                               state && state->values ? state->values->value() : std::nullopt);
    });
}

void quantile_final(sqlite3_context* context) {
    guarded(context, [&] {
        auto state = take_state<QuantileState>(context);
        result_optional_double(context,
                               state && state->values ? state->values->value() : std::nullopt);
    });
}

// ---- theil_sen_slope ---------------------------------------------------------

struct TheilSenState {
    std::deque<Point> rows;  // the frame's rows, oldest first
};

constexpr ArgumentRef kTheilSenY{"theil_sen_slope", 1, "y"};
constexpr ArgumentRef kTheilSenX{"theil_sen_slope", 2, "x"};

std::optional<Point> read_point(sqlite3_value** argv) {
    auto y = read_number(kTheilSenY, argv[0]);
    auto x = read_number(kTheilSenX, argv[1]);
    if (!x || !y) return std::nullopt;
    return Point{*x, *y};
}

void theil_sen_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto point = read_point(argv);
        auto& state = aggregate_state<TheilSenState>(context);
        if (!point) return;
        ensure_frame_room("theil_sen_slope", state.rows.size());
        state.rows.push_back(*point);
    });
}

void theil_sen_inverse(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto point = read_point(argv);
        auto* state = existing_state<TheilSenState>(context);
        if (!point || !state) return;
        auto same = [&](const Point& p) { return p.x == point->x && p.y == point->y; };
        auto& rows = state->rows;
        // Rows leave a frame in the order they entered.
        if (!rows.empty() && same(rows.front())) {
            rows.pop_front();
        } else if (auto found = std::find_if(rows.begin(), rows.end(), same); found != rows.end()) {
            rows.erase(found);
        }
    });
}

void theil_sen_result(sqlite3_context* context, const TheilSenState* state) {
    if (!state) return sqlite3_result_null(context);
    try {
        result_optional_double(
            context, theil_sen_slope(std::vector<Point>(state->rows.begin(), state->rows.end())));
    } catch (const Error& error) {
        raise_function_error("theil_sen_slope", error.what());
    }
}

void theil_sen_value(sqlite3_context* context) {
    guarded(context, [&] { theil_sen_result(context, existing_state<TheilSenState>(context)); });
}

void theil_sen_final(sqlite3_context* context) {
    guarded(context, [&] {
        auto state = take_state<TheilSenState>(context);
        theil_sen_result(context, state.get());
    });
}

}  // namespace

int register_order_statistics_functions(sqlite3* db) {
    constexpr int kPure = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    int rc =
        sqlite3_create_window_function(db, "median", 1, kPure, nullptr, median_step, quantile_final,
                                       quantile_value, median_inverse, nullptr);
    if (rc == SQLITE_OK)
        rc = sqlite3_create_window_function(db, "percentile_cont", 2, kPure, nullptr,
                                            percentile_step, quantile_final, quantile_value,
                                            percentile_inverse, nullptr);
    if (rc == SQLITE_OK)
        rc = sqlite3_create_window_function(db, "theil_sen_slope", 2, kPure, nullptr,
                                            theil_sen_step, theil_sen_final, theil_sen_value,
                                            theil_sen_inverse, nullptr);
    return rc;
}

}  // namespace almanac::sqlite
