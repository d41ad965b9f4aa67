// SPDX-License-Identifier: MIT
// Money as exports write it for people, read back as a number: an optional
// currency symbol or three-letter code before or after the number, grouping
// separators, a decimal mark that the caller states ('.' or ','), and a
// minus before or after, or accounting parentheses, for a negative amount.
//
// Anything that could be read two ways is an error, never a guess: digits
// between separators come in groups of three (or, with ',' grouping and a
// '.' mark, the Indian lakh grouping 1,05,000.00), one kind of separator per
// number, one decimal mark, one sign, one currency.
#pragma once

#include <optional>
#include <string_view>

namespace almanac {

// The amount, or nothing for an empty (or all-space) text. decimal_mark is
// '.' or ','. Throws Error saying what was expected.
std::optional<double> read_amount(std::string_view text, char decimal_mark);

}  // namespace almanac
