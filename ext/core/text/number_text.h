// SPDX-License-Identifier: MIT
// Numbers to text and back, the one home for it. Built on std::to_chars and
// std::from_chars, which never consult the C locale: an application that has
// called setlocale(LC_ALL, "de_DE.UTF-8") reads '12.5' as 12.5 and gets
// width="800" in an SVG, not 12 and width="800,". printf, strtod and streams
// follow LC_NUMERIC and must not be used for numbers anywhere in ext/.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace almanac {

// ---- text to number --------------------------------------------------------

// A decimal number filling the whole text: [+-] digits [. digits] [e [+-] digits],
// with at least one mantissa digit (SQLite's shape; no hex, inf or nan).
// Correctly rounded; beyond a double's range it is ±infinity, below it ±0,
// as strtod and SQLite give them.
std::optional<double> parse_decimal(std::string_view text);

// SQLite reads numeric TEXT as a number; so does almanac. The number when the
// whole text, ASCII white space around it allowed, is a decimal number.
std::optional<double> numeric_text(std::string_view text);

// A whole number filling the whole text: [+-] digits, within int64.
std::optional<std::int64_t> parse_int64(std::string_view text);

// ---- number to text --------------------------------------------------------

// The shortest text that reads back as the same double, laid out as Python's
// repr(): positional from 1e-4 to below 1e16 with at least one decimal
// ("100.0", "0.0001"), scientific outside ("1e+16", "5e-324"); "inf", "-inf",
// "nan".
std::string shortest_double(double value);

// A double as a message shows it, as a user would have typed it: printf's
// %g layout with 15 significant digits, or 16 or 17 when 15 do not read back
// ("0.9", "100", "1e+300", "0.30000000000000004").
std::string readable_double(double value);

// printf's %.*f: `decimals` digits after the point, correctly rounded.
std::string fixed_double(double value, int decimals);

// printf's %.*g: `digits` significant digits, trailing zeros removed.
std::string general_double(double value, int digits);

namespace number_text_detail {
inline constexpr char kDigitPairs[] =
    "00010203040506070809101112131415161718192021222324252627282930313233343536373839"
    "40414243444546474849505152535455565758596061626364656667686970717273747576777879"
    "8081828384858687888990919293949596979899";
}  // namespace number_text_detail

// Writes v as exactly `width` decimal digits, zero-padded (v < 10^width), at
// out and returns the end. No allocation, two digits at a time, and inline:
// time texts are written once per row of every period key.
inline char* write_padded(char* out, unsigned v, int width) {
    int i = width;
    while (i >= 2) {
        i -= 2;
        const char* pair = number_text_detail::kDigitPairs + 2 * (v % 100);
        out[i] = pair[0];
        out[i + 1] = pair[1];
        v /= 100;
    }
    if (i == 1) out[0] = static_cast<char>('0' + v % 10);
    return out + width;
}

// The same as a string ("07" for 7, 2).
std::string padded(unsigned v, int width);

}  // namespace almanac
