// SPDX-License-Identifier: MIT
// How the median slope is found without the list of all slopes.
//
// 1. Counting. For a threshold t, a pair (i, j) with x_i < x_j has slope
//    below t exactly when y_j − t·x_j < y_i − t·x_i. So with the points in x
//    order, the pairs whose slope is below t are the inversions of the keys
//    y − t·x, and merge sort counts them in O(n log n). The keys are
//    fma(−t, x, y): correctly rounded, hence monotone, so two rounded keys
//    that differ order the exact keys the same way; only equal rounded keys
//    are settled by exact arithmetic (exact_sign.h). Ties in x never form a
//    pair: within equal x the points are kept in y order, which is their key
//    order for every t, so they are never inverted.
// 2. Narrowing. The target ranks are bracketed by bisection over the doubles
//    themselves (by their bit patterns, so at most 64 halvings reach
//    neighbouring doubles), until the bracket holds O(n) pairs. This is the
//    selection by counting inversions; bisection replaces the random choice
//    of splitting slopes, which needs no sampling of pairs and is bounded by
//    64 halvings (in practice 15 to 35 counting passes for 10,000 points,
//    all 64 when most slopes are equal).
// 3. The slopes as doubles. Counting uses each pair's exact slope r, but the
//    answer must be the median of the *computed* slopes f = fl(fl(dy)/fl(dx)),
//    which differ from r by at most 3 units in the last place (plus an
//    underflow term). So the bracket is widened by more than that on both
//    sides, the pairs inside the widened band are listed (by the inversions
//    between the key orders at its two ends), their f computed exactly as
//    the definition says, and the target ranks selected among them; the
//    pairs below the band have f below every candidate and only shift the
//    ranks. When very many slopes are equal (collinear points), the band
//    cannot be narrowed below them, but then it spans a few dozen doubles at
//    most, so the pairs in it are tallied by value in O(1) memory.
// 4. Zero slopes (runs of equal y) are common and exactly zero in both r and
//    f, so ranks that fall among them are answered from two counts.
// 5. Seasons. The seasonal form pairs points of one season only, so every
//    count and every band is the sum over the seasons, each season a run of
//    its own in the arrays and sorted on its own; the search is unchanged.
#include "core/stats/theil_sen.h"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>
#include <stdexcept>
#include <utility>

#include "core/exact/exact_sign.h"
#include "core/stats/inversion_sort.h"
#include "core/text/error.h"

