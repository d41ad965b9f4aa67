// SPDX-License-Identifier: MIT
// Reading shop exports honestly.
//
// Contract:
//
//  1. exact_sum(x): an aggregate and a window function with a real inverse.
//     Rows with NULL x are skipped; NULL for no rows. The result is INTEGER
//     when every value is an integer (an INTEGER, or TEXT that SQLite reads as
//     a whole number) and the total fits in 64 bits; otherwise the REAL
//     nearest the exact sum (bit-identical to Python's math.fsum). TEXT that
//     SQLite does not read as a number ('1,050.00', which SQLite's own sum()
//     counts as 1), BLOBs and infinities raise
//     "exact_sum(): argument 1 (x) = <value>: ..." and the message tells the
//     user to read money written as text with to_amount() in a view.
//
// All arithmetic lives in the core (exact_total.h); this file reads
// arguments and writes results.
#include <charconv>
#include <cmath>
#include <cstdint>
#include <string_view>

#include "aggregate_state.h"
#include "arguments.h"
#include "core/exact/exact_total.h"
#include "core/time/time_value.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

// ---- 1. exact_sum -----------------------------------------------------------

constexpr ArgumentRef kSumX{"exact_sum", 1, "x"};

// The whole-number TEXT that SQLite's own sum() counts as an INTEGER ('12',
// ' -3 '); false for anything with a point or an exponent, or out of range.
bool whole_number_text(std::string_view text, std::int64_t& out) {
    while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
    while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
    if (!text.empty() && text.front() == '+') text.remove_prefix(1);
    auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), out);
    return error == std::errc() && end == text.data() + text.size();
}

// Adds (or removes) one row's x; NULL is skipped.
void sum_row(sqlite3_context* context, sqlite3_value* x, bool adding) {
    switch (sqlite3_value_type(x)) {
        case SQLITE_NULL:
            return;
        case SQLITE_INTEGER: {
            auto& total = aggregate_state<ExactTotal>(context);
            std::int64_t v = sqlite3_value_int64(x);
            adding ? total.add_integer(v) : total.remove_integer(v);
            return;
        }
        case SQLITE_FLOAT: {
            double v = sqlite3_value_double(x);
            if (!std::isfinite(v)) raise_argument_error(kSumX, x, "expected a finite number");
            auto& total = aggregate_state<ExactTotal>(context);
            adding ? total.add_real(v) : total.remove_real(v);
            return;
        }
        case SQLITE_TEXT: {
            const char* raw = reinterpret_cast<const char*>(sqlite3_value_text(x));
            std::string_view text(raw ? raw : "", sqlite3_value_bytes(x));
            std::int64_t whole;
            if (whole_number_text(text, whole)) {
                auto& total = aggregate_state<ExactTotal>(context);
                adding ? total.add_integer(whole) : total.remove_integer(whole);
                return;
            }
            auto number = numeric_text(text);
            if (!number)
                raise_argument_error(
                    kSumX, x,
                    "expected a number; money or quantities written as text must be read "
                    "with to_amount() in the view that maps your table (README: \"Your data\")");
            if (!std::isfinite(*number)) raise_argument_error(kSumX, x, "expected a finite number");
            auto& total = aggregate_state<ExactTotal>(context);
            adding ? total.add_real(*number) : total.remove_real(*number);
            return;
        }
        default:
            raise_argument_error(kSumX, x, "expected a number, not a BLOB");
    }
}

void sum_step(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] { sum_row(context, argv[0], true); });
}

void sum_inverse(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] { sum_row(context, argv[0], false); });
}

void sum_value(sqlite3_context* context) {
    guarded(context, [&] {
        auto* total = existing_state<ExactTotal>(context);
        auto value = total ? total->value() : std::nullopt;
        if (!value) return sqlite3_result_null(context);
        if (value->is_integer) return sqlite3_result_int64(context, value->integer);
        sqlite3_result_double(context, value->real);
    });
}

void sum_final(sqlite3_context* context) {
    sum_value(context);
    take_state<ExactTotal>(context);
}

}  // namespace

int register_export_functions(sqlite3* db) {
    constexpr int kPure = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    return sqlite3_create_window_function(db, "exact_sum", 1, kPure, nullptr, sum_step, sum_final,
                                          sum_value, sum_inverse, nullptr);
}

}  // namespace almanac::sqlite
