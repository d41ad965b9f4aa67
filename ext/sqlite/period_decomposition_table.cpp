// SPDX-License-Identifier: MIT
// period_decomposition(source, spec, cycle [, zone [, options]]): a
// table-valued function.
//
//  1. Reads `source` as period_totals does (source_reading.h): the same
//     columns, segments with their rollup, items and zero fill, over the
//     range the data covers. Lists only the periods wholly inside that
//     range: a partial first or last period would look like a drop.
//  2. Columns: segment, all_segments, item, period_start, period_end, label,
//     serial, amount, trend, season, noise, weight; the arguments are the
//     hidden columns source, spec, cycle, zone, options. Rows come in
//     period_totals' order (rollup, segments, items, periods).
//  3. Each item's series of amounts is split by STL (Cleveland et al. 1990;
//     core/stats/seasonal_trend_decomposition.h) into trend + season + noise,
//     amount = trend + season + noise to rounding, with a season of n_p
//     periods: the number of spec periods in a cycle by mean lengths
//     (core/time/periods_per_cycle.h: day/week 7, week/year 52, ...). The
//     pair must nest as period_position allows, with at most 2,000 periods
//     in a cycle.
//  4. The settings are statsmodels' STL defaults: seasonal span 7, trend and
//     low-pass spans from it and n_p, degree 1, no jumps. Robust (2 inner,
//     15 outer passes) for a series of at least four whole cycles, else not
//     (5 inner passes): with two or three cycles the fit is nearly exact and
//     robustness weights would come from rounding noise. weight is the last
//     robustness weight in [0, 1], 1 when not robust.
//  5. options: JSON {"seasonal": odd >= 7, "robust": true|false}, either key
//     optional; an explicit robust is honoured whatever the length.
//  6. An item with fewer than two whole cycles of periods, or a period whose
//     amount is NULL (its rows hold only NULL amounts), gets NULL trend,
//     season, noise and weight; its amounts are still listed.
//  7. Memory beyond the totals is O(periods) of one item: items are
//     decomposed one at a time, as the cursor reaches them.
//  8. A NULL source, spec or cycle gives no rows; a NULL zone is no zone (UTC)
//     and NULL options the defaults, so options can follow without a zone.
//     A missing argument, a spec or cycle that does not parse, a pair that
//     does not nest, an unknown zone, options that are not such JSON, and
//     every error of period_totals' reading (a source that does not exist,
//     ...) is an error naming period_decomposition. Spec, cycle, zone and
//     options are checked before the source is read.
//  9. SQLITE_DIRECTONLY, as period_totals: it reads a table named by a value.
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "argument_table.h"
#include "arguments.h"
#include "core/stats/decomposition_options.h"
#include "core/stats/period_totals.h"
#include "core/stats/seasonal_trend_decomposition.h"
#include "core/text/error.h"
#include "core/time/periods_per_cycle.h"
#include "period_context.h"
#include "registration.h"
#include "source_reading.h"
#include "totals_values.h"

