// SPDX-License-Identifier: MIT
#include "core/time/time_format.h"

#include <array>
#include <cmath>

#include "core/text/ascii.h"
#include "core/text/character_position.h"
#include "core/text/error.h"
#include "core/text/utf8.h"
#include "core/time/civil_days.h"

namespace almanac {
namespace {

constexpr std::string_view kDirectives =
    "%Y %y %m %d %e %H %I %M %S %f %p %b %B %a %A %j %z %%, or the word excel";

constexpr std::array<std::string_view, 12> kMonths = {
    "january", "february", "march",     "april",   "may",      "june",
    "july",    "august",   "september", "october", "november", "december"};
// Monday first, as date::weekday's iso_encoding counts (1 = Monday).
constexpr std::array<std::string_view, 7> kWeekdays = {
    "monday", "tuesday", "wednesday", "thursday", "friday", "saturday", "sunday"};

std::string two_digits(unsigned v) {
    return std::string{char('0' + v / 10 % 10), char('0' + v % 10)};
}

std::string date_text(int year, unsigned month, unsigned day) {
    std::string y = std::to_string(year);
    return std::string(4 - std::min<std::size_t>(4, y.size()), '0') + y + "-" + two_digits(month) +
           "-" + two_digits(day);
}

// What a directive reads, for messages.
std::string expected_for(char directive) {
    switch (directive) {
        case 'Y':
            return "%Y (a four-digit year)";
        case 'y':
            return "%y (a two-digit year)";
        case 'm':
            return "%m (a month number 1-12)";
        case 'd':
            return "%d (a day of the month 1-31)";
        case 'e':
            return "%e (a day of the month 1-31)";
        case 'H':
            return "%H (an hour 0-23)";
        case 'I':
            return "%I (an hour 1-12)";
        case 'M':
            return "%M (minutes 0-59)";
        case 'S':
            return "%S (seconds 0-59)";
        case 'f':
            return "%f (digits of a fraction of a second)";
        case 'p':
            return "%p (AM or PM)";
        case 'b':
            return "%b (a month name such as Mar or March)";
        case 'B':
            return "%B (a month name such as Mar or March)";
        case 'a':
            return "%a (a weekday name such as Thu or Thursday)";
        case 'A':
            return "%A (a weekday name such as Thu or Thursday)";
        case 'j':
            return "%j (a day of the year 1-366)";
        case 'z':
            return "%z (an offset such as +01:00, +0100 or Z)";
        default:
            return "%";
    }
}

[[noreturn]] void mismatch(std::string_view text, std::size_t pos, const std::string& expected) {
    if (pos >= text.size()) throw Error("the text ends where " + expected + " was expected");
    throw Error("at " + character_at(text, pos) + ": expected " + expected);
}

// Reads a name from `names` (full, or its first three letters), case-insensitively.
// Returns the 0-based index and advances pos; -1 when none matches.
int read_name(std::string_view text, std::size_t& pos, const std::string_view* names,
              std::size_t count) {
    auto matches = [&](std::string_view name, std::size_t length) {
        if (pos + length > text.size()) return false;
        for (std::size_t i = 0; i < length; ++i)
            if (to_ascii_lower(text[pos + i]) != name[i]) return false;
        return true;
    };
    for (std::size_t i = 0; i < count; ++i) {
        if (matches(names[i], names[i].size())) {
            pos += names[i].size();
            return int(i);
        }
    }
    for (std::size_t i = 0; i < count; ++i) {
        if (matches(names[i], 3)) {
            pos += 3;
            return int(i);
        }
    }
    return -1;
}

}  // namespace

TimeFormat TimeFormat::parse(std::string_view format) {
    if (format.size() > kLongestFormat)
        throw Error("a format is at most " + std::to_string(kLongestFormat) +
                    " bytes long; this one has " + std::to_string(format.size()));
    TimeFormat result;
    std::string_view trimmed = trim_ascii_space(format);
    if (trimmed.size() == 5) {
        if (ascii_lowercase(trimmed) == "excel") {
            result.spreadsheet_ = true;
            result.has_time_ = true;
            result.has_fraction_ = true;
            return result;
        }
    }
    if (trimmed.empty()) throw Error("expected a format such as '%d.%m.%Y %H:%M', or excel");

    // Which directives occur (by letter), to check the combination at the end.
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
        Field field;
        switch (d) {
            case '%':
                result.steps_.push_back({Field::Literal, '%', 0});
                continue;
            case 'Y':
                field = Field::Year;
                break;
            case 'y':
                field = Field::TwoDigitYear;
                break;
            case 'm':
                field = Field::Month;
                break;
            case 'd':
            case 'e':
                field = Field::Day;
                break;
            case 'H':
                field = Field::Hour24;
                break;
            case 'I':
                field = Field::Hour12;
                break;
            case 'M':
                field = Field::Minute;
                break;
            case 'S':
                field = Field::Second;
                break;
            case 'f':
                field = Field::Fraction;
                break;
            case 'p':
                field = Field::AmPm;
                break;
            case 'b':
            case 'B':
                field = Field::MonthName;
                break;
            case 'a':
            case 'A':
                field = Field::WeekdayName;
                break;
            case 'j':
                field = Field::DayOfYear;
                break;
            case 'z':
                field = Field::Offset;
                break;
            default:
                throw Error("unknown directive at " +
                            character_at(format, i - 1, 1 + utf8_sequence_length(format, i)) +
                            "; expected one of " + std::string(kDirectives));
        }
        // Two spellings of one field (%d and %e, %b and %B) count as one.
        char key = d == 'e' ? 'd' : d == 'B' ? 'b' : d == 'A' ? 'a' : d;
        if (seen[int(key)])
            throw Error("%" + std::string(1, d) + " at " + character_at(format, i - 1, 2) +
                        " reads a field the format already reads");
        seen[int(key)] = true;
        result.steps_.push_back({field, 0, d});
    }

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
    result.has_time_ = hour;
    result.has_fraction_ = has('f');
    result.has_offset_ = has('z');
    return result;
}

