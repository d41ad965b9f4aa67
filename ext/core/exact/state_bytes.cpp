// SPDX-License-Identifier: MIT
#include "core/exact/state_bytes.h"

#include <cstring>
#include <limits>

#include "core/text/error.h"

namespace almanac {

void ByteWriter::i64(std::int64_t v) {
    auto bits = static_cast<std::uint64_t>(v);
    for (int i = 0; i < 8; ++i) bytes_.push_back(static_cast<char>((bits >> (8 * i)) & 0xff));
}

void ByteWriter::f64(double v) {
    std::uint64_t bits;
    std::memcpy(&bits, &v, sizeof bits);
    i64(static_cast<std::int64_t>(bits));
}

void ByteWriter::text(std::string_view v) {
    i64(static_cast<std::int64_t>(v.size()));
    bytes_.append(v);
}

void ByteWriter::exact_sum(const ExactSum& sum) {
    // Each round takes the 53 leading bits of what is left, so the rest
    // shrinks by at least 53 bits a round: a sum of prices is one or two terms.
    ExactSum rest = sum;
    std::int64_t count = 0;
    ByteWriter term_bytes;
    while (!rest.is_zero()) {
        RoundedBinary top = rest.rounded(kUnboundedLowestBit);
        auto mantissa = static_cast<std::int64_t>(top.mantissa);
        term_bytes.i64(top.negative ? -mantissa : mantissa);
        term_bytes.i64(top.exponent);
        // Exact: the mantissa has at most 54 bits.
        rest.subtract_scaled(static_cast<double>(mantissa) * (top.negative ? -1.0 : 1.0),
                             top.exponent);
        ++count;
    }
    i64(count);
    bytes_.append(term_bytes.bytes());
}

std::string_view ByteReader::take(std::size_t n) {
    if (rest_.size() < n) throw Error("a state's bytes end early");
    std::string_view taken = rest_.substr(0, n);
    rest_.remove_prefix(n);
    return taken;
}

std::uint8_t ByteReader::u8() { return static_cast<std::uint8_t>(take(1)[0]); }

std::int64_t ByteReader::i64() {
    std::string_view b = take(8);
    std::uint64_t bits = 0;
    for (int i = 0; i < 8; ++i) bits |= std::uint64_t(static_cast<unsigned char>(b[i])) << (8 * i);
    return static_cast<std::int64_t>(bits);
}

double ByteReader::f64() {
    auto bits = static_cast<std::uint64_t>(i64());
    double v;
    std::memcpy(&v, &bits, sizeof v);
    return v;
}

std::int64_t ByteReader::count(std::int64_t most) {
    std::int64_t n = i64();
    if (n < 0 || n > most) throw Error("a state's bytes hold an impossible count");
    return n;
}

std::string ByteReader::text() {
    std::int64_t n = count(static_cast<std::int64_t>(rest_.size()));
    return std::string(take(static_cast<std::size_t>(n)));
}

void ByteReader::add_exact_sum(ExactSum& sum) {
    // A term takes 16 bytes, so the count cannot exceed what is left.
    std::int64_t terms = count(static_cast<std::int64_t>(rest_.size() / 16));
    for (std::int64_t i = 0; i < terms; ++i) {
        std::int64_t mantissa = i64();
        std::int64_t exponent = i64();
        constexpr std::int64_t kMost = std::int64_t(1) << 54;
        constexpr std::int64_t kFarthest = std::int64_t(1) << 40;
        if (mantissa == 0 || mantissa > kMost || mantissa < -kMost || exponent > kFarthest ||
            exponent < -kFarthest)
            throw Error("a state's bytes hold an impossible term");
        sum.add_scaled(static_cast<double>(mantissa), exponent);
    }
}

void ByteReader::expect_end() const {
    if (!rest_.empty()) throw Error("a state's bytes go on after its end");
}

}  // namespace almanac
