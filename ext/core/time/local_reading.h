// SPDX-License-Identifier: MIT
// A wall-clock reading in a zone, placed on the UTC time line by one rule for
// the two kinds of reading that do not name exactly one instant: a repeated
// reading (a fall-back night) is its first occurrence, and a skipped one (a
// spring-forward gap) is read with the offset in force before the gap. That
// is what Python's zoneinfo does with fold=0, and what a clerk who typed the
// reading on the old clock meant.
#pragma once

#include "core/time/time_value.h"
#include "core/time/zone_clock.h"

namespace almanac {

Instant instant_of_local_reading(const ZoneClock& clock, LocalTime reading);

}  // namespace almanac
