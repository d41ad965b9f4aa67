// SPDX-License-Identifier: MIT
// Two kinds of period, two algorithms:
//  - calendar periods (day and longer) are runs of wall-clock days: their
//    boundaries are wall-clock moments (midnight, or the `from` time of day),
//    placed on the time line at the first instant the clock shows them;
//  - sub-day periods are intervals of elapsed time whose boundaries are the
//    instants at which the clock shows a round value. Within one offset
//    regime those form an arithmetic progression; a change of offset may
//    skip or repeat round readings, so serial numbers are counted across
//    regimes (see SubDayGrid) rather than read off the clock.
#include "core/time/period_calendar.h"

#include <algorithm>
#include <map>
#include <mutex>
#include <tuple>
#include <vector>

#include "core/exact/floor_division.h"
#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/time/civil_days.h"

namespace almanac {
namespace {

using namespace std::chrono;
using date::days;

constexpr std::int64_t kMillisPerDay = 86400000;
constexpr std::int64_t kFirstSupportedDay = -719528;  // 0000-01-01

std::int64_t month_index(date::year_month_day ymd) {
    return std::int64_t(int(ymd.year())) * 12 + (unsigned(ymd.month()) - 1);
}

date::year_month month_at(std::int64_t index) {
    return date::year{int(floor_div(index, 12))} /
           date::month{unsigned(index - 12 * floor_div(index, 12)) + 1};
}

unsigned last_day(date::year_month ym) {
    return days_in_month(int(ym.year()), unsigned(ym.month()));
}

LocalTime local_epoch() { return LocalTime{Millis{0}}; }

void require_supported(LocalTime t) {
    if (!in_supported_range(t)) throw Error("the result falls outside years 0000 through 9999");
}

}  // namespace

// ---------------------------------------------------------------------------
// Calendar periods on the wall clock, numbered by k relative to an anchor.
class CalendarGrid {
  public:
    explicit CalendarGrid(const PeriodSpec& spec) : spec_(spec) {
        switch (spec.unit) {
            case PeriodUnit::Day:
            case PeriodUnit::Week: {
                length_days_ = spec.days();
                if (spec.from) {
                    anchor_ = *spec.from;
                } else if (spec.unit == PeriodUnit::Week) {
                    // The week start on or before 1970-01-01 (a Thursday).
                    date::local_days epoch{date::year{1970} / 1 / 1};
                    auto back = date::weekday{epoch} - spec.week_start;
                    anchor_ = LocalTime{(epoch - back).time_since_epoch()};
                } else {
                    anchor_ = local_epoch();
                }
                break;
            }
            case PeriodUnit::HalfMonth:
                anchor_month_ = 1970 * 12;
                break;
            case PeriodUnit::RetailWeek: {
                // Weeks start the day after the anchor weekday: the one on or
                // before 1970-01-01 anchors the grid.
                length_days_ = 7;
                date::local_days epoch{date::year{1970} / 1 / 1};
                auto back = date::weekday{epoch} - (spec.retail_anchor.weekday + days{1});
                anchor_ = LocalTime{(epoch - back).time_since_epoch()};
                break;
            }
            case PeriodUnit::RetailMonth:
            case PeriodUnit::RetailQuarter:
            case PeriodUnit::RetailYear:
                // Numbered by retail year: k = parts * year name + part.
                retail_parts_ = spec.unit == PeriodUnit::RetailYear      ? 1
                                : spec.unit == PeriodUnit::RetailQuarter ? 4
                                                                         : 12;
                break;
            default: {
                length_months_ = spec.months();
                if (spec.from) {
                    auto day = date::floor<days>(*spec.from);
                    date::year_month_day ymd{day};
                    anchor_month_ = month_index(ymd);
                    anchor_day_ = unsigned(ymd.day());
                    anchor_time_ = *spec.from - LocalTime{day.time_since_epoch()};
                } else {
                    // The period start on or before 1970-01: a start month
                    // (January unless fiscal) a whole number of quarters or
                    // years before it.
                    std::int64_t step = spec.unit == PeriodUnit::Quarter ? 3 : 12;
                    if (spec.unit == PeriodUnit::Month) step = 1;
                    std::int64_t start = 1970 * 12 + (unsigned(spec.year_start) - 1);
                    anchor_month_ = start - step * ((start - 1970 * 12 + step - 1) / step);
                    if (anchor_month_ > 1970 * 12) anchor_month_ -= step;
                }
            }
        }
        epoch_index_ = index_of(local_epoch());
        anchor_day_number_ = date::floor<days>(anchor_).time_since_epoch().count();
    }

