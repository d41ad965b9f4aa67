// SPDX-License-Identifier: MIT
// Reading shop exports honestly.
//
// Contract:
//
//  1. exact_sum(x): an aggregate and a window function with a real inverse.
//     Rows with NULL x are skipped; NULL for no rows. The result is INTEGER
//     when every value is an integer (an INTEGER, or TEXT that SQLite reads as
//     a whole number) and the total fits in 64 bits; otherwise the REAL
//     nearest the exact sum (bit-identical to Python's math.fsum). TEXT that
//     SQLite does not read as a number ('1,050.00', which SQLite's own sum()
//     counts as 1), BLOBs and infinities raise
//     "exact_sum(): argument 1 (x) = <value>: ..." and the message tells the
//     user to read money written as text with to_amount() in a view.
//  2. to_amount(text [, decimal_mark]): REAL from money written as text
//     (core/text/amount_text.h: currency sign or code, grouping in threes or
//     lakhs, one decimal mark, a minus or parentheses). decimal_mark is '.'
//     (default) or ','. INTEGER and REAL pass through unchanged; NULL, and
//     TEXT that is empty or all spaces, give NULL; a NULL decimal_mark gives
//     NULL. Anything else raises "to_amount(): argument N (name) = ...".
//  3. to_time(text, format [, zone]): TEXT 'YYYY-MM-DD HH:MM:SS' (with
//     '.fff' when the milliseconds are not zero), or 'YYYY-MM-DD' when the
//     format has no time of day and no zone is given. format holds strptime
//     directives (core/time/time_format.h) or the word excel (spreadsheet
//     serial days; then text may also be an INTEGER or REAL). Without zone
//     the reading is returned as written, or as its UTC instant when the
//     format reads an offset (%z); with zone the reading is that zone's wall
//     clock and the result is the UTC instant, by the fold=0 rule
//     (core/time/local_reading.h). A format with %z takes no zone. The
//     format and zone are parsed once per statement (auxdata). NULL in any
//     argument gives NULL. The two-argument form is deterministic.
//
// All arithmetic lives in the core (exact_total.h, amount_text.h,
// time_format.h, local_reading.h); this file reads arguments and writes
// results.
#include <cmath>
#include <cstdint>
#include <new>
#include <optional>
#include <string>
#include <string_view>

#include "aggregate_state.h"
#include "arguments.h"
#include "core/exact/exact_total.h"
#include "core/text/amount_text.h"
#include "core/text/ascii.h"
#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/time/local_reading.h"
#include "core/time/time_format.h"
#include "core/time/time_value.h"
#include "core/time/zone_clock.h"
#include "registration.h"
#include "summand.h"

namespace almanac::sqlite {
namespace {

// ---- 1. exact_sum -----------------------------------------------------------

constexpr ArgumentRef kSumX{"exact_sum", 1, "x"};

// Adds (or removes) one row's x; NULL is skipped.
void sum_row(sqlite3_context* context, sqlite3_value* x, bool adding) {
    Summand summand = read_summand(x);
    switch (summand.kind) {
        case Summand::Kind::Null:
            return;
        case Summand::Kind::Integer: {
            auto& total = aggregate_state<ExactTotal>(context);
            adding ? total.add_integer(summand.integer) : total.remove_integer(summand.integer);
            return;
        }
        case Summand::Kind::Real: {
            auto& total = aggregate_state<ExactTotal>(context);
            adding ? total.add_real(summand.real) : total.remove_real(summand.real);
            return;
        }
        case Summand::Kind::Refused:
            raise_argument_error(kSumX, x, summand.expected);
    }
}

void sum_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] { sum_row(context, argv[0], true); });
}

void sum_inverse(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] { sum_row(context, argv[0], false); });
}

void sum_value(sqlite3_context* context) {
    guarded(context, [&] {
        auto* total = existing_state<ExactTotal>(context);
        auto value = total ? total->value() : std::nullopt;
        if (!value) return sqlite3_result_null(context);
        if (value->is_integer) return sqlite3_result_int64(context, value->integer);
        sqlite3_result_double(context, value->real);
    });
}

