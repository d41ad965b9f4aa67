// SPDX-License-Identifier: MIT
// Aggregate state as a C++ object: SQLite's aggregate context holds only a
// pointer to it, so any C++ type (with its own destructor) can be a state.
// xFinal, which SQLite also calls when a statement stops early or fails,
// takes the object back and deletes it.
#pragma once

#include <memory>
#include <new>

#include "arguments.h"
#include "core/stats/order_statistics.h"
#include "core/text/error.h"
#include "sqlite_api.h"

namespace almanac::sqlite {

// The group's state, created on first use (xStep).
template <typename State>
State& aggregate_state(sqlite3_context* context) {
    auto** slot = static_cast<State**>(sqlite3_aggregate_context(context, sizeof(State*)));
    if (!slot) throw std::bad_alloc();
    if (!*slot) *slot = new State();
    return **slot;
}

// The group's state if any row created it (xValue, xInverse), else nullptr.
template <typename State>
State* existing_state(sqlite3_context* context) {
    auto** slot = static_cast<State**>(sqlite3_aggregate_context(context, 0));
    return slot ? *slot : nullptr;
}

// Takes ownership of the state away from SQLite (xFinal).
template <typename State>
std::unique_ptr<State> take_state(sqlite3_context* context) {
    auto** slot = static_cast<State**>(sqlite3_aggregate_context(context, 0));
    if (!slot || !*slot) return nullptr;
    std::unique_ptr<State> state(*slot);
    *slot = nullptr;
    return state;
}

// Room for one more row in the frame of an order statistic that holds `held`
// rows, or the function's error past the limit (README "Limits").
inline void ensure_frame_room(const char* function, std::size_t held) {
    try {
        check_frame_room(held);
    } catch (const Error& error) {
        raise_function_error(function, error.what());
    }
}

}  // namespace almanac::sqlite
