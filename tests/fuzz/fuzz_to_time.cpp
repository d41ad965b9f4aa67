// SPDX-License-Identifier: MIT
// to_time's readers: a strptime-style format and a text, split at the first
// newline of the input. Each is read or refused with almanac::Error; a reading
// that is accepted lies in years 0000-9999 and, placed in a zone, gives an
// instant (or a refusal). The first bytes also make a spreadsheet serial.
#include <cmath>
#include <cstdint>
#include <cstring>
#include <string_view>

#include "core/time/local_reading.h"
#include "core/time/time_format.h"
#include "core/time/zone_clock.h"
#include "refusal_only.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    std::string_view input(reinterpret_cast<const char*>(data), size);
    std::size_t newline = input.find('\n');
    std::string_view format = input.substr(0, newline);
    std::string_view text = newline == std::string_view::npos ? "" : input.substr(newline + 1);
    almanac::fuzz::refusal_only([&] {
        almanac::TimeFormat parsed = almanac::TimeFormat::parse(format);
        if (parsed.is_spreadsheet_serial()) return;
        almanac::TimeReading reading = parsed.read(text);
        if (!almanac::in_supported_range(reading.local))
            almanac::fuzz::fail("a reading outside years 0000-9999");
        static const almanac::ZoneClock kDenver = almanac::ZoneClock::named("America/Denver");
        (void)almanac::instant_of_local_reading(kDenver, reading.local);
    });
    if (size >= sizeof(double)) {
        double serial;
        std::memcpy(&serial, data, sizeof serial);
        if (std::isfinite(serial))
            almanac::fuzz::refusal_only([&] { (void)almanac::read_spreadsheet_serial(serial); });
    }
    return 0;
}
