// SPDX-License-Identifier: MIT
#include "core/time/time_format.h"

#include <algorithm>
#include <cmath>

#include "core/text/ascii.h"
#include "core/text/character_position.h"
#include "core/text/error.h"
#include "core/text/utf8.h"
#include "core/time/calendar_names.h"
#include "core/time/civil_days.h"
#include "core/time/second_fraction.h"

namespace almanac {
namespace {

constexpr std::string_view kDirectives =
    "%Y %y %m %d %e %H %I %M %S %f %p %b %B %a %A %j %z %%, or the word excel";

std::string two_digits(unsigned v) {
    return std::string{char('0' + v / 10 % 10), char('0' + v % 10)};
}

std::string date_text(int year, unsigned month, unsigned day) {
    std::string y = std::to_string(year);
    return std::string(4 - std::min<std::size_t>(4, y.size()), '0') + y + "-" + two_digits(month) +
           "-" + two_digits(day);
}

[[noreturn]] void mismatch(std::string_view text, std::size_t pos, const std::string& expected) {
    if (pos >= text.size()) throw Error("the text ends where " + expected + " was expected");
    throw Error("at " + character_at(text, pos) + ": expected " + expected);
}

// The text being read and the place reached; each field reader advances it.
struct Cursor {
    std::string_view text;
    std::size_t pos = 0;

