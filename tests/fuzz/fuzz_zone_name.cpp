// SPDX-License-Identifier: MIT
// Zone names: anything is refused with almanac::Error or names a zone of the
// tz database; a zone that is found answers for the first and last supported
// instants (years 0000 and 9999) without leaving them.
#include <cstdint>
#include <string_view>

#include "core/time/zone_clock.h"
#include "refusal_only.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    std::string_view name(reinterpret_cast<const char*>(data), size);
    almanac::fuzz::refusal_only([&] {
        almanac::ZoneClock clock = almanac::ZoneClock::named(name);
        for (almanac::Instant t :
             {almanac::earliest_supported_instant(),
              almanac::latest_supported_instant() - almanac::Millis(1), almanac::Instant{}}) {
            almanac::LocalTime local = clock.to_local(t);
            if (clock.first_instant_at(local) > t)
                almanac::fuzz::fail("a wall-clock reading maps to an instant after its own");
        }
    });
    return 0;
}
