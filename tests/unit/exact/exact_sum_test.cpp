// SPDX-License-Identifier: MIT
#include "core/exact/exact_sum.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

#include "core/exact/exact_number.h"
#include "core/text/error.h"

using namespace almanac;

namespace {
double sum_of(std::initializer_list<double> values) {
    ExactSum sum;
    for (double v : values) sum.add(v);
    return sum.to_double();
}
}  // namespace

TEST_CASE("an exact sum of ten 0.1 rounds to 1.0, as math.fsum does") {
    // Python documentation of math.fsum: sum([.1]*10) is 0.9999999999999999,
    // fsum([.1]*10) is 1.0.
    ExactSum sum;
    for (int i = 0; i < 10; ++i) sum.add(0.1);
    CHECK(sum.to_double() == 1.0);
}

TEST_CASE("huge terms that cancel leave the small ones intact") {
    // Exact arithmetic (from memory): 1e308 + 1e308 - 1e308 - 1e308 + 1e-300 = 1e-300.
    CHECK(sum_of({1e308, 1e308, 1e-300, -1e308, -1e308}) == 1e-300);
    CHECK(sum_of({1e100, 1.0, -1e100}) == 1.0);
    CHECK(sum_of({-1e100, -1.0, 1e100}) == -1.0);
}

TEST_CASE("rounding is to nearest, ties to even, in both signs") {
    // IEEE 754 roundTiesToEven (from memory): 2^53 + 1 is a tie between 2^53
    // and 2^53 + 2; the even one wins. Anything above the tie rounds up.
    const double big = 9007199254740992.0;  // 2^53
    CHECK(sum_of({big, 1.0}) == big);
    CHECK(sum_of({big, 1.0, std::ldexp(1.0, -60)}) == big + 2.0);
    CHECK(sum_of({big, 3.0}) == big + 4.0);
    CHECK(sum_of({-big, -1.0}) == -big);
    CHECK(sum_of({-big, -1.0, -std::ldexp(1.0, -60)}) == -big - 2.0);
    CHECK(sum_of({-big, -3.0}) == -big - 4.0);
}

TEST_CASE("subnormal sums are exact and overflow gives infinity") {
    const double tiny = std::numeric_limits<double>::denorm_min();  // 2^-1074
    CHECK(sum_of({tiny, tiny, tiny}) == 3 * tiny);
    CHECK(sum_of({tiny, -tiny}) == 0.0);
    CHECK(sum_of({std::numeric_limits<double>::min(), -tiny}) ==
          std::numeric_limits<double>::min() - tiny);
    CHECK(std::isinf(sum_of({1.7e308, 1.7e308})));
    CHECK(sum_of({1.7e308, 1.7e308, -1.7e308}) == 1.7e308);
}

TEST_CASE("a term that was removed leaves no trace") {
    // Property: the same values with and without a spike that came and went.
    ExactSum fresh, passed;
    passed.add(1e15);
    for (double v : {1000000000.25, 999999999.75, 1000000001.5}) {
        fresh.add(v);
        passed.add(v);
    }
    passed.subtract(1e15);
    CHECK(passed.to_double() == fresh.to_double());
    CHECK(passed.value().to_double() == fresh.value().to_double());
    passed.subtract(1000000000.25);
    passed.subtract(999999999.75);
    passed.subtract(1000000001.5);
    CHECK(passed.is_zero());
    CHECK(passed.to_double() == 0.0);
}

TEST_CASE("products of doubles enter the sum exactly") {
    // (1 + 2^-30)^2 = 1 + 2^-29 + 2^-60 (exact arithmetic, from memory).
    double x = 1.0 + std::ldexp(1.0, -30);
    ExactSum sum;
    sum.add_product(x, x);
    sum.subtract(1.0);
    CHECK(sum.to_double() == std::ldexp(1.0, -29) + std::ldexp(1.0, -60));
    // Products far outside the double range are still exact: 1e300^2 - 1e300^2 + 1 = 1.
    ExactSum wide;
    wide.add_product(1e300, 1e300);
    wide.add(1.0);
    wide.subtract_product(1e300, -1e300 * -1.0);
    CHECK(wide.to_double() == 1.0);
    ExactSum small;
    small.add_product(1e-300, 1e-300);
    CHECK(small.to_double() == 0.0);  // 1e-600 is below the smallest subnormal
    CHECK(small.sign() == 1);         // but the exact sum knows it is there
}

TEST_CASE("shifted terms are exact powers of two apart") {
    ExactSum sum;
    sum.add_scaled(1.5, 3000);
    sum.add_scaled(1.0, 0);
    sum.subtract_scaled(1.5, 3000);
    CHECK(sum.to_double() == 1.0);
}

