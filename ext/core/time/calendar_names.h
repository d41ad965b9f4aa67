// SPDX-License-Identifier: MIT
// The English names of months and weekdays, the one table of them, and the one
// way a name is recognised in input: the full name or its first three
// letters, in any case ("March", "mar", "MAR"). Spec words, to_time's %b and
// %a, and chart ticks all ask here.
#pragma once

#include <date/date.h>

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace almanac {

// "January" ... "December", "Monday" ... "Sunday".
std::string_view month_name(date::month month);
std::string_view weekday_name(date::weekday weekday);
// The first three letters: "Jan", "Mon".
std::string_view month_abbreviation(date::month month);
// The name in lower case, as spec words are written: "january", "sunday".
std::string lowercase_month_name(date::month month);
std::string lowercase_weekday_name(date::weekday weekday);

// A name recognised at the start of a text, and how many bytes it took: the
// full name when the text has it, otherwise its first three letters.
template <typename Value>
struct NameMatch {
    Value value;
    std::size_t length;
};
std::optional<NameMatch<date::month>> match_month_name(std::string_view text);
std::optional<NameMatch<date::weekday>> match_weekday_name(std::string_view text);

// A whole word that is a name (the full name or its first three letters).
std::optional<date::month> month_named(std::string_view word);
std::optional<date::weekday> weekday_named(std::string_view word);

}  // namespace almanac
