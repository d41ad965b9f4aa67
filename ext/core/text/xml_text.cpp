// SPDX-License-Identifier: MIT
#include "core/text/xml_text.h"

#include <cstdint>

namespace almanac {

namespace {

constexpr const char* kReplacement = "\xEF\xBF\xBD";  // U+FFFD

// Length of the well-formed UTF-8 sequence at text[i] (RFC 3629: no overlong
// forms, no surrogates, nothing above U+10FFFF), or 0 when it is not one.
std::size_t utf8_sequence(std::string_view text, std::size_t i, std::uint32_t& code_point) {
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
        if ((byte(i + k) & 0xC0) != 0x80) return 0;
        code_point = (code_point << 6) | (byte(i + k) & 0x3F);
    }
    if (code_point < minimum || code_point > 0x10FFFF) return 0;
    if (code_point >= 0xD800 && code_point <= 0xDFFF) return 0;
    return length;
}

bool allowed_in_xml(std::uint32_t c) {
    if (c < 0x20) return c == 0x09 || c == 0x0A || c == 0x0D;
    return c != 0xFFFE && c != 0xFFFF;
}

}  // namespace

std::string xml_escape(std::string_view text) {
    std::string out;
    out.reserve(text.size() + 16);
    std::size_t i = 0;
    while (i < text.size()) {
        std::uint32_t c = 0;
        std::size_t length = utf8_sequence(text, i, c);
        if (length == 0) {
            out += kReplacement;
            ++i;
            continue;
        }
        switch (c) {
            case '&':
                out += "&amp;";
                break;
            case '<':
                out += "&lt;";
                break;
            case '>':
                out += "&gt;";
                break;
            case '"':
                out += "&quot;";
                break;
            case '\'':
                out += "&#39;";
                break;
            // Newlines and tabs are legal, but an attribute value would
            // normalise them to spaces; keep them as references.
            case '\n':
                out += "&#10;";
                break;
            case '\r':
                out += "&#13;";
                break;
            case '\t':
                out += "&#9;";
                break;
            default:
                if (allowed_in_xml(c))
                    out.append(text.substr(i, length));
                else
                    out += kReplacement;
        }
        i += length;
    }
    return out;
}

std::size_t utf8_length(std::string_view text) {
    std::size_t count = 0;
    for (std::size_t i = 0; i < text.size(); ++count) {
        std::uint32_t c;
        std::size_t length = utf8_sequence(text, i, c);
        i += length ? length : 1;
    }
    return count;
}

std::string shorten_utf8(std::string_view text, std::size_t max_code_points) {
    std::size_t i = 0, count = 0;
    while (i < text.size() && count < max_code_points) {
        std::uint32_t c;
        std::size_t length = utf8_sequence(text, i, c);
        i += length ? length : 1;
        ++count;
    }
    if (i >= text.size()) return std::string(text);
    return std::string(text.substr(0, i)) + "\xE2\x80\xA6";  // U+2026
}

}  // namespace almanac
