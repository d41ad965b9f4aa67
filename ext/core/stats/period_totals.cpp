// SPDX-License-Identifier: MIT
#include "core/stats/period_totals.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <functional>

#include "core/text/error.h"

namespace almanac {

namespace {

using Kind = ValueKey::Kind;

int kind_rank(Kind kind) {
    switch (kind) {
        case Kind::Null:
            return 0;
        case Kind::Integer:
        case Kind::Real:
            return 1;
        case Kind::Text:
            return 2;
        case Kind::Blob:
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

int compare_numbers(const ValueKey& a, const ValueKey& b) {
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

// Equal numbers are one key whatever their type, as GROUP BY has it: a
// whole REAL is keyed as the INTEGER it equals.
ValueView canonical(ValueView view) {
    if (view.kind == Kind::Real && view.real >= -9007199254740992.0 &&
        view.real <= 9007199254740992.0 && std::floor(view.real) == view.real) {
        view.kind = Kind::Integer;
        view.integer = static_cast<std::int64_t>(view.real);
    }
    return view;
}

std::uint64_t hash_of(const ValueView& view) {
    switch (view.kind) {
        case Kind::Integer:
            return mix(static_cast<std::uint64_t>(view.integer) + 1);
        case Kind::Real: {
            std::uint64_t bits;
            std::memcpy(&bits, &view.real, sizeof bits);
            return mix(bits ^ 0x5bd1e995u);
        }
        default:
            return hash_bytes(static_cast<std::uint64_t>(view.kind), view.bytes);
    }
}

bool same(const ValueKey& key, const ValueView& view) {
    if (key.kind != view.kind) return false;
    switch (view.kind) {
        case Kind::Null:
            return true;
        case Kind::Integer:
            return key.integer == view.integer;
        case Kind::Real:
            return std::memcmp(&key.real, &view.real, sizeof view.real) == 0;
        default:
            return key.bytes == view.bytes;
    }
}

ValueView view_of(const ValueKey& key) {
    return ValueView{key.kind, key.integer, key.real, key.bytes};
}

std::vector<std::size_t> in_value_order(std::size_t n,
                                        const std::function<const ValueKey&(std::size_t)>& key) {
    std::vector<std::size_t> order(n);
    for (std::size_t i = 0; i < n; ++i) order[i] = i;
    std::sort(order.begin(), order.end(),
              [&](std::size_t a, std::size_t b) { return value_less(key(a), key(b)); });
    return order;
}

}  // namespace

bool value_less(const ValueKey& a, const ValueKey& b) {
    int ra = kind_rank(a.kind), rb = kind_rank(b.kind);
    if (ra != rb) return ra < rb;
    if (ra == 1) return compare_numbers(a, b) < 0;
    return a.bytes < b.bytes;  // std::string compares bytes as unsigned char
}

void PeriodCell::add(const PeriodCell& other) {
    rows += other.rows;
    amount.add(other.amount);
    if (other.qty) qty_total().add(*other.qty);
}

const PeriodCell* TotalsGroup::at(std::size_t item, std::int64_t serial) const {
    if (item >= series_.size()) return nullptr;
    const Series& series = series_[item];
    std::int64_t offset = serial - series.base;
    if (offset < 0 || offset >= static_cast<std::int64_t>(series.cells.size())) return nullptr;
    const PeriodCell& found = series.cells[static_cast<std::size_t>(offset)];
    return found.rows == 0 ? nullptr : &found;
}

PeriodCell& TotalsGroup::grow_to(Series& series, std::int64_t serial) {
    if (series.cells.empty()) {
        series.base = serial;
        series.cells.resize(1);
        return series.cells[0];
    }
    // Grow by at least the current size in the needed direction, so rows
    // arriving in descending (or ascending) order stay linear. Not clamped to
    // the overall span: that span grows with the same rows, and a clamp would
    // make each step one cell. A series' cells stay within twice the span.
    std::int64_t size = static_cast<std::int64_t>(series.cells.size());
    std::int64_t lo = series.base, hi = series.base + size - 1;
    if (serial < lo) {
        lo = std::min(serial, lo - size);
    } else {
        hi = std::max(serial, hi + size);
    }
    std::vector<PeriodCell> cells(static_cast<std::size_t>(hi - lo + 1));
    std::move(series.cells.begin(), series.cells.end(), cells.begin() + (series.base - lo));
    series.cells.swap(cells);
    series.base = lo;
    return series.cells[static_cast<std::size_t>(serial - lo)];
}

void TotalsGroup::note(Instant t, std::int64_t serial) {
    if (rows_++ == 0) {
        earliest_ = latest_ = t;
        first_serial_ = last_serial_ = serial;
        return;
    }
    if (t < earliest_) earliest_ = t;
    if (t > latest_) latest_ = t;
    if (serial < first_serial_) first_serial_ = serial;
    if (serial > last_serial_) last_serial_ = serial;
}

// Only for groups whose series share item indexes (the rollup and its segments).
void TotalsGroup::add(const TotalsGroup& other) {
    if (other.empty()) return;
    if (series_.size() < other.series_.size()) series_.resize(other.series_.size());
    for (std::size_t item = 0; item < other.series_.size(); ++item) {
        const Series& from = other.series_[item];
        if (from.cells.empty()) continue;
        Series& into = series_[item];
        std::int64_t last = from.base + static_cast<std::int64_t>(from.cells.size()) - 1;
        for (std::int64_t serial = from.base; serial <= last; ++serial) {
            const PeriodCell& cell = from.cells[static_cast<std::size_t>(serial - from.base)];
            if (cell.rows == 0) continue;
            std::int64_t offset = serial - into.base;
            PeriodCell& target =
                offset >= 0 && offset < static_cast<std::int64_t>(into.cells.size())
                    ? into.cells[static_cast<std::size_t>(offset)]
                    : grow_to(into, serial);
            target.add(cell);
        }
    }
    if (empty()) {
        earliest_ = other.earliest_;
        latest_ = other.latest_;
        first_serial_ = other.first_serial_;
        last_serial_ = other.last_serial_;
    } else {
        earliest_ = std::min(earliest_, other.earliest_);
        latest_ = std::max(latest_, other.latest_);
        first_serial_ = std::min(first_serial_, other.first_serial_);
        last_serial_ = std::max(last_serial_, other.last_serial_);
    }
    rows_ += other.rows_;
}

std::size_t PeriodTotals::find(const std::vector<Key>& keys, KeyTable& table,
                               const ValueView& view, std::uint64_t h, std::size_t& free_slot) {
    // Rows of one value often come together; the hash is compared first, so
    // a different value costs no comparison of bytes.
    if (!keys.empty() && keys[table.last].hash == h && same(keys[table.last].key, view))
        return table.last;
    if (table.slots.empty()) table.slots.assign(64, 0);
    std::size_t mask = table.slots.size() - 1;
    std::size_t slot = static_cast<std::size_t>(h) & mask;
    while (table.slots[slot] != 0) {
        const Key& key = keys[table.slots[slot] - 1];
        if (key.hash == h && same(key.key, view)) return table.last = table.slots[slot] - 1;
        slot = (slot + 1) & mask;
    }
    free_slot = slot;
    return kAbsent;
}

std::size_t PeriodTotals::add(std::vector<Key>& keys, KeyTable& table, const ValueView& view,
                              std::uint64_t h, std::size_t free_slot) {
    Key fresh;
    fresh.key.kind = view.kind;
    fresh.key.integer = view.integer;
    fresh.key.real = view.real;
    if (view.kind == Kind::Text || view.kind == Kind::Blob) fresh.key.bytes.assign(view.bytes);
    fresh.hash = h;
    keys.push_back(std::move(fresh));
    table.slots[free_slot] = static_cast<std::uint32_t>(keys.size());
    // Keep the table at most half full.
    if (keys.size() * 2 > table.slots.size()) {
        std::vector<std::uint32_t> wider(table.slots.size() * 2, 0);
        std::size_t wider_mask = wider.size() - 1;
        for (std::size_t i = 0; i < keys.size(); ++i) {
            std::size_t s = static_cast<std::size_t>(keys[i].hash) & wider_mask;
            while (wider[s] != 0) s = (s + 1) & wider_mask;
            wider[s] = static_cast<std::uint32_t>(i + 1);
        }
        table.slots.swap(wider);
    }
    return table.last = keys.size() - 1;
}

std::size_t PeriodTotals::find_or_add(std::vector<Key>& keys, KeyTable& table,
                                      const ValueView& given) {
    ValueView view = canonical(given);
    std::uint64_t h = hash_of(view);
    std::size_t slot = 0;
    std::size_t found = find(keys, table, view, h, slot);
    return found != kAbsent ? found : add(keys, table, view, h, slot);
}

void PeriodTotals::add_group(const ValueKey& key) {
    groups_.emplace_back();
    groups_.back().key_ = key;
}

PeriodCell& PeriodTotals::cell(const ValueView& segment, const ValueView& item,
                               std::int64_t serial, Instant t) {
    ValueView item_view = canonical(item);
    std::uint64_t item_hash = hash_of(item_view);
    std::size_t item_slot = 0;
    std::size_t item_index = find(items_, item_table_, item_view, item_hash, item_slot);
    ValueView group_view;
    std::uint64_t group_hash = 0;
    std::size_t group_slot = 0, group_index = 0;
    if (has_segments_) {
        group_view = canonical(segment);
        group_hash = hash_of(group_view);
        group_index = find(group_keys_, group_table_, group_view, group_hash, group_slot);
    } else if (groups_.empty()) {
        group_index = kAbsent;
    }
    bool new_item = item_index == kAbsent, new_group = group_index == kAbsent;
    if (new_item || new_group || empty_span() || serial < first_serial_ || serial > last_serial_) {
        std::int64_t first = empty_span() ? serial : std::min(first_serial_, serial);
        std::int64_t last = empty_span() ? serial : std::max(last_serial_, serial);
        // Before anything is added: a refused row changes nothing.
        check_limit(groups_with_rollup(group_keys_.size() + (new_group ? 1 : 0)),
                    items_.size() + (new_item ? 1 : 0), first, last);
        first_serial_ = first;
        last_serial_ = last;
        if (new_item) item_index = add(items_, item_table_, item_view, item_hash, item_slot);
        if (new_group) {
            if (has_segments_) {
                group_index = add(group_keys_, group_table_, group_view, group_hash, group_slot);
            } else {
                group_keys_.emplace_back();
                group_index = 0;
            }
            add_group(group_keys_[group_index].key);
        }
    }
    TotalsGroup& group = groups_[group_index];
    if (item_index >= group.series_.size()) group.series_.resize(items_.size());
    group.note(t, serial);
    TotalsGroup::Series& series = group.series_[item_index];
    std::int64_t offset = serial - series.base;
    if (offset >= 0 && offset < static_cast<std::int64_t>(series.cells.size()))
        return series.cells[static_cast<std::size_t>(offset)];
    return group.grow_to(series, serial);
}

void PeriodTotals::set_earliest_form(Instant t, Representation representation,
                                     bool integer_input) {
    if (has_form_ && t == form_at_ &&
        std::make_pair(static_cast<int>(representation), !integer_input) >=
            std::make_pair(static_cast<int>(representation_), !integer_input_))
        return;
    if (has_form_ && t > form_at_) return;
    has_form_ = true;
    form_at_ = t;
    representation_ = representation;
    integer_input_ = integer_input;
}

void PeriodTotals::merge(PeriodTotals&& other) {
    if (other.has_form_) {
        set_earliest_form(other.form_at_, other.representation_, other.integer_input_);
    }
    if (other.items_.empty()) return;
    std::vector<std::size_t> item_index(other.items_.size());
    for (std::size_t i = 0; i < other.items_.size(); ++i)
        item_index[i] = find_or_add(items_, item_table_, view_of(other.items_[i].key));
    for (std::size_t g = 0; g < other.groups_.size(); ++g) {
        std::size_t group_index = 0;
        if (has_segments_) {
            group_index = find_or_add(group_keys_, group_table_, view_of(other.group_keys_[g].key));
        } else if (group_keys_.empty()) {
            group_keys_.emplace_back();
        }
        if (group_index >= groups_.size()) add_group(group_keys_[group_index].key);
        TotalsGroup& into = groups_[group_index];
        TotalsGroup& from = other.groups_[g];
        // The other's series re-indexed by this reading's items, then added.
        TotalsGroup moved;
        moved.series_.resize(items_.size());
        for (std::size_t i = 0; i < from.series_.size(); ++i)
            moved.series_[item_index[i]] = std::move(from.series_[i]);
        moved.rows_ = from.rows_;
        moved.earliest_ = from.earliest_;
        moved.latest_ = from.latest_;
        moved.first_serial_ = from.first_serial_;
        moved.last_serial_ = from.last_serial_;
        if (into.empty() && into.series_.empty()) {
            moved.key_ = std::move(into.key_);
            into = std::move(moved);
        } else {
            into.add(moved);
        }
    }
    if (!other.empty_span()) {
        first_serial_ = empty_span() ? other.first_serial_ : std::min(first_serial_, other.first_serial_);
        last_serial_ = empty_span() ? other.last_serial_ : std::max(last_serial_, other.last_serial_);
    }
    check_limit(groups_with_rollup(group_keys_.size()), items_.size(), first_serial_, last_serial_);
}

void PeriodTotals::finish() {
    if (!has_segments_) return;
    rollup_ = TotalsGroup{};
    for (const TotalsGroup& group : groups_) rollup_.add(group);
}

void PeriodTotals::check_listing(std::int64_t first, std::int64_t last) const {
    check_limit(groups_with_rollup(group_keys_.size()), items_.size(), first, last);
}

void PeriodTotals::check_limit(std::uint64_t groups, std::uint64_t items, std::int64_t first,
                               std::int64_t last) const {
    if (last < first) return;
    auto periods = static_cast<std::uint64_t>(last - first) + 1;
    bool within = periods <= max_cells_ && items <= max_cells_ && groups <= max_cells_ &&
                  items * periods <= max_cells_ && groups * items * periods <= max_cells_;
    if (within) return;
    std::string what = std::to_string(items) + (items == 1 ? " item" : " items") + " over " +
                       std::to_string(periods) + " periods";
    if (has_segments_) {
        std::uint64_t segments = groups - 1;
        what += " in " + std::to_string(segments) + (segments == 1 ? " segment" : " segments") +
                " and their rollup";
    }
    throw Error(what + " are more item-period rows than the limit of " +
                std::to_string(max_cells_) +
                ": use a longer period, a shorter range or a smaller source");
}

std::vector<std::size_t> PeriodTotals::items_in_order() const {
    return in_value_order(items_.size(), [&](std::size_t i) -> const ValueKey& { return items_[i].key; });
}

std::vector<std::size_t> PeriodTotals::segments_in_order() const {
    if (!has_segments_) return {};
    return in_value_order(groups_.size(),
                          [&](std::size_t i) -> const ValueKey& { return groups_[i].key_; });
}

}  // namespace almanac