    // index_of and boundary in day numbers (days since 1970-01-01), for grids
    // whose boundaries are midnights: the period keys' shortcut.
    std::int64_t index_of_day(std::int64_t day) const {
        if (length_days_ == 7) return floor_div_by<7>(day - anchor_day_number_);
        if (length_days_ == 1) return day - anchor_day_number_;
        if (length_days_ > 0) return floor_div(day - anchor_day_number_, length_days_);
        return index_of(LocalTime{Millis{day * kMillisPerDay}});
    }
    std::int64_t boundary_day(std::int64_t k) const {
        if (length_days_ > 0) return anchor_day_number_ + k * length_days_;
        return date::floor<days>(boundary(k)).time_since_epoch().count();
    }

    LocalTime boundary(std::int64_t k) const {
        if (length_days_ > 0) return anchor_ + Millis{k * length_days_ * kMillisPerDay};
        if (retail_parts_ > 0) return LocalTime{Millis{retail_boundary_day(k) * kMillisPerDay}};
        if (spec_.unit == PeriodUnit::HalfMonth) {
            auto ym = month_at(anchor_month_ + floor_div(k, 2));
            unsigned day = (k - 2 * floor_div(k, 2)) == 0 ? 1 : 16;
            return start_of(ym, day);
        }
        auto ym = month_at(anchor_month_ + k * length_months_);
        unsigned day = anchor_day_ <= 28 ? anchor_day_ : std::min(anchor_day_, last_day(ym));
        return start_of(ym, day) + anchor_time_;
    }

    std::int64_t index_of(LocalTime t) const {
        if (length_days_ > 0) {
            // Dividing by a constant compiles to a multiplication; a 64-bit
            // division by a run-time divisor costs tens of cycles per row, so
            // the common lengths get their own constants.
            std::int64_t since = (t - anchor_).count();
            if (length_days_ == 7) return floor_div_by<7 * kMillisPerDay>(since);
            if (length_days_ == 1) return floor_div_by<kMillisPerDay>(since);
            return floor_div(since, length_days_ * kMillisPerDay);
        }
        if (retail_parts_ > 0)
            return retail_index_of_day(date::floor<days>(t).time_since_epoch().count());
        CivilDate civil = civil_from_day_number(
            static_cast<std::int32_t>(date::floor<days>(t).time_since_epoch().count()));
        std::int64_t month = std::int64_t{civil.year} * 12 + (civil.month - 1);
        if (spec_.unit == PeriodUnit::HalfMonth) {
            return 2 * (month - anchor_month_) + (civil.day >= 16 ? 1 : 0);
        }
        std::int64_t k = floor_div(month - anchor_month_, length_months_);
        if (t < boundary(k)) --k;
        return k;
    }

    std::int64_t epoch_index() const { return epoch_index_; }
    bool has_time_of_day() const {
        if (!spec_.from) return false;
        return *spec_.from != LocalTime{date::floor<days>(*spec_.from).time_since_epoch()};
    }

  private:
    // Retail years, quarters and months: the first day of period k, and the
    // period that holds a day, through the retail year's weeks.
    std::int64_t retail_boundary_day(std::int64_t k) const {
        const std::int64_t name = floor_div(k, retail_parts_);
        const unsigned part = unsigned(k - name * retail_parts_);
        const RetailYear year =
            retail_year_named(spec_.retail_anchor, static_cast<std::int32_t>(name));
        const unsigned week = retail_parts_ == 4    ? 13 * part
                              : retail_parts_ == 12 ? spec_.retail_pattern.first_week_of_month(part)
                                                    : 0;
        return year.first_day + 7 * std::int64_t{week};
    }
    std::int64_t retail_index_of_day(std::int64_t day) const {
        const RetailYear year = retail_year_holding(spec_.retail_anchor, day);
        const unsigned week = unsigned((day - year.first_day) / 7);
        const unsigned part = retail_parts_ == 4    ? std::min(week / 13, 3u)
                              : retail_parts_ == 12 ? spec_.retail_pattern.month_of_week(week)
                                                    : 0;
        return std::int64_t{year.name} * retail_parts_ + part;
    }

