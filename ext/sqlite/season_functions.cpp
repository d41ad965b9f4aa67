// SPDX-License-Identifier: MIT
// Seasons, robust trends and anomalies.
//
//  1. period_position(t, spec, cycle [, zone]): INTEGER from 1, which `spec`
//     period of its `cycle` t falls in ('day' in 'week' is the weekday,
//     Monday 1; 'month' in 'year starting april' the fiscal month; 'week' in
//     'year' the ISO week number; 'hour' in 'day' the elapsed hour of the
//     local day, 1-25). NULL when any argument is NULL. Errors: t not a time
//     value, a spec or cycle that does not parse, a spec with 'from', a pair
//     that does not nest (the message lists the pairs that do), an unknown
//     zone. Spec, cycle and zone are parsed once per statement. The form
//     without a zone is deterministic.
//  2. mann_kendall_p(y, x [, season]): two-sided p-value of the Mann-Kendall
//     test (Kendall's S, tau-b tie corrections for x and y, no continuity
//     correction), equal to scipy.stats.kendalltau(x, y,
//     method='asymptotic').pvalue; with season, the seasonal Kendall test
//     (Hirsch, Slack & Smith 1982): S and Var(S) summed over the seasons.
//     NULL when Var(S) is 0 (fewer than two rows, every x or every y tied).
//  3. theil_sen_slope(y, x, season): the median of the slopes of the pairs
//     that share a season value and have distinct x (the two-argument form
//     is in order_statistics_functions.cpp). NULL when there is no such pair.
//  4. mad(x): the median of |x - median(x)|, unscaled; NULL for no rows.
// 2-4 are plain aggregates and window functions (each frame is recomputed
// from its rows: O(w log w) for 2 and 3, O(w) for 4). Rows with a NULL
// argument are skipped. y and x are INTEGER, REAL, or TEXT that SQLite
// reads as a number; other TEXT, BLOBs and infinities raise
// "fn(): argument N (name) = <value>: expected ...". A season is any value
// but NULL: a number (period_position gives one) compared by value, or a
// label ('Mon', 'spring') compared by its bytes; the per-season sums run in
// SQLite's order of the seasons (numbers, then TEXT), so seasons coded as
// text give the same bits as the same seasons coded as numbers in that order.
#include <algorithm>
#include <deque>
#include <new>
#include <optional>
#include <vector>

#include "aggregate_state.h"
#include "arguments.h"
#include "core/stats/mann_kendall.h"
#include "core/stats/median_absolute_deviation.h"
#include "core/stats/theil_sen.h"
#include "core/text/error.h"
#include "core/time/period_position.h"
#include "period_context.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

// ---- period_position -------------------------------------------------------

constexpr ArgumentRef kPositionT{"period_position", 1, "t"};
constexpr ArgumentRef kPositionSpec{"period_position", 2, "spec"};
constexpr ArgumentRef kPositionCycle{"period_position", 3, "cycle"};
constexpr ArgumentRef kPositionZone{"period_position", 4, "zone"};

PeriodPosition make_position(sqlite3_value** argv, int argc) {
    return read_spec_in_cycle(kPositionSpec, argv[1], kPositionCycle, argv[2],
                              argc == 4 ? &kPositionZone : nullptr, argc == 4 ? argv[3] : nullptr)
        .position;
}

void delete_position(void* pointer) { delete static_cast<PeriodPosition*>(pointer); }

