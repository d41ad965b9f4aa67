// SPDX-License-Identifier: MIT
// A wall clock: UTC, or an IANA zone whose rules come from the zone database
// (the OS's zoneinfo or the built-in data; zone_database.h). The only place
// in almanac where a time zone matters.
#pragma once

#include <chrono>
#include <string>
#include <string_view>
#include <vector>

#include "core/time/time_value.h"
#include "core/time/zone_rules.h"

namespace almanac {

class ZoneClock {
  public:
    // A stretch of time during which the zone's offset from UTC is constant.
    struct Regime {
        Instant begin;  // inclusive
        Instant end;    // exclusive
        std::chrono::seconds offset;
    };

    static ZoneClock utc();
    // Throws Error for a name not in the tz database. Never opens a path.
    static ZoneClock named(std::string_view iana_name);

    bool is_utc() const { return rules_ == nullptr; }
    std::string name() const;

    Regime regime_at(Instant t) const;
    std::chrono::seconds offset_at(Instant t) const { return regime_at(t).offset; }
    LocalTime to_local(Instant t) const;
    // The first instant whose wall-clock reading is `local`, or, when the
    // reading was skipped by a forward change, the instant of that change.
    Instant first_instant_at(LocalTime local) const;

  private:
    ZoneClock(const ZoneRules* rules, std::string_view name) : rules_(rules), name_(name) {}
    Regime regime_of_span(Instant t) const;
    // Rules are shared by every clock of the process and never freed.
    const ZoneRules* rules_ = nullptr;
    std::string name_;
    // Rows of one query are usually close in time, so the last regime looked
    // up answers most questions without a search of the zone's transitions.
    // A clock belongs to one statement, which runs on one thread at a time.
    mutable Regime last_{};
    mutable bool has_last_ = false;
    // Every regime looked up so far, in time order, so rows spread over many
    // years are answered by a short binary search instead of a walk
    // through the zone's rules.
    mutable std::vector<Regime> known_;
};

}  // namespace almanac
