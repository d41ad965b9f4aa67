// SPDX-License-Identifier: MIT
// The digits of a fraction of a second, as the time-value reader and
// to_time's %f both read them: the exact decimal value rounded half up to
// the millisecond, which is what SQLite's own strftime('%f', ...) shows
// ("00.5005" is 501 ms). Only the fourth digit decides, so no digit is ever
// accumulated in floating point, where .5005 falls just below a half.
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string_view>

namespace almanac {

struct SecondFraction {
    std::int64_t millis;  // 0 to 1000: .9995 rounds up into the next second
    std::size_t digits;   // how many digits were read
};

// Reads up to `most` digits from the start of `digits_on`; nothing when it
// does not start with a digit. The caller checks what follows.
std::optional<SecondFraction> read_second_fraction(std::string_view digits_on,
                                                   std::size_t most = std::string_view::npos);

}  // namespace almanac
