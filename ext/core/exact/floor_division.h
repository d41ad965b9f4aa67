// SPDX-License-Identifier: MIT
// Division that rounds toward minus infinity. C++'s `/` truncates toward
// zero, which puts -1 ms in the period of +1 ms; every grid in almanac
// (periods, half-lives, 32-bit limbs) needs the floor instead.
#pragma once

#include <cstdint>

namespace almanac {

constexpr std::int64_t floor_div(std::int64_t a, std::int64_t b) {
    std::int64_t q = a / b;
    if ((a % b != 0) && ((a < 0) != (b < 0))) --q;
    return q;
}

// The same for a divisor known at compile time: the compiler turns the
// division into a multiplication, where a run-time 64-bit division costs tens
// of cycles; period keys divide once per row.
template <std::int64_t divisor>
constexpr std::int64_t floor_div_by(std::int64_t a) {
    static_assert(divisor > 0);
    std::int64_t q = a / divisor;
    return (a % divisor != 0 && a < 0) ? q - 1 : q;
}

static_assert(floor_div(-1, 7) == -1 && floor_div(7, 7) == 1 && floor_div(-7, 7) == -1);
static_assert(floor_div_by<32>(-33) == -2 && floor_div_by<32>(31) == 0);

}  // namespace almanac
