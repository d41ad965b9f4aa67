// SPDX-License-Identifier: MIT
// Report functions, for PostgreSQL: the SQLite module's contract
// (ext/sqlite/report_functions.cpp) over PostgreSQL's types.
//
// 1. sparkline(y, x): y double precision (NULL allowed), x double precision,
//    timestamptz, timestamp, date or text (text that is a number is a number,
//    other text a time value).
// 2. svg_line_chart(x, y, series text [, layer text [, options text]]) and
// 3. svg_bar_chart(x, y, series text [, options text]): x as for sparkline
//    (a bar chart also takes other text as categories), y double precision.
// Plain aggregates, parallel safe: a state keeps its rows beside the core's
// chart, fed row by row (so every limit and error meets the same row as in
// SQLite); combining feeds the other state's rows in after its own, and the
// byte form is the rows. Rows reach an aggregate in no fixed order (a
// parallel plan gives each worker a share), so the picture is drawn from the
// rows in one canonical order, by series, then x (categories by their text),
// then layer, rows that tie keeping the order they came in (as in SQLite):
// every plan draws the same SVG unless rows tie on all three, and it is the
// SQLite module's for rows fed in that order.
#include <algorithm>
#include <optional>
#include <string>
#include <type_traits>
#include <vector>

#include "aggregate_state.h"
#include "arguments.h"
#include "boundary.h"
#include "core/chart/axis_kind.h"
#include "core/chart/bar_chart.h"
#include "core/chart/chart_options.h"
#include "core/chart/line_chart.h"
#include "core/chart/sparkline.h"
#include "core/text/error.h"

namespace almanac::postgres {

// An x as the C part read it: a number, a time argument, or nothing (NULL).
struct XArgument {
    bool present = false;
    bool is_number = false;
    double number = 0;
    TimeArgument time{};
};

struct ChartRow {
    AxisKind kind = AxisKind::Number;
    double x = 0;
    std::optional<double> y;
    std::string series;
    ChartLayer layer = ChartLayer::Smooth;
    std::string category;  // AxisKind::Category
};

void write_row(ByteWriter& out, const ChartRow& row) {
    out.u8(static_cast<std::uint8_t>(row.kind));
    out.f64(row.x);
    out.u8(row.y ? 1 : 0);
    out.f64(row.y.value_or(0.0));
    out.text(row.series);
    out.u8(static_cast<std::uint8_t>(row.layer));
    out.text(row.category);
}

ChartRow read_row(ByteReader& in) {
    ChartRow row;
    std::uint8_t kind = in.u8();
    if (kind > static_cast<std::uint8_t>(AxisKind::Category))
        throw Error("a state's bytes hold an unknown axis kind");
    row.kind = static_cast<AxisKind>(kind);
    row.x = in.f64();
    bool has_y = in.u8() != 0;
    double y = in.f64();
    if (has_y) row.y = y;
    row.series = in.text();
    row.layer = in.u8() == 0 ? ChartLayer::Raw : ChartLayer::Smooth;
    row.category = in.text();
    return row;
}

// One chart's rows: the core's chart (LineChart, BarChart or a sparkline)
// and the rows it was given, for combining and the byte form.
template <typename Chart>
struct ChartState {
    ChartSettings settings;
    Chart chart;
    AxisKindGuard x_kind;  // the sparkline's; the charts keep their own
    std::vector<ChartRow> rows;

