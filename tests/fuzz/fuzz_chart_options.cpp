// SPDX-License-Identifier: MIT
// Chart options JSON: any text is read or refused with almanac::Error, and
// options that are accepted are within their documented ranges.
#include <cstdint>
#include <string_view>

#include "core/chart/chart_options.h"
#include "core/text/json_value.h"
#include "refusal_only.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    std::string_view json(reinterpret_cast<const char*>(data), size);
    almanac::fuzz::refusal_only([&] { (void)almanac::parse_json(json); });
    almanac::fuzz::refusal_only([&] {
        almanac::ChartOptions options = almanac::parse_chart_options(json);
        using O = almanac::ChartOptions;
        if (options.width < O::kMinWidth || options.width > O::kMaxWidth ||
            options.height < O::kMinHeight || options.height > O::kMaxHeight)
            almanac::fuzz::fail("a chart size outside its documented range");
    });
    return 0;
}
