// SPDX-License-Identifier: MIT
// Reading shop exports, for PostgreSQL: the SQLite module's contract
// (ext/sqlite/export_functions.cpp) over PostgreSQL's types.
//
//  1. exact_sum(x): x double precision gives double precision, the sum
//     exactly rounded once (bit-identical to the SQLite module and to Python's
//     math.fsum); x smallint, integer or bigint gives bigint, the exact total,
//     or 22003 when it does not fit in 64 bits (the SQLite module answers a
//     REAL there; PostgreSQL's result type is fixed, and a rounded total is
//     not what an integer column's user asks for). Rows with NULL x are
//     skipped; NULL for no rows; NaN and infinities are 22023 with the SQLite
//     module's message. Plain aggregate (combined exactly, so any parallel or
//     sharded plan gives the same bits) and moving aggregate (a real inverse).
//  2. to_amount(text [, decimal_mark text]) double precision: money as
//     exports write it (core/text/amount_text.h); decimal_mark '.' (default)
//     or ','; empty or blank text gives NULL; other text is 22P02.
//  3. to_time(text, format text [, zone zone_name]) text: the SQLite
//     module's to_time (core/time/time_reader.h); with the format excel the
//     text is a serial day number written as text ('46086.6'), and the
//     overload to_time(double precision, text [, zone_name]) takes it as a
//     number. The format and zone are parsed once per call site. A text that
//     does not match is 22007; a bad format or zone 22023.
#include <optional>

#include "aggregate_state.h"
#include "arguments.h"
#include "boundary.h"
#include "core/exact/exact_total.h"
#include "core/text/amount_text.h"
#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/time/time_reader.h"

