// SPDX-License-Identifier: MIT
// The options of a chart, read from a JSON object such as
//   {"title": "Daily sales", "width": 900, "height": 420, "y_caption": "EUR",
//    "series_order": ["Espresso", "Rye"], "period": "week", "zone": "America/Denver"}
// Every key is optional; null means "the default". Unknown keys, wrong types
// and values out of range are errors, so a typo never goes unnoticed.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/time/period_spec.h"
#include "core/time/zone_clock.h"

namespace almanac {

struct ChartOptions {
    static constexpr int kMinWidth = 200, kMaxWidth = 10000;
    static constexpr int kMinHeight = 150, kMaxHeight = 10000;
    // The longest options text read (README "Limits"): room for a
    // series_order of thousands of item names.
    static constexpr std::size_t kLongestText = 100000;

    std::string title;  // empty: no title line
    int width = 800;    // pixels
    int height = 400;
    std::string y_caption;  // empty: no caption beside the y axis
    // Colours go to these names first, in this order, then to the others in
    // sorted order: a report that passes its whole item list keeps each
    // item's colour in every chart, whichever items a chart shows.
    std::vector<std::string> series_order;
    // x values are the starts of these periods: a line breaks over a period
    // without a row, and a bar fills its period on the calendar axis.
    std::optional<PeriodSpec> period;
    // The calendar axis (and `period`) in this zone's local time.
    std::optional<ZoneClock> zone;
};

// The keys parse_chart_options knows, for messages: "title, width, ...".
const char* known_chart_option_keys();

// Throws almanac::Error naming the key and the value, and what was expected.
ChartOptions parse_chart_options(std::string_view json);

// The options of one chart as its rows give them: read on the first row and
// the same on every other (a chart is one picture).
class ChartSettings {
  public:
    // The row's options text (nothing for NULL). Throws almanac::Error for
    // options that do not parse, or that differ from the first row's.
    void accept(const std::optional<std::string>& text);
    const ChartOptions& options() const { return options_; }
    bool read() const { return read_; }
    const std::optional<std::string>& text() const { return text_; }

  private:
    bool read_ = false;
    std::optional<std::string> text_;  // as given on the first row
    ChartOptions options_;
};

}  // namespace almanac
