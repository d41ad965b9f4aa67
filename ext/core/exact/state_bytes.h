// SPDX-License-Identifier: MIT
// The byte form in which an aggregate's state leaves one process and is
// rebuilt in another (PostgreSQL's parallel workers hand their partial states
// to the leader as bytes). Fixed-width little-endian integers and IEEE
// doubles, whatever the machine; an exact sum travels as the few terms
// ±m·2^e (m < 2^54) whose exact sum it is, so the state rebuilt from the
// bytes holds exactly the same value. ext/postgres/README.md documents the
// layouts.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>

#include "core/exact/exact_sum.h"

namespace almanac {

class ByteWriter {
  public:
    void u8(std::uint8_t v) { bytes_.push_back(static_cast<char>(v)); }
    void i64(std::int64_t v);
    void f64(double v);
    void text(std::string_view v);  // its length (i64), then its bytes
    // The terms' count (i64), then each term's signed mantissa and exponent (i64, i64).
    void exact_sum(const ExactSum& sum);
    const std::string& bytes() const { return bytes_; }

  private:
    std::string bytes_;
};

// Throws almanac::Error when the bytes end early or do not hold what is read.
class ByteReader {
  public:
    explicit ByteReader(std::string_view bytes) : rest_(bytes) {}
    std::uint8_t u8();
    std::int64_t i64();
    double f64();
    std::string text();
    // A count that must be in [0, most].
    std::int64_t count(std::int64_t most);
    // Adds the sum that was written into `sum`.
    void add_exact_sum(ExactSum& sum);
    bool at_end() const { return rest_.empty(); }
    // Throws unless every byte was read.
    void expect_end() const;

  private:
    std::string_view take(std::size_t n);
    std::string_view rest_;
};

}  // namespace almanac
