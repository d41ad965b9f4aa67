// SPDX-License-Identifier: MIT
#include "core/text/error_message.h"

#include "core/text/utf8.h"

namespace almanac {

std::string quoted_for_message(std::string_view text) {
    std::string shown(text);
    constexpr std::size_t kLongest = 60;
    if (shown.size() > kLongest) {
        // Cut at a character boundary: half a UTF-8 sequence would
        // make the whole message invalid text.
        shown = std::string(utf8_prefix(shown, kLongest)) + "...";
    }
    std::string quoted = "'";
    for (std::size_t i = 0; i < shown.size();) {
        // Bytes that are not UTF-8 are shown as U+FFFD, so a message
        // about bad input is itself valid text.
        std::size_t length = utf8_sequence_length(shown, i);
        if (length == 0) {
            quoted += "\xEF\xBF\xBD";
            ++i;
            continue;
        }
        if (shown[i] == '\0') {
            quoted += "\xE2\x90\x80";  // U+2400, the symbol for NUL
            ++i;
            continue;
        }
        if (shown[i] == '\'') quoted += '\'';
        quoted.append(shown, i, length);
        i += length;
    }
    return quoted + "'";
}

std::string argument_error_message(const char* function, int position, const char* name,
                                   const std::string& shown_value,
                                   const std::string& what_was_expected) {
    return std::string(function) + "(): argument " + std::to_string(position) + " (" + name +
           ") = " + shown_value + ": " + what_was_expected;
}

}  // namespace almanac
