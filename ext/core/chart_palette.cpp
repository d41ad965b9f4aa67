#include "chart_palette.h"

#include "svg_writer.h"

namespace almanac {

namespace {

// Designed for almanac, not taken from any library. Method: the eight CIELAB
// lightness levels L* = 30, 36.3, ... 74 (evenly spaced, so the colours stay
// apart when printed in grey, and the lightest is still visible on white)
// were each given a hue and chroma by a numerical search that maximised the
// smallest pairwise CIE76 colour difference over normal vision and the
// simulated protanopia, deuteranopia and tritanopia of Machado, Oliveira and
// Fernandes (2009, severity 1) — weighting the simulated views fully and
// normal vision by half — inside the sRGB gamut. The result, rounded to
// 8 bits, was then ordered greedily so that the first k entries are as far
// apart as possible for every k: a two-series chart gets the most distinct
// pair. tests/reference/test_palette.py re-checks all of it from the SVG.
constexpr const char* kColours[kPaletteSize] = {
    "#572e99",  // deep violet   L* 30
    "#cc0116",  // signal red    L* 43
    "#07ccb8",  // turquoise     L* 74
    "#8f3753",  // wine          L* 36
    "#ba0af9",  // electric purple L* 49
    "#6187b4",  // steel blue    L* 55
    "#eb9002",  // amber         L* 68
    "#a09463",  // khaki         L* 61
};

// Gaps are at least 2.5 widths, so the round caps (half a width each end)
// still leave a visible gap of 1.5 widths.
const std::vector<double> kDashes[kDashPatterns] = {
    {},                                 // solid
    {5, 3},                             // long dash
    {0.5, 2.5},                         // dots
    {5, 2.5, 0.5, 2.5},                 // dash dot
    {2, 2.5},                           // short dash
    {10, 3},                            // very long dash
    {5, 2.5, 0.5, 2.5, 0.5, 2.5},       // dash dot dot
    {2, 2.5, 0.5, 2.5},                 // short dash dot
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
