// SPDX-License-Identifier: MIT
#include "period_context.h"

#include <new>

#include "core/text/error.h"

namespace almanac::sqlite {

PeriodSpec read_spec(const ArgumentRef& arg, sqlite3_value* value) {
    auto text = read_text(arg, value);
    try {
        return parse_period_spec(*text);
    } catch (const Error& error) {
        raise_argument_error(arg, value, error.what());
    }
}

ZoneClock read_zone(const ArgumentRef& arg, sqlite3_value* value) {
    auto text = read_text(arg, value);
    try {
        return ZoneClock::named(*text);
    } catch (const Error& error) {
        raise_argument_error(arg, value, error.what());
    }
}

SpecInCycle read_spec_in_cycle(const ArgumentRef& spec_arg, sqlite3_value* spec,
                               const ArgumentRef& cycle_arg, sqlite3_value* cycle,
                               const ArgumentRef* zone_arg, sqlite3_value* zone) {
    const PeriodSpec parsed_spec = read_spec(spec_arg, spec);
    try {
        check_position_spec(parsed_spec);
    } catch (const Error& error) {
        raise_argument_error(spec_arg, spec, error.what());
    }
    const PeriodSpec parsed_cycle = read_spec(cycle_arg, cycle);
    const ZoneClock clock = zone_arg ? read_zone(*zone_arg, zone) : ZoneClock::utc();
    try {
        return SpecInCycle{parsed_spec, parsed_cycle,
                           PeriodPosition(parsed_spec, parsed_cycle, clock)};
    } catch (const Error& error) {
        raise_argument_error(cycle_arg, cycle, error.what());
    }
}

PeriodCalendar make_calendar(const ArgumentRef& spec_arg, sqlite3_value* spec,
                             const ArgumentRef* zone_arg, sqlite3_value* zone) {
    const PeriodSpec parsed = read_spec(spec_arg, spec);
    const ZoneClock clock = zone_arg ? read_zone(*zone_arg, zone) : ZoneClock::utc();
    try {
        return PeriodCalendar(parsed, clock);
    } catch (const Error& error) {
        raise_argument_error(spec_arg, spec, error.what());
    }
}

namespace {
void delete_calendar(void* pointer) { delete static_cast<PeriodCalendar*>(pointer); }
}  // namespace

const PeriodCalendar* cached_calendar(sqlite3_context* context, int spec_index,
                                      const ArgumentRef& spec_arg, sqlite3_value** argv,
                                      int zone_index, const ArgumentRef* zone_arg) {
    sqlite3_value* spec = argv[spec_index];
    sqlite3_value* zone = zone_arg ? argv[zone_index] : nullptr;
    // SQLite keeps auxdata only on constant arguments and drops it after each
    // call otherwise, so a calendar found here was built from these very
    // values (never NULL ones: the NULL checks can wait). With a zone, the
    // calendar hangs on the spec and is marked on the zone: both must still
    // be there for it to be used.
    auto* cached = static_cast<PeriodCalendar*>(sqlite3_get_auxdata(context, spec_index));
    if (cached && (!zone || sqlite3_get_auxdata(context, zone_index) == cached)) return cached;
    if (sqlite3_value_type(spec) == SQLITE_NULL) return nullptr;
    if (zone && sqlite3_value_type(zone) == SQLITE_NULL) return nullptr;
    auto* fresh = new PeriodCalendar(make_calendar(spec_arg, spec, zone_arg, zone));
    // SQLite owns the object from here on, and frees it at once if it cannot keep it.
    sqlite3_set_auxdata(context, spec_index, fresh, delete_calendar);
    auto* kept = static_cast<PeriodCalendar*>(sqlite3_get_auxdata(context, spec_index));
    if (kept == fresh) {
        if (zone) sqlite3_set_auxdata(context, zone_index, fresh, nullptr);
        return kept;
    }
    // Within the call that set it, SQLite hands auxdata back whatever the
    // argument; it has not kept it only when it ran out of memory.
    throw std::bad_alloc();
}

void result_boundary(sqlite3_context* context, const TimeValue& like, Instant t,
                     const PeriodCalendar& calendar) {
    if (!in_supported_range(t)) throw Error("the result falls outside years 0000 through 9999");
    switch (like.representation) {
        case Representation::Text: {
            char text[PeriodCalendar::kBoundaryTextSize];
            char* end = calendar.write_boundary(t, text);
            sqlite3_result_text(context, text, static_cast<int>(end - text), SQLITE_TRANSIENT);
            return;
        }
        case Representation::UnixSeconds:
            if (like.integer_input) {
                sqlite3_result_int64(context, to_unix_seconds_integer(t));
            } else {
                sqlite3_result_double(context, to_unix_seconds_real(t));
            }
            return;
        case Representation::JulianDay:
            sqlite3_result_double(context, to_julian_day(t));
            return;
    }
}

}  // namespace almanac::sqlite
