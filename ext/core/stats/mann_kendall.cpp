// SPDX-License-Identifier: MIT
#include "core/stats/mann_kendall.h"

#include <algorithm>
#include <cmath>

#include "core/stats/inversion_sort.h"
#include "core/text/error.h"

namespace almanac {
namespace {

using Count = std::int64_t;

// The tie statistics of one coordinate, as the variance needs them: for runs
// of t equal values, Σ t(t−1)/2, Σ t(t−1)(t−2) and Σ t(t−1)(2t+5).
struct Ties {
    Count pairs = 0;
    double cubic = 0;
    double spread = 0;
};

template <typename Same>
Ties ties_of_runs(std::size_t n, Same&& same_as_previous) {
    Ties ties;
    std::size_t run = 1;
    auto close_run = [&] {
        const double t = static_cast<double>(run);
        ties.pairs += static_cast<Count>(run) * static_cast<Count>(run - 1) / 2;
        ties.cubic += t * (t - 1) * (t - 2);
        ties.spread += t * (t - 1) * (2 * t + 5);
    };
    for (std::size_t i = 1; i < n; ++i) {
        if (same_as_previous(i)) {
            ++run;
        } else {
            close_run();
            run = 1;
        }
    }
    if (n > 0) close_run();
    return ties;
}

// Sorts y ascending and returns the number of pairs i < j with y_i > y_j.
Count count_inversions(std::vector<double>& y) {
    std::vector<double> buffer;
    Count inversions = 0;
    inversion_sort(
        y.data(), y.size(), buffer, [](double right, double left) { return right < left; },
        [&](double, const double* first, const double* last) {
            inversions += static_cast<Count>(last - first);
            return true;
        });
    return inversions;
}

}  // namespace

KendallScore kendall_score(std::vector<Point> points) {
    for (const Point& p : points)
        if (!std::isfinite(p.x) || !std::isfinite(p.y)) throw Error("expected finite coordinates");
    const std::size_t size = points.size();
    if (size < 2) return {};
    std::sort(points.begin(), points.end(), [](const Point& a, const Point& b) {
        return a.x < b.x || (a.x == b.x && a.y < b.y);
    });
    const Ties x_ties =
        ties_of_runs(size, [&](std::size_t i) { return points[i].x == points[i - 1].x; });
    const Ties both_ties = ties_of_runs(size, [&](std::size_t i) {
        return points[i].x == points[i - 1].x && points[i].y == points[i - 1].y;
    });
    std::vector<double> y(size);
    for (std::size_t i = 0; i < size; ++i) y[i] = points[i].y;
    // Within a run of equal x the y are ascending, so every inversion is a
    // pair with distinct x and y in opposite orders: a discordant pair.
    const Count discordant = count_inversions(y);
    const Ties y_ties = ties_of_runs(size, [&](std::size_t i) { return y[i] == y[i - 1]; });

    const Count n = static_cast<Count>(size);
    const Count pairs = n * (n - 1) / 2;
    KendallScore score;
    // Pairs tied in neither coordinate are concordant or discordant.
    score.s = pairs - x_ties.pairs - y_ties.pairs + both_ties.pairs - 2 * discordant;
    // All x or all y tied: the formula below is 0 in exact arithmetic, and
    // rounding must not make a p-value out of nothing.
    if (x_ties.pairs == pairs || y_ties.pairs == pairs) return score;
    // Kendall (1975), as scipy.stats.kendalltau writes it (its reference [3]).
    const double m = static_cast<double>(n) * static_cast<double>(n - 1);
    const double nd = static_cast<double>(n);
    double variance =
        (m * (2 * nd + 5) - x_ties.spread - y_ties.spread) / 18 +
        2.0 * static_cast<double>(x_ties.pairs) * static_cast<double>(y_ties.pairs) / m;
    if (n > 2) variance += x_ties.cubic * y_ties.cubic / (9 * m * (nd - 2));
    score.variance = variance;
    return score;
}

KendallScore seasonal_kendall_score(std::vector<SeasonalPoint> points) {
    sort_by_season(points);
    KendallScore total;
    std::vector<Point> season;
    for (std::size_t i = 0; i < points.size(); ++i) {
        season.push_back(Point{points[i].x, points[i].y});
        if (i + 1 == points.size() || !same_season(points[i + 1].season, points[i].season)) {
            const KendallScore part = kendall_score(std::move(season));
            total.s += part.s;
            total.variance += part.variance;
            season.clear();
        }
    }
    return total;
}

std::optional<double> mann_kendall_p(const KendallScore& score) {
    if (!(score.variance > 0)) return std::nullopt;
    const double z = static_cast<double>(score.s) / std::sqrt(score.variance);
    // 2(1 − Φ(|z|)) = erfc(|z|/√2), without the cancellation of 1 − Φ.
    return std::erfc(std::fabs(z) / std::sqrt(2.0));
}

}  // namespace almanac
