// SPDX-License-Identifier: MIT
// Text that came from data, made safe to place inside an XML (SVG) document,
// as element content or as an attribute value.
#pragma once

#include <string>
#include <string_view>

namespace almanac {

// Escapes & < > " ' as character references, so the result is safe both as
// element content and inside a double- or single-quoted attribute. Characters
// XML 1.0 forbids even as references (C0 controls other than tab, newline and
// carriage return, U+FFFE, U+FFFF) and bytes that are not UTF-8 become U+FFFD,
// because SQLite TEXT is not guaranteed to be valid UTF-8 and one bad byte
// must not make the whole document unreadable.
std::string xml_escape(std::string_view text);

}  // namespace almanac
