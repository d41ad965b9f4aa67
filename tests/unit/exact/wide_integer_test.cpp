// SPDX-License-Identifier: MIT
#include "core/exact/wide_integer.h"

#include <catch2/catch.hpp>
#include <cstdint>
#include <random>
#include <vector>

using almanac::PortableInt128;
using almanac::PortableUint128;

namespace {
constexpr std::uint64_t kAllOnes = ~std::uint64_t(0);

}  // namespace

TEST_CASE("the portable 128-bit product of two 64-bit numbers is exact at the extremes") {
    // (2^64 - 1)^2 = 2^128 - 2^65 + 1: high half 2^64 - 2, low half 1 (arithmetic identity).
    PortableUint128 square = PortableUint128(kAllOnes) * kAllOnes;
    CHECK(square.high() == kAllOnes - 1);
    CHECK(square.low() == 1);
    // 2^127 * 2 wraps to 0 modulo 2^128, as unsigned arithmetic does (C++17 [basic.fundamental]).
    CHECK((PortableUint128(1) << 127) * 2 == 0);
    // Uint128(-1) is 2^128 - 1: a negative integer converts modulo 2^128 (C++17 [conv.integral]).
    CHECK(PortableUint128(-1) == PortableUint128::from_halves(kAllOnes, kAllOnes));
}

TEST_CASE("the portable signed form knows when a sum leaves its range") {
    const PortableInt128 largest(PortableUint128::from_halves(kAllOnes >> 1, kAllOnes));
    const PortableInt128 smallest = -largest - 1;
    PortableInt128 sum;
    // Two's complement range [-2^127, 2^127 - 1] (C++20 [basic.fundamental], common practice).
    CHECK(almanac::add_overflows(largest, PortableInt128(1), &sum));
    CHECK(almanac::add_overflows(smallest, PortableInt128(-1), &sum));
    CHECK_FALSE(almanac::add_overflows(largest, smallest, &sum));
    CHECK(sum == -1);
    CHECK(smallest < largest);
    CHECK(PortableInt128(-5) < PortableInt128(3));
    CHECK(static_cast<std::int64_t>(PortableInt128(-7) * PortableInt128(6)) == -42);
}

#if defined(__SIZEOF_INT128__)
namespace {
// Halves that sit on every carry and sign boundary, then seeded random ones.
std::vector<std::uint64_t> interesting_halves() {
    std::vector<std::uint64_t> halves = {0,
                                         1,
                                         2,
                                         0xffffffffu,
                                         0x100000000u,
                                         std::uint64_t(1) << 52,
                                         (std::uint64_t(1) << 53) - 1,
                                         std::uint64_t(1) << 63,
                                         (std::uint64_t(1) << 63) - 1,
                                         kAllOnes - 1,
                                         kAllOnes};
    std::mt19937_64 random(20261202);
    for (int i = 0; i < 24; ++i) halves.push_back(random());
    return halves;
}
}  // namespace

TEST_CASE("the portable 128-bit integers give the native __int128 results bit for bit") {
    // oracle: GCC's native unsigned __int128 and __int128 on this 64-bit target
    // (__builtin_add_overflow for the signed sums).
    __extension__ typedef unsigned __int128 Native;
    __extension__ typedef __int128 NativeSigned;
    auto native = [](PortableUint128 v) { return (Native(v.high()) << 64) | v.low(); };
    auto same = [&](PortableUint128 portable, Native expected) {
        return native(portable) == expected;
    };
    const std::vector<std::uint64_t> halves = interesting_halves();
    std::vector<PortableUint128> values;
    for (std::size_t i = 0; i < halves.size(); ++i)
        for (std::size_t j = 0; j < halves.size(); j += 3)
            values.push_back(PortableUint128::from_halves(halves[i], halves[j]));
    const unsigned shifts[] = {0, 1, 13, 31, 32, 33, 63, 64, 65, 96, 127};
    std::size_t compared = 0;
    for (const PortableUint128& a : values) {
        const Native na = native(a);
        for (unsigned s : shifts) {
            REQUIRE(same(a << s, na << s));
            REQUIRE(same(a >> s, na >> s));
            compared += 2;
        }
        REQUIRE(static_cast<std::uint32_t>(a) == static_cast<std::uint32_t>(na));
        REQUIRE(static_cast<std::uint64_t>(a) == static_cast<std::uint64_t>(na));
        REQUIRE(same(-a, Native(0) - na));
        for (const PortableUint128& b : values) {
            const Native nb = native(b);
            REQUIRE(same(a + b, na + nb));
            REQUIRE(same(a - b, na - nb));
            REQUIRE(same(a * b, na * nb));
            REQUIRE(same(a & b, na & nb));
            REQUIRE(same(a | b, na | nb));
            REQUIRE(same(a ^ b, na ^ nb));
            REQUIRE((a < b) == (na < nb));
            REQUIRE((a == b) == (na == nb));
            const PortableInt128 sa(a), sb(b);
            const auto nsa = static_cast<NativeSigned>(na), nsb = static_cast<NativeSigned>(nb);
            REQUIRE((sa < sb) == (nsa < nsb));
            PortableInt128 sum;
            NativeSigned native_sum;
            REQUIRE(almanac::add_overflows(sa, sb, &sum) ==
                    __builtin_add_overflow(nsa, nsb, &native_sum));
            REQUIRE(same(sum.bits(), static_cast<Native>(native_sum)));
            compared += 11;
        }
    }
    for (std::uint64_t h : halves) {
        const auto signed_half = static_cast<std::int64_t>(h);
        REQUIRE(same(PortableUint128(signed_half), static_cast<Native>(NativeSigned(signed_half))));
        REQUIRE(same(PortableInt128(signed_half).bits(),
                     static_cast<Native>(NativeSigned(signed_half))));
        compared += 2;
    }
    WARN("compared " << compared << " portable results with native __int128");
}
#endif
