// SPDX-License-Identifier: MIT
// Period specs: every byte string parses or is refused with almanac::Error,
// and a parsed spec's canonical words parse back to the same canonical words.
#include <cstdint>
#include <string>
#include <string_view>

#include "core/time/period_spec.h"
#include "refusal_only.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    std::string_view text(reinterpret_cast<const char*>(data), size);
    almanac::fuzz::refusal_only([&] {
        almanac::PeriodSpec spec = almanac::parse_period_spec(text);
        std::string words = spec.describe();
        almanac::PeriodSpec again = almanac::parse_period_spec(words);
        if (again.describe() != words) almanac::fuzz::fail("describe() does not read back");
        if (spec.count < 1) almanac::fuzz::fail("a spec with a count below 1");
    });
    return 0;
}
