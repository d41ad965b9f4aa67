// SPDX-License-Identifier: MIT
// UTF-8, the one place that knows its byte patterns (RFC 3629). SQLite TEXT is
// not guaranteed to be valid UTF-8, so every reader here says what it does
// with a byte that does not start a well-formed sequence.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>

namespace almanac {

// Length of the well-formed sequence at text[i] (no overlong forms, no
// surrogates, nothing above U+10FFFF), with its code point; 0 when there is
// none (a stray continuation byte, a cut or malformed sequence).
std::size_t utf8_decode(std::string_view text, std::size_t i, std::uint32_t& code_point);

// The same length without the code point: 0 where no well-formed sequence starts.
std::size_t utf8_sequence_length(std::string_view text, std::size_t i);

// Appends the encoding of a code point (at most U+10FFFF, not a surrogate).
void utf8_append(std::string& out, std::uint32_t code_point);

bool is_valid_utf8(std::string_view text);

// Number of code points (an invalid byte counts as one).
std::size_t utf8_length(std::string_view text);

// Bytes taken by the character at text[i]: its sequence when well formed,
// otherwise the one byte.
std::size_t utf8_character_bytes(std::string_view text, std::size_t i);

// The longest prefix of at most max_bytes that does not end inside a
// multi-byte sequence, so the prefix of valid text is valid text.
std::string_view utf8_prefix(std::string_view text, std::size_t max_bytes);

// The first max_code_points code points (cut only on a code point boundary),
// followed by U+2026 when something was cut.
std::string shorten_utf8(std::string_view text, std::size_t max_code_points);

}  // namespace almanac
