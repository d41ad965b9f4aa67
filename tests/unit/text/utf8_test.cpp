// SPDX-License-Identifier: MIT
#include "core/text/utf8.h"

#include <catch2/catch.hpp>

using namespace almanac;

// Byte patterns below are from RFC 3629, section 4 (syntax) and the table in section 3.

TEST_CASE("well-formed sequences decode to their code points") {
    std::uint32_t c = 0;
    CHECK(utf8_decode("A", 0, c) == 1);
    CHECK(c == 0x41);
    CHECK(utf8_decode("\xC3\xA9", 0, c) == 2);
    CHECK(c == 0xE9);
    CHECK(utf8_decode("\xE2\x82\xAC", 0, c) == 3);
    CHECK(c == 0x20AC);
    CHECK(utf8_decode("\xF0\x9F\x98\x80", 0, c) == 4);
    CHECK(c == 0x1F600);
}

TEST_CASE("ill-formed sequences decode to nothing") {
    std::uint32_t c = 0;
    for (const char* bad : {"\x80", "\xC3", "\xC0\xAF", "\xE0\x80\xAF", "\xED\xA0\x80",
                            "\xF4\x90\x80\x80", "\xFF", "\xC3\x41"}) {
        INFO(bad);
        CHECK(utf8_decode(bad, 0, c) == 0);
        CHECK_FALSE(is_valid_utf8(bad));
    }
    CHECK(is_valid_utf8("caf\xC3\xA9"));
    CHECK(is_valid_utf8(""));
}

TEST_CASE("encoding gives back the bytes decoding read") {
    for (std::uint32_t c : {0x24u, 0xA2u, 0x939u, 0x20ACu, 0xD55Cu, 0x10348u, 0x10FFFFu}) {
        std::string bytes;
        utf8_append(bytes, c);
        std::uint32_t back = 0;
        CHECK(utf8_decode(bytes, 0, back) == bytes.size());
        CHECK(back == c);
    }
}

TEST_CASE("a byte prefix never ends inside a character") {
    std::string text =
        "ab\xC3\xA9"
        "cd";  // a b é c d
    CHECK(utf8_prefix(text, 3) == "ab");
    CHECK(utf8_prefix(text, 4) == "ab\xC3\xA9");
    CHECK(utf8_prefix(text, 2) == "ab");
    CHECK(utf8_prefix(text, 100) == text);
    CHECK(utf8_prefix("\xF0\x9F\x98\x80", 3).empty());
    for (std::size_t cut = 0; cut <= text.size(); ++cut)
        CHECK(is_valid_utf8(utf8_prefix(text, cut)));
}

TEST_CASE("shortening cuts on code point boundaries") {
    CHECK(shorten_utf8("abcdef", 3) == "abc\xE2\x80\xA6");
    CHECK(shorten_utf8("abc", 3) == "abc");
    CHECK(shorten_utf8("\xC3\xA9\xC3\xA9\xC3\xA9", 2) == "\xC3\xA9\xC3\xA9\xE2\x80\xA6");
    CHECK(utf8_length("\xC3\xA9t\xC3\xA9") == 3);
    CHECK(utf8_length("\xFF\xFE") == 2);  // an invalid byte counts as one
}

TEST_CASE("a character's bytes are its sequence, or one byte when it is not one") {
    CHECK(utf8_character_bytes("\xE2\x82\xAC!", 0) == 3);
    CHECK(utf8_character_bytes("\xE2\x82!", 0) == 1);
}
