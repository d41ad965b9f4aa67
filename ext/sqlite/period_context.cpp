#include "period_context.h"

#include "../core/error.h"

namespace almanac::sqlite {

PeriodCalendar make_calendar(const ArgumentRef& spec_arg, sqlite3_value* spec,
                             const ArgumentRef* zone_arg, sqlite3_value* zone) {
    auto spec_text = read_text(spec_arg, spec);
    PeriodSpec parsed;
    try {
        parsed = parse_period_spec(*spec_text);
    } catch (const Error& error) {
        raise_argument_error(spec_arg, spec, error.what());
    }
    ZoneClock clock = ZoneClock::utc();
    if (zone_arg) {
        auto zone_text = read_text(*zone_arg, zone);
        try {
            clock = ZoneClock::named(*zone_text);
        } catch (const Error& error) {
            raise_argument_error(*zone_arg, zone, error.what());
        }
    }
    try {
        return PeriodCalendar(parsed, clock);
    } catch (const Error& error) {
        raise_argument_error(spec_arg, spec, error.what());
    }
}

namespace {
struct CachedCalendar {
    std::string spec;
    std::string zone;
    PeriodCalendar calendar;
};

void delete_cached(void* pointer) { delete static_cast<CachedCalendar*>(pointer); }

std::string text_of(sqlite3_value* value) {
    const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
    return std::string(text ? text : "", sqlite3_value_bytes(value));
}
}  // namespace

const PeriodCalendar* cached_calendar(sqlite3_context* context, int spec_index,
                                      const ArgumentRef& spec_arg, sqlite3_value** argv,
                                      int zone_index, const ArgumentRef* zone_arg) {
    sqlite3_value* spec = argv[spec_index];
    sqlite3_value* zone = zone_arg ? argv[zone_index] : nullptr;
    if (sqlite3_value_type(spec) == SQLITE_NULL) return nullptr;
    if (zone && sqlite3_value_type(zone) == SQLITE_NULL) return nullptr;
    // A non-constant spec loses its auxdata after each row; the texts are
    // compared so a cached calendar is never used for another spec.
    bool texts = sqlite3_value_type(spec) == SQLITE_TEXT &&
                 (!zone || sqlite3_value_type(zone) == SQLITE_TEXT);
    if (texts) {
        auto* cached = static_cast<CachedCalendar*>(sqlite3_get_auxdata(context, spec_index));
        if (cached && cached->spec == text_of(spec) && cached->zone == (zone ? text_of(zone) : "")) {
            return &cached->calendar;
        }
    }
    auto* fresh = new CachedCalendar{texts ? text_of(spec) : "", zone && texts ? text_of(zone) : "",
                                     make_calendar(spec_arg, spec, zone_arg, zone)};
    // SQLite owns the object from here on, and may free it at once.
    sqlite3_set_auxdata(context, spec_index, fresh, delete_cached);
    auto* kept = static_cast<CachedCalendar*>(sqlite3_get_auxdata(context, spec_index));
    if (kept == fresh) return &kept->calendar;
    // SQLite freed it immediately (no memory to keep it): build one for this row.
    thread_local std::optional<PeriodCalendar> scratch;
    scratch.emplace(make_calendar(spec_arg, spec, zone_arg, zone));
    return &*scratch;
}

Instant place_on_time_line(const TimeValue& value, const PeriodCalendar& calendar) {
    return value.is_calendar_day ? calendar.start_of_day(value.day) : value.instant;
}

void result_boundary(sqlite3_context* context, const TimeValue& like, Instant t,
                     const PeriodCalendar& calendar) {
    switch (like.representation) {
        case Representation::Text: {
            std::string text = calendar.format_boundary(t);
            sqlite3_result_text(context, text.c_str(), static_cast<int>(text.size()), SQLITE_TRANSIENT);
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
