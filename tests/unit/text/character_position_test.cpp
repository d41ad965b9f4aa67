// SPDX-License-Identifier: MIT
#include "core/text/character_position.h"

#include <catch2/catch.hpp>
#include <string>

#include "core/text/utf8.h"

using namespace almanac;

TEST_CASE("positions count characters, not bytes") {
    // UTF-8 (RFC 3629): 'é' is two bytes, so the 'x' after it is character 3.
    CHECK(character_at("\xC3\xA9"
                       "ax",
                       3) == "character 3 ('x')");
    CHECK(character_at("\xC3\xA9"
                       "ax",
                       0) == "character 1 ('\xC3\xA9')");
}

TEST_CASE("bytes that are not printable UTF-8 are shown in hex") {
    std::string nul("a\0b", 3);
    CHECK(character_at(nul, 1) == "character 2 (byte 0x00)");
    CHECK(character_at("a\xFF", 1) == "character 2 (byte 0xFF)");
    // RFC 3629: a surrogate (ED A0 80) and an overlong form (E0 80 80) are not UTF-8.
    CHECK(utf8_sequence_length("\xED\xA0\x80", 0) == 0);
    CHECK(utf8_sequence_length("\xE0\x80\x80", 0) == 0);
    CHECK(utf8_sequence_length("\xE2\x82\xAC", 0) == 3);  // U+20AC, the euro sign
}

TEST_CASE("a shown run stops before a byte that is not a whole character") {
    CHECK(character_at("13\xFF", 0, 3) == "character 1 ('13')");
}
