// SPDX-License-Identifier: MIT
#include "core/text/number_text.h"

#include <charconv>
#include <cmath>
#include <limits>

#include "core/text/ascii.h"

namespace almanac {

namespace {

// Room for any double in any of the layouts below (-1.2345678901234567e-308,
// and %.*f of the largest double with a few decimals).
constexpr std::size_t kBufferSize = 400;

// Where the decimal point of the number's first significant digit sits, in
// powers of ten; only its sign matters (out of range high or low).
bool magnitude_is_large(std::string_view mantissa, std::string_view exponent) {
    // Significant digits before the point count up, leading zeros after it down.
    long position = 0;
    bool seen_point = false, seen_nonzero = false;
    for (char c : mantissa) {
        if (c == '.') {
            seen_point = true;
        } else if (!seen_nonzero && c == '0') {
            if (seen_point) --position;
        } else {
            seen_nonzero = true;
            if (!seen_point) ++position;
        }
    }
    long e = 0;
    bool negative = false;
    std::size_t i = 0;
    if (!exponent.empty() && (exponent[0] == '+' || exponent[0] == '-')) {
        negative = exponent[0] == '-';
        i = 1;
    }
    // A huge exponent only needs to be known as huge.
    for (; i < exponent.size() && e < 100000; ++i) e = e * 10 + (exponent[i] - '0');
    return position + (negative ? -e : e) > 0;
}

}  // namespace

std::optional<double> parse_decimal(std::string_view text) {
    std::size_t pos = 0;
    bool negative = false;
    if (pos < text.size() && (text[pos] == '+' || text[pos] == '-')) {
        negative = text[pos] == '-';
        ++pos;
    }
    const std::size_t mantissa_start = pos;
    std::size_t mantissa_digits = 0;
    while (pos < text.size() && is_ascii_digit(text[pos])) ++pos, ++mantissa_digits;
    if (pos < text.size() && text[pos] == '.') {
        ++pos;
        while (pos < text.size() && is_ascii_digit(text[pos])) ++pos, ++mantissa_digits;
    }
    if (mantissa_digits == 0) return std::nullopt;
    const std::size_t mantissa_end = pos;
    std::size_t exponent_start = pos;
    if (pos < text.size() && (text[pos] == 'e' || text[pos] == 'E')) {
        ++pos;
        exponent_start = pos;
        if (pos < text.size() && (text[pos] == '+' || text[pos] == '-')) ++pos;
        std::size_t exponent_digits = 0;
        while (pos < text.size() && is_ascii_digit(text[pos])) ++pos, ++exponent_digits;
        if (exponent_digits == 0) return std::nullopt;
    }
    if (pos != text.size()) return std::nullopt;

    // from_chars takes no leading '+'; the sign is applied after.
    double value = 0;
    auto result = std::from_chars(text.data() + mantissa_start, text.data() + text.size(), value,
                                  std::chars_format::general);
    if (result.ec == std::errc::result_out_of_range) {
        bool large = magnitude_is_large(text.substr(mantissa_start, mantissa_end - mantissa_start),
                                        mantissa_end == exponent_start
                                            ? std::string_view()
                                            : text.substr(exponent_start, pos - exponent_start));
        value = large ? std::numeric_limits<double>::infinity() : 0.0;
    } else if (result.ec != std::errc() || result.ptr != text.data() + text.size()) {
        return std::nullopt;
    }
    return negative ? -value : value;
}

std::optional<double> numeric_text(std::string_view text) {
    return parse_decimal(trim_ascii_space(text));
}

std::optional<std::int64_t> parse_int64(std::string_view text) {
    // from_chars reads a '-' but not a '+'; either sign may appear once.
    if (!text.empty() && text[0] == '+') {
        text.remove_prefix(1);
        if (!text.empty() && text[0] == '-') return std::nullopt;
    }
    std::int64_t value = 0;
    auto result = std::from_chars(text.data(), text.data() + text.size(), value);
    if (result.ec != std::errc() || result.ptr != text.data() + text.size()) return std::nullopt;
    return value;
}

std::string shortest_double(double value) {
    char buffer[kBufferSize];
    if (!std::isfinite(value)) {
        auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
        return std::string(buffer, result.ptr);
    }
    // The shortest digits in scientific form: [-]d[.ddd]e±XX.
    auto result =
        std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::scientific);
    std::string_view scientific(buffer, static_cast<std::size_t>(result.ptr - buffer));
    std::size_t e_at = scientific.find('e');
    int exponent = 0;
    std::from_chars(scientific.data() + e_at + (scientific[e_at + 1] == '+' ? 2 : 1),
                    scientific.data() + scientific.size(), exponent);
    if (exponent < -4 || exponent >= 16) return std::string(scientific);

    std::string out;
    std::string_view mantissa = scientific.substr(0, e_at);
    if (mantissa[0] == '-') {
        out += '-';
        mantissa.remove_prefix(1);
    }
    std::string digits;
    for (char c : mantissa)
        if (c != '.') digits += c;
    const int point = exponent + 1;  // digits before the decimal point
    const int count = static_cast<int>(digits.size());
    if (point <= 0) {
        out += "0.";
        out.append(static_cast<std::size_t>(-point), '0');
        out += digits;
    } else if (point >= count) {
        out += digits;
        out.append(static_cast<std::size_t>(point - count), '0');
        out += ".0";
    } else {
        out.append(digits, 0, static_cast<std::size_t>(point));
        out += '.';
        out.append(digits, static_cast<std::size_t>(point), std::string::npos);
    }
    return out;
}

std::string readable_double(double value) {
    if (!std::isfinite(value)) return shortest_double(value);
    char buffer[kBufferSize];
    char* end = buffer;
    for (int digits = 15; digits <= 17; ++digits) {
        end =
            std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::general, digits)
                .ptr;
        double back = 0;
        std::from_chars(buffer, end, back);
        if (back == value) break;
    }
    return std::string(buffer, end);
}

std::string fixed_double(double value, int decimals) {
    char buffer[kBufferSize];
    auto result =
        std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::fixed, decimals);
    return std::string(buffer, result.ptr);
}

std::string general_double(double value, int digits) {
    char buffer[kBufferSize];
    auto result =
        std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::general, digits);
    return std::string(buffer, result.ptr);
}

std::string padded(unsigned v, int width) {
    char buffer[16];
    return std::string(buffer, write_padded(buffer, v, width));
}

}  // namespace almanac
