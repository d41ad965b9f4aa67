// SPDX-License-Identifier: MIT
#include "core/stats/exponential_weights.h"

#include <catch2/catch.hpp>
#include <cmath>

#include "core/text/error.h"

using namespace almanac;

TEST_CASE("one half-life back weighs one half") {
    // the README definition: weights 0.5^((t_max - t)/h). Rows 1 at t=0, 3 at t=2, h=2:
    // (0.5*1 + 1*3) / 1.5 = 7/3.
    ExponentialWeights w;
    w.add(1.0, ExponentialWeights::position(0.0, 2.0));
    w.add(3.0, ExponentialWeights::position(2.0, 2.0));
    CHECK(*w.mean() == Approx(7.0 / 3.0).epsilon(1e-15));
    ExponentialWeights millis;
    millis.add(1.0, ExponentialWeights::position(std::int64_t(86400000), 86400000));
    millis.add(3.0, ExponentialWeights::position(std::int64_t(2 * 86400000), 86400000));
    CHECK(*millis.mean() == Approx(7.0 / 3.0).epsilon(1e-15));
}

TEST_CASE("the mean does not depend on the order of the rows") {
    // Property: the same rows in two orders give the same bits.
    ExponentialWeights forward, backward;
    double t[] = {0.5, 3.0, 10.25, 11.0, 400.0};
    double x[] = {5.0, -2.0, 1e9, 7.5, 3.0};
    for (int i = 0; i < 5; ++i) forward.add(x[i], ExponentialWeights::position(t[i], 3.0));
    for (int i = 4; i >= 0; --i) backward.add(x[i], ExponentialWeights::position(t[i], 3.0));
    CHECK(*forward.mean() == *backward.mean());
}

TEST_CASE("rows thousands of half-lives apart neither overflow nor linger") {
    // 2^-5000 is far below any double's resolution: only the latest row counts.
    ExponentialWeights w;
    w.add(1e300, ExponentialWeights::position(0.0, 1.0));
    w.add(2.0, ExponentialWeights::position(5000.0, 1.0));
    CHECK(*w.mean() == 2.0);
    // When the latest row leaves, the old one is exactly what remains.
    w.remove(2.0, ExponentialWeights::position(5000.0, 1.0));
    CHECK(*w.mean() == 1e300);
    w.remove(1e300, ExponentialWeights::position(0.0, 1.0));
    CHECK_FALSE(w.mean());
}

TEST_CASE("a row that came and went leaves no trace") {
    ExponentialWeights fresh, slid;
    slid.add(1e15, ExponentialWeights::position(-7.0, 2.0));
    for (int i = 0; i < 6; ++i) {
        fresh.add(1e9 + i * 0.01, ExponentialWeights::position(double(i), 2.0));
        slid.add(1e9 + i * 0.01, ExponentialWeights::position(double(i), 2.0));
    }
    slid.remove(1e15, ExponentialWeights::position(-7.0, 2.0));
    CHECK(*slid.mean() == *fresh.mean());
}

TEST_CASE("t so large that its spacing exceeds a half-life is refused") {
    CHECK_THROWS_AS(ExponentialWeights::position(1e300, 1.0), Error);
}
