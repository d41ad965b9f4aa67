// SPDX-License-Identifier: MIT
#include "core/chart/chart_frame.h"

#include "core/chart/chart_palette.h"
#include "core/text/utf8.h"

namespace almanac {

using namespace chart_style;

SvgWriter draw_chart_frame(const ChartLayout& layout, const ChartOptions& options,
                           const char* fallback_title) {
    const double plot_x0 = layout.plot_x0, plot_x1 = layout.plot_x1;
    const double plot_y0 = layout.plot_y0, plot_y1 = layout.plot_y1;
    SvgWriter svg(layout.width, layout.height,
                  {{"font-family", "DejaVu Sans, Verdana, Arial, sans-serif"},
                   {"font-size", svg_number(kFont)},
                   {"role", "img"}});
    svg.text("title", {}, layout.has_title ? options.title : fallback_title);
    svg.empty("rect", {{"width", svg_number(layout.width)},
                       {"height", svg_number(layout.height)},
                       {"fill", "#ffffff"}});
    if (layout.has_title)
        svg.text("text",
                 {{"class", "chart-title"},
                  {"x", svg_number(plot_x0)},
                  {"y", svg_number(kMargin + kTitleFont)},
                  {"font-size", svg_number(kTitleFont)},
                  {"font-weight", "bold"},
                  {"fill", kInk}},
                 options.title);

    // Grid under everything.
    svg.open("g", {{"class", "grid"}, {"stroke", kGrid}, {"stroke-width", "1"}});
    for (const auto& tick : layout.y_scale.ticks)
        svg.empty("line", {{"x1", svg_number(plot_x0)},
                           {"x2", svg_number(plot_x1)},
                           {"y1", svg_number(layout.py(tick.value))},
                           {"y2", svg_number(layout.py(tick.value))}});
    for (const auto& tick : layout.x_scale.ticks)
        svg.empty("line", {{"x1", svg_number(layout.px(tick.value))},
                           {"x2", svg_number(layout.px(tick.value))},
                           {"y1", svg_number(plot_y0)},
                           {"y2", svg_number(plot_y1)}});
    svg.close();

    // Y axis: labels right-aligned beside the ticks, the caption turned up the side.
    svg.open("g", {{"class", "y-axis"}, {"fill", kInk}});
    svg.empty("line", {{"x1", svg_number(plot_x0)},
                       {"x2", svg_number(plot_x0)},
                       {"y1", svg_number(plot_y0)},
                       {"y2", svg_number(plot_y1)},
                       {"stroke", kAxis}});
    for (const auto& tick : layout.y_scale.ticks)
        svg.text("text",
                 {{"x", svg_number(plot_x0 - 6)},
                  {"y", svg_number(layout.py(tick.value) + kFont * 0.35)},
                  {"text-anchor", "end"}},
                 tick.label);
    if (layout.has_caption) {
        double cx = kMargin + kFont * 0.8, cy = (plot_y0 + plot_y1) / 2;
        svg.text("text",
                 {{"class", "y-caption"},
                  {"x", svg_number(cx)},
                  {"y", svg_number(cy)},
                  {"text-anchor", "middle"},
                  {"transform", "rotate(-90 " + svg_number(cx) + " " + svg_number(cy) + ")"}},
                 options.y_caption);
    }
    svg.close();

    // X axis: labels centred under the ticks, context (year, day) on a second line.
    svg.open("g", {{"class", "x-axis"}, {"fill", kInk}, {"text-anchor", "middle"}});
    svg.empty("line", {{"x1", svg_number(plot_x0)},
                       {"x2", svg_number(plot_x1)},
                       {"y1", svg_number(plot_y1)},
                       {"y2", svg_number(plot_y1)},
                       {"stroke", kAxis}});
    for (const auto& tick : layout.x_scale.ticks) {
        double x = layout.px(tick.value);
        svg.empty("line", {{"x1", svg_number(x)},
                           {"x2", svg_number(x)},
                           {"y1", svg_number(plot_y1)},
                           {"y2", svg_number(plot_y1 + 4)},
                           {"stroke", kAxis}});
        svg.text("text", {{"x", svg_number(x)}, {"y", svg_number(plot_y1 + 6 + kFont)}},
                 tick.label);
        if (!tick.context.empty())
            svg.text(
                "text",
                {{"x", svg_number(x)}, {"y", svg_number(plot_y1 + 8 + 2 * kFont)}, {"fill", kAxis}},
                tick.context);
    }
    svg.close();
    return svg;
}

void draw_chart_legend(SvgWriter& svg, const ChartLayout& layout, const SeriesRanking& ranking,
                       LegendSwatch swatch, double line_width) {
    svg.open("g", {{"class", "legend"}, {"fill", kInk}});
    const double column_w = layout.columns ? layout.legend_w / double(layout.columns) : 0;
    for (std::size_t rank = 0; rank < ranking.names.size(); ++rank) {
        const std::string& name = ranking.names[rank];
        double x = layout.plot_x1 + kMargin + double(rank / layout.per_column) * column_w;
        double y = layout.plot_y0 + kLegendRow * (double(rank % layout.per_column) + 0.5);
        SeriesStyle style = series_style(ranking.slots[rank]);
        svg.open("g", {{"class", "legend-entry"}, {"data-series", name}});
        std::string shown = shorten_utf8(name, layout.legend_chars);
        if (shown != name) svg.text("title", {}, name);
        if (swatch == LegendSwatch::Line) {
            SvgAttributes attributes = {
                {"x1", svg_number(x)},      {"x2", svg_number(x + kSwatch)},
                {"y1", svg_number(y)},      {"y2", svg_number(y)},
                {"stroke", style.colour},   {"stroke-width", svg_number(line_width)},
                {"stroke-linecap", "round"}};
            std::string dashes = dash_array(style, line_width);
            if (!dashes.empty()) attributes.push_back({"stroke-dasharray", dashes});
            svg.empty("line", attributes);
        } else {
            SvgAttributes attributes = {{"x", svg_number(x + kSwatch / 2 - 6)},
                                        {"y", svg_number(y - 6)},
                                        {"width", "12"},
                                        {"height", "12"},
                                        {"fill", style.colour}};
            std::string dashes = dash_array(style, line_width);
            if (!dashes.empty())
                attributes.insert(attributes.end(), {{"stroke", kInk},
                                                     {"stroke-width", svg_number(line_width)},
                                                     {"stroke-dasharray", dashes}});
            svg.empty("rect", attributes);
        }
        svg.text("text", {{"x", svg_number(x + kSwatch + 6)}, {"y", svg_number(y + kFont * 0.35)}},
                 shown);
        svg.close();
    }
    svg.close();
}

}  // namespace almanac