TEST_CASE("the limbs absorb millions of carries between reads") {
    // Products always go to the limbs. 3 * 2^20 terms of (2^53 - 1) * 2^-21
    // leave every digit far beyond 32 bits until the sum is read.
    ExactSum sum;
    double v = std::ldexp(9007199254740991.0, -21);
    const long count = 3L << 20;
    for (long i = 0; i < count; ++i) sum.add_product(v, 1.0);
    // count * v is exactly representable: 3 * 2^20 * (2^53-1) * 2^-21 = 1.5 * (2^53 - 1)
    CHECK(sum.to_double() == 1.5 * 9007199254740991.0);
    for (long i = 0; i < count; ++i) sum.subtract_product(v, -1.0);
    CHECK(sum.to_double() == 3.0 * 9007199254740991.0);
}

TEST_CASE("non-finite terms are refused") {
    ExactSum sum;
    CHECK_THROWS_AS(sum.add(std::numeric_limits<double>::infinity()), Error);
    CHECK_THROWS_AS(sum.add(std::nan("")), Error);
}

TEST_CASE("the 128-bit fast form hands over to the limbs without losing anything") {
    // A single IEEE 754 addition is correctly rounded (from memory), so for two
    // terms the exact sum rounds to a + b.
    ExactSum rescaled;
    rescaled.add(1e9);
    rescaled.add(1e-5);  // a smaller exponent: the fast form rescales
    CHECK(rescaled.to_double() == 1e9 + 1e-5);

    // Terms too far apart for 128 bits move the sum into the limbs.
    ExactSum far;
    far.add(1.0);
    far.add(1e30);
    CHECK(far.to_double() == 1.0 + 1e30);
    far.subtract(1e30);
    CHECK(far.to_double() == 1.0);
    CHECK(far.value().to_double() == 1.0);

    // Overflow of the 128-bit integer, part way through: 40 * 2^122 > 2^127.
    ExactSum overflowing;
    const double big = std::ldexp(1.0, 70);
    overflowing.add(1.0);
    for (int i = 0; i < 40; ++i) overflowing.add(big);
    CHECK(overflowing.to_double() == 40 * big);  // + 1 is far below half an ulp
    for (int i = 0; i < 40; ++i) overflowing.subtract(big);
    CHECK(overflowing.to_double() == 1.0);

    // Back to zero, the sum starts over in the fast form and stays exact.
    overflowing.subtract(1.0);
    CHECK(overflowing.is_zero());
    overflowing.add(0.1);
    overflowing.add(0.2);
    CHECK(overflowing.to_double() == 0.30000000000000004);  // 0.1 + 0.2, one IEEE addition
    CHECK(overflowing.sign() == 1);

    // A product after plain terms: the plain part moves along with it.
    ExactSum mixed;
    mixed.add(3.0);
    mixed.add_product(2.0, 5.0);
    mixed.subtract(-1.0);
    CHECK(mixed.to_double() == 14.0);
    CHECK(mixed.value().to_double() == 14.0);
}

TEST_CASE("a negative sum in the fast form converts exactly") {
    ExactSum sum;
    sum.add(-1e9);
    sum.add(-0.25);
    CHECK(sum.to_double() == -1000000000.25);
    CHECK(sum.value().to_double() == -1000000000.25);
    CHECK(sum.sign() == -1);
    ExactSum other;
    other.add(1e9);
    other.add(sum, 0);  // merging a fast-form sum into another
    CHECK(other.to_double() == -0.25);
}

// The oracle below is the compiler's own 128-bit integer, which 32-bit targets lack.
#if defined(__SIZEOF_INT128__)
TEST_CASE("carries are resolved exactly when a long frame passes 2^29 additions") {
    // The limbs' spare bits are folded every 2^29 additions (exact_sum.h);
    // run past that point with products (which force the limb form) and
    // removals, and compare with the same sum kept in exact 128-bit integer
    // arithmetic, rounded once to a double (common practice: a 128-bit integer
    // holds every partial sum here exactly; GCC converts it with IEEE 754
    // round-to-nearest-even).
    __extension__ typedef __int128 Int128;
    const double a = 67108865.0;  // 2^26 + 1: a*a = 2^52 + 2^27 + 1 needs 53 bits
    const double c = 50331649.0;  // 3 * 2^24 + 1
    const Int128 a2 = Int128{67108865} * 67108865;
    const Int128 c2 = Int128{50331649} * 50331649;
    constexpr std::uint32_t kSteps = (1u << 29) / 3 + 4321;  // three additions per step
    ExactSum sum;
    for (std::uint32_t i = 0; i < kSteps; ++i) {
        sum.add_product(a, a);
        sum.add_product(a, a);
        sum.subtract_product(c, c);
    }
    const Int128 expected = Int128{kSteps} * (2 * a2 - c2);
    CHECK(sum.to_double() == static_cast<double>(expected));
    sum.subtract_scaled(static_cast<double>(expected), 0);
    // What is left is the rounding error of that double, an exact integer.
    CHECK(sum.to_double() ==
          static_cast<double>(expected - static_cast<Int128>(static_cast<double>(expected))));
}
#endif
