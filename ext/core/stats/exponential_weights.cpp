// SPDX-License-Identifier: MIT
#include "core/stats/exponential_weights.h"

#include <cmath>

#include "core/exact/floor_division.h"
#include "core/exact/scaled_double.h"
#include "core/text/error.h"

namespace almanac {
namespace {

constexpr std::int64_t kBlockHalfLives = 64;  // two 32-bit limbs of shift
// Blocks more than this far below the latest one are left out of the mean: a
// row there weighs less than 2^-(64·35) = 2^-2240 of a row in the latest
// block, so even 2^63 rows of the largest double (< 2^1024) move the mean by
// less than 2^-1153, far below the smallest subnormal double (2^-1074).
constexpr std::int64_t kReachBlocks = 36;

}  // namespace

ExponentialWeights::Position ExponentialWeights::position(std::int64_t t, std::int64_t half_life) {
    Position p;
    p.whole = floor_div(t, half_life);
    std::int64_t rest = t - p.whole * half_life;  // in [0, half_life)
    p.fraction = static_cast<double>(rest) / static_cast<double>(half_life);
    return p;
}

ExponentialWeights::Position ExponentialWeights::position(double t, double half_life) {
    double ratio = t / half_life;
    if (!(std::fabs(ratio) < 4503599627370496.0))  // 2^52
        throw Error(
            "t / half_life is beyond 2^52: consecutive values of t are farther apart "
            "than a half-life");
    // fmod is exact, so the fraction depends on t and half_life alone.
    double rest = std::fmod(t, half_life);
    if (rest < 0) rest += half_life;
    Position p;
    p.whole = static_cast<std::int64_t>(std::nearbyint((t - rest) / half_life));
    p.fraction = rest / half_life;
    return p;
}

void ExponentialWeights::change(double x, Position p, int direction) {
    std::int64_t key = floor_div(p.whole, kBlockHalfLives);
    std::int64_t shift = p.whole - key * kBlockHalfLives;
    // The same row always gets the same weight: exp2 of the same fraction.
    double weight = std::exp2(p.fraction);
    Block& block = blocks_[key];
    if (direction > 0) {
        block.weighted.add_product(weight, x, shift);
        block.weights.add_scaled(weight, shift);
        ++block.rows;
        ++rows_;
    } else {
        block.weighted.subtract_product(weight, x, shift);
        block.weights.subtract_scaled(weight, shift);
        --rows_;
        if (--block.rows == 0) blocks_.erase(key);  // its sums are exactly zero again
    }
}

void ExponentialWeights::merge(const ExponentialWeights& other) {
    for (const auto& [key, theirs] : other.blocks_) {
        Block& block = blocks_[key];
        block.weighted.add(theirs.weighted, 0);
        block.weights.add(theirs.weights, 0);
        block.rows += theirs.rows;
    }
    rows_ += other.rows_;
}

void ExponentialWeights::write(ByteWriter& out) const {
    out.i64(static_cast<std::int64_t>(blocks_.size()));
    for (const auto& [key, block] : blocks_) {
        out.i64(key);
        out.i64(block.rows);
        out.exact_sum(block.weighted);
        out.exact_sum(block.weights);
    }
}

ExponentialWeights ExponentialWeights::read(ByteReader& in) {
    ExponentialWeights weights;
    std::int64_t blocks = in.count(INT64_MAX);
    for (std::int64_t i = 0; i < blocks; ++i) {
        std::int64_t key = in.i64();
        Block& block = weights.blocks_[key];
        block.rows = in.count(INT64_MAX);
        if (block.rows == 0) throw Error("a state's bytes hold an empty block");
        in.add_exact_sum(block.weighted);
        in.add_exact_sum(block.weights);
        weights.rows_ += block.rows;
    }
    return weights;
}

std::optional<double> ExponentialWeights::mean() const {
    if (blocks_.empty()) return std::nullopt;
    auto latest = blocks_.rbegin();
    std::int64_t top = latest->first;
    auto next = std::next(latest);
    if (next == blocks_.rend() || next->first < top - kReachBlocks) {
        // One block in reach: its own sums are the whole story.
        ScaledDouble numerator =
            ScaledDouble::from(latest->second.weighted.rounded(kUnboundedLowestBit));
        ScaledDouble denominator =
            ScaledDouble::from(latest->second.weights.rounded(kUnboundedLowestBit));
        return (numerator / denominator).to_double();
    }
    ExactSum weighted, weights;
    for (auto it = latest; it != blocks_.rend() && it->first >= top - kReachBlocks; ++it) {
        std::int64_t limb_shift = (it->first - top) * (kBlockHalfLives / 32);
        weighted.add(it->second.weighted, limb_shift);
        weights.add(it->second.weights, limb_shift);
    }
    ScaledDouble numerator = ScaledDouble::from(weighted.rounded(kUnboundedLowestBit));
    ScaledDouble denominator = ScaledDouble::from(weights.rounded(kUnboundedLowestBit));
    return (numerator / denominator).to_double();
}

}  // namespace almanac
