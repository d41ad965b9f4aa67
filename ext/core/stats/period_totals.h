// SPDX-License-Identifier: MIT
// Totals per (segment, item, period) in one pass over unsorted rows: the row
// count and the exact sums of two columns (qty and amount), and the totals of
// every item over all segments (the rollup).
//
// Why not a sort: a GROUP BY orders every input row before it can add them up,
// and that sort is most of the work of a report. Here each row costs one item
// lookup in a hash table (and one segment lookup when there are segments) and
// one add into a dense per-item array indexed by the period's serial number,
// so the input is read once and never reordered. Memory is
// O((segments + 1) x items x periods): the caller states a limit on that
// product and gets an Error, not an allocation failure, past it.
//
// Sums are CompactTotals, exact_sum()'s total in 32 bytes, so a cell's qty
// and amount are what exact_sum would give over the same rows, and the cells
// of a report stay within the processor's caches (rows fall into them at
// random). Because every total is exact, totals read in parts (one part per
// segment, or per thread reading a range of rows) merge into exactly what
// one reading of all rows gives: the rollup is built that way from the
// segments, and a parallel read from its parts (merge()).
#pragma once

#include <cstdint>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

#include "core/exact/compact_total.h"
#include "core/time/time_value.h"

namespace almanac {

// A SQL value as a key (an item, a segment), ordered as SQLite orders
// values: NULL, then numbers (INTEGER and REAL compared by value), then TEXT
// (bytewise), then BLOBs.
struct ValueKey {
    enum class Kind { Null, Integer, Real, Text, Blob };
    Kind kind = Kind::Null;
    std::int64_t integer = 0;  // Kind::Integer
    double real = 0;           // Kind::Real
    std::string bytes;         // Kind::Text and Kind::Blob
};
bool value_less(const ValueKey& a, const ValueKey& b);

// The same value as one source row holds it, its bytes not copied.
struct ValueView {
    ValueKey::Kind kind = ValueKey::Kind::Null;
    std::int64_t integer = 0;
    double real = 0;
    std::string_view bytes;
};

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
    // Adds the rows and totals of `other`, exactly.
    void add(const PeriodCell& other);
};

// The totals of one segment, or of all rows (the rollup): per item, its
// cells by period serial, and the span of the rows counted.
class TotalsGroup {
  public:
    const ValueKey& key() const { return key_; }
    bool empty() const { return rows_ == 0; }
    std::int64_t rows() const { return rows_; }
    // The earliest and latest instant of the rows counted (when not empty).
    Instant earliest() const { return earliest_; }
    Instant latest() const { return latest_; }
    std::int64_t first_serial() const { return first_serial_; }
    std::int64_t last_serial() const { return last_serial_; }
    // Whether the item (an index of PeriodTotals::item) has a row here.
    bool has_item(std::size_t item) const {
        return item < series_.size() && !series_[item].cells.empty();
    }
    // The cell of (item, serial), or nullptr when no row fell there.
    const PeriodCell* at(std::size_t item, std::int64_t serial) const;

  private:
    friend class PeriodTotals;
    struct Series {
        std::int64_t base = 0;  // serial of cells[0]
        std::vector<PeriodCell> cells;
    };
    PeriodCell& grow_to(Series& series, std::int64_t serial);
    void note(Instant t, std::int64_t serial);
    void add(const TotalsGroup& other);

    ValueKey key_;
    std::vector<Series> series_;  // by item index; empty cells: no row of that item
    std::int64_t rows_ = 0;
    Instant earliest_{}, latest_{};
    std::int64_t first_serial_ = 0, last_serial_ = -1;
};

class PeriodTotals {
  public:
    // max_cells bounds (segments + 1) x items x periods, or items x periods
    // without segments. Without segments every row goes to the rollup.
    PeriodTotals(std::uint64_t max_cells, bool has_segments)
        : max_cells_(max_cells), has_segments_(has_segments) {}

