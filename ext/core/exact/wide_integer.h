// SPDX-License-Identifier: MIT
// 128-bit integers for the exact arithmetic: Uint128 (arithmetic modulo
// 2^128) and Int128 (two's complement).
//
// GCC and Clang have them natively on 64-bit targets (__int128), and there
// they are plain typedefs, so the hot paths compile exactly as before. 32-bit
// targets have no __int128; there PortableUint128 and PortableInt128, two
// 64-bit halves, stand in, with only the operations the exact code uses and
// the native types' results (wrap-around modulo 2^128, two's complement).
// Defining ALMANAC_PORTABLE_INT128 forces the portable form on a 64-bit build,
// so the unit tests can check it against the same expectations as the native
// one; the portable classes are always compiled, so a test can compare them
// with the native types directly.
#pragma once

#include <cstdint>
#include <type_traits>

#if defined(__SIZEOF_INT128__) && !defined(ALMANAC_PORTABLE_INT128)
#define ALMANAC_NATIVE_INT128 1
#endif

namespace almanac {

class PortableInt128;

class PortableUint128 {
  public:
    constexpr PortableUint128() = default;
    // Any integer converts as it does to unsigned __int128: negative values
    // sign-extend, so PortableUint128(-1) is 2^128 - 1.
    template <typename T, typename = std::enable_if_t<std::is_integral<T>::value>>
    constexpr PortableUint128(T value)  // NOLINT: implicit, as the native type converts
        : high_(sign_extension(value)), low_(static_cast<std::uint64_t>(value)) {}
    explicit constexpr PortableUint128(const PortableInt128& value);
    static constexpr PortableUint128 from_halves(std::uint64_t high, std::uint64_t low) {
        PortableUint128 result;
        result.high_ = high;
        result.low_ = low;
        return result;
    }

    // The low bits, as static_cast of the native type gives them.
    template <typename T, typename = std::enable_if_t<std::is_integral<T>::value &&
                                                      !std::is_same<T, bool>::value>>
    explicit constexpr operator T() const {
        return static_cast<T>(low_);
    }
    explicit constexpr operator bool() const { return (high_ | low_) != 0; }

    constexpr std::uint64_t high() const { return high_; }
    constexpr std::uint64_t low() const { return low_; }

    friend constexpr PortableUint128 operator+(PortableUint128 a, PortableUint128 b) {
        std::uint64_t low = a.low_ + b.low_;
        return from_halves(a.high_ + b.high_ + (low < a.low_ ? 1 : 0), low);
    }
    friend constexpr PortableUint128 operator-(PortableUint128 a, PortableUint128 b) {
        return from_halves(a.high_ - b.high_ - (a.low_ < b.low_ ? 1 : 0), a.low_ - b.low_);
    }
    friend constexpr PortableUint128 operator-(PortableUint128 a) { return PortableUint128() - a; }
    friend constexpr PortableUint128 operator*(PortableUint128 a, PortableUint128 b) {
        PortableUint128 product = multiply_halves(a.low_, b.low_);
        product.high_ += a.low_ * b.high_ + a.high_ * b.low_;  // the rest wraps past 2^128
        return product;
    }
    friend constexpr PortableUint128 operator<<(PortableUint128 a, unsigned n) {
        if (n == 0) return a;
        if (n >= 128) return PortableUint128();
        if (n >= 64) return from_halves(a.low_ << (n - 64), 0);
        return from_halves((a.high_ << n) | (a.low_ >> (64 - n)), a.low_ << n);
    }
    friend constexpr PortableUint128 operator>>(PortableUint128 a, unsigned n) {
        if (n == 0) return a;
        if (n >= 128) return PortableUint128();
        if (n >= 64) return from_halves(0, a.high_ >> (n - 64));
        return from_halves(a.high_ >> n, (a.low_ >> n) | (a.high_ << (64 - n)));
    }
    friend constexpr PortableUint128 operator&(PortableUint128 a, PortableUint128 b) {
        return from_halves(a.high_ & b.high_, a.low_ & b.low_);
    }
    friend constexpr PortableUint128 operator|(PortableUint128 a, PortableUint128 b) {
        return from_halves(a.high_ | b.high_, a.low_ | b.low_);
    }
    friend constexpr PortableUint128 operator^(PortableUint128 a, PortableUint128 b) {
        return from_halves(a.high_ ^ b.high_, a.low_ ^ b.low_);
    }
    friend constexpr bool operator==(PortableUint128 a, PortableUint128 b) {
        return a.high_ == b.high_ && a.low_ == b.low_;
    }
    friend constexpr bool operator!=(PortableUint128 a, PortableUint128 b) { return !(a == b); }
    friend constexpr bool operator<(PortableUint128 a, PortableUint128 b) {
        return a.high_ != b.high_ ? a.high_ < b.high_ : a.low_ < b.low_;
    }
    friend constexpr bool operator>(PortableUint128 a, PortableUint128 b) { return b < a; }
    friend constexpr bool operator<=(PortableUint128 a, PortableUint128 b) { return !(b < a); }
    friend constexpr bool operator>=(PortableUint128 a, PortableUint128 b) { return !(a < b); }