namespace almanac {
namespace {

using Count = std::uint64_t;
constexpr double kInfinity = std::numeric_limits<double>::infinity();

// A threshold slope t; t = ±∞ stands for the limit orders (by x, one way or
// the other), which let a bracket start unbounded.
struct Threshold {
    double t;
    bool is_infinite() const { return std::isinf(t); }
};

struct Keyed {
    double key;  // fma(−t, x, y) for the threshold in use
    double x;
    double y;
    // Sign of (y − t·x) − key, found when first needed (kUnknown until then).
    int residual;
};
constexpr int kUnknown = 2;

Keyed keyed(double t, double x, double y) {
    return {std::isinf(t) ? 0.0 : std::fma(-t, x, y), x, y, kUnknown};
}

int residual_sign(double t, Keyed& item) {
    if (item.residual == kUnknown) {
        const Product terms[3] = {{item.y, 1.0}, {-t, item.x}, {-item.key, 1.0}};
        item.residual = exact_sign_of_sum(terms, 3);
    }
    return item.residual;
}

// The sign of (a.y − t·a.x) − (b.y − t·b.x), exactly.
int compare_keys(const Threshold& threshold, Keyed& a, Keyed& b) {
    const double t = threshold.t;
    if (threshold.is_infinite()) {
        // t → −∞: the order of x; t → +∞: the reverse. Equal x: by y.
        if (a.x != b.x) return ((a.x < b.x) == (t < 0)) ? -1 : 1;
        return (a.y > b.y) - (a.y < b.y);
    }
    if (a.key < b.key) return -1;
    if (a.key > b.key) return 1;
    // Equal rounded keys; the common cases need no arithmetic.
    if (a.x == b.x || t == 0) return (a.y > b.y) - (a.y < b.y);
    if (a.y == b.y) {  // the difference is t·(b.x − a.x)
        const int s = b.x > a.x ? 1 : -1;
        return t > 0 ? s : -s;
    }
    // Each exact key is the shared rounded key plus its own residual; when
    // the residuals' signs differ (collinear points: both zero) that decides,
    // at one exact evaluation per point rather than one per comparison.
    const int ra = residual_sign(t, a), rb = residual_sign(t, b);
    if (ra != rb || ra == 0) return (ra > rb) - (ra < rb);
    const Product terms[4] = {{a.y, 1.0}, {-b.y, 1.0}, {-t, a.x}, {t, b.x}};
    return exact_sign_of_sum(terms, 4);
}

// Merge sort by the keys at `threshold`. Whenever an element of a right run
// goes ahead of the rest [first, last) of its left run — all of which have a
// strictly greater key (or a greater or equal one, when not strict) — calls
// on_inversions(element, first, last); a false return stops.
template <typename OnInversions>
bool merge_sort(Keyed* items, std::size_t n, std::vector<Keyed>& buffer, const Threshold& threshold,
                bool strict, OnInversions&& on_inversions) {
    return inversion_sort(
        items, n, buffer,
        [&](Keyed& right, Keyed& left) {
            const int order = compare_keys(threshold, right, left);
            return order < 0 || (!strict && order == 0);
        },
        on_inversions);
}

double widen_down(double v) {
    if (std::isinf(v)) return v;
    // 2^-50 relative is eight units in the last place, more than twice the
    // three by which a computed slope can differ from the exact one; the
    // absolute term covers slopes that underflow.
    const double margin = std::fabs(v) * 0x1p-50 + 0x1p-1070;
    return std::nextafter(v - margin, -kInfinity);
}

double widen_up(double v) {
    if (std::isinf(v)) return v;
    const double margin = std::fabs(v) * 0x1p-50 + 0x1p-1070;
    return std::nextafter(v + margin, kInfinity);
}

// Doubles in order as integers: consecutive doubles differ by one; −0 and +0
// are both 0.
std::int64_t ordinal(double v) {
    std::int64_t bits;
    std::memcpy(&bits, &v, sizeof bits);
    return bits < 0 ? -(bits & std::numeric_limits<std::int64_t>::max()) : bits;
}

double from_ordinal(std::int64_t o) {
    std::uint64_t bits = o < 0 ? (static_cast<std::uint64_t>(-o) | (std::uint64_t{1} << 63))
                               : static_cast<std::uint64_t>(o);
    double v;
    std::memcpy(&v, &bits, sizeof v);
    return v;
}

bool neighbours(double lo, double hi) {
    return static_cast<std::uint64_t>(ordinal(hi)) - static_cast<std::uint64_t>(ordinal(lo)) <= 1;
}

double middle_double(double lo, double hi) {
    const std::int64_t a = ordinal(lo), b = ordinal(hi);
    return from_ordinal(a / 2 + b / 2 + (a % 2 + b % 2) / 2);
}

// The slope as the definition computes it, larger x first (the same double
// either way round: IEEE subtraction and division are sign-symmetric).
double computed_slope(const Keyed& left, const Keyed& right) {
    return right.x > left.x ? (right.y - left.y) / (right.x - left.x)
                            : (left.y - right.y) / (left.x - right.x);
}

// Subtracts a round number near the middle of one coordinate from every
// point, when that is exact for all of them. Differences, and so every pair's
// computed slope, stay bit for bit the same, but keys near 1e9 or near a
// Julian day 2.46e6 become small, and their rounding fine enough to order
// nearly every pair without exact arithmetic.
void center(std::vector<Point>& points, double Point::*coordinate) {
    if (points.empty()) return;
    std::vector<double> values;
    values.reserve(points.size());
    for (const Point& p : points) values.push_back(p.*coordinate);
    auto middle = values.begin() + static_cast<std::ptrdiff_t>(values.size() / 2);
    std::nth_element(values.begin(), middle, values.end());
    int exponent = 0;
    const double fraction = std::frexp(*middle, &exponent);
    const double offset = std::ldexp(std::trunc(fraction * 256) / 256, exponent);
    if (offset == 0.0) return;
    for (const Point& p : points) {
        // Knuth's TwoSum: the rounding error of v − offset, exactly.
        const double v = p.*coordinate;
        const double sum = v - offset;
        const double virtual_b = sum - v;
        const double virtual_a = sum - virtual_b;
        if ((v - virtual_a) + (-offset - virtual_b) != 0.0) return;
    }
    for (Point& p : points) p.*coordinate -= offset;
}

// A run of points that are paired with each other only: one season (the
// whole set when there are no seasons).
struct Group {
    std::size_t begin;
    std::size_t end;
};

class SlopeSelection {
  public:
    SlopeSelection(std::vector<Point> points, std::vector<Group> groups)
        : points_(std::move(points)), groups_(std::move(groups)) {
        center(points_, &Point::x);
        center(points_, &Point::y);
        for (const Group& group : groups_) {
            std::sort(points_.begin() + static_cast<std::ptrdiff_t>(group.begin),
                      points_.begin() + static_cast<std::ptrdiff_t>(group.end),
                      [](const Point& a, const Point& b) {
                          return a.x < b.x || (a.x == b.x && a.y < b.y);
                      });
            const Count n = group.end - group.begin;
            Count same_x = 0;
            for (std::size_t i = group.begin; i < group.end;) {
                std::size_t j = i;
                while (j < group.end && points_[j].x == points_[i].x) {
                    std::size_t k = j;
                    while (k < group.end && points_[k].x == points_[j].x &&
                           points_[k].y == points_[j].y)
                        ++k;
                    const Count run = k - j;
                    duplicates_ += run * (run - 1) / 2;
                    j = k;
                }
                const Count tied = j - i;
                same_x += tied * (tied - 1) / 2;
                i = j;
            }
            pairs_ += n * (n - 1) / 2 - same_x;
        }
    }

