// SPDX-License-Identifier: MIT
// The rules of one time zone: the changes of UTC offset its TZif file lists,
// then the footer rule for every instant after the last of them (RFC 8536
// section 3.2), so a zone keeps its daylight saving in every year 0000-9999,
// not only in the years the file spells out.
#pragma once

#include <cstdint>
#include <optional>
#include <vector>

#include "core/time/posix_tz_rule.h"

namespace almanac {

class ZoneRules {
  public:
    struct Change {
        std::int64_t at;      // seconds since 1970-01-01 00:00 UTC
        std::int32_t offset;  // local minus UTC from `at` on
    };

    // `changes` in time order; `initial_offset` holds before the first.
    // Changes that keep the offset are dropped: only offsets matter here.
    ZoneRules(std::int32_t initial_offset, const std::vector<Change>& changes,
              std::optional<PosixTzRule> footer);

    // The span of constant offset holding t (seconds since the epoch).
    OffsetSpan span_at(std::int64_t t) const;

  private:
    std::int32_t initial_offset_;
    std::vector<Change> changes_;
    std::optional<PosixTzRule> footer_;
    // The last change the file lists, kept even when it changed no offset:
    // the footer governs from there on.
    std::int64_t last_listed_;
};

}  // namespace almanac
