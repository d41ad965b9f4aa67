// SPDX-License-Identifier: MIT
#include "core/time/zone_clock.h"

#include <date/tz.h>

#include <algorithm>
#include <limits>

#include "core/text/error.h"

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

}  // namespace

ZoneClock ZoneClock::utc() { return ZoneClock(nullptr); }

ZoneClock ZoneClock::named(std::string_view iana_name) {
    const char* expected = "expected an IANA time zone name such as 'America/Denver' or 'UTC'";
    if (!plausible_zone_name(iana_name)) throw Error(expected);
    try {
        return ZoneClock(date::locate_zone(iana_name));
    } catch (const std::runtime_error&) {
        throw Error(std::string("not in the tz database; ") + expected);
    }
}

std::string ZoneClock::name() const { return zone_ ? std::string(zone_->name()) : "UTC"; }

ZoneClock::Regime ZoneClock::regime_at(Instant t) const {
    if (!zone_) {
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
        auto info = zone_->get_info(t);
        last_ = Regime{Instant{info.begin}, Instant{info.end}, info.offset};
        known_.insert(later, last_);
    }
    has_last_ = true;
    return last_;
}

LocalTime ZoneClock::to_local(Instant t) const {
    if (!zone_) return LocalTime{t.time_since_epoch()};
    return LocalTime{t.time_since_epoch()} + regime_at(t).offset;
}

Instant ZoneClock::first_instant_at(LocalTime local) const {
    if (!zone_) return Instant{local.time_since_epoch()};
    if (has_last_) {
        // Inside the last regime, more than a day from either end, a reading
        // occurs exactly once: no change of offset can reach it.
        Instant guess = Instant{local.time_since_epoch()} - last_.offset;
        if (last_.begin + std::chrono::hours{24} <= guess &&
            guess + std::chrono::hours{24} < last_.end)
            return guess;
    }
    // choose::earliest: the first of a repeated reading; a skipped reading
    // gives the instant of the change (the date library's documented rule).
    return zone_->to_sys(local, date::choose::earliest);
}

}  // namespace almanac