namespace almanac::sqlite {
namespace {

constexpr const char* kName = "period_decomposition";
constexpr const char* kUsage =
    "expected period_decomposition(source, spec, cycle [, zone [, options]])";

enum Column {
    kSegment,
    kAllSegments,
    kItem,
    kPeriodStart,
    kPeriodEnd,
    kLabel,
    kSerial,
    kAmount,
    kTrend,
    kSeason,
    kNoise,
    kWeight,
    kSource,
    kSpec,
    kCycle,
    kZone,
    kOptions
};
// The first columns are every listing's (totals_values.h).
static_assert(kSerial + 1 == kSeriesColumns, "segment ... serial come first");
constexpr int kFirstArgument = kSource;
constexpr std::int64_t kLongestSeason = 2000;  // periods per cycle (README "Limits")
constexpr int kArguments = 5;

const ArgumentRef kSourceArg{kName, 1, "source"};
const ArgumentRef kSpecArg{kName, 2, "spec"};
const ArgumentRef kCycleArg{kName, 3, "cycle"};
const ArgumentRef kZoneArg{kName, 4, "zone"};
const ArgumentRef kOptionsArg{kName, 5, "options"};

// What the arguments ask for, checked before the source is read.
struct Request {
    std::size_t period = 0;  // n_p
    DecompositionOptions options;
};

// The season's length; the pair must nest as period_position allows.
// At most kLongestSeason periods: STL's work per item grows with n_p squared
// (its trend smoother spans about two cycles), and 'hour' in 'year' (8,766)
// would take minutes an item.
std::size_t season_length(sqlite3_value* spec, sqlite3_value* cycle, sqlite3_value* zone) {
    const SpecInCycle pair =
        read_spec_in_cycle(kSpecArg, spec, kCycleArg, cycle, zone ? &kZoneArg : nullptr, zone);
    const std::int64_t length = periods_per_cycle(pair.spec, pair.cycle);
    if (length > kLongestSeason)
        raise_argument_error(kCycleArg, cycle,
                             "a cycle of " + std::to_string(length) + " '" + pair.spec.describe() +
                                 "' periods; expected at most " + std::to_string(kLongestSeason) +
                                 " (decompose a longer spec, such as 'day' in 'year')");
    return static_cast<std::size_t>(length);
}

DecompositionOptions read_options(sqlite3_value* value) {
    if (!value || sqlite3_value_type(value) == SQLITE_NULL) return {};
    auto text = read_text(kOptionsArg, value);
    try {
        return parse_decomposition_options(*text);
    } catch (const Error& error) {
        raise_argument_error(kOptionsArg, value, error.what());
    }
}

// One item's series over its whole periods, and its parts once decomposed.
struct Decomposed {
    std::int64_t first_serial = 0, last_serial = -1;  // whole periods only
    bool has_parts = false;
    std::vector<double> amounts;
    StlParts parts;
};

struct Cursor {
    sqlite3_vtab_cursor base{};
    std::optional<PeriodCalendar> calendar;
    SourceReading reading;
    Request request;
    TimeValue like;
    std::size_t series = 0;  // position in reading.series
    Decomposed current_series;
    SeasonalTrendDecomposition stl;  // its working memory serves every item
    Period current{};
    bool done = true;
    sqlite3_int64 row = 0;
    ScanArguments<kArguments> arguments;

    const ListedSeries& listed() const { return reading.series[series]; }
};

bool wholly_inside(const Period& period, const PeriodRange& range) {
    const Coverage covered = coverage_of(period, range);
    return covered.start == period.start && covered.end == period.end;
}

// The amount of a cell as the fit reads it; nullopt for a NULL total.
std::optional<double> amount_of(const PeriodCell* cell) {
    if (!cell) return 0.0;
    auto value = cell->amount.value();
    if (!value) return std::nullopt;
    return value->is_integer ? static_cast<double>(value->integer) : value->real;
}

// Finds the series' whole periods and decomposes them, when there are
// enough; false when the series has no whole period.
bool decompose_series(Cursor& cursor) {
    const ListedSeries& series = cursor.listed();
    const PeriodCalendar& calendar = *cursor.calendar;
    Decomposed& out = cursor.current_series;
    out = Decomposed{};
    std::int64_t first = series.range.first_serial, last = series.range.last_serial;
    if (series.range.empty()) return false;
    // Only the first and the last period can be partial.
    if (!wholly_inside(calendar.period_by_serial(first), series.range)) ++first;
    if (last >= first && !wholly_inside(calendar.period_by_serial(last), series.range)) --last;
    if (last < first) return false;
    out.first_serial = first;
    out.last_serial = last;
    const auto count = static_cast<std::size_t>(last - first + 1);
    const std::size_t period = cursor.request.period;
    if (count < 2 * period) return true;
    out.amounts.reserve(count);
    for (std::int64_t serial = first; serial <= last; ++serial) {
        auto amount = amount_of(series.group->at(series.item, serial));
        if (!amount) return true;  // a gap: no parts rather than a guess
        out.amounts.push_back(*amount);
    }
    const bool robust = cursor.request.options.robust.value_or(count >= 4 * period);
    cursor.stl.decompose(out.amounts,
                         StlSettings::defaults(period, cursor.request.options.seasonal, robust),
                         out.parts);
    out.has_parts = true;
    return true;
}

// Moves to the first series from `cursor.series` on that lists a period.
void start_series(Cursor& cursor) {
    for (; cursor.series < cursor.reading.series.size(); ++cursor.series) {
        if (decompose_series(cursor)) {
            cursor.current = cursor.calendar->period_by_serial(cursor.current_series.first_serial);
            return;
        }
    }
    cursor.done = true;
}

int connect(sqlite3* db, void*, int, const char* const*, sqlite3_vtab** out, char**) {
    return connect_argument_table(
        db,
        "CREATE TABLE x(segment, all_segments INTEGER, item, period_start, period_end,"
        " label TEXT, serial INTEGER, amount, trend REAL, season REAL, noise REAL, weight REAL,"
        " source HIDDEN, spec HIDDEN, cycle HIDDEN, zone HIDDEN, options HIDDEN)",
        /*direct_only=*/true, out);
}

int best_index(sqlite3_vtab*, sqlite3_index_info* info) {
    return best_index_for_arguments(info, kFirstArgument, kArguments);
}

int filter(sqlite3_vtab_cursor* base, int mask, const char*, int argc, sqlite3_value** argv) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    cursor->reading = SourceReading{};
    cursor->current_series = Decomposed{};
    cursor->done = true;
    cursor->row = 0;
    cursor->arguments.take(mask, argc, argv);
    sqlite3_value** given = cursor->arguments.given;
    static const char* names[kArguments] = {"source", "spec", "cycle", "zone", "options"};
    for (int argument = 0; argument < 3; ++argument) {
        if (!given[argument])
            return set_table_error(base->pVtab, std::string(kName) + "(): " + names[argument] +
                                                    " is missing; " + kUsage);
    }
    try {
        for (int argument = 0; argument < 3; ++argument) {
            if (sqlite3_value_type(given[argument]) == SQLITE_NULL) return SQLITE_OK;
        }
        // A NULL zone is no zone, so that options can follow without one.
        if (given[3] && sqlite3_value_type(given[3]) == SQLITE_NULL) given[3] = nullptr;
        cursor->request.period = season_length(given[1], given[2], given[3]);
        cursor->request.options = read_options(given[4]);
        cursor->calendar.emplace(
            make_calendar(kSpecArg, given[1], given[3] ? &kZoneArg : nullptr, given[3]));
        SourceRequest request{kName,
                              kSourceArg,
                              given[0],
                              &*cursor->calendar,
                              RangeBounds{},
                              /*wants_qty=*/false};
        cursor->reading = read_source(table_connection(base->pVtab), request);
        if (cursor->reading.series.empty()) return SQLITE_OK;
        cursor->like = boundary_form(*cursor->reading.totals);
        cursor->series = 0;
        cursor->done = false;
        start_series(*cursor);
        return SQLITE_OK;
    } catch (...) {
        return scan_failure(base->pVtab, kName);
    }
}

int next(sqlite3_vtab_cursor* base) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    ++cursor->row;
    try {
        if (cursor->current.serial < cursor->current_series.last_serial) {
            cursor->current = cursor->calendar->next(cursor->current);
            return SQLITE_OK;
        }
        ++cursor->series;
        start_series(*cursor);
        return SQLITE_OK;
    } catch (...) {
        return scan_failure(base->pVtab, kName);
    }
}

