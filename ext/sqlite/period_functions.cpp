// SPDX-License-Identifier: MIT
// Calendar period functions.
//
//  1. period_floor(t, spec [, zone]), period_end(t, spec [, zone]):
//     the start (inclusive) and end (exclusive) of the period of `spec`
//     holding t, in t's representation: TEXT in, TEXT out (a bare date for
//     day and longer units, a date-time for shorter ones, local with ±HH:MM
//     when a zone is given); Unix seconds in, Unix seconds out (INTEGER for
//     INTEGER input); a Julian day in, a REAL Julian day out.
//  2. period_label(t, spec [, zone]): TEXT label of that period.
//  3. period_serial(t, spec [, zone]): INTEGER; 0 for the period holding
//     1970-01-01 00:00 on the (zone's) clock, neighbours differ by 1.
//  4. period_shift(t, n, spec [, zone]): t moved by n whole periods, in t's
//     own representation and TEXT form; n is a whole number.
//  5. period_of_serial(serial, spec [, zone]): the inverse of period_serial,
//     TEXT start of the period with that serial: a bare (local) date for day
//     and longer units, a date-time for shorter ones, local with ±HH:MM when a
//     zone is given. serial is a whole number whose period starts in years
//     0000-9999; NULL gives NULL.
//  6. valid_time(t): 1 when t is a time value every function accepts, else 0;
//     NULL for NULL; never raises.
//  7. almanac_version(): TEXT.
//  8. almanac_tz_version(): TEXT, the tz release in use and where its data
//     came from: "2025b (/usr/share/zoneinfo)" or "2025b (built in)".
//  Any NULL argument gives NULL. A time that is not a time value, a spec that
//  does not parse, an unknown zone, or a result outside years 0000-9999 is an
//  error naming the function, the argument and the value. The forms without a
//  zone are deterministic; the zoned forms are not (a tz database update can
//  change their results).
#include "almanac_version.h"
#include "arguments.h"
#include "core/text/error.h"
#include "core/time/common_form.h"
#include "core/time/zone_database.h"
#include "period_context.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

enum class Question { Floor, End, Label, Serial };

struct PeriodFunction {
    const char* name;
    Question question;
};

const PeriodFunction kFloor{"period_floor", Question::Floor};
const PeriodFunction kEnd{"period_end", Question::End};
const PeriodFunction kLabel{"period_label", Question::Label};
const PeriodFunction kSerial{"period_serial", Question::Serial};

template <typename Body>
void run(sqlite3_context* context, const char* function, Body&& body) noexcept {
    guarded(context, [&] {
        try {
            body();
        } catch (const Error& error) {
            raise_function_error(function, error.what());
        }
    });
}

// period_floor and period_serial of a TEXT time in a common form on a
// calendar of UTC midnights, by day numbers alone (README "Performance"):
// the key of almost every report. True when it answered; false leaves
// everything, errors included, to the general path.
bool answered_by_day_number(sqlite3_context* context, const PeriodFunction& function, int argc,
                            sqlite3_value** argv, const ArgumentRef& spec_arg) {
    // A zone argument means a zoned clock: no UTC midnights to use.
    if (argc != 2) return false;
    if (function.question != Question::Floor && function.question != Question::Serial) return false;
    if (sqlite3_value_type(argv[0]) != SQLITE_TEXT) return false;
    const char* text = reinterpret_cast<const char*>(sqlite3_value_text(argv[0]));
    auto day = common_form_day(
        std::string_view(text ? text : "", static_cast<std::size_t>(sqlite3_value_bytes(argv[0]))));
    // The time is valid here, so the calendar's errors come next, as on the general path.
    if (!day) return false;
    const PeriodCalendar* calendar = cached_calendar(context, 1, spec_arg, argv, 2, nullptr);
    if (!calendar) {
        sqlite3_result_null(context);
        return true;
    }
    if (function.question == Question::Serial) {
        auto serial = calendar->utc_period_serial_of_day(*day);
        if (serial) sqlite3_result_int64(context, *serial);
        return serial.has_value();
    }
    auto start = calendar->utc_period_start_day(*day);
    if (!start) return false;
    char written[10];
    sqlite3_result_text(context, written, static_cast<int>(write_date(written, *start) - written),
                        SQLITE_TRANSIENT);
    return true;
}

// period_floor / period_end / period_label / period_serial share one shape.
void answer_period_question(sqlite3_context* context, int argc, sqlite3_value** argv) {
    const auto* function = static_cast<const PeriodFunction*>(sqlite3_user_data(context));
    run(context, function->name, [&] {
        ArgumentRef t_arg{function->name, 1, "t"};
        ArgumentRef spec_arg{function->name, 2, "spec"};
        ArgumentRef zone_arg{function->name, 3, "zone"};
        if (answered_by_day_number(context, *function, argc, argv, spec_arg)) return;
        // NULL in, NULL out, before the other arguments are looked at (as
        // SQLite's own date(NULL, 'anything') is NULL).
        auto t = read_time(t_arg, argv[0]);
        if (!t) return sqlite3_result_null(context);
        const PeriodCalendar* calendar =
            cached_calendar(context, 1, spec_arg, argv, 2, argc == 3 ? &zone_arg : nullptr);
        if (!calendar) return sqlite3_result_null(context);
        Instant instant = calendar->place_on_time_line(*t);
        switch (function->question) {
            case Question::Floor:
                return result_boundary(context, *t, calendar->floor(instant), *calendar);
            case Question::End:
                return result_boundary(context, *t, calendar->period_of(instant).end, *calendar);
            case Question::Label: {
                std::string label = calendar->label(calendar->period_of(instant));
                return sqlite3_result_text(context, label.c_str(), static_cast<int>(label.size()),
                                           SQLITE_TRANSIENT);
            }
            case Question::Serial:
                return sqlite3_result_int64(context, calendar->period_of(instant).serial);
        }
    });
}

