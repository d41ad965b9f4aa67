// SPDX-License-Identifier: MIT
// The rule a zone follows after the last change its TZif file lists: the
// file's footer, a POSIX TZ string with the extensions of RFC 8536 section
// 3.3.1 (hours from -167 to 167 in transition times), such as
// "MST7MDT,M3.2.0,M11.1.0" or "<+1030>-10:30<+11>-11,M10.1.0,M4.1.0".
#pragma once

#include <cstdint>
#include <optional>
#include <string_view>

namespace almanac {

// A stretch of time, in seconds since 1970-01-01 00:00 UTC, during which a
// zone's offset from UTC (local minus UTC) is constant. `end` is exclusive.
struct OffsetSpan {
    std::int64_t begin;
    std::int64_t end;
    std::int32_t offset;
};

class PosixTzRule {
  public:
    // Throws Error when `text` is not a POSIX TZ string.
    static PosixTzRule parse(std::string_view text);

    bool has_daylight_saving() const { return dst_.has_value(); }
    std::int32_t standard_offset() const { return std_offset_; }
    // The span holding t. Spans are cut at the rule's changes; without
    // daylight saving the span is [-inf, +inf) in the sense of the bounds
    // given by kFarPast/kFarFuture.
    OffsetSpan span_at(std::int64_t t) const;

    // Bounds far outside years 0000-9999, so spans without an end stay
    // comparable and convertible to milliseconds without overflow.
    static constexpr std::int64_t kFarPast = -(std::int64_t{1} << 42);
    static constexpr std::int64_t kFarFuture = std::int64_t{1} << 42;

  private:
    // When in a year a change happens (POSIX "Jn", "n" or "Mm.w.d"), and at
    // what local time, in seconds after that day's local midnight.
    struct ChangeDate {
        enum class Kind { JulianNoLeap, ZeroBasedDay, MonthWeekDay } kind;
        int day = 0;  // Jn: 1-365, n: 0-365, Mm.w.d: weekday 0 (Sunday)-6
        int month = 0, week = 0;
        std::int32_t time = 7200;
        // Seconds of the local day on which the change falls, from 1970-01-01.
        std::int64_t local_day_seconds(int year) const;
    };
    struct Daylight {
        std::int32_t offset;
        ChangeDate start, end;
    };

    std::int32_t std_offset_ = 0;
    std::optional<Daylight> dst_;
};

}  // namespace almanac