TimeReading TimeFormat::read(std::string_view raw) const {
    std::string_view text = trim_ascii_space(raw);
    std::size_t pos = 0;
    int year = -1;
    int month = 0, day = 0, day_of_year = 0, weekday = 0;
    int hour = 0, minute = 0, second = 0, pm = -1;
    std::int64_t fraction_ms = 0;
    std::size_t weekday_at = 0, weekday_end = 0, day_of_year_at = 0;
    TimeReading reading;

    // Reads 1..most digits (exactly `fixed` when given) and checks the range.
    auto number = [&](const Step& step, std::size_t most, int low, int high, bool fixed = false) {
        std::size_t start = pos;
        int value = 0;
        while (pos < text.size() && pos - start < most && is_ascii_digit(text[pos]))
            value = value * 10 + (text[pos++] - '0');
        if (pos == start || (fixed && pos - start != most))
            mismatch(text, start, expected_for(step.directive));
        if (value < low || value > high)
            throw Error("at " + character_at(text, start, pos - start) + ": expected " +
                        expected_for(step.directive));
        return value;
    };

    for (const Step& step : steps_) {
        switch (step.field) {
            case Field::Literal:
                if (pos >= text.size() || text[pos] != step.literal)
                    mismatch(text, pos, "'" + std::string(1, step.literal) + "'");
                ++pos;
                break;
            case Field::Space:
                if (pos >= text.size() || !is_ascii_space(text[pos]))
                    mismatch(text, pos, "a space");
                while (pos < text.size() && is_ascii_space(text[pos])) ++pos;
                break;
            case Field::Year:
                year = number(step, 4, 0, 9999, true);
                break;
            case Field::TwoDigitYear: {
                // POSIX's rule, which Python's strptime follows: 69-99 are 1969-1999, 00-68 are
                // 2000-2068.
                int yy = number(step, 2, 0, 99, true);
                year = yy < 69 ? 2000 + yy : 1900 + yy;
                break;
            }
            case Field::Month:
                month = number(step, 2, 1, 12);
                break;
            case Field::Day:
                // One space may pad a one-digit day ("Mar  5"), as %e writes it.
                if (pos + 1 < text.size() && text[pos] == ' ' && is_ascii_digit(text[pos + 1]))
                    ++pos;
                day = number(step, 2, 1, 31);
                break;
            case Field::Hour24:
                hour = number(step, 2, 0, 23);
                break;
            case Field::Hour12:
                hour = number(step, 2, 1, 12);
                break;
            case Field::Minute:
                minute = number(step, 2, 0, 59);
                break;
            case Field::Second:
                second = number(step, 2, 0, 59);
                break;
            case Field::Fraction: {
                // Up to nanoseconds; rounded half up to the millisecond.
                std::size_t start = pos;
                std::int64_t nanos = 0;
                while (pos < text.size() && pos - start < 9 && is_ascii_digit(text[pos]))
                    nanos = nanos * 10 + (text[pos++] - '0');
                if (pos == start) mismatch(text, start, expected_for(step.directive));
                for (std::size_t n = pos - start; n < 9; ++n) nanos *= 10;
                fraction_ms = (nanos + 500000) / 1000000;
                break;
            }
            case Field::AmPm: {
                char a = pos < text.size() ? to_ascii_lower(text[pos]) : 0;
                char m = pos + 1 < text.size() ? to_ascii_lower(text[pos + 1]) : 0;
                if ((a != 'a' && a != 'p') || m != 'm') mismatch(text, pos, expected_for('p'));
                pm = a == 'p';
                pos += 2;
                break;
            }
            case Field::MonthName: {
                int index = read_name(text, pos, kMonths.data(), kMonths.size());
                if (index < 0) mismatch(text, pos, expected_for(step.directive));
                month = index + 1;
                break;
            }
            case Field::WeekdayName: {
                weekday_at = pos;
                int index = read_name(text, pos, kWeekdays.data(), kWeekdays.size());
                if (index < 0) mismatch(text, pos, expected_for(step.directive));
                weekday = index + 1;
                weekday_end = pos;
                break;
            }
            case Field::DayOfYear:
                day_of_year_at = pos;
                day_of_year = number(step, 3, 1, 366);
                break;
            case Field::Offset: {
                std::size_t start = pos;
                if (pos < text.size() && text[pos] == 'Z') {
                    ++pos;
                    reading.has_offset = true;
                    break;
                }
                if (pos >= text.size() || (text[pos] != '+' && text[pos] != '-'))
                    mismatch(text, pos, expected_for('z'));
                int sign = text[pos++] == '-' ? -1 : 1;
                auto digits2 = [&]() {
                    if (pos + 2 > text.size() || !is_ascii_digit(text[pos]) ||
                        !is_ascii_digit(text[pos + 1]))
                        mismatch(text, pos, expected_for('z'));
                    int v = (text[pos] - '0') * 10 + (text[pos + 1] - '0');
                    pos += 2;
                    return v;
                };
                int hours = digits2();
                if (pos < text.size() && text[pos] == ':') ++pos;
                int minutes = digits2();
                if (hours > 23 || minutes > 59)
                    throw Error("at " + character_at(text, start, pos - start) + ": expected " +
                                expected_for('z'));
                reading.has_offset = true;
                reading.offset = std::chrono::seconds{sign * (hours * 3600 + minutes * 60)};
                break;
            }
        }
    }
    if (pos != text.size()) mismatch(text, pos, "the end of the text");

    if (pm >= 0) hour = hour % 12 + (pm ? 12 : 0);
    bool leap = (year % 4 == 0 && year % 100 != 0) || year % 400 == 0;
    std::int32_t day_number;
    if (day != 0) {
        static constexpr unsigned kDays[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
        unsigned last = kDays[month - 1] + (month == 2 && leap);
        if (unsigned(day) > last)
            throw Error("no such date: " + std::to_string(year) + "-" +
                        two_digits(unsigned(month)) + " has " + std::to_string(last) + " days");
        day_number = day_number_from_civil(year, unsigned(month), unsigned(day));
        if (day_of_year != 0) {
            int actual = int(day_number - day_number_from_civil(year, 1, 1)) + 1;
            if (actual != day_of_year)
                throw Error("at " + character_at(text, day_of_year_at, 3) + ": day of the year " +
                            std::to_string(day_of_year) + " does not agree with " +
                            date_text(year, unsigned(month), unsigned(day)) + ", day " +
                            std::to_string(actual));
        }
    } else {
        if (day_of_year > 365 + leap)
            throw Error("no such date: " + std::to_string(year) + " has " +
                        std::to_string(365 + leap) + " days");
        day_number = day_number_from_civil(year, 1, 1) + day_of_year - 1;
    }
    CivilDate civil = civil_from_day_number(day_number);
    if (weekday != 0) {
        unsigned actual = date::weekday{date::sys_days{date::days{day_number}}}.iso_encoding();
        if (int(actual) != weekday) {
            std::string name(kWeekdays[actual - 1]);
            name[0] = char(name[0] - 'a' + 'A');
            throw Error("at " + character_at(text, weekday_at, weekday_end - weekday_at) + ": " +
                        date_text(civil.year, civil.month, civil.day) + " is a " + name);
        }
    }
    reading.local = LocalTime{date::days{day_number}} + std::chrono::hours{hour} +
                    std::chrono::minutes{minute} + std::chrono::seconds{second} +
                    Millis{fraction_ms};
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
