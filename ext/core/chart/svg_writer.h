// SPDX-License-Identifier: MIT
// Writes an SVG document element by element. Every attribute value and every
// text node goes through xml_escape, so no caller can forget to escape text
// that came from data; element and attribute names are the code's own.
#pragma once

#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace almanac {

struct SvgAttribute {
    std::string_view name;
    std::string value;
};

using SvgAttributes = std::vector<SvgAttribute>;

// A coordinate or length as SVG text: at most two decimals, no trailing
// zeros, never "-0" (a hundredth of a pixel is below what any screen shows).
std::string svg_number(double value);

class SvgWriter {
  public:
    // Starts the document: <svg xmlns=... width height viewBox + extra attributes>.
    SvgWriter(double width, double height, const SvgAttributes& extra = {});

    void open(std::string_view tag, const SvgAttributes& attributes = {});
    void close();  // closes the innermost open element
    void empty(std::string_view tag, const SvgAttributes& attributes);
    void text(std::string_view tag, const SvgAttributes& attributes, std::string_view content);

    // Closes every open element and returns the document.
    std::string finish();

  private:
    void start_tag(std::string_view tag, const SvgAttributes& attributes);
    std::string out_;
    std::vector<std::string> open_;
};

}  // namespace almanac