int eof(sqlite3_vtab_cursor* base) { return reinterpret_cast<Cursor*>(base)->done ? 1 : 0; }

void result_part(sqlite3_context* context, const Cursor& cursor, const std::vector<double>& part) {
    const Decomposed& series = cursor.current_series;
    if (!series.has_parts) return sqlite3_result_null(context);
    sqlite3_result_double(
        context, part[static_cast<std::size_t>(cursor.current.serial - series.first_serial)]);
}

int column(sqlite3_vtab_cursor* base, sqlite3_context* context, int index) {
    auto* cursor = reinterpret_cast<Cursor*>(base);
    guarded(context, [&] {
        try {
            const ListedSeries& series = cursor->listed();
            const PeriodCalendar& calendar = *cursor->calendar;
            const Period& period = cursor->current;
            const StlParts& parts = cursor->current_series.parts;
            if (index < kSeriesColumns) {
                return result_series_column(context, index, series, *cursor->reading.totals, period,
                                            calendar, cursor->like);
            }
            switch (index) {
                case kAmount: {
                    const PeriodCell* found = series.group->at(series.item, period.serial);
                    return result_total(context, found, found ? &found->amount : nullptr);
                }
                case kTrend:
                    return result_part(context, *cursor, parts.trend);
                case kSeason:
                    return result_part(context, *cursor, parts.season);
                case kNoise:
                    return result_part(context, *cursor, parts.remainder);
                case kWeight:
                    return result_part(context, *cursor, parts.weight);
                default:
                    return cursor->arguments.result(context, index - kFirstArgument);
            }
        } catch (const Error& error) {
            std::string message = std::string(kName) + "(): " + error.what();
            sqlite3_result_error(context, message.c_str(), -1);
        }
    });
    return SQLITE_OK;
}

const sqlite3_module kModule =
    argument_table_module<Cursor>(connect, best_index, filter, next, eof, column);

}  // namespace

int register_period_decomposition_table(sqlite3* db) {
    return sqlite3_create_module(db, kName, &kModule, nullptr);
}

}  // namespace almanac::sqlite