// Hung on the spec argument and marked on cycle and zone: SQLite keeps
// auxdata only on constant arguments, so a position found on all of them
// was built from these very values, once per statement.
const PeriodPosition& cached_position(sqlite3_context* context, sqlite3_value** argv, int argc) {
    auto* cached = static_cast<PeriodPosition*>(sqlite3_get_auxdata(context, 1));
    bool marked = cached != nullptr;
    for (int i = 2; marked && i < argc; ++i) marked = sqlite3_get_auxdata(context, i) == cached;
    if (marked) return *cached;
    auto* fresh = new PeriodPosition(make_position(argv, argc));
    // SQLite owns the object from here on, and frees it at once if it cannot keep it.
    sqlite3_set_auxdata(context, 1, fresh, delete_position);
    auto* kept = static_cast<PeriodPosition*>(sqlite3_get_auxdata(context, 1));
    if (kept == fresh) {
        for (int i = 2; i < argc; ++i) sqlite3_set_auxdata(context, i, fresh, nullptr);
        return *kept;
    }
    // Within the call that set it, SQLite hands auxdata back whatever the
    // argument; it has not kept it only when it ran out of memory.
    throw std::bad_alloc();
}

void period_position(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        auto t = read_time(kPositionT, argv[0]);
        if (!t) return sqlite3_result_null(context);
        for (int i = 1; i < argc; ++i)
            if (sqlite3_value_type(argv[i]) == SQLITE_NULL) return sqlite3_result_null(context);
        const PeriodPosition& position = cached_position(context, argv, argc);
        try {
            const Instant instant = position.cycle_calendar().place_on_time_line(*t);
            sqlite3_result_int64(context, position.position(instant));
        } catch (const Error& error) {
            raise_argument_error(kPositionT, argv[0], error.what());
        }
    });
}

// ---- aggregates that recompute their frame ---------------------------------

// A function of the frame's rows. Traits give: kName, Row, read(argc, argv)
// (nullopt to skip the row), same(a, b), and compute(std::vector<Row>).
template <typename Traits>
struct Frame {
    using Row = typename Traits::Row;
    std::deque<Row> rows;  // oldest first

    static void step(sqlite3_context* context, int argc, sqlite3_value** argv) {
        guarded(context, [&] {
            auto row = Traits::read(argc, argv);
            auto& state = aggregate_state<Frame>(context);
            if (!row) return;
            ensure_frame_room(Traits::kName, state.rows.size());
            state.rows.push_back(*row);
        });
    }

    static void inverse(sqlite3_context* context, int argc, sqlite3_value** argv) {
        guarded(context, [&] {
            auto row = Traits::read(argc, argv);
            auto* state = existing_state<Frame>(context);
            if (!row || !state) return;
            auto same = [&](const Row& r) { return Traits::same(r, *row); };
            auto& rows = state->rows;
            // Rows leave a frame in the order they entered.
            if (!rows.empty() && same(rows.front())) {
                rows.pop_front();
            } else if (auto found = std::find_if(rows.begin(), rows.end(), same);
                       found != rows.end()) {
                rows.erase(found);
            }
        });
    }

    static void result(sqlite3_context* context, const Frame* state) {
        if (!state) return result_optional_double(context, Traits::compute({}));
        try {
            result_optional_double(
                context, Traits::compute(std::vector<Row>(state->rows.begin(), state->rows.end())));
        } catch (const Error& error) {
            raise_function_error(Traits::kName, error.what());
        }
    }

    static void value(sqlite3_context* context) {
        guarded(context, [&] { result(context, existing_state<Frame>(context)); });
    }

    static void final(sqlite3_context* context) {
        guarded(context, [&] {
            auto state = take_state<Frame>(context);
            result(context, state.get());
        });
    }
};

bool same_point(const SeasonalPoint& a, const SeasonalPoint& b) {
    return a.x == b.x && a.y == b.y && same_season(a.season, b.season);
}

// Any value but NULL names a season, as SQLite holds it: INTEGER and REAL
// by value, TEXT and BLOBs by their bytes.
std::optional<SeasonKey> read_season(sqlite3_value* value) {
    SeasonKey season;
    switch (sqlite3_value_type(value)) {
        case SQLITE_NULL:
            return std::nullopt;
        case SQLITE_INTEGER:
            season.kind = SeasonKey::Kind::Integer;
            season.integer = sqlite3_value_int64(value);
            return season;
        case SQLITE_FLOAT:
            season.kind = SeasonKey::Kind::Real;
            season.real = sqlite3_value_double(value);
            return season;
        case SQLITE_TEXT: {
            season.kind = SeasonKey::Kind::Text;
            const auto* text = sqlite3_value_text(value);
            season.bytes.assign(reinterpret_cast<const char*>(text),
                                static_cast<std::size_t>(sqlite3_value_bytes(value)));
            return season;
        }
        default: {
            season.kind = SeasonKey::Kind::Blob;
            const auto* blob = static_cast<const char*>(sqlite3_value_blob(value));
            const auto size = static_cast<std::size_t>(sqlite3_value_bytes(value));
            if (size > 0) season.bytes.assign(blob, size);
            return season;
        }
    }
}

