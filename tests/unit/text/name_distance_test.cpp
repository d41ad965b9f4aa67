// SPDX-License-Identifier: MIT
#include "core/text/name_distance.h"

#include <catch2/catch.hpp>

using almanac::closest_name;
using almanac::pair_similarity;

TEST_CASE("pair similarity is Dice's coefficient of the sets of letter pairs") {
    // By hand: 'night' {ni ig gh ht}, 'nacht' {na ac ch ht}: one shared pair of 4 + 4.
    CHECK(pair_similarity("night", "nacht") == Approx(2.0 * 1 / 8));
    // By hand: 'Rye loaf' and 'rye loaf' have the same 7 pairs once case is folded.
    CHECK(pair_similarity("Rye loaf", "rye loaf") == 1.0);
    // By hand: 'aaaa' has the one pair {aa}, 'aa' too: sets, not counts.
    CHECK(pair_similarity("aaaa", "aa") == 1.0);
    CHECK(pair_similarity("ab", "cd") == 0.0);
    CHECK(pair_similarity("a", "a") == 0.0);  // no pairs at all
    CHECK(pair_similarity("", "") == 0.0);
}

TEST_CASE("pairs are of characters, not bytes") {
    // By hand: 'Crème' {cr rè èm me} and 'Creme' {cr re em me}: two shared pairs of 4 + 4.
    CHECK(pair_similarity("Cr\xC3\xA8me", "Creme") == Approx(0.5));
}

TEST_CASE("the closest name has the most pairs in common, ties to the first in byte order") {
    std::vector<std::string> names{"Pumpkin loaf", "Pie", "Pumpernickel", "Seeded rye"};
    CHECK(closest_name("Pumpkin lof", names) == std::optional<std::string>("Pumpkin loaf"));
    CHECK(closest_name("seeded  rye", names) == std::optional<std::string>("Seeded rye"));
    // Neither shares a pair with 'xy': a tie at 0 goes to the first name in byte order.
    CHECK(closest_name("xy", {"b", "a"}) == std::optional<std::string>("a"));
    CHECK_FALSE(closest_name("anything", {}).has_value());
}
