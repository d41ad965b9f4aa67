// SPDX-License-Identifier: MIT
#include "core/time/local_reading.h"

namespace almanac {

Instant instant_of_local_reading(const ZoneClock& clock, LocalTime reading) {
    Instant first = clock.first_instant_at(reading);
    if (clock.to_local(first) == reading) return first;
    // Skipped: first_instant_at gave the instant of the change itself; the
    // offset just before it is the one the reading was taken with.
    auto before = clock.offset_at(first - Millis{1});
    return instant_at_offset(reading, before);
}

}  // namespace almanac