    Count pairs() const { return pairs_; }
    const std::vector<Point>& points() const { return points_; }
    const std::vector<Group>& groups() const { return groups_; }

    // Pairs whose exact slope is below t.
    Count below(double t) {
        if (t == -kInfinity) return 0;
        if (t == kInfinity) return pairs_;
        return count(t, true);
    }
    // Pairs whose exact slope is at most t.
    Count at_or_below(double t) {
        if (t == -kInfinity) return 0;
        if (t == kInfinity) return pairs_;
        return count(t, false) - duplicates_;
    }

    // Calls visit(slope) for every pair whose exact slope r has lo <= r < hi,
    // with slope computed as the definition does; false (stopping early) once
    // more than `cap` pairs have been visited.
    template <typename Visit>
    bool visit_band(double lo, double hi, Count cap, Visit&& visit) {
        load(lo);
        // Order by the keys at lo, equal keys by x: then every pair in the
        // band is an inversion of the keys at hi, and nothing else is.
        const Threshold at_lo{lo};
        for (const Group& group : groups_) {
            std::sort(items_.begin() + static_cast<std::ptrdiff_t>(group.begin),
                      items_.begin() + static_cast<std::ptrdiff_t>(group.end),
                      [&](Keyed& a, Keyed& b) {
                          const int order = compare_keys(at_lo, a, b);
                          return order < 0 || (order == 0 && a.x < b.x);
                      });
        }
        for (Keyed& item : items_) item = keyed(hi, item.x, item.y);
        Count visited = 0;
        for (const Group& group : groups_) {
            const bool complete = merge_sort(
                items_.data() + group.begin, group.end - group.begin, buffer_, Threshold{hi}, true,
                [&](const Keyed& right, const Keyed* first, const Keyed* last) {
                    visited += static_cast<Count>(last - first);
                    if (visited > cap) return false;
                    for (const Keyed* left = first; left != last; ++left)
                        visit(computed_slope(*left, right));
                    return true;
                });
            if (!complete) return false;
        }
        return true;
    }

  private:
    void load(double t) {
        items_.resize(points_.size());
        for (std::size_t i = 0; i < points_.size(); ++i)
            items_[i] = keyed(t, points_[i].x, points_[i].y);
    }

    Count count(double t, bool strict) {
        load(t);
        Count inversions = 0;
        for (const Group& group : groups_) {
            merge_sort(items_.data() + group.begin, group.end - group.begin, buffer_, Threshold{t},
                       strict, [&](const Keyed&, const Keyed* first, const Keyed* last) {
                           inversions += static_cast<Count>(last - first);
                           return true;
                       });
        }
        return inversions;
    }

