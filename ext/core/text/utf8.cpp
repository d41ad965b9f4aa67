// SPDX-License-Identifier: MIT
#include "core/text/utf8.h"

namespace almanac {

namespace {
bool is_continuation(char c) { return (static_cast<unsigned char>(c) & 0xC0) == 0x80; }
}  // namespace

std::size_t utf8_decode(std::string_view text, std::size_t i, std::uint32_t& code_point) {
    auto byte = [&](std::size_t k) { return static_cast<unsigned char>(text[k]); };
    unsigned char lead = byte(i);
    std::size_t length;
    std::uint32_t minimum;
    if (lead < 0x80) {
        code_point = lead;
        return 1;
    } else if ((lead & 0xE0) == 0xC0) {
        length = 2, code_point = lead & 0x1F, minimum = 0x80;
    } else if ((lead & 0xF0) == 0xE0) {
        length = 3, code_point = lead & 0x0F, minimum = 0x800;
    } else if ((lead & 0xF8) == 0xF0) {
        length = 4, code_point = lead & 0x07, minimum = 0x10000;
    } else {
        return 0;
    }
    if (i + length > text.size()) return 0;
    for (std::size_t k = 1; k < length; ++k) {
        if (!is_continuation(text[i + k])) return 0;
        code_point = (code_point << 6) | (byte(i + k) & 0x3F);
    }
    if (code_point < minimum || code_point > 0x10FFFF) return 0;
    if (code_point >= 0xD800 && code_point <= 0xDFFF) return 0;
    return length;
}

std::size_t utf8_sequence_length(std::string_view text, std::size_t i) {
    std::uint32_t c;
    return utf8_decode(text, i, c);
}

void utf8_append(std::string& out, std::uint32_t c) {
    if (c < 0x80) {
        out += char(c);
    } else if (c < 0x800) {
        out += char(0xC0 | (c >> 6));
        out += char(0x80 | (c & 0x3F));
    } else if (c < 0x10000) {
        out += char(0xE0 | (c >> 12));
        out += char(0x80 | ((c >> 6) & 0x3F));
        out += char(0x80 | (c & 0x3F));
    } else {
        out += char(0xF0 | (c >> 18));
        out += char(0x80 | ((c >> 12) & 0x3F));
        out += char(0x80 | ((c >> 6) & 0x3F));
        out += char(0x80 | (c & 0x3F));
    }
}

bool is_valid_utf8(std::string_view text) {
    for (std::size_t i = 0; i < text.size();) {
        std::uint32_t c;
        std::size_t length = utf8_decode(text, i, c);
        if (length == 0) return false;
        i += length;
    }
    return true;
}

std::size_t utf8_character_bytes(std::string_view text, std::size_t i) {
    std::uint32_t c;
    std::size_t length = utf8_decode(text, i, c);
    return length ? length : 1;
}

std::size_t utf8_length(std::string_view text) {
    std::size_t count = 0;
    for (std::size_t i = 0; i < text.size(); ++count) i += utf8_character_bytes(text, i);
    return count;
}

std::string_view utf8_prefix(std::string_view text, std::size_t max_bytes) {
    if (text.size() <= max_bytes) return text;
    // text[cut] is the first byte left out; a continuation byte there means
    // the character it belongs to started inside the prefix.
    std::size_t cut = max_bytes;
    while (cut > 0 && is_continuation(text[cut])) --cut;
    return text.substr(0, cut);
}

std::string shorten_utf8(std::string_view text, std::size_t max_code_points) {
    std::size_t i = 0, count = 0;
    while (i < text.size() && count < max_code_points) {
        i += utf8_character_bytes(text, i);
        ++count;
    }
    if (i >= text.size()) return std::string(text);
    return std::string(text.substr(0, i)) + "\xE2\x80\xA6";  // U+2026
}

}  // namespace almanac