    PortableUint128& operator+=(PortableUint128 b) { return *this = *this + b; }
    PortableUint128& operator-=(PortableUint128 b) { return *this = *this - b; }
    PortableUint128& operator*=(PortableUint128 b) { return *this = *this * b; }

  private:
    template <typename T>
    static constexpr std::uint64_t sign_extension(T value) {
        if constexpr (std::is_signed<T>::value) return value < 0 ? ~std::uint64_t(0) : 0;
        return 0;
    }
    // The full 128-bit product of two 64-bit numbers, from 32-bit halves
    // (the schoolbook method: no partial product or sum can overflow 64 bits).
    static constexpr PortableUint128 multiply_halves(std::uint64_t a, std::uint64_t b) {
        const std::uint64_t a0 = a & 0xffffffffu, a1 = a >> 32;
        const std::uint64_t b0 = b & 0xffffffffu, b1 = b >> 32;
        const std::uint64_t p00 = a0 * b0, p01 = a0 * b1, p10 = a1 * b0, p11 = a1 * b1;
        const std::uint64_t middle = (p00 >> 32) + (p01 & 0xffffffffu) + (p10 & 0xffffffffu);
        return from_halves(p11 + (p01 >> 32) + (p10 >> 32) + (middle >> 32),
                           (middle << 32) | (p00 & 0xffffffffu));
    }

    std::uint64_t high_ = 0;
    std::uint64_t low_ = 0;
};

class PortableInt128 {
  public:
    constexpr PortableInt128() = default;
    template <typename T, typename = std::enable_if_t<std::is_integral<T>::value>>
    constexpr PortableInt128(T value)
        : bits_(value) {}  // NOLINT: implicit, as the native type converts
    // Reinterprets the bits (two's complement), as static_cast of the native type does.
    explicit constexpr PortableInt128(PortableUint128 bits) : bits_(bits) {}

    template <typename T, typename = std::enable_if_t<std::is_integral<T>::value &&
                                                      !std::is_same<T, bool>::value>>
    explicit constexpr operator T() const {
        return static_cast<T>(bits_.low());
    }
    explicit constexpr operator bool() const { return static_cast<bool>(bits_); }

    constexpr PortableUint128 bits() const { return bits_; }
    constexpr bool negative() const { return (bits_.high() >> 63) != 0; }

    friend constexpr PortableInt128 operator+(PortableInt128 a, PortableInt128 b) {
        return PortableInt128(a.bits_ + b.bits_);
    }
    friend constexpr PortableInt128 operator-(PortableInt128 a, PortableInt128 b) {
        return PortableInt128(a.bits_ - b.bits_);
    }
    friend constexpr PortableInt128 operator-(PortableInt128 a) { return PortableInt128(-a.bits_); }
    // Two's complement makes the low 128 bits of a product the same signed or not.
    friend constexpr PortableInt128 operator*(PortableInt128 a, PortableInt128 b) {
        return PortableInt128(a.bits_ * b.bits_);
    }
    friend constexpr PortableInt128 operator<<(PortableInt128 a, unsigned n) {
        return PortableInt128(a.bits_ << n);
    }
    friend constexpr bool operator==(PortableInt128 a, PortableInt128 b) {
        return a.bits_ == b.bits_;
    }
    friend constexpr bool operator!=(PortableInt128 a, PortableInt128 b) {
        return a.bits_ != b.bits_;
    }
    friend constexpr bool operator<(PortableInt128 a, PortableInt128 b) {
        // Flipping the sign bit maps two's complement order onto unsigned order.
        const PortableUint128 sign = PortableUint128(1) << 127;
        return (a.bits_ ^ sign) < (b.bits_ ^ sign);
    }
    friend constexpr bool operator>(PortableInt128 a, PortableInt128 b) { return b < a; }
    friend constexpr bool operator<=(PortableInt128 a, PortableInt128 b) { return !(b < a); }
    friend constexpr bool operator>=(PortableInt128 a, PortableInt128 b) { return !(a < b); }

    PortableInt128& operator+=(PortableInt128 b) { return *this = *this + b; }
    PortableInt128& operator-=(PortableInt128 b) { return *this = *this - b; }
    PortableInt128& operator*=(PortableInt128 b) { return *this = *this * b; }

  private:
    PortableUint128 bits_;
};

constexpr PortableUint128::PortableUint128(const PortableInt128& value)
    : PortableUint128(value.bits()) {}

// sum = a + b; true when the exact sum does not fit (sum is then wrapped):
// overflow is two operands of one sign giving a sum of the other.
inline bool add_overflows(PortableInt128 a, PortableInt128 b, PortableInt128* sum) {
    *sum = a + b;
    return a.negative() == b.negative() && sum->negative() != a.negative();
}

#ifdef ALMANAC_NATIVE_INT128
__extension__ typedef unsigned __int128 Uint128;
__extension__ typedef __int128 Int128;

// sum = a + b; true when the exact sum does not fit (sum is then wrapped).
inline bool add_overflows(Int128 a, Int128 b, Int128* sum) {
    return __builtin_add_overflow(a, b, sum);
}
#else
using Uint128 = PortableUint128;
using Int128 = PortableInt128;
#endif

}  // namespace almanac
