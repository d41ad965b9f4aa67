// SPDX-License-Identifier: MIT
#include "core/time/zone_rules.h"

#include <algorithm>

namespace almanac {

ZoneRules::ZoneRules(std::int32_t initial_offset, const std::vector<Change>& changes,
                     std::optional<PosixTzRule> footer)
    : initial_offset_(initial_offset), footer_(std::move(footer)) {
    std::int32_t current = initial_offset;
    for (const Change& change : changes) {
        if (change.offset == current) continue;
        changes_.push_back(change);
        current = change.offset;
    }
    // A file without changes but with a footer is governed by the footer
    // throughout (RFC 8536 section 3.2).
    last_listed_ = changes.empty() ? PosixTzRule::kFarPast : changes.back().at;
}

OffsetSpan ZoneRules::span_at(std::int64_t t) const {
    if (footer_ && t >= last_listed_) {
        OffsetSpan span = footer_->span_at(t);
        span.begin = std::max(span.begin, last_listed_);
        return span;
    }
    auto later = std::upper_bound(changes_.begin(), changes_.end(), t,
                                  [](std::int64_t value, const Change& c) { return value < c.at; });
    bool before_first = later == changes_.begin();
    OffsetSpan span{before_first ? PosixTzRule::kFarPast : std::prev(later)->at,
                    PosixTzRule::kFarFuture,
                    before_first ? initial_offset_ : std::prev(later)->offset};
    if (later != changes_.end()) {
        span.end = later->at;
    } else if (footer_) {
        // Where the footer takes over the offset may stay the same; the span
        // is still cut there, so every instant gets the same span whichever
        // side it is looked up from.
        span.end = last_listed_;
    }
    return span;
}

}  // namespace almanac
