// SPDX-License-Identifier: MIT
// data_range(ts, amount, day [, zone [, now]]): the range a report should
// use, and what it leaves out (core/stats/stray_days.h).
//
//  1. An aggregate over a table's times and amounts (an amount is only
//     counted when it is NULL: a sale without money). `day` is the spec of the days that
//     are counted: 'day', or 'day from 2000-01-01 04:00' for business days
//     that begin at 04:00 (any date: only its time of day matters); any
//     other spec is an error. `zone` is the calendar's zone (default UTC),
//     `now` the present moment (default: the machine's clock at the first row).
//  2. Rows later than `now` are left out ("future"). Of the others, the days
//     with rows fall into runs separated by gaps of more than 90 days without
//     rows that are also longer than a quarter of the span; the run with the
//     most rows is kept and every other run is left out ("stray").
//  3. Returns JSON TEXT, NULL for no rows (NULL ts rows are skipped):
//       start, stop   the first kept day's start and the last kept day's end,
//                     as period_floor writes them (a bare local date for
//                     midnight days), ready for period_totals' start and stop
//       start_if_cut, stop_if_cut   start and stop when rows were left out,
//                     else null: a report that gives each segment its own
//                     range passes these, so only a cut narrows it
//       whole_stop    stop, or the start of the day that holds `now` when
//                     that is earlier: the end of the last whole day
//       first_day, last_day   labels of the first and last kept day
//       days, rows    days from first to last kept day, rows on them
//       left_out      rows left out
//       no_amount     rows whose amount is NULL (in the range or not)
//       notes         the lines a report prints under its table, each at
//                     most 60 characters (the shell's column mode wraps
//                     longer ones): "range 2023-01-02..2025-12-28: 1092
//                     days, 405365 rows", then "left out: nothing" or a line
//                     per run left out ("left out: 1 stray row on
//                     2005-03-01", "left out: 2 future rows
//                     2031-05-01..2031-05-02"), then "1 row without an
//                     amount (sql/data_check.sql lists it)" when there is one
//       note          the same lines joined by "; ", for a chart's title
//  4. A ts that is not a time value is an error, as everywhere
//     (valid_time(ts) finds such rows).
#include <chrono>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "aggregate_state.h"
#include "arguments.h"
#include "core/stats/stray_days.h"
#include "core/text/error.h"
#include "period_context.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

constexpr const char* kName = "data_range";

struct DataRangeState {
    std::optional<PeriodCalendar> calendar;
    Instant now{};
    std::map<std::int64_t, std::int64_t> days;  // day serial -> rows
    std::int64_t future_rows = 0;
    std::int64_t no_amount = 0;
    Instant future_first{}, future_last{};
};

void data_range_step(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        auto& state = aggregate_state<DataRangeState>(context);
        if (!state.calendar) {
            ArgumentRef day_arg{kName, 3, "day"};
            ArgumentRef zone_arg{kName, 4, "zone"};
            bool zoned = argc > 3 && sqlite3_value_type(argv[3]) != SQLITE_NULL;
            if (sqlite3_value_type(argv[2]) == SQLITE_NULL)
                raise_argument_error(day_arg, argv[2], "expected a spec of one day");
            state.calendar.emplace(make_calendar(day_arg, argv[2], zoned ? &zone_arg : nullptr,
                                                 zoned ? argv[3] : nullptr));
            const auto& spec = state.calendar->spec();
            if (spec.unit != PeriodUnit::Day || spec.count != 1)
                raise_argument_error(day_arg, argv[2],
                                     "expected a spec of one day: 'day', or 'day from 2000-01-01 04:00' "
                                     "for days that begin at 04:00");
            std::optional<TimeValue> now;
            if (argc > 4) now = read_time({kName, 5, "now"}, argv[4]);
            state.now = now ? state.calendar->place_on_time_line(*now)
                            : std::chrono::time_point_cast<Millis>(std::chrono::system_clock::now());
        }
        if (sqlite3_value_type(argv[1]) == SQLITE_NULL) ++state.no_amount;
        auto ts = read_time({kName, 1, "ts"}, argv[0]);
        if (!ts) return;
        Instant t = state.calendar->place_on_time_line(*ts);
        if (t > state.now) {
            if (state.future_rows == 0 || t < state.future_first) state.future_first = t;
            if (state.future_rows == 0 || t > state.future_last) state.future_last = t;
            ++state.future_rows;
            return;
        }
        ++state.days[state.calendar->serial_of(t)];
    });
}

std::string label_of_day(const PeriodCalendar& calendar, std::int64_t serial) {
    return calendar.label(calendar.period_by_serial(serial));
}

