// SPDX-License-Identifier: MIT
#include "core/time/period_position.h"

#include "core/text/error.h"

namespace almanac {
namespace {

constexpr std::int64_t kMillisPerDay = 86400000;

std::int64_t month_index(date::local_days day) {
    const date::year_month_day ymd{day};
    return std::int64_t(int(ymd.year())) * 12 + (unsigned(ymd.month()) - 1);
}

bool is_calendar_cycle(const PeriodSpec& cycle) { return !cycle.is_sub_day(); }

// A cycle that begins at midnight on the first of a month.
bool is_whole_month_cycle(const PeriodSpec& cycle) { return cycle.is_month_based() && !cycle.from; }

}  // namespace

const char* const kNestingRule =
    "expected a pair that nests: second, minute or hour periods in a longer cycle whose length "
    "they divide (in a day or longer when they divide 24 hours); day in N days, week, "
    "half-month, month, quarter or year; week in year; half-month in month, quarter or year; "
    "month, quarter or year periods in a longer month-based cycle that is a whole number of them "
    "and begins where one of them begins";

const char* const kRetailNestingRule =
    "expected a retail pair that shares its anchor: day, retail week, retail month or retail "
    "quarter in a retail year; day, retail week or retail month in a retail quarter; day or "
    "retail week in a retail month; day in a retail week";

void check_position_spec(const PeriodSpec& spec) {
    if (spec.from)
        throw Error("expected a spec without 'from': positions count from the start of the cycle");
}

PeriodPosition::PeriodPosition(const PeriodSpec& spec, const PeriodSpec& cycle, ZoneClock clock)
    : cycle_(cycle, clock) {
    auto refuse = [&]() {
        throw Error("'" + spec.describe() + "' periods do not nest in '" + cycle.describe() +
                    "' cycles; " +
                    (spec.is_retail() || cycle.is_retail() ? kRetailNestingRule : kNestingRule));
    };
    week_start_ = spec.week_start;
    year_start_ = cycle.year_start;
    if (spec.is_sub_day()) {
        kind_ = Kind::Elapsed;
        length_ms_ = spec.sub_day_length().count();
        const std::int64_t room =
            cycle.is_sub_day() ? cycle.sub_day_length().count() : kMillisPerDay;
        if (length_ms_ >= room || room % length_ms_ != 0) refuse();
        return;
    }
    if (spec.is_retail()) {
        // Retail periods nest when they are shorter and share the cycle's
        // anchor; units are declared from the shortest.
        kind_ = Kind::Retail;
        if (!cycle.is_retail() || cycle.retail_anchor != spec.retail_anchor ||
            int(spec.unit) >= int(cycle.unit))
            refuse();
        retail_periods_.emplace(spec, clock);
        return;
    }
    switch (spec.unit) {
        case PeriodUnit::Day: {
            kind_ = Kind::Day;
            const bool longer =
                cycle.unit == PeriodUnit::Day ? cycle.count >= 2 : is_calendar_cycle(cycle);
            // A cycle that begins at some time of day cuts days in two.
            const bool midnight =
                !cycle.from || *cycle.from == LocalTime{date::floor<date::days>(*cycle.from)};
            if (spec.count != 1 || !longer || !midnight) refuse();
            return;
        }
        case PeriodUnit::Week:
            kind_ = Kind::Week;
            if (spec.count != 1 || cycle.unit != PeriodUnit::Year || cycle.count != 1 || cycle.from)
                refuse();
            return;
        case PeriodUnit::HalfMonth:
            kind_ = Kind::HalfMonth;
            if (!is_whole_month_cycle(cycle)) refuse();
            return;
        default: {
            kind_ = Kind::Months;
            length_months_ = spec.months();
            if (!is_whole_month_cycle(cycle) || cycle.months() <= length_months_ ||
                cycle.months() % length_months_ != 0)
                refuse();
            // One cycle start on the spec's grid puts them all there, since
            // the cycle is a whole number of spec periods.
            const PeriodCalendar cycles(cycle, ZoneClock::utc());
            const PeriodCalendar periods(spec, ZoneClock::utc());
            const Instant sample =
                cycles.period_of(Instant{date::sys_days{date::year{2001} / 6 / 15}}).start;
            if (periods.floor(sample) != sample) refuse();
            return;
        }
    }
}

date::local_days PeriodPosition::local_day(Instant t) const {
    return date::floor<date::days>(cycle_.clock().to_local(t));
}

std::int64_t PeriodPosition::position(Instant t) const {
    switch (kind_) {
        case Kind::Elapsed: {
            const Instant start = cycle_.floor(t);
            return (t - start).count() / length_ms_ + 1;
        }
        case Kind::Day:
            return (local_day(t) - local_day(cycle_.floor(t))).count() + 1;
        case Kind::HalfMonth: {
            const date::local_days day = local_day(t);
            const std::int64_t months = month_index(day) - month_index(local_day(cycle_.floor(t)));
            return 2 * months + (unsigned(date::year_month_day{day}.day()) > 15 ? 1 : 0) + 1;
        }
        case Kind::Months:
            return (month_index(local_day(t)) - month_index(local_day(cycle_.floor(t)))) /
                       length_months_ +
                   1;
        case Kind::Retail:
            return retail_periods_->serial_of(t) - retail_periods_->serial_of(cycle_.floor(t)) + 1;
        case Kind::Week: {
            const date::local_days day = local_day(t);
            const date::local_days week = day - (date::weekday{day} - week_start_);
            // The week belongs to the year that holds its fourth day.
            const date::year_month_day fourth{week + date::days{3}};
            date::year year = fourth.year();
            if (fourth.month() < year_start_) --year;
            const date::local_days year_begins{year / year_start_ / 1};
            // Week 1 is the first week with its fourth day in that year.
            const date::local_days earliest = year_begins - date::days{3};
            const auto behind = date::weekday{earliest} - week_start_;
            const date::local_days first_week =
                behind.count() == 0 ? earliest : earliest + (date::days{7} - behind);
            return (week - first_week).count() / 7 + 1;
        }
    }
    return 0;
}

}  // namespace almanac