void sum_final(sqlite3_context* context) {
    sum_value(context);
    take_state<ExactTotal>(context);
}

// ---- 2. to_amount -----------------------------------------------------------

constexpr ArgumentRef kAmountText{"to_amount", 1, "text"};
constexpr ArgumentRef kAmountMark{"to_amount", 2, "decimal_mark"};

void to_amount(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        char mark = '.';
        if (argc == 2) {
            if (sqlite3_value_type(argv[1]) == SQLITE_NULL) return sqlite3_result_null(context);
            const char* written = reinterpret_cast<const char*>(sqlite3_value_text(argv[1]));
            if (sqlite3_value_type(argv[1]) != SQLITE_TEXT || sqlite3_value_bytes(argv[1]) != 1 ||
                (written[0] != '.' && written[0] != ','))
                raise_argument_error(kAmountMark, argv[1], "expected '.' or ','");
            mark = written[0];
        }
        sqlite3_value* text = argv[0];
        switch (sqlite3_value_type(text)) {
            case SQLITE_NULL:
            case SQLITE_INTEGER:
            case SQLITE_FLOAT:
                return sqlite3_result_value(context, text);
            case SQLITE_TEXT:
                break;
            default:
                raise_argument_error(kAmountText, text, "expected TEXT or a number, not a BLOB");
        }
        const char* raw = reinterpret_cast<const char*>(sqlite3_value_text(text));
        std::optional<double> amount;
        try {
            amount = read_amount(std::string_view(raw ? raw : "", sqlite3_value_bytes(text)), mark);
        } catch (const Error& error) {
            raise_argument_error(kAmountText, text, error.what());
        }
        result_optional_double(context, amount);
    });
}

// ---- 3. to_time -------------------------------------------------------------

constexpr ArgumentRef kTimeText{"to_time", 1, "text"};
constexpr ArgumentRef kTimeFormat{"to_time", 2, "format"};
constexpr ArgumentRef kTimeZone{"to_time", 3, "zone"};

// A statement's format and zone, parsed once.
struct TimeReader {
    TimeFormat format;
    std::optional<ZoneClock> zone;
};

TimeReader make_reader(sqlite3_value* format, sqlite3_value* zone) {
    TimeReader reader;
    auto format_text = read_text(kTimeFormat, format);
    try {
        reader.format = TimeFormat::parse(*format_text);
    } catch (const Error& error) {
        raise_argument_error(kTimeFormat, format, error.what());
    }
    if (zone) {
        auto zone_text = read_text(kTimeZone, zone);
        try {
            reader.zone = ZoneClock::named(*zone_text);
        } catch (const Error& error) {
            raise_argument_error(kTimeZone, zone, error.what());
        }
        if (reader.format.has_offset())
            raise_argument_error(kTimeZone, zone,
                                 "expected no zone, because the format reads an offset (%z) "
                                 "and each reading is already an instant");
    }
    return reader;
}

void delete_reader(void* pointer) { delete static_cast<TimeReader*>(pointer); }

// As the period functions cache their calendar: SQLite keeps auxdata only on
// constant arguments, so a reader found here was built from these values.
const TimeReader& cached_reader(sqlite3_context* context, sqlite3_value** argv, bool zoned) {
    auto* cached = static_cast<TimeReader*>(sqlite3_get_auxdata(context, 1));
    if (cached && (!zoned || sqlite3_get_auxdata(context, 2) == cached)) return *cached;
    auto* fresh = new TimeReader(make_reader(argv[1], zoned ? argv[2] : nullptr));
    sqlite3_set_auxdata(context, 1, fresh, delete_reader);
    auto* kept = static_cast<TimeReader*>(sqlite3_get_auxdata(context, 1));
    if (kept == fresh) {
        if (zoned) sqlite3_set_auxdata(context, 2, fresh, nullptr);
        return *kept;
    }
    // Within the call that set it, SQLite hands auxdata back whatever the
    // argument; it has not kept it only when it ran out of memory.
    throw std::bad_alloc();
}

