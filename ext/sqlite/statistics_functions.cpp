// SPDX-License-Identifier: MIT
// Trend and noise statistics: aggregates that are also sliding windows.
//
// Contract (every function is a plain aggregate and a window function with a
// real inverse, so a sliding frame costs O(1) per row; "x", "y" are read as
// numbers: INTEGER, REAL, or TEXT that SQLite reads as a number; other TEXT,
// BLOBs and infinities raise "fn(): argument N (name) = <value>: ..."):
//
//  1. var_samp(x), var_pop(x), stddev_samp(x), stddev_pop(x): rows with NULL x
//     are skipped; NULL for no rows (and for one row in the _samp forms).
//  2. covar_samp(y, x), covar_pop(y, x), corr(y, x), regr_count(y, x),
//     regr_avgx, regr_avgy, regr_sxx, regr_syy, regr_sxy, regr_slope,
//     regr_intercept, regr_r2 (all (y, x)): SQL-standard meaning over the rows
//     where both are non-NULL. regr_count gives 0 for no rows, the others
//     NULL; covar_samp NULL for one row; corr NULL when Sxx or Syy is 0;
//     regr_slope, regr_intercept, regr_r2 NULL when Sxx is 0; regr_r2 is 1
//     when Syy is 0 and Sxx is not.
//  3. resid_sd(y, x) = √(SSE/(n−2)), slope_stderr(y, x) = resid_sd/√Sxx: NULL
//     for n < 3 or Sxx = 0.
//  4. moving_mean(x [, min_values]): the exactly rounded sum of the non-NULL
//     x divided by their count (bit-identical to Python's math.fsum(v)/n);
//     NULL while fewer than min_values (default 1) values. min_values is a
//     whole number from 1 to 1000000000, the same in every row; a row whose
//     min_values is NULL is skipped.
//  5. ewma(x, t, half_life): Σ w·x / Σ w with w = 0.5^((t_max − t)/half_life),
//     t_max the latest t among the rows present. half_life is either a
//     fixed-length period spec ('2 weeks', 'PT12H'; not months or years), and
//     then t is a time value, or a positive number, and then t is a plain
//     number. half_life must be the same in every row. Rows with any NULL
//     argument are skipped; NULL for no rows.
//
// All arithmetic lives in the core (moment_sums.h, exact_sum.h,
// exponential_weights.h); this file reads arguments and writes results.
#include <cmath>
#include <cstring>
#include <new>
#include <optional>
#include <string>

#include "aggregate_state.h"
#include "arguments.h"
#include "core/exact/exact_sum.h"
#include "core/stats/exponential_weights.h"
#include "core/stats/moment_sums.h"
#include "core/text/error.h"
#include "core/time/period_spec.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

// ---- 1. one-variable moments ----------------------------------------------

struct UnivariateFunction {
    const char* name;
    std::optional<double> (*compute)(const UnivariateMoments&);
};

const UnivariateFunction kUnivariate[] = {
    {"var_samp", [](const UnivariateMoments& m) { return m.variance(true); }},
    {"var_pop", [](const UnivariateMoments& m) { return m.variance(false); }},
    {"stddev_samp", [](const UnivariateMoments& m) { return m.standard_deviation(true); }},
    {"stddev_pop", [](const UnivariateMoments& m) { return m.standard_deviation(false); }},
};

const UnivariateFunction& univariate(sqlite3_context* context) {
    return *static_cast<const UnivariateFunction*>(sqlite3_user_data(context));
}

void univariate_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto x = read_number({univariate(context).name, 1, "x"}, argv[0]);
        if (x) aggregate_state<UnivariateMoments>(context).add(*x);
    });
}

void univariate_inverse(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto x = read_number({univariate(context).name, 1, "x"}, argv[0]);
        if (x) aggregate_state<UnivariateMoments>(context).remove(*x);
    });
}

void univariate_value(sqlite3_context* context) {
    guarded(context, [&] {
        auto* moments = existing_state<UnivariateMoments>(context);
        result_optional_double(context,
                               moments ? univariate(context).compute(*moments) : std::nullopt);
    });
}

