// SPDX-License-Identifier: MIT
// Trend and noise statistics, for PostgreSQL: the SQLite module's contract
// (ext/sqlite/statistics_functions.cpp) over double precision.
//
//  1. moving_mean(x [, min_values bigint]): the exactly rounded sum of the
//     non-NULL x divided by their count; NULL while fewer than min_values
//     (1 to 1000000000, the same in every row).
//  2. resid_sd(y, x), slope_stderr(y, x): NULL for n < 3 or Sxx = 0.
//  3. ewma(x, t, half_life): t timestamptz, timestamp, date or text with a
//     fixed-length period_spec half_life ('2 weeks'), or t and half_life
//     double precision (half_life > 0); half_life the same in every row.
// All are plain aggregates whose states combine exactly (exact sums are
// added, not rounded), with a byte form for parallel workers, and moving
// aggregates with a real inverse. Rows with a NULL argument are skipped; NaN
// and infinities are errors (22023) with the SQLite module's messages.
#include <optional>
#include <string>

#include "aggregate_state.h"
#include "arguments.h"
#include "boundary.h"
#include "core/exact/exact_sum.h"
#include "core/stats/exponential_weights.h"
#include "core/stats/moment_sums.h"
#include "core/text/error.h"
#include "core/time/period_spec.h"

