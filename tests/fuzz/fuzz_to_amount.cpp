// SPDX-License-Identifier: MIT
// to_amount's reader: money text with '.' or ',' as the decimal mark (the
// first byte chooses). Read or refused with almanac::Error; an amount that is
// read is a finite number.
#include <cmath>
#include <cstdint>
#include <string_view>

#include "core/text/amount_text.h"
#include "refusal_only.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    if (size == 0) return 0;
    char mark = data[0] & 1 ? ',' : '.';
    std::string_view text(reinterpret_cast<const char*>(data) + 1, size - 1);
    almanac::fuzz::refusal_only([&] {
        auto amount = almanac::read_amount(text, mark);
        if (amount && !std::isfinite(*amount)) almanac::fuzz::fail("an amount that is not finite");
    });
    return 0;
}