void univariate_final(sqlite3_context* context) {
    univariate_value(context);
    take_state<UnivariateMoments>(context);
}

// ---- 2, 3. two-variable moments -------------------------------------------

struct BivariateFunction {
    const char* name;
    std::optional<double> (*compute)(const BivariateMoments&);
};

const BivariateFunction kBivariate[] = {
    {"covar_samp", [](const BivariateMoments& m) { return m.covariance(true); }},
    {"covar_pop", [](const BivariateMoments& m) { return m.covariance(false); }},
    {"corr", [](const BivariateMoments& m) { return m.correlation(); }},
    {"regr_avgx", [](const BivariateMoments& m) { return m.mean_x(); }},
    {"regr_avgy", [](const BivariateMoments& m) { return m.mean_y(); }},
    {"regr_sxx", [](const BivariateMoments& m) { return m.sxx(); }},
    {"regr_syy", [](const BivariateMoments& m) { return m.syy(); }},
    {"regr_sxy", [](const BivariateMoments& m) { return m.sxy(); }},
    {"regr_slope", [](const BivariateMoments& m) { return m.slope(); }},
    {"regr_intercept", [](const BivariateMoments& m) { return m.intercept(); }},
    {"regr_r2", [](const BivariateMoments& m) { return m.r_squared(); }},
    {"resid_sd", [](const BivariateMoments& m) { return m.residual_sd(); }},
    {"slope_stderr", [](const BivariateMoments& m) { return m.slope_stderr(); }},
    // regr_count is the one integer result; see bivariate_value.
    {"regr_count", nullptr},
};

const BivariateFunction& bivariate(sqlite3_context* context) {
    return *static_cast<const BivariateFunction*>(sqlite3_user_data(context));
}

// Reads (y, x); false when the row is skipped.
bool read_pair(sqlite3_context* context, sqlite3_value** argv, double& y, double& x) {
    const char* name = bivariate(context).name;
    auto y_value = read_number({name, 1, "y"}, argv[0]);
    auto x_value = read_number({name, 2, "x"}, argv[1]);
    if (!y_value || !x_value) return false;
    y = *y_value;
    x = *x_value;
    return true;
}

void bivariate_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        double y, x;
        if (read_pair(context, argv, y, x)) aggregate_state<BivariateMoments>(context).add(y, x);
    });
}

void bivariate_inverse(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        double y, x;
        if (read_pair(context, argv, y, x)) aggregate_state<BivariateMoments>(context).remove(y, x);
    });
}

void bivariate_value(sqlite3_context* context) {
    guarded(context, [&] {
        const BivariateFunction& function = bivariate(context);
        auto* moments = existing_state<BivariateMoments>(context);
        if (!function.compute) {
            sqlite3_result_int64(context, moments ? moments->count() : 0);
            return;
        }
        result_optional_double(context, moments ? function.compute(*moments) : std::nullopt);
    });
}

void bivariate_final(sqlite3_context* context) {
    bivariate_value(context);
    take_state<BivariateMoments>(context);
}

// ---- 4. moving_mean ---------------------------------------------------------

constexpr std::int64_t kMostMinValues = 1000000000;

struct MeanState {
    ExactSum sum;
    std::int64_t count = 0;
    std::int64_t min_values = 1;
    bool min_values_seen = false;
};

// Reads x and min_values; false when the row is skipped.
bool read_mean_row(int argc, sqlite3_value** argv, double& x, std::int64_t& min_values) {
    min_values = 1;
    // The common case, a finite REAL, without the general reader's call.
    if (argc == 1 && sqlite3_value_type(argv[0]) == SQLITE_FLOAT) {
        x = sqlite3_value_double(argv[0]);
        if (std::isfinite(x)) return true;
    }
    auto value = read_number({"moving_mean", 1, "x"}, argv[0]);
    if (argc == 2) {
        auto given = read_integer({"moving_mean", 2, "min_values"}, argv[1], 1, kMostMinValues);
        if (!given) return false;
        min_values = *given;
    }
    if (!value) return false;
    x = *value;
    return true;
}