std::string days_text(const PeriodCalendar& calendar, std::int64_t first, std::int64_t last) {
    return first == last ? "on " + label_of_day(calendar, first)
                         : label_of_day(calendar, first) + ".." + label_of_day(calendar, last);
}

std::string rows_text(std::int64_t rows, const char* kind) {
    return std::to_string(rows) + " " + kind + (rows == 1 ? " row" : " rows");
}

std::string quoted(const std::string& text) { return "\"" + text + "\""; }  // labels and boundaries: no escapes

void data_range_final(sqlite3_context* context) {
    guarded(context, [&] {
        auto state = take_state<DataRangeState>(context);
        if (!state || (state->days.empty() && state->future_rows == 0 && state->no_amount == 0)) {
            sqlite3_result_null(context);
            return;
        }
        const PeriodCalendar& calendar = *state->calendar;
        std::string json = "{";
        std::vector<std::string> notes;  // each short enough for the shell's column mode (60 characters)
        std::int64_t left_rows = state->future_rows;
        if (!state->days.empty()) {
            std::vector<DayRows> days;
            days.reserve(state->days.size());
            for (const auto& [day, rows] : state->days) days.push_back({day, rows});
            DaySplit split = split_stray_days(days);
            Period first = calendar.period_by_serial(split.kept.first);
            Period last = calendar.period_by_serial(split.kept.last);
            Instant whole_stop = std::max(first.start, std::min(last.end, calendar.floor(state->now)));
            std::int64_t day_count = split.kept.last - split.kept.first + 1;
            for (const auto& run : split.strays) left_rows += run.rows;
            std::string start = quoted(calendar.format_boundary(first.start));
            std::string stop = quoted(calendar.format_boundary(last.end));
            json += "\"start\":" + start + ",\"stop\":" + stop + ",\"start_if_cut\":" +
                    (left_rows > 0 ? start : "null") + ",\"stop_if_cut\":" + (left_rows > 0 ? stop : "null") +
                    ",\"whole_stop\":" + quoted(calendar.format_boundary(whole_stop)) + ",\"first_day\":" +
                    quoted(calendar.label(first)) + ",\"last_day\":" + quoted(calendar.label(last)) +
                    ",\"days\":" + std::to_string(day_count) + ",\"rows\":" + std::to_string(split.kept.rows) + ",";
            notes.push_back("range " + calendar.label(first) + ".." + calendar.label(last) + ": " +
                            std::to_string(day_count) + (day_count == 1 ? " day, " : " days, ") +
                            std::to_string(split.kept.rows) + (split.kept.rows == 1 ? " row" : " rows"));
            for (const auto& run : split.strays)
                notes.push_back("left out: " + rows_text(run.rows, "stray") + " " +
                                days_text(calendar, run.first, run.last));
        } else {
            json += "\"start\":null,\"stop\":null,\"start_if_cut\":null,\"stop_if_cut\":null,\"whole_stop\":null,"
                    "\"first_day\":null,\"last_day\":null,\"days\":0,\"rows\":0,";
            notes.push_back("range: no rows up to now");
        }
        if (state->future_rows > 0)
            notes.push_back("left out: " + rows_text(state->future_rows, "future") + " " +
                            days_text(calendar, calendar.serial_of(state->future_first),
                                      calendar.serial_of(state->future_last)));
        if (left_rows == 0) notes.push_back("left out: nothing");
        if (state->no_amount > 0)
            notes.push_back(std::to_string(state->no_amount) +
                            (state->no_amount == 1 ? " row without an amount (sql/data_check.sql lists it)"
                                                   : " rows without an amount (sql/data_check.sql lists them)"));
        std::string note, list;
        for (const auto& line : notes) {
            note += (note.empty() ? "" : "; ") + line;
            list += (list.empty() ? "" : ",") + quoted(line);
        }
        json += "\"left_out\":" + std::to_string(left_rows) + ",\"no_amount\":" + std::to_string(state->no_amount) +
                ",\"note\":" + quoted(note) + ",\"notes\":[" + list + "]}";
        sqlite3_result_text(context, json.data(), static_cast<int>(json.size()), SQLITE_TRANSIENT);
    });
}

}  // namespace

int register_data_range_functions(sqlite3* db) {
    // Not deterministic: without `now` it reads the clock, and a zone follows the tz database.
    const int flags = SQLITE_UTF8;
    int rc = SQLITE_OK;
    for (int argc = 3; argc <= 5 && rc == SQLITE_OK; ++argc)
        rc = sqlite3_create_function(db, kName, argc, flags, nullptr, nullptr, data_range_step, data_range_final);
    return rc;
}

}  // namespace almanac::sqlite