// (y, x [, season]); the two-argument form is one season.
template <const char* Name>
std::optional<SeasonalPoint> read_seasonal_point(int argc, sqlite3_value** argv) {
    const ArgumentRef y_arg{Name, 1, "y"}, x_arg{Name, 2, "x"};
    auto y = read_number(y_arg, argv[0]);
    auto x = read_number(x_arg, argv[1]);
    std::optional<SeasonKey> season = SeasonKey{};
    if (argc == 3) season = read_season(argv[2]);
    if (!y || !x || !season) return std::nullopt;
    return SeasonalPoint{*x, *y, std::move(*season)};
}

constexpr char kMannKendall[] = "mann_kendall_p";
constexpr char kTheilSen[] = "theil_sen_slope";
constexpr char kMad[] = "mad";

struct MannKendallTraits {
    static constexpr const char* kName = kMannKendall;
    using Row = SeasonalPoint;
    static constexpr auto read = read_seasonal_point<kMannKendall>;
    static bool same(const Row& a, const Row& b) { return same_point(a, b); }
    static std::optional<double> compute(std::vector<Row> rows) {
        return mann_kendall_p(seasonal_kendall_score(std::move(rows)));
    }
};

struct SeasonalTheilSenTraits {
    static constexpr const char* kName = kTheilSen;
    using Row = SeasonalPoint;
    static constexpr auto read = read_seasonal_point<kTheilSen>;
    static bool same(const Row& a, const Row& b) { return same_point(a, b); }
    static std::optional<double> compute(std::vector<Row> rows) {
        return seasonal_theil_sen_slope(std::move(rows));
    }
};

struct MadTraits {
    static constexpr const char* kName = kMad;
    using Row = double;
    static std::optional<double> read(int, sqlite3_value** argv) {
        return read_number(ArgumentRef{kMad, 1, "x"}, argv[0]);
    }
    static bool same(double a, double b) { return a == b; }
    static std::optional<double> compute(std::vector<double> rows) {
        return median_absolute_deviation(std::move(rows));
    }
};

template <typename Traits>
int register_frame_function(sqlite3* db, int arity) {
    constexpr int kPure = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    using F = Frame<Traits>;
    return sqlite3_create_window_function(db, Traits::kName, arity, kPure, nullptr, F::step,
                                          F::final, F::value, F::inverse, nullptr);
}

}  // namespace

int register_season_functions(sqlite3* db) {
    constexpr int kPure = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    // A zone's rules come from the tz database, which can change under us.
    constexpr int kZoned = SQLITE_UTF8 | SQLITE_INNOCUOUS;
    int rc = sqlite3_create_function(db, "period_position", 3, kPure, nullptr, period_position,
                                     nullptr, nullptr);
    if (rc == SQLITE_OK)
        rc = sqlite3_create_function(db, "period_position", 4, kZoned, nullptr, period_position,
                                     nullptr, nullptr);
    if (rc == SQLITE_OK) rc = register_frame_function<MannKendallTraits>(db, 2);
    if (rc == SQLITE_OK) rc = register_frame_function<MannKendallTraits>(db, 3);
    if (rc == SQLITE_OK) rc = register_frame_function<SeasonalTheilSenTraits>(db, 3);
    if (rc == SQLITE_OK) rc = register_frame_function<MadTraits>(db, 1);
    return rc;
}

}  // namespace almanac::sqlite
