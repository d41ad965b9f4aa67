// SPDX-License-Identifier: MIT
// Aggregate states as C++ objects in PostgreSQL's aggregate memory context.
//
// A state is made on the group's first row in the context AggCheckCallContext
// names, and destroyed by a reset callback of that context (boundary.h), so
// a query that ends, fails or is cancelled frees it like any palloc'd state.
// Each state type S has a StateTraits<S> specialisation with
//   static constexpr std::uint8_t kTag;             // its tag in the byte form
//   static void merge(S& into, const S& from);      // COMBINEFUNC: exact merges
//   static void write(ByteWriter&, const S&);       // SERIALFUNC
//   static void read(ByteReader&, S&);              // DESERIALFUNC
// and the byte form starts with the format version and the state's tag
// (ext/postgres/README.md, "State byte formats").
#pragma once

#include <cstdint>
#include <cstring>
#include <optional>
#include <string_view>

#include "arguments.h"
#include "boundary.h"
#include "core/exact/state_bytes.h"
#include "core/text/error.h"

namespace almanac::postgres {

// The first byte of every serialised state; a reader refuses any other.
constexpr std::uint8_t kStateFormatVersion = 1;

template <typename State>
struct StateTraits;

// Whether a row enters the state (SFUNC, MSFUNC) or leaves it (MINVFUNC).
enum class Direction { Add, Remove };

// C part: the aggregate's memory context; raises if called outside an aggregate.
MemoryContext aggregate_context(FunctionCallInfo fcinfo, const char* function);

// C part: the state argument at `index`, or nullptr for SQL NULL.
template <typename State>
State* state_argument(FunctionCallInfo fcinfo, int index = 0) {
    return PG_ARGISNULL(index) ? nullptr : reinterpret_cast<State*>(PG_GETARG_POINTER(index));
}

// C part: the group's state, made in the aggregate context on first use.
template <typename State>
State* state_for_row(FunctionCallInfo fcinfo, const char* function) {
    if (State* state = state_argument<State>(fcinfo)) return state;
    State* state = new_in_context<State>(aggregate_context(fcinfo, function));
    if (!state) report_failure();
    return state;
}

// FINALFUNC of a double precision result: compute(const State&) gives an
// optional double; NULL for a group without a state or without a value.
template <typename State, typename Compute>
Datum optional_double_final(FunctionCallInfo fcinfo, Compute&& compute) {
    const State* state = state_argument<State>(fcinfo);
    std::optional<double> value;
    if (state && !guarded([&] { value = compute(*state); })) report_failure();
    if (!value) PG_RETURN_NULL();
    PG_RETURN_FLOAT8(*value);
}

// COMBINEFUNC(internal, internal): the first state with the second merged in
// (which is copied, never moved: it may be another node's live state).
template <typename State>
Datum combine_states(FunctionCallInfo fcinfo, const char* function) {
    State* from = state_argument<State>(fcinfo, 1);
    State* into = state_argument<State>(fcinfo, 0);
    if (!from) {
        if (!into) PG_RETURN_NULL();
        PG_RETURN_POINTER(into);
    }
    if (!into) into = state_for_row<State>(fcinfo, function);
    if (!guarded([&] { StateTraits<State>::merge(*into, *from); })) report_failure();
    PG_RETURN_POINTER(into);
}

// SERIALFUNC(internal) -> bytea.
template <typename State>
Datum serialize_state(FunctionCallInfo fcinfo) {
    State* state = state_argument<State>(fcinfo);
    bool ok = guarded([&] {
        ByteWriter out;
        out.u8(kStateFormatVersion);
        out.u8(StateTraits<State>::kTag);
        StateTraits<State>::write(out, *state);
        result_text() = out.bytes();
    });
    if (!ok) report_failure();
    const std::string& bytes = result_text();
    bytea* result = static_cast<bytea*>(palloc(bytes.size() + VARHDRSZ));
    SET_VARSIZE(result, bytes.size() + VARHDRSZ);
    std::memcpy(VARDATA(result), bytes.data(), bytes.size());
    PG_RETURN_BYTEA_P(result);
}

// Checks the version and tag, then reads the rest into state.
void read_state_header(ByteReader& in, std::uint8_t tag, const char* function);

// DESERIALFUNC(bytea, internal) -> internal, made in the current memory
// context (the caller's per-tuple context; COMBINEFUNC copies from it).
template <typename State>
Datum deserialize_state(FunctionCallInfo fcinfo, const char* function) {
    bytea* bytes = PG_GETARG_BYTEA_PP(0);
    std::string_view view(VARDATA_ANY(bytes), VARSIZE_ANY_EXHDR(bytes));
    State* state = new_in_context<State>(CurrentMemoryContext);
    if (!state) report_failure();
    bool ok = guarded([&] {
        ByteReader in(view);
        read_state_header(in, StateTraits<State>::kTag, function);
        try {
            StateTraits<State>::read(in, *state);
            in.expect_end();
        } catch (const Error& error) {
            raise_function_error(function, error.what(), ERRCODE_DATA_CORRUPTED);
        }
    });
    if (!ok) report_failure();
    PG_RETURN_POINTER(state);
}

}  // namespace almanac::postgres
