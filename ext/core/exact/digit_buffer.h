// SPDX-License-Identifier: MIT
// The digits of an ExactNumber: a short array of 32-bit digits kept inline,
// on the heap only when long. The sums almanac combines are a few digits
// long, and a statistic is computed once per output row of a window, so
// keeping those few digits off the heap matters more than anything else in
// the final combination.
#pragma once

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <memory>

namespace almanac {

class DigitBuffer {
  public:
    DigitBuffer() = default;
    explicit DigitBuffer(std::size_t size) { resize_zeroed(size); }
    DigitBuffer(const DigitBuffer& other) { assign(other); }
    DigitBuffer& operator=(const DigitBuffer& other) {
        if (this != &other) assign(other);
        return *this;
    }
    DigitBuffer(DigitBuffer&& other) noexcept { take(other); }
    DigitBuffer& operator=(DigitBuffer&& other) noexcept {
        if (this != &other) take(other);
        return *this;
    }

    std::size_t size() const { return size_; }
    bool empty() const { return size_ == 0; }
    std::uint32_t* data() { return data_; }
    const std::uint32_t* data() const { return data_; }
    std::uint32_t& operator[](std::size_t i) { return data_[i]; }
    std::uint32_t operator[](std::size_t i) const { return data_[i]; }
    std::uint32_t back() const { return data_[size_ - 1]; }
    void pop_back() { --size_; }
    void push_back(std::uint32_t digit) {
        if (size_ == capacity_) grow(size_ + 1);
        data_[size_++] = digit;
    }
    // Drops the lowest `count` digits.
    void erase_front(std::size_t count) {
        std::memmove(data_, data_ + count, (size_ - count) * sizeof(std::uint32_t));
        size_ -= count;
    }

  private:
    static constexpr std::size_t kInline = 16;

    void resize_zeroed(std::size_t size) {
        if (size > capacity_) grow(size);
        std::fill(data_, data_ + size, 0u);
        size_ = size;
    }
    void grow(std::size_t wanted) {
        std::size_t capacity = std::max(wanted, capacity_ * 2);
        auto fresh = std::make_unique<std::uint32_t[]>(capacity);
        std::copy(data_, data_ + size_, fresh.get());
        heap_ = std::move(fresh);
        data_ = heap_.get();
        capacity_ = capacity;
    }
    void assign(const DigitBuffer& other) {
        size_ = 0;
        if (other.size_ > capacity_) grow(other.size_);
        std::copy(other.data_, other.data_ + other.size_, data_);
        size_ = other.size_;
    }
    void take(DigitBuffer& other) {
        if (other.heap_) {
            heap_ = std::move(other.heap_);
            data_ = heap_.get();
            capacity_ = other.capacity_;
            size_ = other.size_;
        } else {
            heap_.reset();
            data_ = inline_;
            capacity_ = kInline;
            std::copy(other.data_, other.data_ + other.size_, inline_);
            size_ = other.size_;
        }
        other.data_ = other.inline_;
        other.capacity_ = kInline;
        other.size_ = 0;
    }

    std::uint32_t inline_[kInline];
    std::unique_ptr<std::uint32_t[]> heap_;
    std::uint32_t* data_ = inline_;
    std::size_t size_ = 0;
    std::size_t capacity_ = kInline;
};

}  // namespace almanac
