// SPDX-License-Identifier: MIT
// Totals per (item, period) in one pass over unsorted rows: the row count and
// the exact sums of two columns (qty and amount).
//
// Why not a sort: a GROUP BY orders every input row before it can add them up,
// and that sort is most of the work of a report. Here each row costs one item
// lookup in a hash table and one add into a dense per-item array indexed by
// the period's serial number, so the input is read once and never reordered.
// Memory is O(items x periods): the caller states a limit on that product and
// gets an Error, not an allocation failure, past it.
//
// Sums are CompactTotals, exact_sum()'s total in 32 bytes, so a cell's qty
// and amount are what exact_sum would give over the same rows, and the cells
// of a report stay within the processor's caches (rows fall into them at
// random).
#pragma once

#include <cstdint>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

#include "core/exact/compact_total.h"

namespace almanac {

// An item as a SQL value, ordered as SQLite orders values: NULL, then numbers
// (INTEGER and REAL compared by value), then TEXT (bytewise), then BLOBs.
struct ItemKey {
    enum class Kind { Null, Integer, Real, Text, Blob };
    Kind kind = Kind::Null;
    std::int64_t integer = 0;  // Kind::Integer
    double real = 0;           // Kind::Real
    std::string bytes;         // Kind::Text and Kind::Blob
};
bool item_less(const ItemKey& a, const ItemKey& b);

struct PeriodCell {
    std::int64_t rows = 0;
    CompactTotal amount;
    // Apart, and made only by a pass that reads qty: the part of a cell that
    // every row touches stays at 48 bytes.
    std::unique_ptr<CompactTotal> qty;
    CompactTotal& qty_total() {
        if (!qty) qty = std::make_unique<CompactTotal>();
        return *qty;
    }
};

class PeriodTotals {
  public:
    // max_cells bounds items x (latest serial - earliest serial + 1).
    explicit PeriodTotals(std::uint64_t max_cells) : max_cells_(max_cells) {}

    // The cell of (item, serial), created empty when new; a new item or a
    // wider span past max_cells throws Error. Keys are looked up by kind and
    // bytes, so a TEXT item costs one hash of its bytes.
    PeriodCell& cell(ItemKey::Kind kind, std::int64_t integer, double real, std::string_view bytes,
                     std::int64_t serial);

    bool empty() const { return items_.empty(); }
    std::int64_t first_serial() const { return first_serial_; }
    std::int64_t last_serial() const { return last_serial_; }
    std::size_t item_count() const { return items_.size(); }
    // Items in SQLite's order (see ItemKey); indexes for item() and at().
    std::vector<std::size_t> items_in_order() const;
    const ItemKey& item(std::size_t index) const { return items_[index].key; }
    // The cell of (item, serial), or nullptr when no row fell there.
    PeriodCell* at(std::size_t index, std::int64_t serial);

    static std::uint64_t cell_bytes() { return sizeof(PeriodCell); }

  private:
    struct ItemCells {
        ItemKey key;
        std::uint64_t hash = 0;
        std::int64_t base = 0;  // serial of cells[0]
        std::vector<PeriodCell> cells;
    };
    std::size_t find_or_add(ItemKey::Kind kind, std::int64_t integer, double real,
                            std::string_view bytes);
    bool empty_span() const { return last_serial_ < first_serial_; }
    void check_limit(std::uint64_t items, std::int64_t first, std::int64_t last) const;
    PeriodCell& grow_to(ItemCells& item, std::int64_t serial);

    std::uint64_t max_cells_;
    std::vector<ItemCells> items_;
    std::vector<std::uint32_t> slots_;  // open addressing: index + 1, 0 is free
    std::size_t last_item_ = 0;         // rows of one item often come together
    std::int64_t first_serial_ = 0, last_serial_ = -1;
};

}  // namespace almanac