    static LocalTime start_of(date::year_month ym, unsigned day) {
        std::int32_t number = day_number_from_civil(int(ym.year()), unsigned(ym.month()), day);
        return LocalTime{Millis{std::int64_t{number} * kMillisPerDay}};
    }

    PeriodSpec spec_;
    std::int64_t length_days_ = 0;
    std::int64_t length_months_ = 0;
    std::int64_t retail_parts_ = 0;  // retail year, quarter, month: periods per retail year
    LocalTime anchor_{};
    std::int64_t anchor_month_ = 0;
    unsigned anchor_day_ = 1;
    Millis anchor_time_{0};
    std::int64_t epoch_index_ = 0;
    std::int64_t anchor_day_number_ = 0;  // anchor_'s day (days since 1970-01-01)
};

// ---------------------------------------------------------------------------
// Sub-day periods: boundaries at instants u whose reading u + offset(u) is
// anchor + q·L for a whole q. In a regime with offset c that is the
// progression u = anchor − c + q·L. Each regime gets a constant K so that the
// serial of the period starting at grid point q is q + K; the K are chained
// across regimes so that consecutive boundaries differ by exactly one.
class SubDayGrid {
  public:
    struct RegimeSerials {
        ZoneClock::Regime regime;
        bool has_boundary;             // a grid point falls inside the regime
        std::int64_t first_q, last_q;  // grid points inside, when has_boundary
        std::int64_t k;                // serial = q + k
    };

    SubDayGrid(const PeriodSpec& spec, const ZoneClock& clock)
        : length_(spec.sub_day_length().count()),
          anchor_(spec.from ? spec.from->time_since_epoch().count() : 0) {
        // Every regime of the zone within the supported years, in order.
        Instant t = earliest_supported_instant() - hours{24};
        Instant stop = latest_supported_instant() + hours{24};
        while (true) {
            auto regime = clock.regime_at(t);
            RegimeSerials entry{regime, false, 0, 0, 0};
            Instant begin = std::max(regime.begin, earliest_supported_instant() - hours{24});
            Instant end = std::min(regime.end, stop);
            entry.regime.begin = begin;
            entry.regime.end = end;
            std::int64_t c = duration_cast<Millis>(regime.offset).count();
            entry.first_q = ceil_q(begin.time_since_epoch().count(), c);
            entry.last_q = floor_q(end.time_since_epoch().count() - 1, c);
            entry.has_boundary = entry.first_q <= entry.last_q;
            regimes_.push_back(entry);
            if (regime.end >= stop) break;
            t = regime.end;
        }
        // Chain serials, starting from 0 at the period holding 1970-01-01
        // 00:00 on the clock (the anchor's day when `from` is given).
        Instant epoch = clock.first_instant_at(local_epoch());
        std::size_t home = regime_index(epoch);
        // Find the boundary at or before the epoch instant.
        std::size_t i = home;
        std::int64_t q_start;
        while (true) {
            const auto& r = regimes_[i];
            std::int64_t c = offset_millis(r);
            std::int64_t t_ms = i == home ? epoch.time_since_epoch().count()
                                          : r.regime.end.time_since_epoch().count() - 1;
            std::int64_t q = floor_q(t_ms, c);
            if (r.has_boundary && q >= r.first_q) {
                q_start = q;
                break;
            }
            if (i == 0) throw Error("no period boundary found before 1970 in this zone");
            --i;
        }
        regimes_[i].k = -q_start;
        // Forward.
        std::int64_t last_serial = regimes_[i].last_q + regimes_[i].k;
        for (std::size_t j = i + 1; j < regimes_.size(); ++j) {
            if (!regimes_[j].has_boundary) continue;
            regimes_[j].k = last_serial + 1 - regimes_[j].first_q;
            last_serial = regimes_[j].last_q + regimes_[j].k;
        }
        // Backward.
        std::int64_t first_serial = regimes_[i].first_q + regimes_[i].k;
        for (std::size_t j = i; j-- > 0;) {
            if (!regimes_[j].has_boundary) continue;
            regimes_[j].k = first_serial - 1 - regimes_[j].last_q;
            first_serial = regimes_[j].first_q + regimes_[j].k;
        }
    }

