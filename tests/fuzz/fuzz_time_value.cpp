// SPDX-License-Identifier: MIT
// Time values as TEXT: every byte string either parses or is refused with
// almanac::Error; a parsed instant lies in the supported years, and a value
// that parses as a number also parses as time TEXT the same way SQLite reads it.
#include <cstdint>
#include <string_view>

#include "core/text/number_text.h"
#include "core/time/time_value.h"
#include "refusal_only.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    std::string_view text(reinterpret_cast<const char*>(data), size);
    almanac::fuzz::refusal_only([&] {
        almanac::TimeValue value = almanac::parse_time_text(text);
        if (!value.is_calendar_day() && !almanac::in_supported_range(value.instant()))
            almanac::fuzz::fail("a parsed instant outside years 0000-9999");
        if (value.is_calendar_day()) {
            // A calendar day written back reads as the same day.
            almanac::TimeValue again = almanac::parse_time_text(almanac::format_date(value.day()));
            if (!again.is_calendar_day() || again.day() != value.day())
                almanac::fuzz::fail("a calendar day does not survive format_date");
        }
    });
    almanac::fuzz::refusal_only([&] { (void)almanac::numeric_text(text); });
    return 0;
}