void mean_step(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        double x;
        std::int64_t min_values;
        if (!read_mean_row(argc, argv, x, min_values)) return;
        MeanState& mean = aggregate_state<MeanState>(context);
        if (mean.min_values_seen && min_values != mean.min_values)
            raise_argument_error({"moving_mean", 2, "min_values"}, argv[1],
                                 "expected the same min_values in every row (the first was " +
                                     std::to_string(mean.min_values) + ")");
        mean.min_values = min_values;
        mean.min_values_seen = true;
        mean.sum.add(x);
        ++mean.count;
    });
}

void mean_inverse(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        double x;
        std::int64_t min_values;
        if (!read_mean_row(argc, argv, x, min_values)) return;
        MeanState& mean = aggregate_state<MeanState>(context);
        mean.sum.subtract(x);
        --mean.count;
    });
}

void mean_value(sqlite3_context* context) {
    guarded(context, [&] {
        auto* mean = existing_state<MeanState>(context);
        if (!mean || mean->count == 0 || mean->count < mean->min_values)
            return sqlite3_result_null(context);
        // The correctly rounded sum, then one IEEE division: math.fsum(v)/n.
        sqlite3_result_double(context, mean->sum.to_double() / static_cast<double>(mean->count));
    });
}

void mean_final(sqlite3_context* context) {
    mean_value(context);
    take_state<MeanState>(context);
}

// ---- 5. ewma -------------------------------------------------------------

struct EwmaState {
    ExponentialWeights weights;
    bool configured = false;
    bool time_based = false;  // half_life is a period spec, t a time value
    std::int64_t half_life_ms = 0;
    double half_life = 0.0;       // when numeric
    std::string half_life_text;   // as written, when a spec: rows usually repeat it
    std::string first_half_life;  // as messages show it
};

constexpr ArgumentRef kEwmaX{"ewma", 1, "x"};
constexpr ArgumentRef kEwmaT{"ewma", 2, "t"};
constexpr ArgumentRef kEwmaHalfLife{"ewma", 3, "half_life"};

// The half-life one row gives: a spec (time_based) or a positive number.
struct HalfLife {
    bool time_based = false;
    std::int64_t ms = 0;
    double number = 0.0;
};

HalfLife read_half_life(sqlite3_value* value) {
    HalfLife half_life;
    int type = sqlite3_value_type(value);
    if (type == SQLITE_TEXT) {
        const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
        std::string_view written(text ? text : "", sqlite3_value_bytes(value));
        if (!numeric_text(written)) {
            try {
                half_life.time_based = true;
                half_life.ms = parse_period_spec(written).fixed_length().count();
            } catch (const Error& error) {
                raise_argument_error(kEwmaHalfLife, value, error.what());
            }
            return half_life;
        }
    }
    if (type == SQLITE_BLOB)
        raise_argument_error(kEwmaHalfLife, value,
                             "expected a period such as '7 days' or a positive number, not a BLOB");
    half_life.number = *read_number(kEwmaHalfLife, value);
    if (!(half_life.number > 0))
        raise_argument_error(kEwmaHalfLife, value,
                             "expected a positive number or a period such as '7 days'");
    return half_life;
}

