// A hand-written parser: it runs once per row, so no streams and no regex.
#include "time_value.h"

#include <cmath>
#include <cstdio>
#include <cstdlib>

#include "error.h"

namespace almanac {
namespace {

using namespace std::chrono;

constexpr const char* kExpectedForms =
    "expected YYYY-MM-DD, optionally followed by HH:MM[:SS[.fff]] and Z or +HH:MM, "
    "or a number (a Julian day below 5373484.5, Unix seconds otherwise)";

// Julian day number of the Unix epoch, in milliseconds, as SQLite keeps it.
constexpr std::int64_t kUnixEpochJulianMillis = 210866760000000LL;
constexpr double kLargestJulianDay = 5373484.5;

bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_space(char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || c == '\v'; }

// Reads exactly n digits at text[pos], advancing pos.
bool read_digits(std::string_view text, std::size_t& pos, int n, int& out) {
    if (pos + n > text.size()) return false;
    int value = 0;
    for (int i = 0; i < n; ++i) {
        char c = text[pos + i];
        if (!is_digit(c)) return false;
        value = value * 10 + (c - '0');
    }
    pos += n;
    out = value;
    return true;
}

std::string_view trim(std::string_view text) {
    while (!text.empty() && is_space(text.front())) text.remove_prefix(1);
    while (!text.empty() && is_space(text.back())) text.remove_suffix(1);
    return text;
}

[[noreturn]] void fail(const std::string& reason) { throw Error(reason); }

std::string two_digits(int v) {
    char buffer[8];
    std::snprintf(buffer, sizeof buffer, "%02d", v);
    return buffer;
}

Instant from_unix_millis(std::int64_t ms) { return Instant{Millis{ms}}; }

void check_range(Instant t, const std::string& described) {
    if (t < earliest_supported_instant())
        fail(described + " is before year 0000; years 0000 through 9999 are supported");
    if (t >= latest_supported_instant())
        fail(described + " is after year 9999; years 0000 through 9999 are supported");
}

}  // namespace

Instant earliest_supported_instant() {
    return Instant{date::sys_days{date::year{0} / 1 / 1}.time_since_epoch()};
}
Instant latest_supported_instant() {
    return Instant{date::sys_days{date::year{10000} / 1 / 1}.time_since_epoch()};
}
bool in_supported_range(Instant t) {
    return t >= earliest_supported_instant() && t < latest_supported_instant();
}
bool in_supported_range(LocalTime t) {
    return in_supported_range(Instant{t.time_since_epoch()});
}

std::optional<double> numeric_text(std::string_view text) {
    text = trim(text);
    if (text.empty()) return std::nullopt;
    // The shape SQLite itself treats as a number: sign, digits, point, exponent.
    std::size_t pos = 0;
    if (text[pos] == '+' || text[pos] == '-') ++pos;
    std::size_t mantissa_digits = 0;
    while (pos < text.size() && is_digit(text[pos])) ++pos, ++mantissa_digits;
    if (pos < text.size() && text[pos] == '.') {
        ++pos;
        while (pos < text.size() && is_digit(text[pos])) ++pos, ++mantissa_digits;
    }
    if (mantissa_digits == 0) return std::nullopt;
    if (pos < text.size() && (text[pos] == 'e' || text[pos] == 'E')) {
        ++pos;
        if (pos < text.size() && (text[pos] == '+' || text[pos] == '-')) ++pos;
        std::size_t exponent_digits = 0;
        while (pos < text.size() && is_digit(text[pos])) ++pos, ++exponent_digits;
        if (exponent_digits == 0) return std::nullopt;
    }
    if (pos != text.size()) return std::nullopt;
    std::string copy(text);
    return std::strtod(copy.c_str(), nullptr);
}

TimeValue parse_time_text(std::string_view raw) {
    std::string_view text = trim(raw);
    if (auto number = numeric_text(text)) {
        // An integer-looking text behaves as the INTEGER it spells.
        bool integral = text.find_first_of(".eE") == std::string_view::npos;
        if (integral && std::fabs(*number) < 9.2e18) {
            return parse_time_integer(std::strtoll(std::string(text).c_str(), nullptr, 10));
        }
        return parse_time_real(*number);
    }

    TimeValue value;
    value.representation = Representation::Text;
    std::size_t pos = 0;
    int y, mo, d;
    if (!read_digits(text, pos, 4, y) || pos >= text.size() || text[pos++] != '-' ||
        !read_digits(text, pos, 2, mo) || pos >= text.size() || text[pos++] != '-' ||
        !read_digits(text, pos, 2, d)) {
        fail(kExpectedForms);
    }
    if (mo < 1 || mo > 12) fail("month " + two_digits(mo) + " does not exist; " + kExpectedForms);
    date::year_month_day ymd{date::year{y}, date::month{unsigned(mo)}, date::day{unsigned(d)}};
    if (!ymd.ok()) {
        auto last = date::year_month_day_last{date::year{y}, date::month_day_last{date::month{unsigned(mo)}}};
        fail("no such date: " + std::to_string(y) + "-" + two_digits(mo) + " has " +
             std::to_string(unsigned(last.day())) + " days");
    }
    date::local_days day{ymd};
    if (pos == text.size()) {
        value.is_calendar_day = true;
        value.day = day;
        value.form.precision = TextForm::Precision::Date;
        return value;
    }

    // Time of day, after a T or spaces.
    if (text[pos] == 'T' || text[pos] == 't') {
        value.form.t_separator = true;
        ++pos;
    } else if (is_space(text[pos])) {
        while (pos < text.size() && is_space(text[pos])) ++pos;
    } else {
        fail(kExpectedForms);
    }
    int h, mi, s = 0;
    if (!read_digits(text, pos, 2, h) || pos >= text.size() || text[pos++] != ':' ||
        !read_digits(text, pos, 2, mi)) {
        fail(kExpectedForms);
    }
    value.form.precision = TextForm::Precision::Minutes;
    std::int64_t fraction_millis = 0;
    if (pos < text.size() && text[pos] == ':') {
        ++pos;
        if (!read_digits(text, pos, 2, s)) fail(kExpectedForms);
        value.form.precision = TextForm::Precision::Seconds;
        if (pos < text.size() && text[pos] == '.') {
            ++pos;
            std::size_t start = pos;
            double scale = 0.1, fraction = 0;
            while (pos < text.size() && is_digit(text[pos])) {
                fraction += (text[pos] - '0') * scale;
                scale /= 10;
                ++pos;
            }
            if (pos == start) fail(kExpectedForms);
            fraction_millis = static_cast<std::int64_t>(fraction * 1000.0 + 0.5);
            value.form.precision = TextForm::Precision::Fraction;
        }
    }
    if (h > 23) fail("hour " + two_digits(h) + " does not exist; hours run 00 to 23");
    if (mi > 59) fail("minute " + two_digits(mi) + " does not exist; minutes run 00 to 59");
    if (s > 59) fail("second " + two_digits(s) + " does not exist; seconds run 00 to 59");

    while (pos < text.size() && is_space(text[pos])) ++pos;
    std::chrono::seconds offset{0};
    if (pos < text.size()) {
        char c = text[pos];
        if ((c == 'Z' || c == 'z') && pos + 1 == text.size()) {
            value.form.suffix = TextForm::Suffix::Z;
        } else if (c == '+' || c == '-') {
            ++pos;
            int oh, om, os = 0;
            if (!read_digits(text, pos, 2, oh) || pos >= text.size() || text[pos++] != ':' ||
                !read_digits(text, pos, 2, om)) {
                fail("expected a zone offset as Z, +HH:MM or -HH:MM at the end");
            }
            // ±HH:MM:SS is what almanac writes for historic local mean times.
            if (pos < text.size() && text[pos] == ':') {
                ++pos;
                if (!read_digits(text, pos, 2, os)) fail("expected a zone offset as Z, +HH:MM or -HH:MM at the end");
            }
            if (pos != text.size()) fail("expected a zone offset as Z, +HH:MM or -HH:MM at the end");
            if (oh > 14 || om > 59 || os > 59) fail("zone offset out of range; offsets run -14:00 to +14:00");
            offset = std::chrono::seconds{(c == '-' ? -1 : 1) * (oh * 3600 + om * 60 + os)};
            value.form.suffix = TextForm::Suffix::Offset;
            value.form.offset = offset;
        } else {
            fail(kExpectedForms);
        }
    }
    auto local = LocalTime{day.time_since_epoch()} + hours{h} + minutes{mi} + seconds{s} +
                 Millis{fraction_millis};
    value.instant = Instant{local.time_since_epoch()} - offset;
    check_range(value.instant, "the time");
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
        check_range(t, "Julian day " + std::to_string(v));
    } else {
        value.representation = Representation::UnixSeconds;
        double ms = std::floor(v * 1000.0 + 0.5);
        if (ms >= 4e17 || ms <= -4e17) {
            fail("Unix seconds far past year 9999 (is it in milliseconds? divide by 1000)");
        }
        t = from_unix_millis(static_cast<std::int64_t>(ms));
        if (t >= latest_supported_instant())
            fail("Unix seconds past year 9999 (is it in milliseconds? divide by 1000)");
        check_range(t, "the Unix time");
    }
    value.instant = t;
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
    value.instant = from_unix_millis(v * 1000);
    return value;
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
    date::year_month_day ymd{day};
    char buffer[16];
    std::snprintf(buffer, sizeof buffer, "%04d-%02u-%02u", int(ymd.year()), unsigned(ymd.month()),
                  unsigned(ymd.day()));
    return buffer;
}