namespace almanac::postgres {

// ---- 1. moving_mean ----------------------------------------------------------

struct MeanState {
    ExactSum sum;
    std::int64_t count = 0;
    std::int64_t min_values = 1;
    bool min_values_seen = false;
};

constexpr const char* kMean = "moving_mean";
constexpr std::int64_t kMostMinValues = 1000000000;

void check_same_min_values(MeanState& mean, std::int64_t min_values) {
    if (mean.min_values_seen && min_values != mean.min_values)
        raise_argument_error({kMean, 2, "min_values"}, std::to_string(min_values),
                             "expected the same min_values in every row (the first was " +
                                 std::to_string(mean.min_values) + ")",
                             ERRCODE_INVALID_PARAMETER_VALUE);
    mean.min_values = min_values;
    mean.min_values_seen = true;
}

template <>
struct StateTraits<MeanState> {
    static constexpr std::uint8_t kTag = 2;
    static void merge(MeanState& into, const MeanState& from) {
        if (from.min_values_seen) check_same_min_values(into, from.min_values);
        into.sum.add(from.sum, 0);
        into.count += from.count;
    }
    static void write(ByteWriter& out, const MeanState& mean) {
        out.i64(mean.count);
        out.i64(mean.min_values);
        out.u8(mean.min_values_seen ? 1 : 0);
        out.exact_sum(mean.sum);
    }
    static void read(ByteReader& in, MeanState& mean) {
        mean.count = in.count(INT64_MAX);
        mean.min_values = in.count(kMostMinValues);
        mean.min_values_seen = in.u8() != 0;
        in.add_exact_sum(mean.sum);
    }
};

// ---- 2. resid_sd, slope_stderr ---------------------------------------------------

template <>
struct StateTraits<BivariateMoments> {
    static constexpr std::uint8_t kTag = 3;
    static void merge(BivariateMoments& into, const BivariateMoments& from) { into.merge(from); }
    static void write(ByteWriter& out, const BivariateMoments& m) { m.write(out); }
    static void read(ByteReader& in, BivariateMoments& m) { m = BivariateMoments::read(in); }
};

// ---- 3. ewma ------------------------------------------------------------------------

struct EwmaState {
    ExponentialWeights weights;
    bool configured = false;
    bool time_based = false;
    std::int64_t half_life_ms = 0;
    double half_life = 0.0;
    std::string first_half_life;  // as messages show it
    std::string half_life_text;   // a spec as written: rows usually repeat it
};

constexpr const char* kEwma = "ewma";
constexpr Argument kEwmaX{kEwma, 1, "x"}, kEwmaT{kEwma, 2, "t"},
    kEwmaHalfLife{kEwma, 3, "half_life"};

void same_half_life(EwmaState& into, const EwmaState& from) {
    if (!from.configured) return;
    if (!into.configured) {
        into.configured = true;
        into.time_based = from.time_based;
        into.half_life_ms = from.half_life_ms;
        into.half_life = from.half_life;
        into.first_half_life = from.first_half_life;
        into.half_life_text = from.half_life_text;
        return;
    }
    bool same = into.time_based == from.time_based &&
                (into.time_based ? into.half_life_ms == from.half_life_ms
                                 : into.half_life == from.half_life);
    if (!same)
        raise_argument_error(
            kEwmaHalfLife, from.first_half_life,
            "expected the same half_life in every row (the first was " + into.first_half_life + ")",
            ERRCODE_INVALID_PARAMETER_VALUE);
}

template <>
struct StateTraits<EwmaState> {
    static constexpr std::uint8_t kTag = 4;
    static void merge(EwmaState& into, const EwmaState& from) {
        same_half_life(into, from);
        into.weights.merge(from.weights);
    }
    static void write(ByteWriter& out, const EwmaState& ewma) {
        out.u8((ewma.configured ? 1 : 0) | (ewma.time_based ? 2 : 0));
        out.i64(ewma.half_life_ms);
        out.f64(ewma.half_life);
        out.text(ewma.first_half_life);
        out.text(ewma.half_life_text);
        ewma.weights.write(out);
    }
    static void read(ByteReader& in, EwmaState& ewma) {
        std::uint8_t flags = in.u8();
        ewma.configured = flags & 1;
        ewma.time_based = flags & 2;
        ewma.half_life_ms = in.i64();
        ewma.half_life = in.f64();
        ewma.first_half_life = in.text();
        ewma.half_life_text = in.text();
        ewma.weights = ExponentialWeights::read(in);
    }
};

namespace {

// ---- moving_mean rows -----------------------------------------------------------

Datum mean_row(FunctionCallInfo fcinfo, Direction direction) {
    MeanState* mean = state_for_row<MeanState>(fcinfo, kMean);
    bool has_min = PG_NARGS() > 2;
    if (PG_ARGISNULL(1) || (has_min && PG_ARGISNULL(2))) PG_RETURN_POINTER(mean);
    double x = PG_GETARG_FLOAT8(1);
    std::int64_t min_values = has_min ? PG_GETARG_INT64(2) : 1;
    bool ok = guarded([&] {
        finite_number({kMean, 1, "x"}, x);
        if (min_values < 1 || min_values > kMostMinValues)
            raise_argument_error({kMean, 2, "min_values"}, std::to_string(min_values),
                                 "expected a whole number from 1 to 1000000000",
                                 ERRCODE_INVALID_PARAMETER_VALUE);
        if (direction == Direction::Add) {
            check_same_min_values(*mean, min_values);
            mean->sum.add(x);
            ++mean->count;
        } else {
            mean->sum.subtract(x);
            --mean->count;
        }
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(mean);
}

Datum mean_final(FunctionCallInfo fcinfo) {
    MeanState* mean = state_argument<MeanState>(fcinfo);
    if (!mean || mean->count == 0 || mean->count < mean->min_values) PG_RETURN_NULL();
    double value = 0;
    // The correctly rounded sum, then one IEEE division: math.fsum(v)/n.
    if (!guarded([&] { value = mean->sum.to_double() / static_cast<double>(mean->count); }))
        report_failure();
    PG_RETURN_FLOAT8(value);
}

// ---- resid_sd, slope_stderr rows ----------------------------------------------------

Datum moments_row(FunctionCallInfo fcinfo, const char* name, Direction direction) {
    BivariateMoments* moments = state_for_row<BivariateMoments>(fcinfo, name);
    if (PG_ARGISNULL(1) || PG_ARGISNULL(2)) PG_RETURN_POINTER(moments);
    double y = PG_GETARG_FLOAT8(1), x = PG_GETARG_FLOAT8(2);
    bool ok = guarded([&] {
        finite_number({name, 1, "y"}, y);
        finite_number({name, 2, "x"}, x);
        direction == Direction::Add ? moments->add(y, x) : moments->remove(y, x);
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(moments);
}

Datum moments_final(FunctionCallInfo fcinfo, bool slope) {
    return optional_double_final<BivariateMoments>(fcinfo, [slope](const BivariateMoments& m) {
        return slope ? m.slope_stderr() : m.residual_sd();
    });
}

// ---- ewma rows ------------------------------------------------------------------------

// Fixes the group's half_life on its first row; later rows must give the same.
void configure_time_based(EwmaState& ewma, std::string_view spec) {
    if (ewma.configured && ewma.time_based && spec == ewma.half_life_text) return;
    std::int64_t ms = 0;
    try {
        ms = parse_period_spec(spec).fixed_length().count();
    } catch (const Error& error) {
        raise_argument_error(kEwmaHalfLife, shown_text(spec), error.what(),
                             ERRCODE_INVALID_PARAMETER_VALUE);
    }
    EwmaState row;
    row.configured = true;
    row.time_based = true;
    row.half_life_ms = ms;
    row.first_half_life = shown_text(spec);
    row.half_life_text.assign(spec);
    same_half_life(ewma, row);
}

void configure_numeric(EwmaState& ewma, double half_life) {
    if (ewma.configured && !ewma.time_based && half_life == ewma.half_life) return;
    if (!(half_life > 0) || !std::isfinite(half_life))
        raise_argument_error(kEwmaHalfLife, shown_number(half_life),
                             "expected a positive number or a period such as '7 days'",
                             ERRCODE_INVALID_PARAMETER_VALUE);
    EwmaState row;
    row.configured = true;
    row.half_life = half_life;
    row.first_half_life = shown_number(half_life);
    same_half_life(ewma, row);
}

template <TimeKind Kind>
Datum ewma_time_row(FunctionCallInfo fcinfo, Direction direction) {
    EwmaState* ewma = state_for_row<EwmaState>(fcinfo, kEwma);
    if (PG_ARGISNULL(1) || PG_ARGISNULL(2) || PG_ARGISNULL(3)) PG_RETURN_POINTER(ewma);
    double x = PG_GETARG_FLOAT8(1);
    TimeArgument t = time_argument(fcinfo, 2, Kind);
    std::string_view spec = text_argument(fcinfo, 3);
    bool ok = guarded([&] {
        finite_number(kEwmaX, x);
        if (direction == Direction::Add) configure_time_based(*ewma, spec);
        TimeValue time = read_time(kEwmaT, t);
        auto position = ExponentialWeights::position(time.utc_instant().time_since_epoch().count(),
                                                     ewma->half_life_ms);
        direction == Direction::Add ? ewma->weights.add(x, position)
                                    : ewma->weights.remove(x, position);
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(ewma);
}

Datum ewma_number_row(FunctionCallInfo fcinfo, Direction direction) {
    EwmaState* ewma = state_for_row<EwmaState>(fcinfo, kEwma);
    if (PG_ARGISNULL(1) || PG_ARGISNULL(2) || PG_ARGISNULL(3)) PG_RETURN_POINTER(ewma);
    double x = PG_GETARG_FLOAT8(1), t = PG_GETARG_FLOAT8(2), half_life = PG_GETARG_FLOAT8(3);
    bool ok = guarded([&] {
        finite_number(kEwmaX, x);
        if (direction == Direction::Add) configure_numeric(*ewma, half_life);
        finite_number(kEwmaT, t);
        ExponentialWeights::Position position;
        try {
            position = ExponentialWeights::position(t, ewma->half_life);
        } catch (const Error& error) {
            raise_argument_error(kEwmaT, shown_number(t), error.what(),
                                 ERRCODE_INVALID_PARAMETER_VALUE);
        }
        direction == Direction::Add ? ewma->weights.add(x, position)
                                    : ewma->weights.remove(x, position);
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(ewma);
}

Datum ewma_final(FunctionCallInfo fcinfo) {
    return optional_double_final<EwmaState>(
        fcinfo, [](const EwmaState& ewma) { return ewma.weights.mean(); });
}

}  // namespace
}  // namespace almanac::postgres

namespace pg = almanac::postgres;
using pg::Direction;
using pg::TimeKind;

ALMANAC_PG_FUNCTION(almanac_moving_mean_step) { return pg::mean_row(fcinfo, Direction::Add); }
ALMANAC_PG_FUNCTION(almanac_moving_mean_inverse) { return pg::mean_row(fcinfo, Direction::Remove); }
ALMANAC_PG_FUNCTION(almanac_moving_mean_final) { return pg::mean_final(fcinfo); }
ALMANAC_PG_FUNCTION(almanac_moving_mean_combine) {
    return pg::combine_states<pg::MeanState>(fcinfo, pg::kMean);
}
ALMANAC_PG_FUNCTION(almanac_moving_mean_serialize) {
    return pg::serialize_state<pg::MeanState>(fcinfo);
}
ALMANAC_PG_FUNCTION(almanac_moving_mean_deserialize) {
    return pg::deserialize_state<pg::MeanState>(fcinfo, pg::kMean);
}

ALMANAC_PG_FUNCTION(almanac_resid_sd_step) {
    return pg::moments_row(fcinfo, "resid_sd", Direction::Add);
}
ALMANAC_PG_FUNCTION(almanac_resid_sd_inverse) {
    return pg::moments_row(fcinfo, "resid_sd", Direction::Remove);
}
ALMANAC_PG_FUNCTION(almanac_slope_stderr_step) {
    return pg::moments_row(fcinfo, "slope_stderr", Direction::Add);
}
ALMANAC_PG_FUNCTION(almanac_slope_stderr_inverse) {
    return pg::moments_row(fcinfo, "slope_stderr", Direction::Remove);
}
ALMANAC_PG_FUNCTION(almanac_resid_sd_final) { return pg::moments_final(fcinfo, false); }
ALMANAC_PG_FUNCTION(almanac_slope_stderr_final) { return pg::moments_final(fcinfo, true); }
ALMANAC_PG_FUNCTION(almanac_moments_combine) {
    return pg::combine_states<almanac::BivariateMoments>(fcinfo, "resid_sd");
}
ALMANAC_PG_FUNCTION(almanac_moments_serialize) {
    return pg::serialize_state<almanac::BivariateMoments>(fcinfo);
}
ALMANAC_PG_FUNCTION(almanac_moments_deserialize) {
    return pg::deserialize_state<almanac::BivariateMoments>(fcinfo, "resid_sd");
}

#define ALMANAC_EWMA_TIME(suffix, kind)                            \
    ALMANAC_PG_FUNCTION(almanac_ewma_##suffix##_step) {            \
        return pg::ewma_time_row<kind>(fcinfo, Direction::Add);    \
    }                                                              \
    ALMANAC_PG_FUNCTION(almanac_ewma_##suffix##_inverse) {         \
        return pg::ewma_time_row<kind>(fcinfo, Direction::Remove); \
    }
ALMANAC_EWMA_TIME(timestamptz, TimeKind::Timestamptz)
ALMANAC_EWMA_TIME(timestamp, TimeKind::Timestamp)
ALMANAC_EWMA_TIME(date, TimeKind::Date)
ALMANAC_EWMA_TIME(text, TimeKind::Text)
ALMANAC_PG_FUNCTION(almanac_ewma_number_step) {
    return pg::ewma_number_row(fcinfo, Direction::Add);
}
ALMANAC_PG_FUNCTION(almanac_ewma_number_inverse) {
    return pg::ewma_number_row(fcinfo, Direction::Remove);
}
ALMANAC_PG_FUNCTION(almanac_ewma_final) { return pg::ewma_final(fcinfo); }
ALMANAC_PG_FUNCTION(almanac_ewma_combine) {
    return pg::combine_states<pg::EwmaState>(fcinfo, pg::kEwma);
}
ALMANAC_PG_FUNCTION(almanac_ewma_serialize) { return pg::serialize_state<pg::EwmaState>(fcinfo); }
ALMANAC_PG_FUNCTION(almanac_ewma_deserialize) {
    return pg::deserialize_state<pg::EwmaState>(fcinfo, pg::kEwma);
}