// Checks the row's half_life against the group's (parsing only when it is
// written differently) and fixes it on the first row.
void configure(EwmaState& ewma, sqlite3_value* value) {
    bool text = sqlite3_value_type(value) == SQLITE_TEXT;
    if (ewma.configured) {
        if (ewma.time_based && text) {
            const char* written = reinterpret_cast<const char*>(sqlite3_value_text(value));
            if (ewma.half_life_text.size() == std::size_t(sqlite3_value_bytes(value)) &&
                std::memcmp(ewma.half_life_text.data(), written, ewma.half_life_text.size()) == 0)
                return;
        }
        if (!ewma.time_based && !text && sqlite3_value_double(value) == ewma.half_life) return;
    }
    HalfLife half_life = read_half_life(value);
    if (ewma.configured) {
        bool same = half_life.time_based == ewma.time_based &&
                    (half_life.time_based ? half_life.ms == ewma.half_life_ms
                                          : half_life.number == ewma.half_life);
        if (!same)
            raise_argument_error(kEwmaHalfLife, value,
                                 "expected the same half_life in every row (the first was " +
                                     ewma.first_half_life + ")");
        return;
    }
    ewma.configured = true;
    ewma.time_based = half_life.time_based;
    ewma.half_life_ms = half_life.ms;
    ewma.half_life = half_life.number;
    ewma.first_half_life = describe_value(value);
    if (text) {
        const char* written = reinterpret_cast<const char*>(sqlite3_value_text(value));
        ewma.half_life_text.assign(written ? written : "", sqlite3_value_bytes(value));
    }
}

ExponentialWeights::Position read_position(const EwmaState& ewma, sqlite3_value* value,
                                           bool& present) {
    present = false;
    if (ewma.time_based) {
        auto t = read_time(kEwmaT, value);
        if (!t) return {};
        present = true;
        return ExponentialWeights::position(t->utc_instant().time_since_epoch().count(),
                                            ewma.half_life_ms);
    }
    if (sqlite3_value_type(value) == SQLITE_TEXT) {
        const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
        if (!numeric_text(text ? text : ""))
            raise_argument_error(kEwmaT, value,
                                 "expected a number, because half_life is a number (give "
                                 "half_life as a period such as '7 days' for time values)");
    }
    auto t = read_number(kEwmaT, value);
    if (!t) return {};
    present = true;
    try {
        return ExponentialWeights::position(*t, ewma.half_life);
    } catch (const Error& error) {
        raise_argument_error(kEwmaT, value, error.what());
    }
}

void ewma_row(sqlite3_context* context, sqlite3_value** argv, bool adding) {
    auto x = read_number(kEwmaX, argv[0]);
    if (sqlite3_value_type(argv[2]) == SQLITE_NULL) return;
    EwmaState& ewma = aggregate_state<EwmaState>(context);
    if (adding) configure(ewma, argv[2]);
    bool present;
    auto position = read_position(ewma, argv[1], present);
    if (!x || !present) return;
    if (adding)
        ewma.weights.add(*x, position);
    else
        ewma.weights.remove(*x, position);
}

void ewma_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] { ewma_row(context, argv, true); });
}

void ewma_inverse(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] { ewma_row(context, argv, false); });
}

void ewma_value(sqlite3_context* context) {
    guarded(context, [&] {
        auto* ewma = existing_state<EwmaState>(context);
        result_optional_double(context, ewma ? ewma->weights.mean() : std::nullopt);
    });
}

void ewma_final(sqlite3_context* context) {
    ewma_value(context);
    take_state<EwmaState>(context);
}

}  // namespace

int register_statistics_functions(sqlite3* db) {
    constexpr int kPure = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    auto window = [db](const char* name, int args, const void* data, auto step, auto final_,
                       auto value, auto inverse) {
        return sqlite3_create_window_function(db, name, args, kPure, const_cast<void*>(data), step,
                                              final_, value, inverse, nullptr);
    };
    int rc = SQLITE_OK;
    for (const auto& function : kUnivariate) {
        if (rc == SQLITE_OK)
            rc = window(function.name, 1, &function, univariate_step, univariate_final,
                        univariate_value, univariate_inverse);
    }
    for (const auto& function : kBivariate) {
        if (rc == SQLITE_OK)
            rc = window(function.name, 2, &function, bivariate_step, bivariate_final,
                        bivariate_value, bivariate_inverse);
    }
    for (int args : {1, 2}) {
        if (rc == SQLITE_OK)
            rc = window("moving_mean", args, nullptr, mean_step, mean_final, mean_value,
                        mean_inverse);
    }
    if (rc == SQLITE_OK)
        rc = window("ewma", 3, nullptr, ewma_step, ewma_final, ewma_value, ewma_inverse);
    return rc;
}

}  // namespace almanac::sqlite
