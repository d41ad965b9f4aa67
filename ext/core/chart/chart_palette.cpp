// SPDX-License-Identifier: MIT
#include "core/chart/chart_palette.h"

#include "core/chart/svg_writer.h"

namespace almanac {

namespace {

// Designed for almanac, not taken from any library. Method: a numerical
// search over 8-bit sRGB colours maximised the smallest pairwise CIE76
// colour difference under the simulated protanopia, deuteranopia and
// tritanopia of Machado, Oliveira and Fernandes (2009, severity 1), plus half
// the smallest difference for normal vision, subject to greyscale
// constraints: neighbours at least 6 apart in CIE L* and 12/255 apart in
// BT.601 luma (so the colours stay apart printed in grey, whichever
// conversion the printer uses), lightness within 28..76 (the lightest still
// visible on white). The entries are then ordered greedily so that the
// first k are as far apart as possible for every k: a two-series chart gets
// the most distinct pair. tests/reference/test_palette.py re-checks all of
// it from the colours the SVG uses.
constexpr const char* kColours[kPaletteSize] = {
    "#7308ea",  // violet      L* 37
    "#ee1a08",  // vermilion   L* 51
    "#8aacde",  // sky blue    L* 70
    "#e2568e",  // rose        L* 57
    "#f9ac29",  // amber       L* 76
    "#003ba2",  // navy        L* 29
    "#636b43",  // olive       L* 44
    "#01b14a",  // green       L* 63
};

// Gaps are at least 2.5 widths, so the round caps (half a width each end)
// still leave a visible gap of 1.5 widths.
const std::vector<double> kDashes[kDashPatterns] = {
    {},                            // solid
    {5, 3},                        // long dash
    {0.5, 2.5},                    // dots
    {5, 2.5, 0.5, 2.5},            // dash dot
    {2, 2.5},                      // short dash
    {10, 3},                       // very long dash
    {5, 2.5, 0.5, 2.5, 0.5, 2.5},  // dash dot dot
    {2, 2.5, 0.5, 2.5},            // short dash dot
};

}  // namespace

const char* palette_colour(std::size_t i) { return kColours[i % kPaletteSize]; }

SeriesStyle series_style(std::size_t rank) {
    return {kColours[rank % kPaletteSize], kDashes[(rank / kPaletteSize) % kDashPatterns]};
}

std::string dash_array(const SeriesStyle& style, double stroke_width) {
    std::string out;
    for (double length : style.dashes) {
        if (!out.empty()) out += ' ';
        out += svg_number(length * stroke_width);
    }
    return out;
}

}  // namespace almanac