    void add(const ChartRow& row) {
        if constexpr (std::is_same_v<Chart, Sparkline>) {
            x_kind.accept(row.kind);
            chart.add(row.x, row.y);
        } else if constexpr (std::is_same_v<Chart, LineChart>) {
            chart.accept_x_kind(row.kind);
            chart.add(row.x, row.y, row.series, row.layer);
        } else {
            chart.accept_x_kind(row.kind);
            if (row.kind == AxisKind::Category)
                chart.add_category(row.category, row.y, row.series);
            else
                chart.add(row.x, row.y, row.series);
        }
        rows.push_back(row);
    }
};

using SparklineState = ChartState<Sparkline>;
using LineChartState = ChartState<LineChart>;
using BarChartState = ChartState<BarChart>;

template <typename Chart>
struct ChartTraits {
    static void merge(ChartState<Chart>& into, const ChartState<Chart>& from) {
        if (from.settings.read()) into.settings.accept(from.settings.text());
        for (const ChartRow& row : from.rows) into.add(row);
    }
    static void write(ByteWriter& out, const ChartState<Chart>& state) {
        out.u8((state.settings.read() ? 1 : 0) | (state.settings.text() ? 2 : 0));
        out.text(state.settings.text().value_or(""));
        out.i64(static_cast<std::int64_t>(state.rows.size()));
        for (const ChartRow& row : state.rows) write_row(out, row);
    }
    static void read(ByteReader& in, ChartState<Chart>& state) {
        std::uint8_t flags = in.u8();
        std::string text = in.text();
        if (flags & 1)
            state.settings.accept(flags & 2 ? std::optional<std::string>(text) : std::nullopt);
        std::int64_t rows = in.count(static_cast<std::int64_t>(ChartLimits{}.max_points) + 1);
        for (std::int64_t i = 0; i < rows; ++i) state.add(read_row(in));
    }
};

template <>
struct StateTraits<SparklineState> : ChartTraits<Sparkline> {
    static constexpr std::uint8_t kTag = 7;
};
template <>
struct StateTraits<LineChartState> : ChartTraits<LineChart> {
    static constexpr std::uint8_t kTag = 8;
};
template <>
struct StateTraits<BarChartState> : ChartTraits<BarChart> {
    static constexpr std::uint8_t kTag = 9;
};

namespace {

constexpr const char* kSparkline = "sparkline";
constexpr const char* kLineChart = "svg_line_chart";
constexpr const char* kBarChart = "svg_bar_chart";

// C part: the x argument at `index`.
template <TimeKind Kind, bool Number>
XArgument x_argument(FunctionCallInfo fcinfo, int index) {
    XArgument x;
    if (PG_ARGISNULL(index)) return x;
    x.present = true;
    if constexpr (Number) {
        x.is_number = true;
        x.number = PG_GETARG_FLOAT8(index);
    } else {
        x.time = time_argument(fcinfo, index, Kind);
    }
    return x;
}

// The x of one row on the axis (a category's text goes into the row).
void read_x(const Argument& arg, const XArgument& x, const ZoneClock* zone, bool categories,
            ChartRow& row) {
    if (x.is_number) {
        row.kind = AxisKind::Number;
        row.x = finite_number(arg, x.number);
        return;
    }
    try {
        if (x.time.kind == TimeKind::Text) {
            AxisValue value = axis_value_of_text(x.time.text, zone, categories);
            row.kind = value.kind;
            row.x = value.value;
            if (value.kind == AxisKind::Category) row.category.assign(x.time.text);
            return;
        }
    } catch (const Error& error) {
        std::string what = error.what();
        raise_argument_error(arg, shown_time(x.time), what, time_error_state(what));
    }
    TimeValue time = read_time(arg, x.time);
    row.kind = AxisKind::Time;
    row.x = zone ? time_axis_value(time, *zone) : time_axis_value(time);
}

void kind_error(const Argument& arg, const XArgument& x, const Error& error) {
    raise_argument_error(arg, x.is_number ? shown_number(x.number) : shown_time(x.time),
                         error.what(), ERRCODE_INVALID_PARAMETER_VALUE);
}

template <TimeKind Kind, bool Number>
Datum sparkline_row(FunctionCallInfo fcinfo) {
    SparklineState* state = state_for_row<SparklineState>(fcinfo, kSparkline);
    bool has_y = !PG_ARGISNULL(1);
    double y = has_y ? PG_GETARG_FLOAT8(1) : 0.0;
    XArgument x = x_argument<Kind, Number>(fcinfo, 2);
    bool ok = guarded([&] {
        Argument y_arg{kSparkline, 1, "y"}, x_arg{kSparkline, 2, "x"};
        ChartRow row;
        if (has_y) row.y = finite_number(y_arg, y);
        if (!x.present) return;
        read_x(x_arg, x, nullptr, false, row);
        try {
            state->add(row);
        } catch (const Error& error) {
            kind_error(x_arg, x, error);
        }
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(state);
}

template <typename State>
void read_options(State& state, const Argument& arg, FunctionCallInfo fcinfo, int index,
                  std::string_view text) {
    std::optional<std::string> given;
    if (!PG_ARGISNULL(index)) given.emplace(text);
    try {
        state.settings.accept(given);
    } catch (const Error& error) {
        raise_argument_error(arg, given ? shown_text(*given) : "NULL", error.what(),
                             ERRCODE_INVALID_PARAMETER_VALUE);
    }
}

// svg_line_chart (layer_index 4, options_index 5) and svg_bar_chart (options_index 4).
template <typename State, TimeKind Kind, bool Number>
Datum chart_row(FunctionCallInfo fcinfo, const char* name, int layer_index, int options_index) {
    State* state = state_for_row<State>(fcinfo, name);
    XArgument x = x_argument<Kind, Number>(fcinfo, 1);
    bool has_y = !PG_ARGISNULL(2);
    double y = has_y ? PG_GETARG_FLOAT8(2) : 0.0;
    bool has_series = !PG_ARGISNULL(3);
    std::string_view series = has_series ? text_argument(fcinfo, 3) : std::string_view();
    bool has_layer = layer_index > 0 && PG_NARGS() > layer_index && !PG_ARGISNULL(layer_index);
    std::string_view layer = has_layer ? text_argument(fcinfo, layer_index) : std::string_view();
    bool has_options = PG_NARGS() > options_index;
    std::string_view options = has_options && !PG_ARGISNULL(options_index)
                                   ? text_argument(fcinfo, options_index)
                                   : std::string_view();
    bool ok = guarded([&] {
        Argument x_arg{name, 1, "x"}, y_arg{name, 2, "y"}, layer_arg{name, 4, "layer"},
            options_arg{name, options_index, "options"};
        if (has_options) read_options(*state, options_arg, fcinfo, options_index, options);
        const ChartOptions& chart_options = state->settings.options();
        ChartRow row;
        bool categories = std::is_same_v<State, BarChartState>;
        if (x.present)
            read_x(x_arg, x, chart_options.zone ? &*chart_options.zone : nullptr, categories, row);
        if (has_y) row.y = finite_number(y_arg, y);
        if (has_layer) {
            try {
                row.layer = parse_chart_layer(layer);
            } catch (const Error& error) {
                raise_argument_error(layer_arg, shown_text(layer), error.what(),
                                     ERRCODE_INVALID_PARAMETER_VALUE);
            }
        }
        if (!x.present || !has_series) return;
        row.series.assign(series);
        try {
            state->chart.accept_x_kind(row.kind);
        } catch (const Error& error) {
            kind_error(x_arg, x, error);
        }
        try {
            state->add(row);
        } catch (const Error& error) {
            raise_function_error(name, error.what(), ERRCODE_PROGRAM_LIMIT_EXCEEDED);
        }
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(state);
}

// The canonical order of a chart's rows (see the contract above).
bool drawn_before(const ChartRow& a, const ChartRow& b) {
    if (a.series != b.series) return a.series < b.series;
    if (a.kind != b.kind) return a.kind < b.kind;
    if (a.kind == AxisKind::Category ? a.category != b.category : a.x != b.x)
        return a.kind == AxisKind::Category ? a.category < b.category : a.x < b.x;
    return a.layer < b.layer;
}

// Both charts and the sparkline end alike: their text, or NULL when no row had a place.
template <typename State>
Datum chart_final(FunctionCallInfo fcinfo) {
    State* state = state_argument<State>(fcinfo);
    if (!state || state->chart.empty()) PG_RETURN_NULL();
    bool ok = guarded([&] {
        State drawn;
        std::vector<ChartRow> rows = state->rows;
        std::stable_sort(rows.begin(), rows.end(), drawn_before);
        drawn.settings = state->settings;
        for (const ChartRow& row : rows) drawn.add(row);
        if constexpr (std::is_same_v<State, SparklineState>)
            result_text() = drawn.chart.render();
        else
            result_text() = drawn.chart.render_svg(drawn.settings.options());
    });
    if (!ok) report_failure();
    PG_RETURN_TEXT_P(cstring_to_text_with_len(result_text().data(), int(result_text().size())));
}

}  // namespace
}  // namespace almanac::postgres

namespace pg = almanac::postgres;
using pg::TimeKind;

#define ALMANAC_REPORT_ROWS(suffix, kind, number)                                             \
    ALMANAC_PG_FUNCTION(almanac_sparkline_##suffix##_step) {                                  \
        return pg::sparkline_row<kind, number>(fcinfo);                                       \
    }                                                                                         \
    ALMANAC_PG_FUNCTION(almanac_svg_line_chart_##suffix##_step) {                             \
        return pg::chart_row<pg::LineChartState, kind, number>(fcinfo, pg::kLineChart, 4, 5); \
    }                                                                                         \
    ALMANAC_PG_FUNCTION(almanac_svg_bar_chart_##suffix##_step) {                              \
        return pg::chart_row<pg::BarChartState, kind, number>(fcinfo, pg::kBarChart, 0, 4);   \
    }
ALMANAC_REPORT_ROWS(number, TimeKind::Text, true)
ALMANAC_REPORT_ROWS(timestamptz, TimeKind::Timestamptz, false)
ALMANAC_REPORT_ROWS(timestamp, TimeKind::Timestamp, false)
ALMANAC_REPORT_ROWS(date, TimeKind::Date, false)
ALMANAC_REPORT_ROWS(text, TimeKind::Text, false)

#define ALMANAC_REPORT_STATE(name, State, function)                                                \
    ALMANAC_PG_FUNCTION(almanac_##name##_final) { return pg::chart_final<State>(fcinfo); }         \
    ALMANAC_PG_FUNCTION(almanac_##name##_combine) {                                                \
        return pg::combine_states<State>(fcinfo, function);                                        \
    }                                                                                              \
    ALMANAC_PG_FUNCTION(almanac_##name##_serialize) { return pg::serialize_state<State>(fcinfo); } \
    ALMANAC_PG_FUNCTION(almanac_##name##_deserialize) {                                            \
        return pg::deserialize_state<State>(fcinfo, function);                                     \
    }
ALMANAC_REPORT_STATE(sparkline, pg::SparklineState, pg::kSparkline)
ALMANAC_REPORT_STATE(svg_line_chart, pg::LineChartState, pg::kLineChart)
ALMANAC_REPORT_STATE(svg_bar_chart, pg::BarChartState, pg::kBarChart)
