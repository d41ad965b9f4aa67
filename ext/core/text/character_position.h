// SPDX-License-Identifier: MIT
// Where a reader stopped, as a message shows it: "character 12 ('x')". The
// position counts characters, not bytes, and a byte that is a control
// character or not valid UTF-8 is shown in hex, so the message is always
// valid, printable text whatever the input was (NUL bytes included).
#pragma once

#include <cstddef>
#include <string>
#include <string_view>

namespace almanac {

// "character N ('c')" for the character at byte pos (pos < text.size()); with
// length, that many bytes are shown (a number that is out of range, say).
std::string character_at(std::string_view text, std::size_t pos, std::size_t length = 0);

}  // namespace almanac
