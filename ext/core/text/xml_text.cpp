// SPDX-License-Identifier: MIT
#include "core/text/xml_text.h"

#include <cstdint>

#include "core/text/utf8.h"

namespace almanac {

namespace {

constexpr const char* kReplacement = "\xEF\xBF\xBD";  // U+FFFD

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
        std::size_t length = utf8_decode(text, i, c);
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

}  // namespace almanac