    Period period_of(Instant t) const {
        std::size_t i = regime_index(t);
        std::int64_t t_ms = t.time_since_epoch().count();
        // The latest boundary at or before t: in t's regime, or an earlier one.
        std::size_t s = i;
        std::int64_t q;
        while (true) {
            const auto& r = regimes_[s];
            q = floor_q(s == i ? t_ms : r.regime.end.time_since_epoch().count() - 1,
                        offset_millis(r));
            if (r.has_boundary && q >= r.first_q) break;
            if (s == 0) throw Error("the time is before the first period boundary of the zone");
            --s;
        }
        Period period;
        period.start = point(regimes_[s], q);
        period.serial = q + regimes_[s].k;
        period.end = boundary_after(s, q);
        return period;
    }

    Period period_by_serial(std::int64_t serial) const {
        // The regime whose serials cover `serial`: the last one with a
        // boundary whose first serial is at most `serial`.
        std::size_t found = regimes_.size();
        std::size_t lo = 0, hi = regimes_.size();
        // Serials increase with regime order, so a binary search over the
        // regimes' first serials works; regimes without boundaries are skipped.
        while (lo < hi) {
            std::size_t mid = (lo + hi) / 2;
            std::size_t m = mid;
            while (m < hi && !regimes_[m].has_boundary) ++m;
            if (m == hi) {
                hi = mid;
                continue;
            }
            if (regimes_[m].first_q + regimes_[m].k <= serial) {
                found = m;
                lo = m + 1;
            } else {
                hi = mid;
            }
        }
        if (found == regimes_.size())
            throw Error("the result falls outside years 0000 through 9999");
        const auto& r = regimes_[found];
        std::int64_t q = serial - r.k;
        if (q > r.last_q) throw Error("the result falls outside years 0000 through 9999");
        Period period{point(r, q), Instant{}, serial};
        period.end = boundary_after(found, q);
        return period;
    }

  private:
    static std::int64_t offset_millis(const RegimeSerials& r) {
        return duration_cast<Millis>(r.regime.offset).count();
    }
    std::int64_t floor_q(std::int64_t t_ms, std::int64_t c) const {
        return floor_div(t_ms + c - anchor_, length_);
    }
    std::int64_t ceil_q(std::int64_t t_ms, std::int64_t c) const {
        return -floor_div(-(t_ms + c - anchor_), length_);
    }
    Instant point(const RegimeSerials& r, std::int64_t q) const {
        return Instant{Millis{anchor_ - offset_millis(r) + q * length_}};
    }
    Instant boundary_after(std::size_t s, std::int64_t q) const {
        if (q < regimes_[s].last_q) return point(regimes_[s], q + 1);
        for (std::size_t j = s + 1; j < regimes_.size(); ++j) {
            if (regimes_[j].has_boundary) return point(regimes_[j], regimes_[j].first_q);
        }
        return latest_supported_instant();
    }
    std::size_t regime_index(Instant t) const {
        auto it = std::upper_bound(
            regimes_.begin(), regimes_.end(), t,
            [](Instant value, const RegimeSerials& r) { return value < r.regime.end; });
        if (it == regimes_.end()) return regimes_.size() - 1;
        return static_cast<std::size_t>(it - regimes_.begin());
    }