std::string format_date_time(LocalTime t, TextForm::Precision precision, bool t_separator) {
    auto day = date::floor<date::days>(t);
    auto time_of_day = date::hh_mm_ss<Millis>{t - day};
    std::string text = format_date(day);
    if (precision == TextForm::Precision::Date) return text;
    char buffer[24];
    std::snprintf(buffer, sizeof buffer, "%c%02d:%02d", t_separator ? 'T' : ' ',
                  int(time_of_day.hours().count()), int(time_of_day.minutes().count()));
    text += buffer;
    if (precision == TextForm::Precision::Minutes) return text;
    std::snprintf(buffer, sizeof buffer, ":%02d", int(time_of_day.seconds().count()));
    text += buffer;
    if (precision == TextForm::Precision::Fraction) {
        std::snprintf(buffer, sizeof buffer, ".%03d", int(time_of_day.subseconds().count()));
        text += buffer;
    }
    return text;
}

std::string format_offset(std::chrono::seconds offset) {
    auto total = offset.count();
    char sign = total < 0 ? '-' : '+';
    if (total < 0) total = -total;
    // Offsets of whole minutes are the rule; historic local mean times have
    // seconds, which ±HH:MM cannot carry, so they are written ±HH:MM:SS.
    char buffer[16];
    if (total % 60 == 0) {
        std::snprintf(buffer, sizeof buffer, "%c%02lld:%02lld", sign, (long long)(total / 3600),
                      (long long)(total / 60 % 60));
    } else {
        std::snprintf(buffer, sizeof buffer, "%c%02lld:%02lld:%02lld", sign, (long long)(total / 3600),
                      (long long)(total / 60 % 60), (long long)(total % 60));
    }
    return buffer;
}

}  // namespace almanac
