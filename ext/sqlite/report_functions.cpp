// SPDX-License-Identifier: MIT
// Report functions: pictures of a series, from SQL.
//
// 1. sparkline(y, x) — aggregate. y a number (NULL allowed), x a number or a
//    time value (TEXT that is not a number is read as a time value). Returns
//    TEXT with one character per row whose x is not NULL, in x order: U+2581
//    ... U+2588 at level round(7 (y - min) / (max - min)), halves rounded up;
//    every row U+2584 when all values are equal; a space for a NULL y. Rows
//    with equal x keep the order in which SQLite fed them. Rows with a NULL x
//    are skipped (they have no place in the order). No rows → NULL.
//    Raises: y not a number; x not a number or a time value; x mixing
//    numbers and time values within one group.
// 2. svg_line_chart(x, y, series [, layer [, options]]) — aggregate. x as for
//    sparkline (time values get a calendar axis in UTC, numbers a numeric
//    axis); y a number, NULL breaks the line; series TEXT or a number (its
//    text is the name; NULL skips the row); layer 'raw' or 'smooth' (any
//    case; NULL or omitted: 'smooth'); options NULL or a JSON object with
//    title, width, height, y_caption (null values mean the default), the
//    same for every row. Returns TEXT: an SVG document with one path per
//    (series, layer), a legend entry per series. Rows with a NULL x or NULL
//    series are skipped; no rows left → NULL.
//    series_order (colours in that order first), period (a spec: a line
//    breaks over a period without a row) and zone (the calendar axis in that
//    zone's local time).
//    Raises: bad x/y/series/layer/options (invalid JSON, unknown key, wrong
//    type, out of range, options differing between rows); x mixing numbers
//    and time values; more than 64 series or 200,000 rows.
// 3. svg_bar_chart(x, y, series [, options]) — aggregate. x a number, a time
//    value, or a category (other TEXT; TEXT that begins like YYYY-MM-DD must
//    be a valid time value); y a number (NULL: no bar); series and options as
//    for svg_line_chart. Returns TEXT: an SVG document with one rect per row
//    with a y, the bars of one x side by side in legend order, a zero
//    baseline; time x on a calendar axis, each bar inside its period (the
//    period option's, else the smallest step between x values). Rows with a
//    NULL x or series are skipped; no rows left → NULL. Raises as
//    svg_line_chart.
#include <memory>
#include <optional>
#include <string>
#include <type_traits>

#include "aggregate_state.h"
#include "arguments.h"
#include "core/chart/axis_kind.h"
#include "core/chart/bar_chart.h"
#include "core/chart/chart_options.h"
#include "core/chart/line_chart.h"
#include "core/chart/sparkline.h"
#include "core/text/error.h"
#include "registration.h"

namespace almanac::sqlite {

namespace {

// A number (including numeric TEXT, as SQLite reads it) or a time value.
// With a zone, time values are placed on its wall clock (see time_axis_value).
// With categories, TEXT that is neither a number nor a time value is a
// category (the caller reads its text).
std::optional<AxisValue> read_x(const ArgumentRef& arg, sqlite3_value* value,
                                const ZoneClock* zone = nullptr, bool categories = false) {
    switch (sqlite3_value_type(value)) {
        case SQLITE_NULL:
            return std::nullopt;
        case SQLITE_INTEGER:
        case SQLITE_FLOAT:
            return AxisValue{AxisKind::Number, *read_number(arg, value)};
        case SQLITE_TEXT: {
            const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
            try {
                return axis_value_of_text(
                    std::string_view(text ? text : "", sqlite3_value_bytes(value)), zone,
                    categories);
            } catch (const Error& error) {
                raise_argument_error(arg, value, error.what());
            }
        }
        default:
            raise_argument_error(arg, value, "expected a number or a time value, not a BLOB");
    }
}

// The kind of this row's x against the group's first (a sparkline's guard or
// a chart): the other kind is an error about x.
template <typename Taker>
void accept_x_kind(Taker& taker, const ArgumentRef& arg, sqlite3_value* value, AxisKind kind) {
    try {
        if constexpr (std::is_same_v<Taker, AxisKindGuard>)
            taker.accept(kind);
        else
            taker.accept_x_kind(kind);
    } catch (const Error& error) {
        raise_argument_error(arg, value, error.what());
    }
}

// ---------------------------------------------------------------------------
// sparkline(y, x)

struct SparklineState {
    AxisKindGuard x_kind;
    Sparkline line;
};

void sparkline_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        auto y = read_number({"sparkline", 1, "y"}, argv[0]);
        ArgumentRef x_arg{"sparkline", 2, "x"};
        auto x = read_x(x_arg, argv[1]);
        auto& state = aggregate_state<SparklineState>(context);
        if (!x) return;
        accept_x_kind(state.x_kind, x_arg, argv[1], x->kind);
        state.line.add(x->value, y);
    });
}

