// SPDX-License-Identifier: MIT
// CompactTotal against ExactTotal, the total it stands in for (ExactTotal is
// itself compared with Python's math.fsum and with 128-bit integer sums in
// exact_total_test.cpp and tests/reference/): the same values in, the same
// kind and the same bits out.
#include "core/exact/compact_total.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <cstring>
#include <limits>
#include <random>
#include <vector>

using namespace almanac;

namespace {

struct Term {
    bool integer;
    std::int64_t i;
    double r;
};

bool same(const std::optional<ExactTotal::Value>& a, const std::optional<ExactTotal::Value>& b) {
    if (a.has_value() != b.has_value()) return false;
    if (!a) return true;
    if (a->is_integer != b->is_integer) return false;
    if (a->is_integer) return a->integer == b->integer;
    return std::memcmp(&a->real, &b->real, sizeof(double)) == 0;
}

// Terms of one of several kinds of series: prices, integer counts, huge and
// tiny magnitudes mixed, cancellations, integers beyond 2^53 and near 2^63.
Term random_term(std::mt19937_64& random, int kind) {
    std::uniform_int_distribution<int> pick(0, 99);
    std::uniform_int_distribution<std::int64_t> cents(-500000, 500000);
    int p = pick(random);
    switch (kind) {
        case 0:  // prices in cents as REAL, some integers among them
            if (p < 20) return {true, cents(random) / 100, 0};
            return {false, 0, double(cents(random)) / 100.0};
        case 1:  // counts
            return {true, std::uniform_int_distribution<std::int64_t>(-50, 1000)(random), 0};
        case 2: {  // integers across the whole range, some past 2^53
            std::int64_t big = std::numeric_limits<std::int64_t>::max() / 3;
            if (p < 10)
                return {true, std::uniform_int_distribution<std::int64_t>(-big, big)(random), 0};
            if (p < 20) return {true, (std::int64_t{1} << 53) + p - 10, 0};
            return {true, std::uniform_int_distribution<std::int64_t>(-1000000, 1000000)(random),
                    0};
        }
        default: {  // magnitudes far apart, subnormals, zeros of both signs
            if (p < 5) return {false, 0, p % 2 ? 0.0 : -0.0};
            if (p < 10) return {false, 0, std::ldexp(double(p), -1074)};
            std::uniform_int_distribution<int> exponent(-1000, 1000);
            double m = std::uniform_real_distribution<double>(-1, 1)(random);
            if (p < 40) return {false, 0, std::ldexp(m, exponent(random))};
            if (p < 50) return {true, cents(random), 0};
            return {false, 0, m * 1e6};
        }
    }
}

}  // namespace

TEST_CASE("CompactTotal gives ExactTotal's answer over every kind of series") {
    std::mt19937_64 random(42);
    int spilled_kinds = 0;
    for (int series = 0; series < 4000; ++series) {
        int kind = series % 4;
        ExactTotal reference;
        CompactTotal compact;
        REQUIRE(same(compact.value(), reference.value()));  // no value: NULL
        int length = std::uniform_int_distribution<int>(1, series % 50 == 0 ? 5000 : 60)(random);
        for (int n = 0; n < length; ++n) {
            Term term = random_term(random, kind);
            if (term.integer) {
                reference.add_integer(term.i);
                compact.add_integer(term.i);
            } else {
                reference.add_real(term.r);
                compact.add_real(term.r);
            }
            INFO("series " << series << " term " << n);
            REQUIRE(same(compact.value(), reference.value()));
        }
        if (kind >= 2) ++spilled_kinds;
    }
    CHECK(spilled_kinds > 0);
}

TEST_CASE("CompactTotal's edges: exact cancellation, int64 overflow and back, 2^53") {
    // Expected values: integer arithmetic and fsum rules, worked by hand (common practice).
    CompactTotal back;
    const std::int64_t most = std::numeric_limits<std::int64_t>::max();
    back.add_integer(most);
    back.add_integer(most);
    CHECK_FALSE(back.value()->is_integer);  // 2^64 - 2 does not fit: REAL
    CHECK(back.value()->real == 18446744073709551616.0);
    back.add_integer(-most);
    REQUIRE(back.value()->is_integer);  // back in range: INTEGER again, as exact_sum
    CHECK(back.value()->integer == most);

    CompactTotal beyond;
    beyond.add_integer((std::int64_t{1} << 53) + 1);  // its double is 2^53
    beyond.add_real(0.5);
    // fsum([2.0**53, 0.5]): 2^53 + 0.5 lies halfway between doubles 2^53 and 2^53 + 2; nearest is
    // 2^53.
    CHECK(beyond.value()->real == 9007199254740992.0);

    CompactTotal cancel;
    cancel.add_real(1e300);
    cancel.add_real(1e-300);
    cancel.add_real(-1e300);
    CHECK(cancel.value()->real == 1e-300);

    CompactTotal zero;
    zero.add_real(-0.0);
    REQUIRE(zero.value());
    CHECK_FALSE(zero.value()->is_integer);
    CHECK(zero.value()->real == 0.0);
}

TEST_CASE("a CompactTotal is small") {
    // The reason it exists: period_totals keeps two per item and period.
    CHECK(sizeof(CompactTotal) <= 32);
}

TEST_CASE("totals of two runs merged give one total's answer over both, whatever the split") {
    // ExactTotal over the whole run is the reference (compared with math.fsum elsewhere).
    std::mt19937_64 random(7);
    for (int series = 0; series < 2000; ++series) {
        int kind = series % 4;
        int length = std::uniform_int_distribution<int>(0, 80)(random);
        std::vector<Term> terms;
        for (int n = 0; n < length; ++n) terms.push_back(random_term(random, kind));
        // Mixed kinds across the split: integers on one side, reals on the other.
        if (series % 7 == 0 && !terms.empty()) terms.front() = random_term(random, (kind + 1) % 4);
        ExactTotal reference;
        for (const Term& term : terms) {
            if (term.integer) {
                reference.add_integer(term.i);
            } else {
                reference.add_real(term.r);
            }
        }
        std::size_t split = std::uniform_int_distribution<std::size_t>(0, terms.size())(random);
        CompactTotal left, right;
        for (std::size_t n = 0; n < terms.size(); ++n) {
            CompactTotal& side = n < split ? left : right;
            if (terms[n].integer) {
                side.add_integer(terms[n].i);
            } else {
                side.add_real(terms[n].r);
            }
        }
        left.add(right);
        INFO("series " << series << " split " << split);
        REQUIRE(same(left.value(), reference.value()));
    }
}
