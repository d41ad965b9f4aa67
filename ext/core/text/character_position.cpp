// SPDX-License-Identifier: MIT
#include "core/text/character_position.h"

#include <algorithm>

#include "core/text/utf8.h"

namespace almanac {

std::string character_at(std::string_view text, std::size_t pos, std::size_t length) {
    std::size_t character = 1;
    for (std::size_t i = 0; i < pos; ++i)
        if ((static_cast<unsigned char>(text[i]) & 0xC0) != 0x80) ++character;
    std::string shown;
    unsigned char lead = static_cast<unsigned char>(text[pos]);
    std::size_t first = utf8_sequence_length(text, pos);
    if (first == 0 || lead < 0x20 || lead == 0x7F) {
        const char* hex = "0123456789ABCDEF";
        shown = std::string("byte 0x") + hex[lead >> 4] + hex[lead & 15];
    } else {
        // Only whole characters, and never a control byte, go into the quotes.
        std::size_t end = pos + first;
        while (end < std::min(text.size(), pos + length)) {
            std::size_t next = utf8_sequence_length(text, end);
            if (next == 0 || static_cast<unsigned char>(text[end]) < 0x20) break;
            end += next;
        }
        shown = "'" + std::string(text.substr(pos, end - pos)) + "'";
    }
    return "character " + std::to_string(character) + " (" + shown + ")";
}

}  // namespace almanac
