// SPDX-License-Identifier: MIT
#include "core/chart/svg_writer.h"

#include <cmath>

#include "core/text/number_text.h"
#include "core/text/xml_text.h"

namespace almanac {

std::string svg_number(double value) {
    double rounded = std::round(value * 100.0) / 100.0;
    if (rounded == 0.0) rounded = 0.0;  // no "-0"
    std::string text = fixed_double(rounded, 2);
    while (text.back() == '0') text.pop_back();
    if (text.back() == '.') text.pop_back();
    return text;
}

SvgWriter::SvgWriter(double width, double height, const SvgAttributes& extra) {
    SvgAttributes attributes = {
        {"xmlns", "http://www.w3.org/2000/svg"},
        {"width", svg_number(width)},
        {"height", svg_number(height)},
        {"viewBox", "0 0 " + svg_number(width) + " " + svg_number(height)},
    };
    attributes.insert(attributes.end(), extra.begin(), extra.end());
    open("svg", attributes);
}

void SvgWriter::start_tag(std::string_view tag, const SvgAttributes& attributes) {
    out_ += '<';
    out_ += tag;
    for (const auto& attribute : attributes) {
        out_ += ' ';
        out_ += attribute.name;
        out_ += "=\"";
        out_ += xml_escape(attribute.value);
        out_ += '"';
    }
}

void SvgWriter::open(std::string_view tag, const SvgAttributes& attributes) {
    start_tag(tag, attributes);
    out_ += ">\n";
    open_.emplace_back(tag);
}

void SvgWriter::close() {
    out_ += "</" + open_.back() + ">\n";
    open_.pop_back();
}

void SvgWriter::empty(std::string_view tag, const SvgAttributes& attributes) {
    start_tag(tag, attributes);
    out_ += "/>\n";
}

void SvgWriter::text(std::string_view tag, const SvgAttributes& attributes,
                     std::string_view content) {
    start_tag(tag, attributes);
    out_ += '>';
    out_ += xml_escape(content);
    out_ += "</";
    out_ += tag;
    out_ += ">\n";
}

std::string SvgWriter::finish() {
    while (!open_.empty()) close();
    return std::move(out_);
}

}  // namespace almanac