namespace almanac::postgres {

template <>
struct StateTraits<ExactTotal> {
    static constexpr std::uint8_t kTag = 1;
    static void merge(ExactTotal& into, const ExactTotal& from) { into.merge(from); }
    static void write(ByteWriter& out, const ExactTotal& total) { total.write(out); }
    static void read(ByteReader& in, ExactTotal& total) { total = ExactTotal::read(in); }
};

namespace {

constexpr const char* kSum = "exact_sum";
constexpr Argument kSumX{kSum, 1, "x"};

Datum sum_real_row(FunctionCallInfo fcinfo, Direction direction) {
    ExactTotal* total = state_for_row<ExactTotal>(fcinfo, kSum);
    if (PG_ARGISNULL(1)) PG_RETURN_POINTER(total);
    double x = PG_GETARG_FLOAT8(1);
    bool ok = guarded([&] {
        finite_number(kSumX, x);
        direction == Direction::Add ? total->add_real(x) : total->remove_real(x);
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(total);
}

template <typename Integer>
Datum sum_integer_row(FunctionCallInfo fcinfo, Direction direction) {
    ExactTotal* total = state_for_row<ExactTotal>(fcinfo, kSum);
    if (PG_ARGISNULL(1)) PG_RETURN_POINTER(total);
    std::int64_t x;
    if constexpr (sizeof(Integer) == 8)
        x = PG_GETARG_INT64(1);
    else if constexpr (sizeof(Integer) == 4)
        x = PG_GETARG_INT32(1);
    else
        x = PG_GETARG_INT16(1);
    bool ok = guarded(
        [&] { direction == Direction::Add ? total->add_integer(x) : total->remove_integer(x); });
    if (!ok) report_failure();
    PG_RETURN_POINTER(total);
}

Datum sum_real_final(FunctionCallInfo fcinfo) {
    ExactTotal* total = state_argument<ExactTotal>(fcinfo);
    std::optional<ExactTotal::Value> value;
    if (total && !guarded([&] { value = total->value(); })) report_failure();
    if (!value) PG_RETURN_NULL();
    PG_RETURN_FLOAT8(value->is_integer ? static_cast<double>(value->integer) : value->real);
}

Datum sum_integer_final(FunctionCallInfo fcinfo) {
    ExactTotal* total = state_argument<ExactTotal>(fcinfo);
    std::optional<ExactTotal::Value> value;
    if (total && !guarded([&] { value = total->value(); })) report_failure();
    if (!value) PG_RETURN_NULL();
    if (!value->is_integer)
        ereport(ERROR, (errcode(ERRCODE_NUMERIC_VALUE_OUT_OF_RANGE),
                        errmsg_internal("exact_sum(): the total does not fit in a bigint; sum "
                                        "x::numeric with sum() for totals this large")));
    PG_RETURN_INT64(value->integer);
}

Datum to_amount(FunctionCallInfo fcinfo) {
    std::string_view text = text_argument(fcinfo, 0);
    std::string_view mark = PG_NARGS() > 1 ? text_argument(fcinfo, 1) : std::string_view(".");
    std::optional<double> amount;
    bool ok = guarded([&] {
        if (mark != "." && mark != ",")
            raise_argument_error({"to_amount", 2, "decimal_mark"}, shown_text(mark),
                                 "expected '.' or ','", ERRCODE_INVALID_PARAMETER_VALUE);
        try {
            amount = read_amount(text, mark[0]);
        } catch (const Error& error) {
            raise_argument_error({"to_amount", 1, "text"}, shown_text(text), error.what(),
                                 ERRCODE_INVALID_TEXT_REPRESENTATION);
        }
    });
    if (!ok) report_failure();
    if (!amount) PG_RETURN_NULL();
    PG_RETURN_FLOAT8(*amount);
}

// ---- to_time ------------------------------------------------------------------

constexpr Argument kTimeText{"to_time", 1, "text"}, kTimeFormat{"to_time", 2, "format"},
    kTimeZone{"to_time", 3, "zone"};

// The call site's reader, rebuilt only when the format or zone text changes.
struct TimeReaderCache {
    std::string format, zone;
    bool zoned = false;
    std::optional<TimeReader> reader;

    const TimeReader& get(std::string_view format_text, bool with_zone,
                          std::string_view zone_text) {
        if (reader && format == format_text && zoned == with_zone && zone == zone_text)
            return *reader;
        reader.reset();
        try {
            reader.emplace(format_text,
                           with_zone ? std::optional<std::string_view>(zone_text) : std::nullopt);
        } catch (const TimeReaderError& error) {
            if (error.culprit() == TimeReaderError::Culprit::Zone)
                raise_argument_error(kTimeZone, shown_text(zone_text), error.what(),
                                     ERRCODE_INVALID_PARAMETER_VALUE);
            raise_argument_error(kTimeFormat, shown_text(format_text), error.what(),
                                 ERRCODE_INVALID_PARAMETER_VALUE);
        }
        format.assign(format_text);
        zoned = with_zone;
        zone.assign(zone_text);
        return *reader;
    }
};

TimeReaderCache* reader_cache(FunctionCallInfo fcinfo) {
    if (!fcinfo->flinfo->fn_extra) {
        fcinfo->flinfo->fn_extra = new_in_context<TimeReaderCache>(fcinfo->flinfo->fn_mcxt);
        if (!fcinfo->flinfo->fn_extra) report_failure();
    }
    return static_cast<TimeReaderCache*>(fcinfo->flinfo->fn_extra);
}

// text is the text argument's bytes, or nothing when it is a number (serial).
Datum to_time(FunctionCallInfo fcinfo, bool numeric) {
    std::string_view text = numeric ? std::string_view() : text_argument(fcinfo, 0);
    double serial = numeric ? PG_GETARG_FLOAT8(0) : 0.0;
    std::string_view format = text_argument(fcinfo, 1);
    bool zoned = PG_NARGS() > 2;
    std::string_view zone = zoned ? text_argument(fcinfo, 2) : std::string_view();
    TimeReaderCache* cache = reader_cache(fcinfo);
    bool ok = guarded([&] {
        const TimeReader& reader = cache->get(format, zoned, zone);
        std::string shown = numeric ? shown_number(serial) : shown_text(text);
        try {
            if (reader.reads_serials()) {
                if (!numeric) {
                    auto parsed = numeric_text(text);
                    if (!parsed)
                        raise_argument_error(kTimeText, shown,
                                             "expected a serial day number such as 46086.6, "
                                             "because the format is excel",
                                             ERRCODE_INVALID_DATETIME_FORMAT);
                    serial = *parsed;
                }
                result_text() = reader.read_serial(serial);
            } else {
                if (numeric)
                    raise_argument_error(kTimeText, shown,
                                         "expected TEXT (a REAL is read only with the format "
                                         "excel)",
                                         ERRCODE_INVALID_DATETIME_FORMAT);
                result_text() = reader.read_text(text);
            }
        } catch (const Error& error) {
            std::string what = error.what();
            raise_argument_error(kTimeText, shown, what, time_error_state(what));
        }
    });
    if (!ok) report_failure();
    PG_RETURN_TEXT_P(cstring_to_text_with_len(result_text().data(), int(result_text().size())));
}

}  // namespace
}  // namespace almanac::postgres

namespace pg = almanac::postgres;
using pg::Direction;

ALMANAC_PG_FUNCTION(almanac_exact_sum_real_step) {
    return pg::sum_real_row(fcinfo, Direction::Add);
}
ALMANAC_PG_FUNCTION(almanac_exact_sum_real_inverse) {
    return pg::sum_real_row(fcinfo, Direction::Remove);
}
#define ALMANAC_EXACT_SUM_INTEGER(type)                              \
    ALMANAC_PG_FUNCTION(almanac_exact_sum_##type##_step) {           \
        return pg::sum_integer_row<type>(fcinfo, Direction::Add);    \
    }                                                                \
    ALMANAC_PG_FUNCTION(almanac_exact_sum_##type##_inverse) {        \
        return pg::sum_integer_row<type>(fcinfo, Direction::Remove); \
    }
ALMANAC_EXACT_SUM_INTEGER(int16)
ALMANAC_EXACT_SUM_INTEGER(int32)
ALMANAC_EXACT_SUM_INTEGER(int64)
ALMANAC_PG_FUNCTION(almanac_exact_sum_real_final) { return pg::sum_real_final(fcinfo); }
ALMANAC_PG_FUNCTION(almanac_exact_sum_integer_final) { return pg::sum_integer_final(fcinfo); }
ALMANAC_PG_FUNCTION(almanac_exact_sum_combine) {
    return pg::combine_states<almanac::ExactTotal>(fcinfo, pg::kSum);
}
ALMANAC_PG_FUNCTION(almanac_exact_sum_serialize) {
    return pg::serialize_state<almanac::ExactTotal>(fcinfo);
}
ALMANAC_PG_FUNCTION(almanac_exact_sum_deserialize) {
    return pg::deserialize_state<almanac::ExactTotal>(fcinfo, pg::kSum);
}
ALMANAC_PG_FUNCTION(almanac_to_amount) { return pg::to_amount(fcinfo); }
ALMANAC_PG_FUNCTION(almanac_to_time) { return pg::to_time(fcinfo, false); }
ALMANAC_PG_FUNCTION(almanac_to_time_serial) { return pg::to_time(fcinfo, true); }
