// SPDX-License-Identifier: MIT
// A hand-written parser: it runs once per row, so no streams and no regex.
#include "core/time/time_value.h"

#include <cmath>
#include <cstring>
#include <initializer_list>

#include "core/text/ascii.h"
#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/time/civil_days.h"
#include "core/time/common_form.h"
#include "core/time/second_fraction.h"

namespace almanac {
namespace {

using namespace std::chrono;

constexpr const char* kExpectedForms =
    "expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, "
    "or a number (a Julian day below 5373484.5, Unix seconds otherwise)";

// Julian day number of the Unix epoch, in milliseconds, as SQLite keeps it.
constexpr std::int64_t kUnixEpochJulianMillis = 210866760000000LL;
constexpr double kLargestJulianDay = 5373484.5;

// Reads exactly n digits at text[pos], advancing pos.
bool read_digits(std::string_view text, std::size_t& pos, int n, int& out) {
    if (pos + n > text.size()) return false;
    int value = 0;
    for (int i = 0; i < n; ++i) {
        char c = text[pos + i];
        if (!is_ascii_digit(c)) return false;
        value = value * 10 + (c - '0');
    }
    pos += n;
    out = value;
    return true;
}

inline std::string_view trim(std::string_view text) {
    // Spaces are all at or below ' '; most texts start and end with neither.
    auto above_space = [](char c) { return static_cast<unsigned char>(c) > ' '; };
    if (text.empty() || (above_space(text.front()) && above_space(text.back()))) return text;
    return trim_ascii_space(text);
}

[[noreturn]] void fail(const std::string& reason) { throw Error(reason); }

std::string two_digits(int v) { return padded(static_cast<unsigned>(v), 2); }

Instant from_unix_millis(std::int64_t ms) { return Instant{Millis{ms}}; }

// A Julian day before year 0000 is almost never meant as one. An unquoted date
// in the sqlite3 shell is arithmetic (2025-12-01 is 2012), and a spreadsheet
// serial day of our era lies between 20,000 (1954) and 80,000 (2119).
std::string misread_number_hint(double julian_day) {
    if (julian_day >= 20000 && julian_day <= 80000)
        return "; for a spreadsheet serial use to_time(x, 'excel')";
    return "; if this was a date, quote it: '2025-12-01'";
}

std::string no_hint() { return {}; }

// `described` and `hint` are only turned into a message on failure: this runs per row.
template <typename Describe, typename Hint = std::string (*)()>
void check_range(Instant t, Describe&& described, Hint&& hint = no_hint) {
    if (t < earliest_supported_instant())
        fail(described() + " is before year 0000; years 0000 through 9999 are supported" + hint());
    if (t >= latest_supported_instant())
        fail(described() + " is after year 9999; years 0000 through 9999 are supported");
}

}  // namespace

// 0000-01-01 and 10000-01-01 are days -719528 and 2932897 of the Unix epoch.
constexpr std::int64_t kEarliestMillis = -719528LL * 86400000LL;
constexpr std::int64_t kLatestMillis = 2932897LL * 86400000LL;
static_assert(date::sys_days{date::year{0} / 1 / 1}.time_since_epoch().count() == -719528);
static_assert(date::sys_days{date::year{10000} / 1 / 1}.time_since_epoch().count() == 2932897);

Instant earliest_supported_instant() { return Instant{Millis{kEarliestMillis}}; }
Instant latest_supported_instant() { return Instant{Millis{kLatestMillis}}; }
bool in_supported_range(Instant t) {
    return t >= earliest_supported_instant() && t < latest_supported_instant();
}
bool in_supported_range(LocalTime t) { return in_supported_range(Instant{t.time_since_epoch()}); }

TimeValue parse_time_text(std::string_view text) {
    CommonForm form;
    if (!read_common_form(text, form)) return parse_time_text_in_full(text);
    TimeValue value;
    value.form.precision = form.precision;
    value.form.t_separator = form.t_separator;
    if (form.precision == TextForm::Precision::Date) {
        value.when = date::local_days{date::days{form.day}};
    } else {
        // Years 0000-9999 with no offset always lie in the supported range.
        value.when = Instant{Millis{form.day * 86400000 + form.millis_of_day}};
    }
    return value;
}

namespace {

constexpr const char* kExpectedOffset = "expected a zone offset as Z, +HH:MM or -HH:MM at the end";

// The date at fixed places, YYYY-MM-DD, checked against the calendar.
date::local_days read_date_part(std::string_view text) {
    auto digit = [&](std::size_t i) { return unsigned(text[i]) - '0'; };
    if (text.size() < 10 || text[4] != '-' || text[7] != '-') fail(kExpectedForms);
    for (std::size_t i : {0, 1, 2, 3, 5, 6, 8, 9})
        if (!is_ascii_digit(text[i])) fail(kExpectedForms);
    int y = int(digit(0) * 1000 + digit(1) * 100 + digit(2) * 10 + digit(3));
    unsigned mo = digit(5) * 10 + digit(6);
    unsigned d = digit(8) * 10 + digit(9);
    if (mo < 1 || mo > 12)
        fail("month " + two_digits(int(mo)) + " does not exist; " + kExpectedForms);
    if (d < 1 || d > days_in_month(y, mo))
        fail("no such date: " + std::to_string(y) + "-" + two_digits(int(mo)) + " has " +
             std::to_string(days_in_month(y, mo)) + " days");
    return date::local_days{date::days{day_number_from_civil(y, mo, d)}};
}

// HH:MM[:SS[.fff...]] at pos, advancing it; the precision goes into form.
Millis read_time_of_day(std::string_view text, std::size_t& pos, TextForm& form) {
    auto digit = [&](std::size_t i) { return int(unsigned(text[i]) - '0'); };
    auto digits_at = [&](std::initializer_list<std::size_t> places) {
        for (std::size_t i : places)
            if (!is_ascii_digit(text[i])) return false;
        return true;
    };
    if (text.size() < pos + 5 || text[pos + 2] != ':' ||
        !digits_at({pos, pos + 1, pos + 3, pos + 4})) {
        fail(kExpectedForms);
    }
    int h = digit(pos) * 10 + digit(pos + 1);
    int mi = digit(pos + 3) * 10 + digit(pos + 4);
    int s = 0;
    pos += 5;
    form.precision = TextForm::Precision::Minutes;
    std::int64_t fraction_millis = 0;
    if (pos < text.size() && text[pos] == ':') {
        ++pos;
        if (text.size() < pos + 2 || !digits_at({pos, pos + 1})) fail(kExpectedForms);
        s = digit(pos) * 10 + digit(pos + 1);
        pos += 2;
        form.precision = TextForm::Precision::Seconds;
        if (pos < text.size() && text[pos] == '.') {
            ++pos;
            auto fraction = read_second_fraction(text.substr(pos));
            if (!fraction) fail(kExpectedForms);
            pos += fraction->digits;
            fraction_millis = fraction->millis;
            form.precision = TextForm::Precision::Fraction;
        }
    }
    if (h > 23) fail("hour " + two_digits(h) + " does not exist; hours run 00 to 23");
    if (mi > 59) fail("minute " + two_digits(mi) + " does not exist; minutes run 00 to 59");
    if (s > 59) fail("second " + two_digits(s) + " does not exist; seconds run 00 to 59");
    return hours{h} + minutes{mi} + seconds{s} + Millis{fraction_millis};
}

// What follows the time of day: nothing, Z, or ±HH:MM[:SS] to the end.
void read_offset_suffix(std::string_view text, std::size_t pos, TextForm& form) {
    if (pos == text.size()) return;
    char c = text[pos];
    if ((c == 'Z' || c == 'z') && pos + 1 == text.size()) {
        form.suffix = TextForm::Suffix::Z;
        return;
    }
    if (c != '+' && c != '-') fail(kExpectedForms);
    ++pos;
    int oh, om, os = 0;
    if (!read_digits(text, pos, 2, oh) || pos >= text.size() || text[pos++] != ':' ||
        !read_digits(text, pos, 2, om)) {
        fail(kExpectedOffset);
    }
    // ±HH:MM:SS is what almanac writes for historic local mean times.
    if (pos < text.size() && text[pos] == ':') {
        ++pos;
        if (!read_digits(text, pos, 2, os)) fail(kExpectedOffset);
    }
    if (pos != text.size()) fail(kExpectedOffset);
    if (oh > 14 || om > 59 || os > 59)
        fail("zone offset out of range; offsets run -14:00 to +14:00");
    form.suffix = TextForm::Suffix::Offset;
    form.offset = std::chrono::seconds{(c == '-' ? -1 : 1) * (oh * 3600 + om * 60 + os)};
}

}  // namespace

TimeValue parse_time_text_in_full(std::string_view raw) {
    std::string_view text = trim(raw);
    // A date never reads as a number; skip the number test for the common case.
    bool looks_like_date = text.size() >= 10 && text[4] == '-';
    if (auto number = looks_like_date ? std::nullopt : numeric_text(text)) {
        // An integer-looking text behaves as the INTEGER it spells.
        bool integral = text.find_first_of(".eE") == std::string_view::npos;
        if (integral && std::fabs(*number) < 9.2e18) {
            if (auto whole = parse_int64(text)) return parse_time_integer(*whole);
        }
        return parse_time_real(*number);
    }

    TimeValue value;
    value.representation = Representation::Text;
    date::local_days day = read_date_part(text);
    std::size_t pos = 10;
    if (pos == text.size()) {
        value.when = day;
        value.form.precision = TextForm::Precision::Date;
        return value;
    }

    // Time of day, after a T or spaces.
    if (text[pos] == 'T' || text[pos] == 't') {
        value.form.t_separator = true;
        ++pos;
    } else if (is_ascii_space(text[pos])) {
        while (pos < text.size() && is_ascii_space(text[pos])) ++pos;
    } else {
        fail(kExpectedForms);
    }
    Millis time_of_day = read_time_of_day(text, pos, value.form);
    while (pos < text.size() && is_ascii_space(text[pos])) ++pos;
    read_offset_suffix(text, pos, value.form);
    Instant instant =
        instant_at_offset(LocalTime{day.time_since_epoch()} + time_of_day, value.form.offset);
    check_range(instant, [] { return std::string("the time"); });
    value.when = instant;
    return value;
}

TimeValue parse_time_real(double v) {
    if (!std::isfinite(v)) fail("expected a finite number");
    TimeValue value;
    Instant t;
    if (v >= 0 && v < kLargestJulianDay) {
        value.representation = Representation::JulianDay;
        // SQLite rounds a Julian day to the millisecond the same way.
        auto jd_millis = static_cast<std::int64_t>(v * 86400000.0 + 0.5);
        t = from_unix_millis(jd_millis - kUnixEpochJulianMillis);
        check_range(
            t, [v] { return "Julian day " + readable_double(v); },
            [v] { return misread_number_hint(v); });
    } else {
        value.representation = Representation::UnixSeconds;
        double ms = std::floor(v * 1000.0 + 0.5);
        if (ms >= 4e17 || ms <= -4e17) {
            fail("Unix seconds far past year 9999 (is it in milliseconds? divide by 1000)");
        }
        t = from_unix_millis(static_cast<std::int64_t>(ms));
        if (t >= latest_supported_instant())
            fail("Unix seconds past year 9999 (is it in milliseconds? divide by 1000)");
        check_range(t, [] { return std::string("the Unix time"); });
    }
    value.when = t;
    return value;
}

TimeValue parse_time_integer(std::int64_t v) {
    if (v >= 0 && v < 5373484) {
        TimeValue value = parse_time_real(static_cast<double>(v));
        return value;
    }
    TimeValue value;
    value.representation = Representation::UnixSeconds;
    value.integer_input = true;
    // 253402300800 is 10000-01-01 00:00:00 UTC.
    if (v >= 253402300800LL)
        fail("Unix seconds past year 9999 (is it in milliseconds? divide by 1000)");
    if (v < -62167219200LL) fail("Unix seconds before year 0000");
    value.when = from_unix_millis(v * 1000);
    return value;
}

Instant TimeValue::utc_instant() const {
    if (is_calendar_day()) return Instant{day().time_since_epoch()};
    return instant();
}

double to_julian_day(Instant t) {
    return static_cast<double>(t.time_since_epoch().count() + kUnixEpochJulianMillis) / 86400000.0;
}
double to_unix_seconds_real(Instant t) {
    return static_cast<double>(t.time_since_epoch().count()) / 1000.0;
}
std::int64_t to_unix_seconds_integer(Instant t) {
    return date::floor<seconds>(t).time_since_epoch().count();
}

std::string format_date(date::local_days day) {
    char buffer[10];
    return std::string(buffer, write_date(buffer, day));
}

std::string format_date_time(LocalTime t, TextForm::Precision precision, bool t_separator) {
    auto day = date::floor<date::days>(t);
    auto time_of_day = date::hh_mm_ss<Millis>{t - day};
    std::string text = format_date(day);
    if (precision == TextForm::Precision::Date) return text;
    char buffer[16];
    char* out = buffer;
    *out++ = t_separator ? 'T' : ' ';
    out = write_padded(out, unsigned(time_of_day.hours().count()), 2);
    *out++ = ':';
    out = write_padded(out, unsigned(time_of_day.minutes().count()), 2);
    if (precision != TextForm::Precision::Minutes) {
        *out++ = ':';
        out = write_padded(out, unsigned(time_of_day.seconds().count()), 2);
    }
    if (precision == TextForm::Precision::Fraction) {
        *out++ = '.';
        out = write_padded(out, unsigned(time_of_day.subseconds().count()), 3);
    }
    text.append(buffer, out);
    return text;
}

std::string format_offset(std::chrono::seconds offset) {
    auto total = offset.count();
    char buffer[12];
    char* out = buffer;
    *out++ = total < 0 ? '-' : '+';
    unsigned magnitude = static_cast<unsigned>(total < 0 ? -total : total);
    out = write_padded(out, magnitude / 3600, 2);
    *out++ = ':';
    out = write_padded(out, magnitude / 60 % 60, 2);
    // Offsets of whole minutes are the rule; historic local mean times have
    // seconds, which ±HH:MM cannot carry, so they are written ±HH:MM:SS.
    if (magnitude % 60 != 0) {
        *out++ = ':';
        out = write_padded(out, magnitude % 60, 2);
    }
    return std::string(buffer, out);
}

}  // namespace almanac
