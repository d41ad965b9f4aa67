// SPDX-License-Identifier: MIT
#include "core/exact/state_bytes.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <limits>
#include <vector>

#include "core/exact/exact_total.h"
#include "core/stats/exponential_weights.h"
#include "core/stats/moment_sums.h"
#include "core/text/error.h"

using namespace almanac;

namespace {

ExactSum sum_of(const std::vector<double>& values) {
    ExactSum sum;
    for (double v : values) sum.add(v);
    return sum;
}

ExactSum through_bytes(const ExactSum& sum) {
    ByteWriter out;
    out.exact_sum(sum);
    ByteReader in(out.bytes());
    ExactSum back;
    in.add_exact_sum(back);
    in.expect_end();
    return back;
}

}  // namespace

TEST_CASE("an exact sum rebuilt from its bytes holds exactly the same value") {
    // Values far apart in magnitude: the sum spans thousands of bits, so it
    // travels as several terms. Exactness is checked by subtracting the
    // original values again: an exact sum is then exactly zero (from memory:
    // x + y - x - y = 0 in exact arithmetic).
    std::vector<double> values = {1e300, 0.1, -1e-300, 3.0, 5e-324, -2.5e200, 1.0 / 3.0};
    ExactSum back = through_bytes(sum_of(values));
    for (double v : values) back.subtract(v);
    CHECK(back.is_zero());
}

TEST_CASE("an exact sum of products survives the bytes too") {
    ExactSum sum;
    sum.add_product(0.1, 0.1);
    sum.add_product(1e-200, 1e-200);
    sum.add_product(-1e150, 3e150);
    ExactSum back = through_bytes(sum);
    back.subtract_product(0.1, 0.1);
    back.subtract_product(1e-200, 1e-200);
    back.subtract_product(-1e150, 3e150);
    CHECK(back.is_zero());
}

TEST_CASE("a zero sum is written as no terms") {
    ByteWriter out;
    out.exact_sum(ExactSum());
    CHECK(out.bytes().size() == 8);
}

TEST_CASE("bytes that end early or run on are refused") {
    ByteWriter out;
    out.exact_sum(sum_of({0.1, 0.2}));
    std::string cut = out.bytes().substr(0, out.bytes().size() - 1);
    ByteReader short_reader(cut);
    ExactSum into;
    CHECK_THROWS_AS(short_reader.add_exact_sum(into), Error);
    std::string longer = out.bytes() + "x";
    ByteReader long_reader(longer);
    long_reader.add_exact_sum(into);
    CHECK_THROWS_AS(long_reader.expect_end(), Error);
}

TEST_CASE("merged totals equal the total of all values, in any split") {
    // math.fsum([0.1] * 10 + [1e16, -1e16]) == 1.0 (oracle: Python's math.fsum).
    ExactTotal left, right, whole;
    for (int i = 0; i < 10; ++i) {
        (i < 4 ? left : right).add_real(0.1);
        whole.add_real(0.1);
    }
    left.add_real(1e16);
    right.add_real(-1e16);
    whole.add_real(1e16);
    whole.add_real(-1e16);
    left.add_integer(std::numeric_limits<std::int64_t>::max());
    right.add_integer(-1);
    whole.add_integer(std::numeric_limits<std::int64_t>::max());
    whole.add_integer(-1);
    ByteWriter out;
    right.write(out);
    ByteReader in(out.bytes());
    left.merge(ExactTotal::read(in));
    auto merged = left.value(), expected = whole.value();
    REQUIRE(merged);
    REQUIRE(expected);
    CHECK(merged->is_integer == expected->is_integer);
    CHECK(merged->real == expected->real);
}

TEST_CASE("merged regression sums give the one-pass statistics bit for bit") {
    BivariateMoments left, right, whole;
    for (int i = 0; i < 40; ++i) {
        double x = i * 0.7, y = 3.0 + 0.25 * x + std::sin(i) * 1e-3;
        (i % 3 == 0 ? left : right).add(y, x);
        whole.add(y, x);
    }
    ByteWriter out;
    right.write(out);
    ByteReader in(out.bytes());
    left.merge(BivariateMoments::read(in));
    CHECK(left.count() == whole.count());
    CHECK(left.residual_sd() == whole.residual_sd());
    CHECK(left.slope_stderr() == whole.slope_stderr());
}

TEST_CASE("merged exponential weights give the one-pass mean bit for bit") {
    ExponentialWeights left, right, whole;
    for (int i = 0; i < 300; ++i) {
        auto p = ExponentialWeights::position(std::int64_t(i) * 3600000, std::int64_t(86400000));
        double x = 10.0 + (i % 7);
        (i % 2 ? left : right).add(x, p);
        whole.add(x, p);
    }
    ByteWriter out;
    right.write(out);
    ByteReader in(out.bytes());
    left.merge(ExponentialWeights::read(in));
    CHECK(left.count() == whole.count());
    CHECK(left.mean() == whole.mean());
}
