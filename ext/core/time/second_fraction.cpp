// SPDX-License-Identifier: MIT
#include "core/time/second_fraction.h"

#include "core/text/ascii.h"

namespace almanac {

std::optional<SecondFraction> read_second_fraction(std::string_view text, std::size_t most) {
    std::size_t count = 0;
    std::int64_t millis = 0;
    bool round_up = false;
    while (count < text.size() && count < most && is_ascii_digit(text[count])) {
        const int digit = text[count] - '0';
        if (count < 3) millis = millis * 10 + digit;
        // Half up: the rest is at least a half exactly when its first digit is 5 or more.
        if (count == 3) round_up = digit >= 5;
        ++count;
    }
    if (count == 0) return std::nullopt;
    for (std::size_t n = count; n < 3; ++n) millis *= 10;
    return SecondFraction{millis + (round_up ? 1 : 0), count};
}

}  // namespace almanac
