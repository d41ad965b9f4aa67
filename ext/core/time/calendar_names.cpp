// SPDX-License-Identifier: MIT
#include "core/time/calendar_names.h"

#include <array>

#include "core/text/ascii.h"

namespace almanac {
namespace {

constexpr std::array<std::string_view, 12> kMonthNames = {
    "January", "February", "March",     "April",   "May",      "June",
    "July",    "August",   "September", "October", "November", "December"};
// Monday first, as ISO 8601 numbers the weekdays (date::weekday::iso_encoding).
constexpr std::array<std::string_view, 7> kWeekdayNames = {
    "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday", "Sunday"};

bool starts_with_name(std::string_view text, std::string_view name, std::size_t length) {
    if (text.size() < length) return false;
    for (std::size_t i = 0; i < length; ++i)
        if (to_ascii_lower(text[i]) != to_ascii_lower(name[i])) return false;
    return true;
}

// Full names are tried before abbreviations, so "June" is never read as "Jun" + "e".
template <std::size_t N>
std::optional<NameMatch<std::size_t>> match_in(const std::array<std::string_view, N>& names,
                                               std::string_view text) {
    for (std::size_t i = 0; i < N; ++i)
        if (starts_with_name(text, names[i], names[i].size())) return {{i, names[i].size()}};
    for (std::size_t i = 0; i < N; ++i)
        if (starts_with_name(text, names[i], 3)) return {{i, 3}};
    return std::nullopt;
}

date::month month_at(std::size_t index) { return date::month{unsigned(index) + 1}; }
date::weekday weekday_at(std::size_t index) { return date::weekday{unsigned(index) + 1}; }

}  // namespace

std::string_view month_name(date::month month) { return kMonthNames[unsigned(month) - 1]; }
std::string_view weekday_name(date::weekday weekday) {
    return kWeekdayNames[weekday.iso_encoding() - 1];
}
std::string_view month_abbreviation(date::month month) { return month_name(month).substr(0, 3); }
std::string lowercase_month_name(date::month month) { return ascii_lowercase(month_name(month)); }
std::string lowercase_weekday_name(date::weekday weekday) {
    return ascii_lowercase(weekday_name(weekday));
}

std::optional<NameMatch<date::month>> match_month_name(std::string_view text) {
    auto found = match_in(kMonthNames, text);
    if (!found) return std::nullopt;
    return NameMatch<date::month>{month_at(found->value), found->length};
}

std::optional<NameMatch<date::weekday>> match_weekday_name(std::string_view text) {
    auto found = match_in(kWeekdayNames, text);
    if (!found) return std::nullopt;
    return NameMatch<date::weekday>{weekday_at(found->value), found->length};
}

std::optional<date::month> month_named(std::string_view word) {
    auto found = match_month_name(word);
    if (!found || found->length != word.size()) return std::nullopt;
    return found->value;
}

std::optional<date::weekday> weekday_named(std::string_view word) {
    auto found = match_weekday_name(word);
    if (!found || found->length != word.size()) return std::nullopt;
    return found->value;
}

}  // namespace almanac
