// SPDX-License-Identifier: MIT
// The options of a chart, read from a JSON object such as
//   {"title": "Daily sales", "width": 900, "height": 420, "y_caption": "EUR"}
// Every key is optional; null means "the default". Unknown keys, wrong types
// and values out of range are errors, so a typo never goes unnoticed.
#pragma once

#include <string>
#include <string_view>

namespace almanac {

struct ChartOptions {
    static constexpr int kMinWidth = 200, kMaxWidth = 10000;
    static constexpr int kMinHeight = 150, kMaxHeight = 10000;

    std::string title;  // empty: no title line
    int width = 800;    // pixels
    int height = 400;
    std::string y_caption;  // empty: no caption beside the y axis
};

// Throws almanac::Error naming the key and the value, and what was expected.
ChartOptions parse_chart_options(std::string_view json);

}  // namespace almanac
