// SPDX-License-Identifier: MIT
#include "core/stats/period_totals.h"

#include <algorithm>
#include <cmath>
#include <cstring>

#include "core/text/error.h"

namespace almanac {

namespace {

int kind_rank(ItemKey::Kind kind) {
    switch (kind) {
        case ItemKey::Kind::Null:
            return 0;
        case ItemKey::Kind::Integer:
        case ItemKey::Kind::Real:
            return 1;
        case ItemKey::Kind::Text:
            return 2;
        case ItemKey::Kind::Blob:
            return 3;
    }
    return 4;
}

// -1, 0 or 1 as the INTEGER i compares with the REAL r, exactly: converting
// either one to the other's type could round.
int compare_integer_real(std::int64_t i, double r) {
    if (r < -9223372036854775808.0) return 1;
    if (r >= 9223372036854775808.0) return -1;
    double whole = std::floor(r);
    auto w = static_cast<std::int64_t>(whole);
    if (i != w) return i < w ? -1 : 1;
    return whole < r ? -1 : 0;
}

int compare_numbers(const ItemKey& a, const ItemKey& b) {
    using Kind = ItemKey::Kind;
    if (a.kind == Kind::Integer && b.kind == Kind::Integer)
        return a.integer < b.integer ? -1 : a.integer > b.integer;
    if (a.kind == Kind::Real && b.kind == Kind::Real) return a.real < b.real ? -1 : a.real > b.real;
    if (a.kind == Kind::Integer) return compare_integer_real(a.integer, b.real);
    return -compare_integer_real(b.integer, a.real);
}

std::uint64_t mix(std::uint64_t x) {
    x ^= x >> 33;
    x *= 0xff51afd7ed558ccdull;
    x ^= x >> 33;
    return x;
}

// Up to eight bytes as one number (the missing high bytes zero), in the
// machine's byte order: only equality of hashes matters.
std::uint64_t load_up_to_8(const char* p, std::size_t n) {
    std::uint64_t x = 0;
    std::memcpy(&x, p, n);
    return x;
}

std::uint64_t hash_bytes(std::uint64_t seed, std::string_view bytes) {
    // Eight bytes per step: item names are short, and this runs per row.
    std::uint64_t h = mix(seed * 0x9e3779b97f4a7c15ull + bytes.size());
    const char* p = bytes.data();
    std::size_t n = bytes.size();
    for (; n >= 8; p += 8, n -= 8) h = mix(h ^ load_up_to_8(p, 8)) * 0x9e3779b97f4a7c15ull;
    return mix(h ^ load_up_to_8(p, n));
}

}  // namespace

bool item_less(const ItemKey& a, const ItemKey& b) {
    int ra = kind_rank(a.kind), rb = kind_rank(b.kind);
    if (ra != rb) return ra < rb;
    if (ra == 1) return compare_numbers(a, b) < 0;
    return a.bytes < b.bytes;  // std::string compares bytes as unsigned char
}

PeriodCell& PeriodTotals::cell(ItemKey::Kind kind, std::int64_t integer, double real,
                               std::string_view bytes, std::int64_t serial) {
    std::size_t index = find_or_add(kind, integer, real, bytes);
    ItemCells& item = items_[index];
    if (serial < first_serial_ || serial > last_serial_) {
        std::int64_t first = empty_span() ? serial : std::min(first_serial_, serial);
        std::int64_t last = empty_span() ? serial : std::max(last_serial_, serial);
        check_limit(items_.size(), first, last);
        first_serial_ = first;
        last_serial_ = last;
    }
    std::int64_t offset = serial - item.base;
    if (offset >= 0 && offset < static_cast<std::int64_t>(item.cells.size()))
        return item.cells[static_cast<std::size_t>(offset)];
    return grow_to(item, serial);
}

PeriodCell& PeriodTotals::grow_to(ItemCells& item, std::int64_t serial) {
    if (item.cells.empty()) {
        item.base = serial;
        item.cells.resize(1);
        return item.cells[0];
    }
    // Grow by at least the current size in the needed direction, so rows
    // arriving in descending (or ascending) order stay linear. Not clamped to
    // the overall span: that span grows with the same rows, and a clamp would
    // make each step one cell. An item's cells stay within twice the span.
    std::int64_t size = static_cast<std::int64_t>(item.cells.size());
    std::int64_t lo = item.base, hi = item.base + size - 1;
    if (serial < lo) {
        lo = std::min(serial, lo - size);
    } else {
        hi = std::max(serial, hi + size);
    }
    std::vector<PeriodCell> cells(static_cast<std::size_t>(hi - lo + 1));
    std::move(item.cells.begin(), item.cells.end(), cells.begin() + (item.base - lo));
    item.cells.swap(cells);
    item.base = lo;
    return item.cells[static_cast<std::size_t>(serial - lo)];
}

void PeriodTotals::check_limit(std::uint64_t items, std::int64_t first, std::int64_t last) const {
    auto periods = static_cast<std::uint64_t>(last - first) + 1;
    if (periods > max_cells_ || items * periods > max_cells_) {
        throw Error(std::to_string(items) + (items == 1 ? " item" : " items") + " over " +
                    std::to_string(periods) +
                    " periods are more item-period rows than the limit of " +
                    std::to_string(max_cells_) + ": use a longer period or a smaller source");
    }
}

std::size_t PeriodTotals::find_or_add(ItemKey::Kind kind, std::int64_t integer, double real,
                                      std::string_view bytes) {
    using Kind = ItemKey::Kind;
    // Equal numbers are one item whatever their type, as GROUP BY has it: a
    // whole REAL is keyed as the INTEGER it equals.
    if (kind == Kind::Real && real >= -9007199254740992.0 && real <= 9007199254740992.0 &&
        std::floor(real) == real) {
        kind = Kind::Integer;
        integer = static_cast<std::int64_t>(real);
    }
    auto same = [&](const ItemCells& item) {
        if (item.key.kind != kind) return false;
        switch (kind) {
            case Kind::Null:
                return true;
            case Kind::Integer:
                return item.key.integer == integer;
            case Kind::Real:
                return std::memcmp(&item.key.real, &real, sizeof real) == 0;
            default:
                return item.key.bytes == bytes;
        }
    };
    std::uint64_t h;
    switch (kind) {
        case Kind::Integer:
            h = mix(static_cast<std::uint64_t>(integer) + 1);
            break;
        case Kind::Real: {
            std::uint64_t bits;
            std::memcpy(&bits, &real, sizeof bits);
            h = mix(bits ^ 0x5bd1e995u);
            break;
        }
        default:
            h = hash_bytes(static_cast<std::uint64_t>(kind), bytes);
    }
    // Rows of one item often come together; the hash is compared first, so
    // a different item costs no comparison of bytes.
    if (!items_.empty() && items_[last_item_].hash == h && same(items_[last_item_]))
        return last_item_;
    if (slots_.empty()) slots_.assign(64, 0);
    std::size_t mask = slots_.size() - 1;
    std::size_t slot = static_cast<std::size_t>(h) & mask;
    while (slots_[slot] != 0) {
        const ItemCells& item = items_[slots_[slot] - 1];
        if (item.hash == h && same(item)) return last_item_ = slots_[slot] - 1;
        slot = (slot + 1) & mask;
    }
    if (!empty_span()) check_limit(items_.size() + 1, first_serial_, last_serial_);
    ItemCells fresh;
    fresh.key.kind = kind;
    fresh.key.integer = integer;
    fresh.key.real = real;
    if (kind == Kind::Text || kind == Kind::Blob) fresh.key.bytes.assign(bytes);
    fresh.hash = h;
    items_.push_back(std::move(fresh));
    slots_[slot] = static_cast<std::uint32_t>(items_.size());
    // Keep the table at most half full.
    if (items_.size() * 2 > slots_.size()) {
        std::vector<std::uint32_t> wider(slots_.size() * 2, 0);
        std::size_t wider_mask = wider.size() - 1;
        for (std::size_t i = 0; i < items_.size(); ++i) {
            std::size_t s = static_cast<std::size_t>(items_[i].hash) & wider_mask;
            while (wider[s] != 0) s = (s + 1) & wider_mask;
            wider[s] = static_cast<std::uint32_t>(i + 1);
        }
        slots_.swap(wider);
    }
    return last_item_ = items_.size() - 1;
}

std::vector<std::size_t> PeriodTotals::items_in_order() const {
    std::vector<std::size_t> order(items_.size());
    for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return item_less(items_[a].key, items_[b].key);
    });
    return order;
}

PeriodCell* PeriodTotals::at(std::size_t index, std::int64_t serial) {
    ItemCells& item = items_[index];
    std::int64_t offset = serial - item.base;
    if (offset < 0 || offset >= static_cast<std::int64_t>(item.cells.size())) return nullptr;
    PeriodCell& found = item.cells[static_cast<std::size_t>(offset)];
    return found.rows == 0 ? nullptr : &found;
}

}  // namespace almanac
