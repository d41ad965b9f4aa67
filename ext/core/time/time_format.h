// SPDX-License-Identifier: MIT
// Times written in a stated layout, as shop exports write them: a format of
// C strptime directives, or the word `excel` for spreadsheet serial days.
//
// A format is parsed once (per statement) into a list of steps, and every
// text is then read by walking the steps. Reading is strict: every field must
// be in its range, the date must exist, a weekday or day of the year must
// agree with the date, and nothing may be left over; an error names the first
// character that did not match and the directive expected there.
#pragma once

#include <chrono>
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "core/time/time_value.h"

namespace almanac {

// What one text says: a wall-clock reading, and an offset when the format
// has %z (then the reading names one instant: reading - offset).
struct TimeReading {
    LocalTime local{};
    bool has_offset = false;
    std::chrono::seconds offset{0};
};

class TimeFormat {
  public:
    // The longest format text read (README "Limits").
    static constexpr std::size_t kLongestFormat = 200;

    // Throws Error saying what is wrong with the format.
    static TimeFormat parse(std::string_view format);

    bool is_spreadsheet_serial() const { return spreadsheet_; }
    bool has_time_of_day() const { return has_time_; }
    bool has_fraction() const { return has_fraction_; }
    bool has_offset() const { return has_offset_; }

    // Reads a text written in this format (not for `excel`). Surrounding
    // spaces are allowed. Throws Error.
    TimeReading read(std::string_view text) const;

  private:
    enum class Field : unsigned char {
        Literal,
        Space,
        Year,
        TwoDigitYear,
        Month,
        Day,
        Hour24,
        Hour12,
        Minute,
        Second,
        Fraction,
        AmPm,
        MonthName,
        WeekdayName,
        DayOfYear,
        Offset,
    };
    struct Step {
        Field field;
        char literal;    // Literal: the byte to match
        char directive;  // the letter after %, for messages
    };
    // What a directive letter reads: its field, the letter it shares that
    // field with (%e reads %d's), and how messages name it. One table serves
    // the format's parse and the reader's messages.
    struct Directive {
        char letter;
        Field field;
        char key;
        const char* expected;
    };
    static const Directive* directive_for(char letter);
    static const char* expected_for(char letter);
    // The combination of directives a format reads must name one moment.
    void check_combination(const bool (&seen)[128]);

    std::vector<Step> steps_;
    bool spreadsheet_ = false;
    bool has_time_ = false;
    bool has_fraction_ = false;
    bool has_offset_ = false;
};

// A spreadsheet serial day number in the 1900 date system as a wall-clock
// reading: serial 1 is 1900-01-01, 61 is 1900-03-01, and 60 (the 29 February
// 1900 that spreadsheets count but that never was) is an error, as is
// anything below 1 or past 9999-12-31. The fraction is the time of day,
// rounded to the millisecond. Throws Error.
LocalTime read_spreadsheet_serial(double serial);

}  // namespace almanac
