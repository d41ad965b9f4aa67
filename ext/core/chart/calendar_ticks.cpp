// SPDX-License-Identifier: MIT
#include "core/chart/calendar_ticks.h"

#include <algorithm>

#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/time/calendar_names.h"
#include "core/time/period_calendar.h"
#include "core/time/period_spec.h"
#include "core/time/zone_clock.h"

namespace almanac {

namespace {

enum class LabelKind { Clock, Day, Month, Quarter, Year };

struct Candidate {
    const char* spec;
    double approx_days;  // typical length, to skip candidates quickly
    LabelKind kind;
};

// Year multiples count from 2000 so that decades and centuries land on
// round years (counting from 1970, "100 years" would tick at 1870 and 1970).
constexpr Candidate kCandidates[] = {
    {"minute", 1.0 / 1440, LabelKind::Clock},
    {"5 minutes", 5.0 / 1440, LabelKind::Clock},
    {"15 minutes", 15.0 / 1440, LabelKind::Clock},
    {"30 minutes", 30.0 / 1440, LabelKind::Clock},
    {"hour", 1.0 / 24, LabelKind::Clock},
    {"3 hours", 3.0 / 24, LabelKind::Clock},
    {"6 hours", 6.0 / 24, LabelKind::Clock},
    {"12 hours", 12.0 / 24, LabelKind::Clock},
    {"day", 1, LabelKind::Day},
    {"2 days", 2, LabelKind::Day},
    {"week", 7, LabelKind::Day},
    {"2 weeks", 14, LabelKind::Day},
    {"month", 30.44, LabelKind::Month},
    {"quarter", 91.31, LabelKind::Quarter},
    {"year", 365.25, LabelKind::Year},
    {"2 years from 2000-01-01", 730.5, LabelKind::Year},
    {"5 years from 2000-01-01", 1826.25, LabelKind::Year},
    {"10 years from 2000-01-01", 3652.5, LabelKind::Year},
    {"20 years from 2000-01-01", 7305, LabelKind::Year},
    {"50 years from 2000-01-01", 18262.5, LabelKind::Year},
    {"100 years from 2000-01-01", 36525, LabelKind::Year},
    {"200 years from 2000-01-01", 73050, LabelKind::Year},
    {"500 years from 2000-01-01", 182625, LabelKind::Year},
    {"1000 years from 2000-01-01", 365250, LabelKind::Year},
    {"2000 years from 2000-01-01", 730500, LabelKind::Year},
};

double to_axis(Instant t) { return static_cast<double>(t.time_since_epoch().count()); }

struct Civil {
    int year;
    unsigned month, day, hour, minute;
};

Civil civil(Instant t) {
    auto day = date::floor<date::days>(t);
    date::year_month_day ymd{day};
    auto time = date::make_time(t - day);
    return {int(ymd.year()), unsigned(ymd.month()), unsigned(ymd.day()),
            unsigned(time.hours().count()), unsigned(time.minutes().count())};
}

std::string day_month(const Civil& c) {
    return std::to_string(c.day) + " " + std::string(month_abbreviation(date::month{c.month}));
}

void label_ticks(AxisScale& scale, const std::vector<Instant>& instants, LabelKind kind) {
    bool first = true;
    Civil previous{};
    for (Instant t : instants) {
        Civil c = civil(t);
        AxisTick tick{to_axis(t), "", ""};
        switch (kind) {
            case LabelKind::Clock:
                tick.label = padded(c.hour, 2) + ":" + padded(c.minute, 2);
                if (first || c.day != previous.day || c.month != previous.month ||
                    c.year != previous.year)
                    tick.context = day_month(c) + " " + std::to_string(c.year);
                break;
            case LabelKind::Day:
                tick.label = day_month(c);
                break;
            case LabelKind::Month:
                tick.label = std::string(month_abbreviation(date::month{c.month}));
                break;
            case LabelKind::Quarter:
                tick.label = "Q" + std::to_string((c.month - 1) / 3 + 1);
                break;
            case LabelKind::Year:
                tick.label = std::to_string(c.year);
                break;
        }
        if (kind != LabelKind::Clock && kind != LabelKind::Year &&
            (first || c.year != previous.year))
            tick.context = std::to_string(c.year);
        scale.ticks.push_back(std::move(tick));
        previous = c;
        first = false;
    }
}

}  // namespace

AxisScale calendar_scale(Instant low, Instant high, int max_ticks, bool whole_days) {
    if (high <= low) {
        // One moment: a day (or, for dates, two days) around it.
        auto widen = whole_days ? std::chrono::hours(24) : std::chrono::hours(12);
        low -= widen;
        high += widen;
    }
    max_ticks = std::max(max_ticks, 2);
    AxisScale scale{to_axis(low), to_axis(high), {}};
    double span_days = (scale.high - scale.low) / 86400000.0;
    for (const Candidate& candidate : kCandidates) {
        if (span_days / candidate.approx_days > max_ticks + 1) continue;
        if (whole_days && candidate.kind == LabelKind::Clock) continue;
        PeriodCalendar calendar(parse_period_spec(candidate.spec), ZoneClock::utc());
        std::vector<Instant> instants;
        bool too_many = false;
        try {
            Period period = calendar.period_of(low);
            if (period.start < low) period = calendar.next(period);
            while (period.start <= high) {
                if (int(instants.size()) == max_ticks) {
                    too_many = true;
                    break;
                }
                instants.push_back(period.start);
                if (!in_supported_range(period.end)) break;
                period = calendar.next(period);
            }
        } catch (const Error&) {
            // A boundary beyond year 9999 (or before 0000): keep what fits.
        }
        if (too_many) continue;
        if (instants.empty()) break;  // finer candidates were too many, this one has none
        label_ticks(scale, instants, candidate.kind);
        return scale;
    }
    // No calendar boundary fits: label both ends with date and time.
    std::vector<Instant> ends = {low, high};
    label_ticks(scale, ends, LabelKind::Clock);
    return scale;
}

}  // namespace almanac