void sparkline_final(sqlite3_context* context) {
    guarded(context, [&] {
        auto state = take_state<SparklineState>(context);
        if (!state || state->line.empty()) {
            sqlite3_result_null(context);
            return;
        }
        std::string text = state->line.render();
        sqlite3_result_text(context, text.data(), int(text.size()), SQLITE_TRANSIENT);
    });
}

// ---------------------------------------------------------------------------
// svg_line_chart(x, y, series [, layer [, options]])

constexpr const char* kChart = "svg_line_chart";

struct ChartState {
    LineChart chart;
    ChartSettings settings;
};

std::optional<std::string> read_series(const ArgumentRef& arg, sqlite3_value* value) {
    switch (sqlite3_value_type(value)) {
        case SQLITE_NULL:
            return std::nullopt;
        case SQLITE_BLOB:
            raise_argument_error(arg, value,
                                 "expected TEXT or a number as the series name, not a BLOB");
        default: {
            // A number names its series by SQLite's own text for it (42, 1.5).
            const char* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
            return std::string(text ? text : "", sqlite3_value_bytes(value));
        }
    }
}

void read_options(ChartSettings& settings, const ArgumentRef& arg, sqlite3_value* value) {
    auto text = read_text(arg, value);
    try {
        settings.accept(text);
    } catch (const Error& error) {
        raise_argument_error(arg, value, error.what());
    }
}

void chart_step(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        auto& state = aggregate_state<ChartState>(context);
        if (argc >= 5) read_options(state.settings, {kChart, 5, "options"}, argv[4]);
        const ChartOptions& options = state.settings.options();
        ArgumentRef x_arg{kChart, 1, "x"};
        auto x = read_x(x_arg, argv[0], options.zone ? &*options.zone : nullptr);
        auto y = read_number({kChart, 2, "y"}, argv[1]);
        auto series = read_series({kChart, 3, "series"}, argv[2]);
        ChartLayer layer = ChartLayer::Smooth;
        if (argc >= 4) {
            ArgumentRef layer_arg{kChart, 4, "layer"};
            if (auto word = read_text(layer_arg, argv[3])) {
                try {
                    layer = parse_chart_layer(*word);
                } catch (const Error& error) {
                    raise_argument_error(layer_arg, argv[3], error.what());
                }
            }
        }
        if (!x || !series) return;
        accept_x_kind(state.chart, x_arg, argv[0], x->kind);
        try {
            state.chart.add(x->value, y, *series, layer);
        } catch (const Error& error) {
            raise_function_error(kChart, error.what());
        }
    });
}

// Both charts end alike: the SVG document, or NULL when no row had a place.
template <typename State>
void chart_final(sqlite3_context* context) {
    guarded(context, [&] {
        auto state = take_state<State>(context);
        if (!state || state->chart.empty()) {
            sqlite3_result_null(context);
            return;
        }
        std::string svg = state->chart.render_svg(state->settings.options());
        sqlite3_result_text(context, svg.data(), int(svg.size()), SQLITE_TRANSIENT);
    });
}

// ---------------------------------------------------------------------------
// svg_bar_chart(x, y, series [, options])

constexpr const char* kBarChart = "svg_bar_chart";

struct BarChartState {
    BarChart chart;
    ChartSettings settings;
};

void bar_chart_step(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        auto& state = aggregate_state<BarChartState>(context);
        if (argc >= 4) read_options(state.settings, {kBarChart, 4, "options"}, argv[3]);
        const ChartOptions& options = state.settings.options();
        ArgumentRef x_arg{kBarChart, 1, "x"};
        auto x = read_x(x_arg, argv[0], options.zone ? &*options.zone : nullptr, true);
        auto y = read_number({kBarChart, 2, "y"}, argv[1]);
        auto series = read_series({kBarChart, 3, "series"}, argv[2]);
        if (!x || !series) return;
        accept_x_kind(state.chart, x_arg, argv[0], x->kind);
        try {
            if (x->kind == AxisKind::Category) {
                auto category = read_text(x_arg, argv[0]);
                state.chart.add_category(*category, y, *series);
            } else {
                state.chart.add(x->value, y, *series);
            }
        } catch (const Error& error) {
            raise_function_error(kBarChart, error.what());
        }
    });
}

}  // namespace

int register_report_functions(sqlite3* db) {
    const int flags = SQLITE_UTF8 | SQLITE_DETERMINISTIC;
    int rc = sqlite3_create_function(db, "sparkline", 2, flags, nullptr, nullptr, sparkline_step,
                                     sparkline_final);
    for (int argc = 3; argc <= 5 && rc == SQLITE_OK; ++argc)
        rc = sqlite3_create_function(db, kChart, argc, flags, nullptr, nullptr, chart_step,
                                     chart_final<ChartState>);
    for (int argc = 3; argc <= 4 && rc == SQLITE_OK; ++argc)
        rc = sqlite3_create_function(db, kBarChart, argc, flags, nullptr, nullptr, bar_chart_step,
                                     chart_final<BarChartState>);
    return rc;
}

}  // namespace almanac::sqlite
