// SPDX-License-Identifier: MIT
#include "core/chart/chart_layout.h"

#include <algorithm>

#include "core/chart/calendar_ticks.h"
#include "core/text/utf8.h"

namespace almanac {

using namespace chart_style;

double text_width(std::string_view text) { return double(utf8_length(text)) * kCharWidth; }

namespace {

// Fewer ticks until the widest label fits its share of the axis.
AxisScale numeric_x_scale(double x_min, double x_max, double plot_w) {
    AxisScale scale;
    for (int target = std::max(2, int(plot_w / 80));; --target) {
        scale = numeric_scale(x_min, x_max, target, false);
        double widest = 0;
        for (const auto& tick : scale.ticks) widest = std::max(widest, text_width(tick.label));
        double share = plot_w / double(std::max<std::size_t>(1, scale.ticks.size()));
        if (widest + 12 <= share || target <= 1) return scale;
    }
}

// One tick per category; when the names do not fit, only every k-th is labelled.
AxisScale category_scale(const std::vector<std::string>& categories, double plot_w) {
    AxisScale scale;
    scale.low = -0.5;
    scale.high = double(categories.size()) - 0.5;
    double widest = 0;
    for (const auto& name : categories) widest = std::max(widest, text_width(name));
    double share = plot_w / double(std::max<std::size_t>(1, categories.size()));
    std::size_t every =
        std::max<std::size_t>(1, std::size_t((widest + 12) / std::max(1.0, share)) + 1);
    for (std::size_t i = 0; i < categories.size(); i += every)
        scale.ticks.push_back({double(i), categories[i], ""});
    return scale;
}

}  // namespace

ChartLayout lay_out_chart(const ChartOptions& options, const std::vector<std::string>& names,
                          const ChartExtent& extent) {
    ChartLayout layout;
    layout.width = options.width;
    layout.height = options.height;

    // Vertical layout: title, plot, two lines of x labels.
    layout.has_title = !options.title.empty();
    const double top = kMargin + (layout.has_title ? kTitleFont + 14 : 4);
    const double bottom = kMargin + 2 * kFont + 14;
    layout.plot_h = std::max(40.0, layout.height - top - bottom);

    layout.y_scale =
        numeric_scale(extent.y_min, extent.y_max, std::max(2, int(layout.plot_h / 45)), true);
    double y_label_w = 0;
    for (const auto& tick : layout.y_scale.ticks)
        y_label_w = std::max(y_label_w, text_width(tick.label));

    // Horizontal layout: caption, y labels, plot, legend columns.
    layout.has_caption = !options.y_caption.empty();
    const double left = kMargin + (layout.has_caption ? kFont + 10 : 0) + y_label_w + 8;
    layout.per_column = std::max<std::size_t>(1, std::size_t(layout.plot_h / kLegendRow));
    layout.columns = names.empty() ? 0 : (names.size() + layout.per_column - 1) / layout.per_column;
    std::size_t longest = 0;
    for (const auto& name : names) longest = std::max(longest, utf8_length(name));
    layout.legend_chars = std::min(kLegendChars, longest);
    auto legend_width = [&](std::size_t chars) {
        return double(layout.columns) * (kSwatch + 6 + double(chars + 1) * kCharWidth + 10);
    };
    // Long names give way to the plot: the legend takes at most 40% of the width.
    while (layout.legend_chars > 6 && legend_width(layout.legend_chars) > 0.4 * layout.width)
        --layout.legend_chars;
    layout.legend_w = layout.columns ? legend_width(layout.legend_chars) : 0;
    const double right = kMargin + layout.legend_w;
    layout.plot_w = std::max(40.0, layout.width - left - right);
    layout.plot_x0 = left;
    layout.plot_x1 = left + layout.plot_w;
    layout.plot_y0 = top;
    layout.plot_y1 = top + layout.plot_h;

    if (!extent.categories.empty()) {
        layout.x_scale = category_scale(extent.categories, layout.plot_w);
    } else if (extent.kind == AxisKind::Time) {
        layout.x_scale = calendar_scale(instant_from_axis_value(extent.x_min),
                                        instant_from_axis_value(extent.x_max),
                                        std::max(2, int(layout.plot_w / 64)), extent.whole_days);
    } else {
        layout.x_scale = numeric_x_scale(extent.x_min, extent.x_max, layout.plot_w);
    }
    return layout;
}

}  // namespace almanac