// A serial day number from an INTEGER, a REAL, or TEXT that spells a number.
double read_serial(sqlite3_value* text) {
    switch (sqlite3_value_type(text)) {
        case SQLITE_INTEGER:
        case SQLITE_FLOAT:
            return sqlite3_value_double(text);
        case SQLITE_TEXT: {
            const char* raw = reinterpret_cast<const char*>(sqlite3_value_text(text));
            if (auto serial =
                    numeric_text({raw ? raw : "", std::size_t(sqlite3_value_bytes(text))}))
                return *serial;
            raise_argument_error(kTimeText, text,
                                 "expected a serial day number such as 46086.6, because the "
                                 "format is excel");
        }
        default:
            raise_argument_error(kTimeText, text, "expected a serial day number, not a BLOB");
    }
}

void result_reading(sqlite3_context* context, sqlite3_value* text, LocalTime t, bool with_time) {
    if (!in_supported_range(t))
        raise_argument_error(kTimeText, text, "the time falls outside years 0000 through 9999");
    std::string written;
    if (!with_time) {
        written = format_date(date::floor<date::days>(t));
    } else {
        bool whole_second = date::floor<std::chrono::seconds>(t) == t;
        written = format_date_time(
            t, whole_second ? TextForm::Precision::Seconds : TextForm::Precision::Fraction, false);
    }
    sqlite3_result_text(context, written.data(), int(written.size()), SQLITE_TRANSIENT);
}

void to_time(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        for (int i = 0; i < argc; ++i)
            if (sqlite3_value_type(argv[i]) == SQLITE_NULL) return sqlite3_result_null(context);
        bool zoned = argc == 3;
        const TimeReader& reader = cached_reader(context, argv, zoned);
        sqlite3_value* text = argv[0];
        TimeReading reading;
        try {
            if (reader.format.is_spreadsheet_serial()) {
                reading.local = read_spreadsheet_serial(read_serial(text));
            } else {
                int type = sqlite3_value_type(text);
                if (type == SQLITE_BLOB)
                    raise_argument_error(kTimeText, text, "expected TEXT, not a BLOB");
                if (type == SQLITE_FLOAT)
                    raise_argument_error(
                        kTimeText, text,
                        "expected TEXT (a REAL is read only with the format excel)");
                const char* raw = reinterpret_cast<const char*>(sqlite3_value_text(text));
                reading =
                    reader.format.read(std::string_view(raw ? raw : "", sqlite3_value_bytes(text)));
            }
        } catch (const Error& error) {
            raise_argument_error(kTimeText, text, error.what());
        }
        if (reading.has_offset || reader.zone) {
            Instant instant = reading.has_offset
                                  ? instant_at_offset(reading.local, reading.offset)
                                  : instant_of_local_reading(*reader.zone, reading.local);
            return result_reading(context, text, LocalTime{instant.time_since_epoch()}, true);
        }
        result_reading(context, text, reading.local, reader.format.has_time_of_day());
    });
}

}  // namespace

int register_export_functions(sqlite3* db) {
    constexpr int kPure = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    int rc = sqlite3_create_window_function(db, "exact_sum", 1, kPure, nullptr, sum_step, sum_final,
                                            sum_value, sum_inverse, nullptr);
    for (int args : {1, 2}) {
        if (rc == SQLITE_OK)
            rc = sqlite3_create_function(db, "to_amount", args, kPure, nullptr, to_amount, nullptr,
                                         nullptr);
    }
    if (rc == SQLITE_OK)
        rc = sqlite3_create_function(db, "to_time", 2, kPure, nullptr, to_time, nullptr, nullptr);
    // With a zone the result depends on the tz database, as SQLite's own
    // 'localtime' does, so that form is not deterministic.
    if (rc == SQLITE_OK)
        rc = sqlite3_create_function(db, "to_time", 3, SQLITE_UTF8 | SQLITE_INNOCUOUS, nullptr,
                                     to_time, nullptr, nullptr);
    return rc;
}

}  // namespace almanac::sqlite