    std::int64_t length_;
    std::int64_t anchor_;
    std::vector<RegimeSerials> regimes_;
};

// A zone's grid walks every offset regime from year 0000 to 9999: about
// 16,000 for a zone that keeps daylight saving by its footer rule, a few
// milliseconds of work. Statements repeat the same zone and spec, and zone
// rules never change while the process runs, so zoned grids are built once
// and shared by every statement and thread of the process.
std::shared_ptr<const SubDayGrid> shared_sub_day_grid(const PeriodSpec& spec,
                                                      const ZoneClock& clock) {
    if (clock.is_utc()) return std::make_shared<const SubDayGrid>(spec, clock);
    using Key = std::tuple<std::string, std::int64_t, std::int64_t>;
    static std::mutex mutex;
    static std::map<Key, std::shared_ptr<const SubDayGrid>> grids;
    // A bound on the cache: a process that cycles through many zones and
    // specs starts over rather than keeping every grid (about 1 MB each).
    constexpr std::size_t kMostGrids = 64;
    Key key{clock.name(), spec.sub_day_length().count(),
            spec.from ? spec.from->time_since_epoch().count() : 0};
    std::lock_guard<std::mutex> lock(mutex);
    auto found = grids.find(key);
    if (found != grids.end()) return found->second;
    auto grid = std::make_shared<const SubDayGrid>(spec, clock);
    if (grids.size() >= kMostGrids) grids.clear();
    grids.emplace(std::move(key), grid);
    return grid;
}

// ---------------------------------------------------------------------------

PeriodCalendar::PeriodCalendar(PeriodSpec spec, ZoneClock clock)
    : spec_(std::move(spec)), clock_(clock) {
    if (spec_.is_sub_day()) {
        sub_day_ = shared_sub_day_grid(spec_, clock_);
    } else {
        grid_ = std::make_shared<CalendarGrid>(spec_);
        writes_dates_ = !grid_->has_time_of_day();
        utc_midnights_ = writes_dates_ && clock_.is_utc();
    }
}

std::optional<date::local_days> PeriodCalendar::utc_period_start_day(date::local_days day) const {
    if (!utc_midnights_) return std::nullopt;
    std::int64_t start = grid_->boundary_day(grid_->index_of_day(day.time_since_epoch().count()));
    if (start < kFirstSupportedDay) return std::nullopt;
    return date::local_days{date::days{start}};
}

std::optional<std::int64_t> PeriodCalendar::utc_period_serial_of_day(date::local_days day) const {
    if (!utc_midnights_) return std::nullopt;
    return grid_->index_of_day(day.time_since_epoch().count()) - grid_->epoch_index();
}

Period PeriodCalendar::period_of(Instant t) const {
    if (sub_day_) return sub_day_->period_of(t);
    std::int64_t k = grid_->index_of(clock_.to_local(t));
    Period period{clock_.first_instant_at(grid_->boundary(k)),
                  clock_.first_instant_at(grid_->boundary(k + 1)), k - grid_->epoch_index()};
    // In a repeated hour the reading can be earlier than the next boundary
    // while the instant is already past its first occurrence.
    while (period.end <= t) {
        ++k;
        period = Period{period.end, clock_.first_instant_at(grid_->boundary(k + 1)),
                        k - grid_->epoch_index()};
    }
    return period;
}

Instant PeriodCalendar::floor(Instant t) const {
    if (sub_day_) return period_of(t).start;
    LocalTime local = clock_.to_local(t);
    Instant start = clock_.first_instant_at(grid_->boundary(grid_->index_of(local)));
    // period_of's correction for a repeated hour is needed only when the
    // offset changed between the start and t.
    if (!clock_.is_utc() && clock_.regime_at(t).begin > start) return period_of(t).start;
    return start;
}

std::int64_t PeriodCalendar::serial_of(Instant t) const {
    if (sub_day_) return sub_day_->period_of(t).serial;
    if (clock_.is_utc()) return grid_->index_of(clock_.to_local(t)) - grid_->epoch_index();
    // One look-up of the offset: when the period's first reading falls in
    // t's own regime, more than a day after the regime began, no change of
    // offset lies between the period's start and t, and no earlier regime
    // can have shown that reading or the next boundary's (offsets change by
    // at most 26 hours), so the period is the one the reading names.
    // Otherwise period_of sorts it out.
    ZoneClock::Regime regime = clock_.regime_at(t);
    std::int64_t k = grid_->index_of(LocalTime{t.time_since_epoch()} + regime.offset);
    Instant start{(grid_->boundary(k) - regime.offset).time_since_epoch()};
    if (start >= regime.begin + std::chrono::hours{26}) return k - grid_->epoch_index();
    return period_of(t).serial;
}

Instant PeriodCalendar::start_of_day(date::local_days day) const {
    return clock_.first_instant_at(LocalTime{day.time_since_epoch()});
}

Instant PeriodCalendar::place_on_time_line(const TimeValue& value) const {
    return value.is_calendar_day() ? start_of_day(value.day()) : value.instant();
}

Period PeriodCalendar::period_by_serial(std::int64_t serial) const {
    if (sub_day_) return sub_day_->period_by_serial(serial);
    std::int64_t k = serial + grid_->epoch_index();
    LocalTime start = grid_->boundary(k), end = grid_->boundary(k + 1);
    require_supported(start);
    return Period{clock_.first_instant_at(start), clock_.first_instant_at(end), serial};
}

std::pair<std::int64_t, std::int64_t> PeriodCalendar::supported_serials() const {
    Period first = period_of(earliest_supported_instant());
    std::int64_t lowest =
        first.start < earliest_supported_instant() ? first.serial + 1 : first.serial;
    return {lowest, period_of(latest_supported_instant() - Millis{1}).serial};
}

LocalTime PeriodCalendar::shift_reading(LocalTime local, std::int64_t n) const {
    std::int64_t k = grid_->index_of(local);
    LocalTime target_start = grid_->boundary(k + n);
    LocalTime target_end = grid_->boundary(k + n + 1);
    require_supported(target_start);
    LocalTime target;
    if (spec_.is_month_based()) {
        // Months move the date's month and keep its day, clamped to the
        // month's last day (Jan 31 + 1 month = Feb 28 or 29), and its time.
        auto day = date::floor<days>(local);
        date::year_month_day ymd{day};
        auto ym = month_at(month_index(ymd) + n * spec_.months());
        unsigned d = std::min(unsigned(ymd.day()), last_day(ym));
        target = LocalTime{date::local_days{ym / d}.time_since_epoch()} +
                 (local - LocalTime{day.time_since_epoch()});
        // With a `from` day late in the month the clamped date can fall just
        // outside the target period; keep it inside.
        if (target < target_start) target = target_start;
    } else {
        // Days, weeks and half-months keep the offset from their period's start.
        target = target_start + (local - grid_->boundary(k));
    }
    if (target >= target_end) {
        auto excess_days = (target - target_end).count() / kMillisPerDay + 1;
        target -= Millis{excess_days * kMillisPerDay};
    }
    require_supported(target);
    return target;
}

Instant PeriodCalendar::shift(Instant t, std::int64_t n) const {
    if (sub_day_) {
        // Whole periods by serial, keeping the elapsed offset into the period.
        Period here = sub_day_->period_of(t);
        Period there = sub_day_->period_by_serial(here.serial + n);
        Instant result = there.start + (t - here.start);
        if (result >= there.end) result = there.end - Millis{1};
        return result;
    }
    return clock_.first_instant_at(shift_reading(clock_.to_local(t), n));
}

date::local_days PeriodCalendar::shift_day(date::local_days day, std::int64_t n) const {
    if (sub_day_) {
        throw Error("a calendar day cannot be moved by sub-day periods; give a date-time");
    }
    return date::floor<days>(shift_reading(LocalTime{day.time_since_epoch()}, n));
}

char* PeriodCalendar::write_boundary(Instant t, char* out) const {
    LocalTime local = clock_.to_local(t);
    require_supported(local);
    if (writes_dates()) return write_date(out, date::floor<days>(local));
    std::string text = format_date_time(local, TextForm::Precision::Seconds, false);
    if (!clock_.is_utc()) text += format_offset(clock_.offset_at(t));
    return std::copy(text.begin(), text.end(), out);
}

std::string PeriodCalendar::format_like(const TextForm& like, Instant t) const {
    std::chrono::seconds offset{0};
    if (like.suffix == TextForm::Suffix::Offset) {
        offset = clock_.is_utc() ? like.offset : clock_.offset_at(t);
    }
    LocalTime reading{(t + offset).time_since_epoch()};
    std::string text = format_date_time(reading, like.precision, like.t_separator);
    if (like.suffix == TextForm::Suffix::Z) text += 'Z';
    if (like.suffix == TextForm::Suffix::Offset) text += format_offset(offset);
    return text;
}

std::string PeriodCalendar::format_boundary(Instant t) const {
    char buffer[kBoundaryTextSize];
    return std::string(buffer, write_boundary(t, buffer));
}

namespace {

// Years are written with at least four digits; a fiscal year that ends after
// 9999 takes a fifth.
std::string year_text(int year) {
    return year >= 0 && year < 10000 ? padded(unsigned(year), 4) : std::to_string(year);
}

std::string two_digits(unsigned v) { return padded(v, 2); }

// ISO 8601 week date: the week belongs to the year of its Thursday.
std::string iso_week_label(date::local_days monday) {
    auto thursday = monday + days{3};
    date::year iso_year = date::year_month_day{thursday}.year();
    date::local_days first_thursday{
        date::year_month_weekday{iso_year / date::January / date::Thursday[1]}};
    unsigned week = unsigned((thursday - first_thursday).count() / 7) + 1;
    return year_text(int(iso_year)) + "-W" + two_digits(week);
}

// The days it covers, so a reader needs no rule: 2026-02 (1-15), 2026-02 (16-28).
std::string half_month_label(date::year_month_day start) {
    std::string month = year_text(int(start.year())) + "-" + two_digits(unsigned(start.month()));
    if (unsigned(start.day()) < 16) return month + " (1-15)";
    return month + " (16-" + two_digits(last_day(start.year() / start.month())) + ")";
}

std::string month_label(date::year_month_day start) {
    return year_text(int(start.year())) + "-" + two_digits(unsigned(start.month()));
}

// Quarters and years: 2026, 2026-Q1; fiscal ones are named for the calendar
// year in which they end: FY2027, FY2027-Q1 for a year starting in July 2026.
std::string year_or_quarter_label(date::year_month_day start, const PeriodSpec& spec) {
    unsigned month = unsigned(start.month());
    if (!spec.is_fiscal()) {
        std::string year = year_text(int(start.year()));
        if (spec.unit == PeriodUnit::Year) return year;
        return year + "-Q" + std::to_string((month - 1) / 3 + 1);
    }
    unsigned first_month = unsigned(spec.year_start);
    std::string year = "FY" + year_text(int(start.year()) + (month >= first_month ? 1 : 0));
    if (spec.unit == PeriodUnit::Year) return year;
    return year + "-Q" + std::to_string(((month + 12 - first_month) % 12) / 3 + 1);
}

// FY2025, FY2025-Q4, FY2025-P12, FY2025-W53: the retail year's name and the
// period's number within it.
std::string retail_label(date::local_days start, const PeriodSpec& spec) {
    const std::int64_t day = start.time_since_epoch().count();
    const RetailYear year = retail_year_holding(spec.retail_anchor, day);
    const std::string name = "FY" + year_text(year.name);
    const unsigned week = unsigned((day - year.first_day) / 7);
    switch (spec.unit) {
        case PeriodUnit::RetailWeek:
            return name + "-W" + two_digits(week + 1);
        case PeriodUnit::RetailMonth:
            return name + "-P" + two_digits(spec.retail_pattern.month_of_week(week) + 1);
        case PeriodUnit::RetailQuarter:
            return name + "-Q" + std::to_string(std::min(week / 13, 3u) + 1);
        default:
            return name;
    }
}

// Counted from a date, a month (quarter, year) is not the calendar month its
// start lies in, and a label like 2026-02 would say it was: name its days,
// 2026-02-15..03-14 (the year again only when it changes).
std::string span_label(date::local_days first, date::local_days last) {
    std::string first_text = format_date(first), last_text = format_date(last);
    bool same_year = date::year_month_day{last}.year() == date::year_month_day{first}.year();
    return first_text + ".." + (same_year ? last_text.substr(5) : last_text);
}

}  // namespace

std::string PeriodCalendar::label(const Period& period) const {
    LocalTime local = clock_.to_local(period.start);
    require_supported(local);
    auto day = date::floor<days>(local);
    date::year_month_day ymd{day};
    bool calendar_named = spec_.unit == PeriodUnit::HalfMonth || spec_.unit == PeriodUnit::Month ||
                          spec_.unit == PeriodUnit::Quarter || spec_.unit == PeriodUnit::Year;
    if (spec_.from && calendar_named)
        return span_label(day, date::floor<days>(clock_.to_local(period.end) - Millis{1}));
    switch (spec_.unit) {
        case PeriodUnit::Second:
        case PeriodUnit::Minute:
        case PeriodUnit::Hour: {
            auto precision = spec_.unit == PeriodUnit::Second ? TextForm::Precision::Seconds
                                                              : TextForm::Precision::Minutes;
            std::string text = format_date_time(local, precision, false);
            if (!clock_.is_utc()) text += format_offset(clock_.offset_at(period.start));
            return text;
        }
        case PeriodUnit::Week:
            if (spec_.count == 1 && spec_.week_start == date::Monday) return iso_week_label(day);
            return format_date(day);
        case PeriodUnit::Day:
            return format_date(day);
        case PeriodUnit::HalfMonth:
            return half_month_label(ymd);
        case PeriodUnit::Month:
            return month_label(ymd);
        case PeriodUnit::Quarter:
        case PeriodUnit::Year:
            return year_or_quarter_label(ymd, spec_);
        case PeriodUnit::RetailWeek:
        case PeriodUnit::RetailMonth:
        case PeriodUnit::RetailQuarter:
        case PeriodUnit::RetailYear:
            return retail_label(day, spec_);
    }
    return format_date(day);
}

}  // namespace almanac
