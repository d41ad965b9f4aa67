// SPDX-License-Identifier: MIT
#include "core/text/character_position.h"

#include <algorithm>

namespace almanac {

std::size_t utf8_length(std::string_view text, std::size_t pos) {
    auto byte = [&](std::size_t i) { return static_cast<unsigned char>(text[i]); };
    unsigned char lead = byte(pos);
    std::size_t length = lead < 0x80                    ? 1
                         : lead >= 0xC2 && lead <= 0xDF ? 2
                         : lead >= 0xE0 && lead <= 0xEF ? 3
                         : lead >= 0xF0 && lead <= 0xF4 ? 4
                                                        : 0;
    if (length == 0 || pos + length > text.size()) return 0;
    for (std::size_t i = 1; i < length; ++i)
        if ((byte(pos + i) & 0xC0) != 0x80) return 0;
    // RFC 3629: no overlong forms, no surrogates, nothing above U+10FFFF.
    unsigned char second = byte(pos + 1 < text.size() ? pos + 1 : pos);
    if ((lead == 0xE0 && second < 0xA0) || (lead == 0xED && second > 0x9F) ||
        (lead == 0xF0 && second < 0x90) || (lead == 0xF4 && second > 0x8F))
        return 0;
    return length;
}

std::string character_at(std::string_view text, std::size_t pos, std::size_t length) {
    std::size_t character = 1;
    for (std::size_t i = 0; i < pos; ++i)
        if ((static_cast<unsigned char>(text[i]) & 0xC0) != 0x80) ++character;
    std::string shown;
    unsigned char lead = static_cast<unsigned char>(text[pos]);
    std::size_t first = utf8_length(text, pos);
    if (first == 0 || lead < 0x20 || lead == 0x7F) {
        const char* hex = "0123456789ABCDEF";
        shown = std::string("byte 0x") + hex[lead >> 4] + hex[lead & 15];
    } else {
        // Only whole characters, and never a control byte, go into the quotes.
        std::size_t end = pos + first;
        while (end < std::min(text.size(), pos + length)) {
            std::size_t next = utf8_length(text, end);
            if (next == 0 || static_cast<unsigned char>(text[end]) < 0x20) break;
            end += next;
        }
        shown = "'" + std::string(text.substr(pos, end - pos)) + "'";
    }
    return "character " + std::to_string(character) + " (" + shown + ")";
}

}  // namespace almanac