    bool at_end() const { return pos >= text.size(); }
    std::string_view rest() const { return text.substr(pos); }
};

// 1..most digits (exactly `most` when fixed) in low..high.
int read_number(Cursor& in, const char* expected, std::size_t most, int low, int high,
                bool fixed = false) {
    std::size_t start = in.pos;
    int value = 0;
    while (!in.at_end() && in.pos - start < most && is_ascii_digit(in.text[in.pos]))
        value = value * 10 + (in.text[in.pos++] - '0');
    if (in.pos == start || (fixed && in.pos - start != most)) mismatch(in.text, start, expected);
    if (value < low || value > high)
        throw Error("at " + character_at(in.text, start, in.pos - start) + ": expected " +
                    expected);
    return value;
}

// Up to nanoseconds, rounded half up to the millisecond (second_fraction.h).
std::int64_t read_fraction(Cursor& in, const char* expected) {
    auto fraction = read_second_fraction(in.rest(), 9);
    if (!fraction) mismatch(in.text, in.pos, expected);
    in.pos += fraction->digits;
    return fraction->millis;
}

// AM or PM in any case: true for PM.
bool read_am_pm(Cursor& in, const char* expected) {
    char a = in.pos < in.text.size() ? to_ascii_lower(in.text[in.pos]) : 0;
    char m = in.pos + 1 < in.text.size() ? to_ascii_lower(in.text[in.pos + 1]) : 0;
    if ((a != 'a' && a != 'p') || m != 'm') mismatch(in.text, in.pos, expected);
    in.pos += 2;
    return a == 'p';
}

template <typename Match>
auto read_name(Cursor& in, const char* expected, Match&& match) {
    auto found = match(in.rest());
    if (!found) mismatch(in.text, in.pos, expected);
    in.pos += found->length;
    return found->value;
}

// Z, or ±HH[:]MM.
std::chrono::seconds read_offset(Cursor& in, const char* expected) {
    std::size_t start = in.pos;
    if (!in.at_end() && in.text[in.pos] == 'Z') {
        ++in.pos;
        return std::chrono::seconds{0};
    }
    if (in.at_end() || (in.text[in.pos] != '+' && in.text[in.pos] != '-'))
        mismatch(in.text, in.pos, expected);
    int sign = in.text[in.pos++] == '-' ? -1 : 1;
    auto digits2 = [&]() {
        if (in.pos + 2 > in.text.size() || !is_ascii_digit(in.text[in.pos]) ||
            !is_ascii_digit(in.text[in.pos + 1]))
            mismatch(in.text, in.pos, expected);
        int v = (in.text[in.pos] - '0') * 10 + (in.text[in.pos + 1] - '0');
        in.pos += 2;
        return v;
    };
    int hours = digits2();
    if (!in.at_end() && in.text[in.pos] == ':') ++in.pos;
    int minutes = digits2();
    if (hours > 23 || minutes > 59)
        throw Error("at " + character_at(in.text, start, in.pos - start) + ": expected " +
                    expected);
    return std::chrono::seconds{sign * (hours * 3600 + minutes * 60)};
}

// What the fields of one text said, before the date is worked out.
struct Fields {
    int year = -1;
    unsigned month = 0, day = 0, day_of_year = 0;
    std::optional<date::weekday> weekday;
    int hour = 0, minute = 0, second = 0, pm = -1;
    std::int64_t fraction_ms = 0;
    std::size_t weekday_at = 0, weekday_end = 0, day_of_year_at = 0;
};

// The day the fields name: year-month-day or year and day of the year, which
// must exist and agree with a day of the year or weekday also given.
std::int32_t resolve_day(const Fields& f, std::string_view text) {
    std::int32_t day_number;
    if (f.day != 0) {
        unsigned last = days_in_month(f.year, f.month);
        if (f.day > last)
            throw Error("no such date: " + std::to_string(f.year) + "-" + two_digits(f.month) +
                        " has " + std::to_string(last) + " days");
        day_number = day_number_from_civil(f.year, f.month, f.day);
        if (f.day_of_year != 0) {
            unsigned actual = unsigned(day_number - day_number_from_civil(f.year, 1, 1)) + 1;
            if (actual != f.day_of_year)
                throw Error("at " + character_at(text, f.day_of_year_at, 3) + ": day of the year " +
                            std::to_string(f.day_of_year) + " does not agree with " +
                            date_text(f.year, f.month, f.day) + ", day " + std::to_string(actual));
        }
    } else {
        if (f.day_of_year > days_in_year(f.year))
            throw Error("no such date: " + std::to_string(f.year) + " has " +
                        std::to_string(days_in_year(f.year)) + " days");
        day_number = day_number_from_civil(f.year, 1, 1) + std::int32_t(f.day_of_year) - 1;
    }
    if (f.weekday) {
        date::weekday actual{date::sys_days{date::days{day_number}}};
        if (actual != *f.weekday) {
            CivilDate civil = civil_from_day_number(day_number);
            throw Error("at " + character_at(text, f.weekday_at, f.weekday_end - f.weekday_at) +
                        ": " + date_text(civil.year, civil.month, civil.day) + " is a " +
                        std::string(weekday_name(actual)));
        }
    }
    return day_number;
}

}  // namespace

const TimeFormat::Directive* TimeFormat::directive_for(char letter) {
    static constexpr Directive kTable[] = {
        {'Y', Field::Year, 'Y', "%Y (a four-digit year)"},
        {'y', Field::TwoDigitYear, 'y', "%y (a two-digit year)"},
        {'m', Field::Month, 'm', "%m (a month number 1-12)"},
        {'d', Field::Day, 'd', "%d (a day of the month 1-31)"},
        {'e', Field::Day, 'd', "%e (a day of the month 1-31)"},
        {'H', Field::Hour24, 'H', "%H (an hour 0-23)"},
        {'I', Field::Hour12, 'I', "%I (an hour 1-12)"},
        {'M', Field::Minute, 'M', "%M (minutes 0-59)"},
        {'S', Field::Second, 'S', "%S (seconds 0-59)"},
        {'f', Field::Fraction, 'f', "%f (digits of a fraction of a second)"},
        {'p', Field::AmPm, 'p', "%p (AM or PM)"},
        {'b', Field::MonthName, 'b', "%b (a month name such as Mar or March)"},
        {'B', Field::MonthName, 'b', "%B (a month name such as Mar or March)"},
        {'a', Field::WeekdayName, 'a', "%a (a weekday name such as Thu or Thursday)"},
        {'A', Field::WeekdayName, 'a', "%A (a weekday name such as Thu or Thursday)"},
        {'j', Field::DayOfYear, 'j', "%j (a day of the year 1-366)"},
        {'z', Field::Offset, 'z', "%z (an offset such as +01:00, +0100 or Z)"},
    };
    for (const Directive& directive : kTable)
        if (directive.letter == letter) return &directive;
    return nullptr;
}

const char* TimeFormat::expected_for(char letter) {
    const Directive* directive = directive_for(letter);
    return directive ? directive->expected : "%";
}

TimeFormat TimeFormat::parse(std::string_view format) {
    if (format.size() > kLongestFormat)
        throw Error("a format is at most " + std::to_string(kLongestFormat) +
                    " bytes long; this one has " + std::to_string(format.size()));
    TimeFormat result;
    std::string_view trimmed = trim_ascii_space(format);
    if (trimmed.size() == 5 && ascii_lowercase(trimmed) == "excel") {
        result.spreadsheet_ = true;
        result.has_time_ = true;
        result.has_fraction_ = true;
        return result;
    }
    if (trimmed.empty()) throw Error("expected a format such as '%d.%m.%Y %H:%M', or excel");

    // Which fields occur (by the letter of their key), to check the combination at the end.
    bool seen[128] = {};
    for (std::size_t i = 0; i < format.size(); ++i) {
        char c = format[i];
        if (is_ascii_space(c)) {
            // A run of spaces in the format matches one or more spaces.
            while (i + 1 < format.size() && is_ascii_space(format[i + 1])) ++i;
            result.steps_.push_back({Field::Space, ' ', 0});
            continue;
        }
        if (c != '%') {
            result.steps_.push_back({Field::Literal, c, 0});
            continue;
        }
        if (i + 1 == format.size())
            throw Error("the format ends with a lone %; write %% for a percent sign");
        char d = format[++i];
        if (d == '%') {
            result.steps_.push_back({Field::Literal, '%', 0});
            continue;
        }
        const Directive* directive = directive_for(d);
        if (!directive)
            throw Error("unknown directive at " +
                        character_at(format, i - 1, 1 + utf8_sequence_length(format, i)) +
                        "; expected one of " + std::string(kDirectives));
        // Two spellings of one field (%d and %e, %b and %B) count as one.
        if (seen[int(directive->key)])
            throw Error("%" + std::string(1, d) + " at " + character_at(format, i - 1, 2) +
                        " reads a field the format already reads");
        seen[int(directive->key)] = true;
        result.steps_.push_back({directive->field, 0, d});
    }
    result.check_combination(seen);
    return result;
}

void TimeFormat::check_combination(const bool (&seen)[128]) {
    auto has = [&](char key) { return seen[int(key)]; };
    if (!has('Y') && !has('y')) throw Error("the format has no year; expected %Y or %y");
    if (has('Y') && has('y')) throw Error("the format has both %Y and %y; expected one year");
    bool month = has('m') || has('b');
    if (has('m') && has('b')) throw Error("the format has both %m and %b; expected one month");
    if (month && !has('d')) throw Error("the format has a month without a day (%d)");
    if (has('d') && !month) throw Error("the format has %d without a month (%m or %b)");
    if (!has('j') && !month)
        throw Error("the format has no day; expected %m (or %b) with %d, or %j");
    if (has('H') && has('I')) throw Error("the format has both %H and %I; expected one hour");
    if (has('I') != has('p')) throw Error("%I (a 12-hour clock) and %p (AM or PM) need each other");
    bool hour = has('H') || has('I');
    if (has('M') && !hour) throw Error("the format has %M without an hour (%H or %I)");
    if (has('S') && !has('M')) throw Error("the format has %S without minutes (%M)");
    if (has('f') && !has('S')) throw Error("the format has %f without seconds (%S)");
    has_time_ = hour;
    has_fraction_ = has('f');
    has_offset_ = has('z');
}

TimeReading TimeFormat::read(std::string_view raw) const {
    Cursor in{trim_ascii_space(raw)};
    Fields f;
    TimeReading reading;
    for (const Step& step : steps_) {
        const char* expected = expected_for(step.directive);
        switch (step.field) {
            case Field::Literal:
                if (in.at_end() || in.text[in.pos] != step.literal)
                    mismatch(in.text, in.pos, "'" + std::string(1, step.literal) + "'");
                ++in.pos;
                break;
            case Field::Space:
                if (in.at_end() || !is_ascii_space(in.text[in.pos]))
                    mismatch(in.text, in.pos, "a space");
                while (!in.at_end() && is_ascii_space(in.text[in.pos])) ++in.pos;
                break;
            case Field::Year:
                f.year = read_number(in, expected, 4, 0, 9999, true);
                break;
            case Field::TwoDigitYear: {
                // POSIX's rule, which Python's strptime follows: 69-99 are
                // 1969-1999, 00-68 are 2000-2068.
                int yy = read_number(in, expected, 2, 0, 99, true);
                f.year = yy < 69 ? 2000 + yy : 1900 + yy;
                break;
            }
            case Field::Month:
                f.month = unsigned(read_number(in, expected, 2, 1, 12));
                break;
            case Field::Day:
                // One space may pad a one-digit day ("Mar  5"), as %e writes it.
                if (in.pos + 1 < in.text.size() && in.text[in.pos] == ' ' &&
                    is_ascii_digit(in.text[in.pos + 1]))
                    ++in.pos;
                f.day = unsigned(read_number(in, expected, 2, 1, 31));
                break;
            case Field::Hour24:
                f.hour = read_number(in, expected, 2, 0, 23);
                break;
            case Field::Hour12:
                f.hour = read_number(in, expected, 2, 1, 12);
                break;
            case Field::Minute:
                f.minute = read_number(in, expected, 2, 0, 59);
                break;
            case Field::Second:
                f.second = read_number(in, expected, 2, 0, 59);
                break;
            case Field::Fraction:
                f.fraction_ms = read_fraction(in, expected);
                break;
            case Field::AmPm:
                f.pm = read_am_pm(in, expected) ? 1 : 0;
                break;
            case Field::MonthName:
                f.month = unsigned(read_name(in, expected, match_month_name));
                break;
            case Field::WeekdayName:
                f.weekday_at = in.pos;
                f.weekday = read_name(in, expected, match_weekday_name);
                f.weekday_end = in.pos;
                break;
            case Field::DayOfYear:
                f.day_of_year_at = in.pos;
                f.day_of_year = unsigned(read_number(in, expected, 3, 1, 366));
                break;
            case Field::Offset:
                reading.offset = read_offset(in, expected);
                reading.has_offset = true;
                break;
        }
    }
    if (!in.at_end()) mismatch(in.text, in.pos, "the end of the text");

    if (f.pm >= 0) f.hour = f.hour % 12 + (f.pm ? 12 : 0);
    reading.local = LocalTime{date::days{resolve_day(f, in.text)}} + std::chrono::hours{f.hour} +
                    std::chrono::minutes{f.minute} + std::chrono::seconds{f.second} +
                    Millis{f.fraction_ms};
    return reading;
}

LocalTime read_spreadsheet_serial(double serial) {
    // 9999-12-31 is serial 2958465 (from 1899-12-30, the day before serial 1
    // once the false leap day is counted); anything after it is past year 9999.
    constexpr double kLast = 2958466.0;
    if (!(serial >= 1.0 && serial < kLast))
        throw Error("expected a serial day number from 1 (1900-01-01) to 2958465 (9999-12-31)");
    if (serial >= 60.0 && serial < 61.0)
        throw Error("serial 60 is 29 February 1900, a day spreadsheets count but that never was");
    std::int64_t ms = std::llround(serial * 86400000.0);
    // Serials below 60 count from 1899-12-31; from 61 on, the false leap day
    // shifts the count so they start from 1899-12-30.
    std::int32_t epoch =
        serial < 60.0 ? day_number_from_civil(1899, 12, 31) : day_number_from_civil(1899, 12, 30);
    return LocalTime{date::days{epoch}} + Millis{ms};
}

}  // namespace almanac
