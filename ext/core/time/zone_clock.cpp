// SPDX-License-Identifier: MIT
#include "core/time/zone_clock.h"

#include <algorithm>
#include <limits>

#include "core/text/error.h"
#include "core/time/zone_database.h"

namespace almanac {
namespace {

bool plausible_zone_name(std::string_view name) {
    // IANA names are words of letters, digits, '_', '-', '+' separated by
    // '/'. Refusing anything else up front means a name can never be a path.
    if (name.empty() || name.size() > 64 || name.front() == '/' || name.back() == '/') return false;
    for (char c : name) {
        bool ok = (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') ||
                  c == '_' || c == '-' || c == '+' || c == '/';
        if (!ok) return false;
    }
    return name.find("..") == std::string_view::npos && name.find("//") == std::string_view::npos;
}

constexpr std::int64_t kMillisPerSecond = 1000;

}  // namespace

ZoneClock ZoneClock::utc() { return ZoneClock(nullptr, "UTC"); }

ZoneClock ZoneClock::named(std::string_view iana_name) {
    const char* expected = "expected an IANA time zone name such as 'America/Denver' or 'UTC'";
    if (!plausible_zone_name(iana_name)) throw Error(expected);
    const ZoneRules* rules = find_zone_rules(iana_name);
    if (!rules) throw Error(std::string("not in the tz database; ") + expected);
    return ZoneClock(rules, iana_name);
}

std::string ZoneClock::name() const { return name_; }

ZoneClock::Regime ZoneClock::regime_of_span(Instant t) const {
    std::int64_t seconds = date::floor<std::chrono::seconds>(t).time_since_epoch().count();
    OffsetSpan span = rules_->span_at(seconds);
    return Regime{Instant{Millis{span.begin * kMillisPerSecond}},
                  Instant{Millis{span.end * kMillisPerSecond}}, std::chrono::seconds{span.offset}};
}

ZoneClock::Regime ZoneClock::regime_at(Instant t) const {
    if (!rules_) {
        return Regime{Instant{Millis{std::numeric_limits<std::int64_t>::min() / 2}},
                      Instant{Millis{std::numeric_limits<std::int64_t>::max() / 2}},
                      std::chrono::seconds{0}};
    }
    if (has_last_ && last_.begin <= t && t < last_.end) return last_;
    auto later = std::upper_bound(known_.begin(), known_.end(), t,
                                  [](Instant value, const Regime& r) { return value < r.end; });
    if (later != known_.end() && later->begin <= t) {
        last_ = *later;
    } else {
        last_ = regime_of_span(t);
        known_.insert(later, last_);
    }
    has_last_ = true;
    return last_;
}

LocalTime ZoneClock::to_local(Instant t) const {
    if (!rules_) return LocalTime{t.time_since_epoch()};
    return LocalTime{t.time_since_epoch()} + regime_at(t).offset;
}

Instant ZoneClock::first_instant_at(LocalTime local) const {
    if (!rules_) return Instant{local.time_since_epoch()};
    Instant guess = Instant{local.time_since_epoch()};
    if (has_last_) {
        // Inside the last regime, more than a day from either end, a reading
        // occurs exactly once: no change of offset can reach it.
        Instant inside = guess - last_.offset;
        if (last_.begin + std::chrono::hours{24} <= inside &&
            inside + std::chrono::hours{24} < last_.end)
            return inside;
    }
    // Every instant read as `local` lies within a day and two hours of it
    // (offsets stay within -25h..+26h), so the regimes of that window, in
    // order, hold every occurrence: the first regime in which the reading
    // falls gives the first occurrence. A reading that falls in none was
    // skipped by a forward change, and gives the instant of that change.
    constexpr std::chrono::hours kReach{26};
    Regime regime = regime_at(guess - kReach);
    while (true) {
        Instant candidate = guess - regime.offset;
        if (regime.begin <= candidate && candidate < regime.end) return candidate;
        if (candidate < regime.begin) return regime.begin;  // skipped: the change that skipped it
        if (regime.end > guess + kReach) return candidate;  // no change nearby
        regime = regime_at(regime.end);
    }
}

}  // namespace almanac
