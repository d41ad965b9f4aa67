// SPDX-License-Identifier: MIT
// Order statistics and robust trends, for PostgreSQL: the SQLite module's
// contract (order_statistics_functions.cpp, season_functions.cpp) over
// double precision.
//
//  1. median(x): numpy's median, bit for bit; a sliding frame costs
//     O(log w) per row (moving aggregate over a SlidingQuantile).
//  2. theil_sen_slope(y, x [, season]), mann_kendall_p(y, x [, season]),
//     mad(x): computed from the group's rows (a sliding frame keeps its rows
//     and recomputes).
// The plain aggregates keep their rows, so states combine by merging values
// (every result is independent of row order) and travel between parallel
// workers as the values themselves. Rows with a NULL argument are skipped;
// NULL for no rows; NaN and infinities are 22023; more than 10,000,000 rows
// in one group or frame is 54000 (README "Limits").
#include <algorithm>
#include <deque>
#include <optional>
#include <vector>

#include "aggregate_state.h"
#include "arguments.h"
#include "boundary.h"
#include "core/stats/mann_kendall.h"
#include "core/stats/median_absolute_deviation.h"
#include "core/stats/order_statistics.h"
#include "core/stats/theil_sen.h"
#include "core/text/error.h"

namespace almanac::postgres {

void ensure_room(const char* function, std::size_t held) {
    try {
        check_frame_room(held);
    } catch (const Error& error) {
        raise_function_error(function, error.what(), ERRCODE_PROGRAM_LIMIT_EXCEEDED);
    }
}

// The rows of a group or frame, oldest first.
struct ValueRows {
    std::deque<double> rows;
};
struct PointRows {
    std::deque<SeasonalPoint> rows;
};

template <>
struct StateTraits<ValueRows> {
    static constexpr std::uint8_t kTag = 5;
    static void merge(ValueRows& into, const ValueRows& from) {
        if (!from.rows.empty()) ensure_room("median", into.rows.size() + from.rows.size() - 1);
        into.rows.insert(into.rows.end(), from.rows.begin(), from.rows.end());
    }
    static void write(ByteWriter& out, const ValueRows& state) {
        out.i64(static_cast<std::int64_t>(state.rows.size()));
        for (double v : state.rows) out.f64(v);
    }
    static void read(ByteReader& in, ValueRows& state) {
        std::int64_t n = in.count(static_cast<std::int64_t>(kMostFrameValues));
        for (std::int64_t i = 0; i < n; ++i) state.rows.push_back(in.f64());
    }
};

template <>
struct StateTraits<PointRows> {
    static constexpr std::uint8_t kTag = 6;
    static void merge(PointRows& into, const PointRows& from) {
        if (!from.rows.empty())
            ensure_room("theil_sen_slope", into.rows.size() + from.rows.size() - 1);
        into.rows.insert(into.rows.end(), from.rows.begin(), from.rows.end());
    }
    static void write(ByteWriter& out, const PointRows& state) {
        out.i64(static_cast<std::int64_t>(state.rows.size()));
        for (const SeasonalPoint& p : state.rows) {
            out.f64(p.x);
            out.f64(p.y);
            out.f64(p.season);
        }
    }
    static void read(ByteReader& in, PointRows& state) {
        std::int64_t n = in.count(static_cast<std::int64_t>(kMostFrameValues));
        for (std::int64_t i = 0; i < n; ++i) {
            SeasonalPoint p;
            p.x = in.f64();
            p.y = in.f64();
            p.season = in.f64();
            state.rows.push_back(p);
        }
    }
};

// The moving form of median: a frame that slides in O(log w).
struct SlidingMedian {
    SlidingQuantile values{0.5};
};

namespace {

// Rows leave a frame in the order they entered.
template <typename Row, typename Same>
void remove_row(std::deque<Row>& rows, Same same) {
    if (!rows.empty() && same(rows.front())) {
        rows.pop_front();
    } else if (auto found = std::find_if(rows.begin(), rows.end(), same); found != rows.end()) {
        rows.erase(found);
    }
}

Datum value_row(FunctionCallInfo fcinfo, const char* name, Direction direction) {
    ValueRows* state = state_for_row<ValueRows>(fcinfo, name);
    if (PG_ARGISNULL(1)) PG_RETURN_POINTER(state);
    double x = PG_GETARG_FLOAT8(1);
    bool ok = guarded([&] {
        finite_number({name, 1, "x"}, x);
        if (direction == Direction::Add) {
            ensure_room(name, state->rows.size());
            state->rows.push_back(x);
        } else {
            remove_row(state->rows, [&](double v) { return v == x; });
        }
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(state);
}

Datum point_row(FunctionCallInfo fcinfo, const char* name, Direction direction) {
    PointRows* state = state_for_row<PointRows>(fcinfo, name);
    bool seasonal = PG_NARGS() > 3;
    if (PG_ARGISNULL(1) || PG_ARGISNULL(2) || (seasonal && PG_ARGISNULL(3)))
        PG_RETURN_POINTER(state);
    double y = PG_GETARG_FLOAT8(1), x = PG_GETARG_FLOAT8(2);
    double season = seasonal ? PG_GETARG_FLOAT8(3) : 0.0;
    bool ok = guarded([&] {
        finite_number({name, 1, "y"}, y);
        finite_number({name, 2, "x"}, x);
        if (seasonal) finite_number({name, 3, "season"}, season);
        SeasonalPoint point{x, y, season};
        if (direction == Direction::Add) {
            ensure_room(name, state->rows.size());
            state->rows.push_back(point);
        } else {
            remove_row(state->rows, [&](const SeasonalPoint& p) {
                return p.x == point.x && p.y == point.y && p.season == point.season;
            });
        }
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(state);
}

enum class Statistic { Median, Mad, TheilSen, SeasonalTheilSen, MannKendall };

const char* statistic_name(Statistic statistic) {
    switch (statistic) {
        case Statistic::Median:
            return "median";
        case Statistic::Mad:
            return "mad";
        case Statistic::TheilSen:
        case Statistic::SeasonalTheilSen:
            return "theil_sen_slope";
        case Statistic::MannKendall:
            return "mann_kendall_p";
    }
    return "median";
}

std::optional<double> compute(Statistic statistic, const ValueRows* values,
                              const PointRows* points) {
    try {
        switch (statistic) {
            case Statistic::Median:
                return quantile_of(std::vector<double>(values->rows.begin(), values->rows.end()),
                                   0.5);
            case Statistic::Mad:
                return median_absolute_deviation(
                    std::vector<double>(values->rows.begin(), values->rows.end()));
            case Statistic::TheilSen: {
                std::vector<Point> rows;
                rows.reserve(points->rows.size());
                for (const SeasonalPoint& p : points->rows) rows.push_back(Point{p.x, p.y});
                return theil_sen_slope(std::move(rows));
            }
            case Statistic::SeasonalTheilSen:
                return seasonal_theil_sen_slope(
                    std::vector<SeasonalPoint>(points->rows.begin(), points->rows.end()));
            case Statistic::MannKendall:
                return mann_kendall_p(seasonal_kendall_score(
                    std::vector<SeasonalPoint>(points->rows.begin(), points->rows.end())));
        }
    } catch (const Error& error) {
        raise_function_error(statistic_name(statistic), error.what());
    }
    return std::nullopt;
}

Datum statistic_final(FunctionCallInfo fcinfo, Statistic statistic) {
    if (statistic == Statistic::Median || statistic == Statistic::Mad)
        return optional_double_final<ValueRows>(
            fcinfo, [&](const ValueRows& values) { return compute(statistic, &values, nullptr); });
    return optional_double_final<PointRows>(
        fcinfo, [&](const PointRows& points) { return compute(statistic, nullptr, &points); });
}

Datum sliding_median_row(FunctionCallInfo fcinfo, Direction direction) {
    SlidingMedian* state = state_for_row<SlidingMedian>(fcinfo, "median");
    if (PG_ARGISNULL(1)) PG_RETURN_POINTER(state);
    double x = PG_GETARG_FLOAT8(1);
    bool ok = guarded([&] {
        finite_number({"median", 1, "x"}, x);
        if (direction == Direction::Add) {
            ensure_room("median", state->values.size());
            state->values.insert(x);
        } else {
            state->values.remove(x);
        }
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(state);
}

Datum sliding_median_final(FunctionCallInfo fcinfo) {
    return optional_double_final<SlidingMedian>(
        fcinfo, [](const SlidingMedian& median) { return median.values.value(); });
}

}  // namespace
}  // namespace almanac::postgres

namespace pg = almanac::postgres;
using pg::Direction;
using pg::Statistic;

ALMANAC_PG_FUNCTION(almanac_median_step) { return pg::value_row(fcinfo, "median", Direction::Add); }
ALMANAC_PG_FUNCTION(almanac_mad_step) { return pg::value_row(fcinfo, "mad", Direction::Add); }
ALMANAC_PG_FUNCTION(almanac_mad_inverse) { return pg::value_row(fcinfo, "mad", Direction::Remove); }
ALMANAC_PG_FUNCTION(almanac_median_final) { return pg::statistic_final(fcinfo, Statistic::Median); }
ALMANAC_PG_FUNCTION(almanac_mad_final) { return pg::statistic_final(fcinfo, Statistic::Mad); }
ALMANAC_PG_FUNCTION(almanac_values_combine) {
    return pg::combine_states<pg::ValueRows>(fcinfo, "median");
}
ALMANAC_PG_FUNCTION(almanac_values_serialize) { return pg::serialize_state<pg::ValueRows>(fcinfo); }
ALMANAC_PG_FUNCTION(almanac_values_deserialize) {
    return pg::deserialize_state<pg::ValueRows>(fcinfo, "median");
}
ALMANAC_PG_FUNCTION(almanac_median_sliding_step) {
    return pg::sliding_median_row(fcinfo, Direction::Add);
}
ALMANAC_PG_FUNCTION(almanac_median_sliding_inverse) {
    return pg::sliding_median_row(fcinfo, Direction::Remove);
}
ALMANAC_PG_FUNCTION(almanac_median_sliding_final) { return pg::sliding_median_final(fcinfo); }

ALMANAC_PG_FUNCTION(almanac_theil_sen_step) {
    return pg::point_row(fcinfo, "theil_sen_slope", Direction::Add);
}
ALMANAC_PG_FUNCTION(almanac_theil_sen_inverse) {
    return pg::point_row(fcinfo, "theil_sen_slope", Direction::Remove);
}
ALMANAC_PG_FUNCTION(almanac_mann_kendall_step) {
    return pg::point_row(fcinfo, "mann_kendall_p", Direction::Add);
}
ALMANAC_PG_FUNCTION(almanac_mann_kendall_inverse) {
    return pg::point_row(fcinfo, "mann_kendall_p", Direction::Remove);
}
ALMANAC_PG_FUNCTION(almanac_theil_sen_final) {
    return pg::statistic_final(fcinfo, Statistic::TheilSen);
}
ALMANAC_PG_FUNCTION(almanac_seasonal_theil_sen_final) {
    return pg::statistic_final(fcinfo, Statistic::SeasonalTheilSen);
}
ALMANAC_PG_FUNCTION(almanac_mann_kendall_final) {
    return pg::statistic_final(fcinfo, Statistic::MannKendall);
}
ALMANAC_PG_FUNCTION(almanac_points_combine) {
    return pg::combine_states<pg::PointRows>(fcinfo, "theil_sen_slope");
}
ALMANAC_PG_FUNCTION(almanac_points_serialize) { return pg::serialize_state<pg::PointRows>(fcinfo); }
ALMANAC_PG_FUNCTION(almanac_points_deserialize) {
    return pg::deserialize_state<pg::PointRows>(fcinfo, "theil_sen_slope");
}
