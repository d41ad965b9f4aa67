// SPDX-License-Identifier: MIT
#include "core/text/xml_text.h"

#include <catch2/catch.hpp>

#include "core/chart/svg_writer.h"

using namespace almanac;

TEST_CASE("markup characters in data become character references") {
    // XML 1.0 (W3C, 5th ed.) section 2.4: & and < must be escaped in content,
    // quotes in attribute values; &amp; &lt; &gt; &quot; and &#39; are the standard references.
    CHECK(xml_escape("<script>alert(1)</script>") == "&lt;script&gt;alert(1)&lt;/script&gt;");
    CHECK(xml_escape("Fish & Chips") == "Fish &amp; Chips");
    CHECK(xml_escape("say \"hi\" o'clock") == "say &quot;hi&quot; o&#39;clock");
    CHECK(xml_escape("&amp;") ==
          "&amp;amp;");  // escaping is not idempotent on purpose: data is data
}

TEST_CASE("characters XML cannot hold and broken UTF-8 become U+FFFD") {
    // XML 1.0 section 2.2 (Char production): C0 controls other than #x9 #xA #xD are not allowed.
    CHECK(xml_escape(std::string("a\x01z", 3)) == "a\xEF\xBF\xBDz");
    CHECK(xml_escape(std::string("nul\0x", 5)) == "nul\xEF\xBF\xBDx");
    // RFC 3629: 0xFF never appears in UTF-8; C0 80 is an overlong NUL; ED A0 80 a surrogate.
    CHECK(xml_escape("\xFF") == "\xEF\xBF\xBD");
    CHECK(xml_escape("\xC0\x80") == "\xEF\xBF\xBD\xEF\xBF\xBD");
    CHECK(xml_escape("\xED\xA0\x80") == "\xEF\xBF\xBD\xEF\xBF\xBD\xEF\xBF\xBD");
    // Valid multi-byte text passes through unchanged (U+00E9, U+20AC, U+1F600).
    CHECK(xml_escape("caf\xC3\xA9 \xE2\x82\xAC \xF0\x9F\x98\x80") ==
          "caf\xC3\xA9 \xE2\x82\xAC \xF0\x9F\x98\x80");
}

TEST_CASE("newlines and tabs survive inside attribute values") {
    // XML 1.0 section 3.3.3: literal whitespace in attributes is normalised to spaces,
    // character references are not.
    CHECK(xml_escape("a\nb\tc\rd") == "a&#10;b&#9;c&#13;d");
}

TEST_CASE("the SVG writer escapes every attribute and text node") {
    SvgWriter svg(100, 50);
    svg.text("text", {{"data-series", "<b>\"x\"</b>"}}, "<script>alert(1)</script>");
    std::string doc = svg.finish();
    CHECK_THAT(doc, Catch::Contains("data-series=\"&lt;b&gt;&quot;x&quot;&lt;/b&gt;\""));
    CHECK_THAT(doc, Catch::Contains(">&lt;script&gt;alert(1)&lt;/script&gt;</text>"));
    CHECK_THAT(doc, !Catch::Contains("<script>"));
    CHECK_THAT(doc, Catch::EndsWith("</svg>\n"));
}

TEST_CASE("SVG numbers have at most two decimals and no negative zero") {
    // common practice: a hundredth of a pixel is below any display's resolution.
    CHECK(svg_number(12.0) == "12");
    CHECK(svg_number(12.345) == "12.35");
    CHECK(svg_number(-0.001) == "0");
    CHECK(svg_number(0.5) == "0.5");
}
