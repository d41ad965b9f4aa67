// SPDX-License-Identifier: MIT
// The time texts almost every export writes, YYYY-MM-DD and
// YYYY-MM-DD HH:MM[:SS] with a space or a T, read at fixed places with one
// check per part. Inline because it runs once per row of every period key
// (README "Performance"). Texts it does not take (spaces around, fractions,
// offsets, out-of-range fields) go to the general reader, parse_time_text's
// full path, which gives the same value or the message; the two agree on
// every input (tests/unit/time/period_key_shortcuts_test.cpp).
#pragma once

#include <cstdint>
#include <cstring>
#include <optional>
#include <string_view>

#include "core/text/ascii.h"
#include "core/time/civil_days.h"
#include "core/time/time_value.h"

namespace almanac {
namespace common_form_detail {

inline unsigned digit_at(const char* p) { return static_cast<unsigned>(p[0]) - '0'; }
inline unsigned two_digits_at(const char* p) { return digit_at(p) * 10 + digit_at(p + 1); }

struct CommonForm {
    std::int64_t day;            // days since 1970-01-01
    std::int64_t millis_of_day;  // 0 for a bare date
    TextForm::Precision precision;
    bool t_separator;
};

// Eight bytes as one number, the first byte lowest, whatever the machine's
// byte order: one load where the order is already that.
inline std::uint64_t eight_bytes(const char* p) {
    std::uint64_t x = 0;
#if defined(__BYTE_ORDER__) && __BYTE_ORDER__ == __ORDER_LITTLE_ENDIAN__
    std::memcpy(&x, p, sizeof x);
#else
    for (int i = 7; i >= 0; --i) x = x << 8 | static_cast<unsigned char>(p[i]);
#endif
    return x;
}

constexpr std::uint64_t bytes_of(unsigned char c) { return 0x0101010101010101ull * c; }

// Whether the bytes of x picked by `where` (0xFF each) are all '0'-'9': the
// high nibble is 3, and still 3 after adding 6 (which carries out of ':'-'?').
inline bool digits_where(std::uint64_t x, std::uint64_t where) {
    const std::uint64_t high = bytes_of(0xF0) & where, threes = bytes_of(0x30) & where;
    return (x & high) == threes && ((x + bytes_of(6)) & high) == threes;
}

// Two-digit numbers from each byte pair: byte k of the result is
// 10 * digit k + digit k+1 (valid at the pairs' first bytes).
inline std::uint64_t digit_pairs(std::uint64_t x) {
    std::uint64_t d = x & bytes_of(0x0F);
    return d * 10 + (d >> 8);
}
inline unsigned byte_at(std::uint64_t x, int k) { return unsigned(x >> (8 * k)) & 0xFF; }

inline bool read_common_form(std::string_view text, CommonForm& form) {
    const std::size_t size = text.size();
    if (size != 10 && size != 16 && size != 19) return false;
    const char* p = text.data();
    // "YYYY-MM-": digits in bytes 0-3 and 5-6, '-' in bytes 4 and 7.
    const std::uint64_t head = eight_bytes(p);
    constexpr std::uint64_t kDashes = 0xFF0000FF00000000ull;
    if ((head & kDashes) != (std::uint64_t{'-'} << 32 | std::uint64_t{'-'} << 56) ||
        !digits_where(head, ~kDashes))
        return false;
    const std::uint64_t head_pairs = digit_pairs(head);
    int y = int(byte_at(head_pairs, 0) * 100 + byte_at(head_pairs, 2));
    unsigned mo = byte_at(head_pairs, 5), d, h = 0, mi = 0, s = 0;
    form.precision = TextForm::Precision::Date;
    form.t_separator = false;
    if (size == 10) {
        if (!is_ascii_digit(p[8]) || !is_ascii_digit(p[9])) return false;
        d = two_digits_at(p + 8);
    } else {
        // "DD HH:MM" (or "DDTHH:MM"): digits in bytes 0-1, 3-4 and 6-7.
        const std::uint64_t tail = eight_bytes(p + 8);
        constexpr std::uint64_t kColon = 0x0000FF0000000000ull, kSeparator = 0x0000000000FF0000ull;
        const unsigned separator = byte_at(tail, 2);
        if ((tail & kColon) != std::uint64_t{':'} << 40 || (separator != ' ' && separator != 'T') ||
            !digits_where(tail, ~(kColon | kSeparator)))
            return false;
        const std::uint64_t tail_pairs = digit_pairs(tail);
        d = byte_at(tail_pairs, 0);
        h = byte_at(tail_pairs, 3);
        mi = byte_at(tail_pairs, 6);
        form.precision = TextForm::Precision::Minutes;
        form.t_separator = separator == 'T';
        if (size == 19) {
            if (p[16] != ':' || !is_ascii_digit(p[17]) || !is_ascii_digit(p[18])) return false;
            s = two_digits_at(p + 17);
            form.precision = TextForm::Precision::Seconds;
        }
    }
    if (mo < 1 || mo > 12 || d < 1 || d > days_in_month(y, mo) || h > 23 || mi > 59 || s > 59)
        return false;
    form.day = day_number_from_civil(y, mo, d);
    form.millis_of_day = (h * 3600 + mi * 60 + s) * std::int64_t{1000};
    return true;
}

}  // namespace common_form_detail

using common_form_detail::CommonForm;
using common_form_detail::read_common_form;

inline std::optional<date::local_days> common_form_day(std::string_view text) {
    CommonForm form;
    if (!read_common_form(text, form)) return std::nullopt;
    return date::local_days{date::days{form.day}};
}

}  // namespace almanac