    std::vector<Point> points_;  // by group, then x, then y
    std::vector<Group> groups_;
    Count pairs_ = 0;       // within a group, with distinct x
    Count duplicates_ = 0;  // pairs of identical points
    std::vector<Keyed> items_;
    std::vector<Keyed> buffer_;
};

// The computed slopes of 0-based ranks k_lo and k_hi (k_hi is k_lo or
// k_lo + 1) in sorted order.
class MedianSearch {
  public:
    explicit MedianSearch(SlopeSelection& slopes) : slopes_(slopes) {
        const Count n = slopes.points().size();
        small_bracket_ = std::max<Count>(2 * n, 4096);
        band_cap_ = 8 * n + 8192;
    }

    // Invariants: below(lo) = at_lo <= k_lo and below(hi) = at_hi > k_hi,
    // so both target exact slopes lie in [lo, hi).
    std::pair<double, double> select(Count k_lo, Count k_hi, double lo, Count at_lo, double hi,
                                     Count at_hi) {
        bool band_tried = false;
        for (;;) {
            const bool narrowest = neighbours(lo, hi);
            if (narrowest || (!band_tried && at_hi - at_lo <= small_bracket_)) {
                std::pair<double, double> found;
                if (from_band(k_lo, k_hi, lo, hi, narrowest, found)) return found;
                band_tried = true;
            }
            const double middle = middle_double(lo, hi);
            const Count at_middle = slopes_.below(middle);
            if (at_middle <= k_lo) {
                lo = middle;
                at_lo = at_middle;
            } else if (at_middle > k_hi) {
                hi = middle;
                at_hi = at_middle;
            } else {  // the two ranks part here
                const double first = select(k_lo, k_lo, lo, at_lo, middle, at_middle).first;
                const double second = select(k_hi, k_hi, middle, at_middle, hi, at_hi).first;
                return {first, second};
            }
        }
    }

  private:
    bool from_band(Count k_lo, Count k_hi, double lo, double hi, bool narrowest,
                   std::pair<double, double>& found) {
        // Exact slopes below band_lo give computed slopes below every
        // computed slope of the targets, and those at or above band_hi above.
        const double band_lo = widen_down(widen_down(lo));
        const double band_hi = widen_up(widen_up(hi));
        const Count before = slopes_.below(band_lo);
        const Count rank_lo = k_lo - before, rank_hi = k_hi - before;
        if (!narrowest) {
            std::vector<double> band;
            const bool complete = slopes_.visit_band(band_lo, band_hi, band_cap_,
                                                     [&](double slope) { band.push_back(slope); });
            if (!complete) return false;
            if (rank_hi >= band.size()) throw std::logic_error("theil_sen: band lost a rank");
            auto at = band.begin() + static_cast<std::ptrdiff_t>(rank_lo);
            std::nth_element(band.begin(), at, band.end());
            const double first = *at;
            const double second =
                rank_hi == rank_lo ? first : *std::min_element(at + 1, band.end());
            found = {first, second};
            return true;
        }
        // A band between neighbouring doubles, widened: its computed slopes
        // take a few dozen values at most, so tally them.
        std::vector<std::pair<double, Count>> tally;
        std::size_t last_hit = 0;
        slopes_.visit_band(band_lo, band_hi, std::numeric_limits<Count>::max(), [&](double slope) {
            if (last_hit < tally.size() && tally[last_hit].first == slope) {
                ++tally[last_hit].second;
                return;
            }
            for (std::size_t i = 0; i < tally.size(); ++i)
                if (tally[i].first == slope) {
                    ++tally[i].second;
                    last_hit = i;
                    return;
                }
            if (tally.size() > 4096) throw std::logic_error("theil_sen: band is not narrow");
            tally.push_back({slope, 1});
            last_hit = tally.size() - 1;
        });
        std::sort(tally.begin(), tally.end());
        auto value_at = [&](Count rank) {
            for (const auto& [value, times] : tally) {
                if (rank < times) return value;
                rank -= times;
            }
            throw std::logic_error("theil_sen: band lost a rank");
        };
        found = {value_at(rank_lo), value_at(rank_hi)};
        return true;
    }