    // The cell of (segment, item, serial) for a row at instant t, created
    // empty when new; the row's instant and serial widen its segment's span.
    // A new item, segment or a wider span past max_cells throws Error. Keys
    // are looked up by kind and bytes, so a TEXT value costs one hash of its
    // bytes. The segment is ignored without segments.
    PeriodCell& cell(const ValueView& segment, const ValueView& item, std::int64_t serial,
                     Instant t);

    // Whether a row at t would be the earliest so far; the representation of
    // the earliest row is the one results are written in.
    // A tie goes to the representation first in Representation's order, so
    // the choice does not depend on the order rows are read in.
    bool is_new_earliest(Instant t) const { return !has_form_ || t <= form_at_; }
    void set_earliest_form(Instant t, Representation representation, bool integer_input);
    Representation representation() const { return representation_; }
    bool integer_input() const { return integer_input_; }

    // Adds the totals of another reading of other rows of the same source
    // (a range of rows read by another thread), exactly: the result is what
    // one reading of both sets of rows gives, in whichever order they come.
    void merge(PeriodTotals&& other);
    // Builds the rollup from the segments (exact merges); call once, after
    // every row and merge. Without segments the rows went to the rollup.
    void finish();

    // After an Error from merge() the totals are not to be used again.
    // Throws the limit's Error unless every group's items fit over the
    // periods first..last (a listing's span, wider than the rows' own).
    void check_listing(std::int64_t first, std::int64_t last) const;

    bool has_segments() const { return has_segments_; }
    bool empty() const { return items_.empty(); }
    std::size_t item_count() const { return items_.size(); }
    std::size_t segment_count() const { return has_segments_ ? groups_.size() : 0; }
    // Items and segments in SQLite's order (see ValueKey): indexes for item() and segment().
    std::vector<std::size_t> items_in_order() const;
    std::vector<std::size_t> segments_in_order() const;
    const ValueKey& item(std::size_t index) const { return items_[index].key; }
    const TotalsGroup& segment(std::size_t index) const { return groups_[index]; }
    // The totals over all rows (after finish()).
    const TotalsGroup& rollup() const {
        return has_segments_ || groups_.empty() ? rollup_ : groups_.front();
    }

    static std::uint64_t cell_bytes() { return sizeof(PeriodCell); }

  private:
    struct Key {
        ValueKey key;
        std::uint64_t hash = 0;
    };
    // Open addressing over `keys` (index + 1 in slots, 0 is free).
    struct KeyTable {
        std::vector<std::uint32_t> slots;
        std::size_t last = 0;  // rows of one value often come together
    };
    static constexpr std::size_t kAbsent = ~std::size_t{0};
    // The index of a canonical value with hash h in `keys`, or kAbsent and
    // the free slot where add() puts it.
    static std::size_t find(const std::vector<Key>& keys, KeyTable& table, const ValueView& view,
                            std::uint64_t h, std::size_t& free_slot);
    static std::size_t add(std::vector<Key>& keys, KeyTable& table, const ValueView& view,
                           std::uint64_t h, std::size_t free_slot);
    static std::size_t find_or_add(std::vector<Key>& keys, KeyTable& table,
                                   const ValueView& view);
    void add_group(const ValueKey& key);
    std::size_t groups_with_rollup(std::size_t segments) const {
        return has_segments_ ? segments + 1 : 1;
    }
    void check_limit(std::uint64_t groups, std::uint64_t items, std::int64_t first,
                     std::int64_t last) const;
    bool empty_span() const { return last_serial_ < first_serial_; }

    std::uint64_t max_cells_;
    bool has_segments_;
    std::vector<Key> items_;
    KeyTable item_table_;
    std::vector<TotalsGroup> groups_;  // the segments, or the rollup alone
    std::vector<Key> group_keys_;      // the keys of groups_, for the look-up
    KeyTable group_table_;
    TotalsGroup rollup_;  // with segments, after finish()
    std::int64_t first_serial_ = 0, last_serial_ = -1;  // over every row
    bool has_form_ = false;
    Instant form_at_{};
    Representation representation_ = Representation::Text;
    bool integer_input_ = false;
};

}  // namespace almanac
