// SPDX-License-Identifier: MIT
// The one shape of an argument error, in every binding:
//     fn(): argument N (name) = <value>: <what was expected>
// and a TEXT value as such a message shows it: 'in quotes', quotes doubled as
// SQL writes them, cut after 60 bytes at a character boundary (with "..."),
// bytes that are not UTF-8 as U+FFFD and NUL as U+2400, so that a message
// about bad input is itself valid text. Every binding quotes values this one
// way, so the same bad value gives the same message in every engine.
#pragma once

#include <string>
#include <string_view>

namespace almanac {

std::string quoted_for_message(std::string_view text);

// shown_value as quoted_for_message or readable_double write it, or NULL.
std::string argument_error_message(const char* function, int position, const char* name,
                                   const std::string& shown_value,
                                   const std::string& what_was_expected);

}  // namespace almanac
