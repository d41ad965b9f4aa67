// SPDX-License-Identifier: MIT
// ASCII character classes. The C library's isspace/isdigit/tolower answer by
// the C locale an embedding application may have set (and are undefined for
// negative chars); almanac's grammars are ASCII, so these ask no locale.
#pragma once

#include <string>
#include <string_view>

namespace almanac {

constexpr bool is_ascii_digit(char c) { return c >= '0' && c <= '9'; }

// The white space SQLite skips around numeric TEXT: space, \t, \n, \v, \f, \r.
constexpr bool is_ascii_space(char c) { return c == ' ' || (c >= '\t' && c <= '\r'); }

constexpr bool is_ascii_lower(char c) { return c >= 'a' && c <= 'z'; }

constexpr char to_ascii_lower(char c) {
    return c >= 'A' && c <= 'Z' ? static_cast<char>(c - 'A' + 'a') : c;
}

// Every ASCII letter lower-cased; other bytes (UTF-8 included) unchanged.
inline std::string ascii_lowercase(std::string_view text) {
    std::string out(text);
    for (char& c : out) c = to_ascii_lower(c);
    return out;
}

// The text without leading and trailing ASCII white space.
constexpr std::string_view trim_ascii_space(std::string_view text) {
    while (!text.empty() && is_ascii_space(text.front())) text.remove_prefix(1);
    while (!text.empty() && is_ascii_space(text.back())) text.remove_suffix(1);
    return text;
}

}  // namespace almanac