    SlopeSelection& slopes_;
    Count small_bracket_;
    Count band_cap_;
};

// Few points: list every slope; this is the definition itself.
std::pair<double, double> middle_slopes_by_listing(const SlopeSelection& selection, Count k_lo,
                                                   Count k_hi) {
    const std::vector<Point>& points = selection.points();
    std::vector<double> slopes;
    for (const Group& group : selection.groups())
        for (std::size_t i = group.begin; i < group.end; ++i)
            for (std::size_t j = i + 1; j < group.end; ++j)
                if (points[j].x != points[i].x)
                    slopes.push_back((points[j].y - points[i].y) / (points[j].x - points[i].x));
    auto at = slopes.begin() + static_cast<std::ptrdiff_t>(k_lo);
    std::nth_element(slopes.begin(), at, slopes.end());
    const double first = *at;
    const double second = k_hi == k_lo ? first : *std::min_element(at + 1, slopes.end());
    return {first, second};
}

constexpr Count kListingLimit = 2048;  // pairs; a constant, so memory stays O(1) here

std::optional<double> median_slope(std::vector<Point> input, std::vector<Group> groups) {
    for (const Point& p : input)
        if (!std::isfinite(p.x) || !std::isfinite(p.y)) throw Error("expected finite coordinates");
    SlopeSelection slopes(std::move(input), std::move(groups));
    const Count pairs = slopes.pairs();
    if (pairs == 0) return std::nullopt;

    const auto& points = slopes.points();
    const auto [y_min, y_max] = std::minmax_element(
        points.begin(), points.end(), [](const Point& a, const Point& b) { return a.y < b.y; });
    const auto [x_min, x_max] = std::minmax_element(
        points.begin(), points.end(), [](const Point& a, const Point& b) { return a.x < b.x; });
    if (std::isinf(x_max->x - x_min->x))
        throw Error("the x values differ by more than the largest double, so no slope is finite");
    if (std::isinf(y_max->y - y_min->y))
        throw Error("the y values differ by more than the largest double, so no slope is finite");

    // numpy.median's middle ranks.
    const Count k_lo = (pairs - 1) / 2;
    const Count k_hi = pairs / 2;
    std::pair<double, double> middle;
    if (pairs <= kListingLimit) {
        middle = middle_slopes_by_listing(slopes, k_lo, k_hi);
    } else {
        MedianSearch search(slopes);
        const Count negative = slopes.below(0.0);
        const Count not_positive = slopes.at_or_below(0.0);
        auto zero = [&](Count k) { return negative <= k && k < not_positive; };
        auto select = [&](Count first, Count second) {
            if (first < negative) return search.select(first, second, -kInfinity, 0, 0.0, negative);
            return search.select(first, second, 0.0, negative, kInfinity, pairs);
        };
        if (zero(k_lo) && zero(k_hi)) {
            middle = {0.0, 0.0};
        } else if (zero(k_lo)) {
            middle = {0.0, select(k_hi, k_hi).first};
        } else if (zero(k_hi)) {
            middle = {select(k_lo, k_lo).first, 0.0};
        } else if ((k_hi < negative) == (k_lo < negative)) {
            middle = select(k_lo, k_hi);
        } else {
            middle = {select(k_lo, k_lo).first, select(k_hi, k_hi).first};
        }
    }
    if (k_lo == k_hi) return middle.first;
    return (middle.first + middle.second) / 2.0;  // numpy.median: mean of the two
}

}  // namespace

std::optional<double> theil_sen_slope(std::vector<Point> points) {
    const std::size_t n = points.size();
    return median_slope(std::move(points), {Group{0, n}});
}

std::optional<double> seasonal_theil_sen_slope(std::vector<SeasonalPoint> input) {
    sort_by_season(input);
    std::vector<Point> points;
    points.reserve(input.size());
    std::vector<Group> groups;
    for (std::size_t i = 0; i < input.size(); ++i) {
        if (i == 0 || !same_season(input[i].season, input[i - 1].season)) {
            if (!groups.empty()) groups.back().end = i;
            groups.push_back(Group{i, input.size()});
        }
        points.push_back(Point{input[i].x, input[i].y});
    }
    return median_slope(std::move(points), std::move(groups));
}

}  // namespace almanac