void period_shift(sqlite3_context* context, int argc, sqlite3_value** argv) {
    const char* name = "period_shift";
    run(context, name, [&] {
        ArgumentRef t_arg{name, 1, "t"};
        ArgumentRef n_arg{name, 2, "n"};
        ArgumentRef spec_arg{name, 3, "spec"};
        ArgumentRef zone_arg{name, 4, "zone"};
        auto t = read_time(t_arg, argv[0]);
        if (!t) return sqlite3_result_null(context);
        auto n = read_integer(n_arg, argv[1], -100000000LL, 100000000LL);
        if (!n) return sqlite3_result_null(context);
        const PeriodCalendar* calendar =
            cached_calendar(context, 2, spec_arg, argv, 3, argc == 4 ? &zone_arg : nullptr);
        if (!calendar) return sqlite3_result_null(context);
        if (t->is_calendar_day()) {
            if (calendar->spec().is_sub_day()) {
                raise_argument_error(t_arg, argv[0],
                                     "a bare date cannot move by sub-day periods; give a date-time "
                                     "such as 'YYYY-MM-DD 00:00'");
            }
            std::string text = format_date(calendar->shift_day(t->day(), *n));
            return sqlite3_result_text(context, text.c_str(), static_cast<int>(text.size()),
                                       SQLITE_TRANSIENT);
        }
        Instant moved = calendar->shift(t->instant(), *n);
        if (!in_supported_range(moved))
            throw Error("the result falls outside years 0000 through 9999");
        switch (t->representation) {
            case Representation::Text: {
                std::string text = calendar->format_like(t->form, moved);
                return sqlite3_result_text(context, text.c_str(), static_cast<int>(text.size()),
                                           SQLITE_TRANSIENT);
            }
            default:
                return result_boundary(context, *t, moved, *calendar);
        }
    });
}

void period_of_serial(sqlite3_context* context, int argc, sqlite3_value** argv) {
    const char* name = "period_of_serial";
    run(context, name, [&] {
        ArgumentRef serial_arg{name, 1, "serial"};
        ArgumentRef spec_arg{name, 2, "spec"};
        ArgumentRef zone_arg{name, 3, "zone"};
        if (sqlite3_value_type(argv[0]) == SQLITE_NULL) return sqlite3_result_null(context);
        const PeriodCalendar* calendar =
            cached_calendar(context, 1, spec_arg, argv, 2, argc == 3 ? &zone_arg : nullptr);
        if (!calendar) return sqlite3_result_null(context);
        auto [lowest, highest] = calendar->supported_serials();
        auto serial = read_integer(serial_arg, argv[0], lowest, highest);
        std::string text = calendar->format_boundary(calendar->period_by_serial(*serial).start);
        sqlite3_result_text(context, text.c_str(), static_cast<int>(text.size()), SQLITE_TRANSIENT);
    });
}

void almanac_version(sqlite3_context* context, int, sqlite3_value**) {
    sqlite3_result_text(context, ALMANAC_VERSION, -1, SQLITE_STATIC);
}

void almanac_tz_version(sqlite3_context* context, int, sqlite3_value**) {
    guarded(context, [&] {
        std::string text = zone_data_description();
        sqlite3_result_text(context, text.c_str(), static_cast<int>(text.size()), SQLITE_TRANSIENT);
    });
}

void valid_time(sqlite3_context* context, int, sqlite3_value** argv) {
    if (sqlite3_value_type(argv[0]) == SQLITE_NULL) return sqlite3_result_null(context);
    // Never raises for bad input, but running out of memory while reading it
    // must still reach SQLite as SQLITE_NOMEM, not as an exception.
    guarded(context, [&] { sqlite3_result_int(context, is_valid_time(argv[0]) ? 1 : 0); });
}

}  // namespace

int register_period_functions(sqlite3* db) {
    constexpr int kPure = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    // A zone's rules come from the tz database, which can change under us.
    constexpr int kZoned = SQLITE_UTF8 | SQLITE_INNOCUOUS;
    int rc = SQLITE_OK;
    auto add = [&](const char* name, int arity, int flags, const void* data,
                   void (*function)(sqlite3_context*, int, sqlite3_value**)) {
        if (rc == SQLITE_OK) {
            rc = sqlite3_create_function(db, name, arity, flags, const_cast<void*>(data), function,
                                         nullptr, nullptr);
        }
    };
    for (const PeriodFunction* function : {&kFloor, &kEnd, &kLabel, &kSerial}) {
        add(function->name, 2, kPure, function, answer_period_question);
        add(function->name, 3, kZoned, function, answer_period_question);
    }
    add("period_shift", 3, kPure, nullptr, period_shift);
    add("period_shift", 4, kZoned, nullptr, period_shift);
    add("period_of_serial", 2, kPure, nullptr, period_of_serial);
    add("period_of_serial", 3, kZoned, nullptr, period_of_serial);
    add("valid_time", 1, kPure, nullptr, valid_time);
    add("almanac_version", 0, kPure, nullptr, almanac_version);
    add("almanac_tz_version", 0, kZoned, nullptr, almanac_tz_version);
    return rc;
}

}  // namespace almanac::sqlite
