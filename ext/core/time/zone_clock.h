// SPDX-License-Identifier: MIT
// A wall clock: UTC, or an IANA zone read through the date library's tz
// database (which reads the operating system's zoneinfo). The only place in
// almanac where a time zone matters.
#pragma once

#include <chrono>
#include <string>
#include <string_view>
#include <vector>

#include "core/time/time_value.h"

namespace date {
class time_zone;
}

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

    bool is_utc() const { return zone_ == nullptr; }
    std::string name() const;

    Regime regime_at(Instant t) const;
    std::chrono::seconds offset_at(Instant t) const { return regime_at(t).offset; }
    LocalTime to_local(Instant t) const;
    // The first instant whose wall-clock reading is `local`, or, when the
    // reading was skipped by a forward change, the instant of that change.
    Instant first_instant_at(LocalTime local) const;

  private:
    explicit ZoneClock(const date::time_zone* zone) : zone_(zone) {}
    const date::time_zone* zone_ = nullptr;
    // Rows of one query are usually close in time, so the last regime looked
    // up answers most questions without a search of the zone's transitions.
    // A clock belongs to one statement, which runs on one thread at a time.
    mutable Regime last_{};
    mutable bool has_last_ = false;
    // Every regime looked up so far, in time order, so rows spread over many
    // years are answered by a short binary search instead of the tz
    // database's own look-up (which also builds the abbreviation string).
    mutable std::vector<Regime> known_;
};

}  // namespace almanac
