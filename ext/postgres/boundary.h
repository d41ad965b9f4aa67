// SPDX-License-Identifier: MIT
// The boundary between PostgreSQL's C frames and almanac's C++ ones.
//
// Two kinds of non-local exit must never meet a frame of the other kind: a
// C++ exception must not unwind through PostgreSQL, and a PostgreSQL error
// (ereport, a longjmp) must not jump over a C++ frame whose objects still
// need their destructors. So every entry point has the same three steps:
//   1. C part: read the arguments (detoasting may palloc and may raise), with
//      only plain values on its frame;
//   2. C++ part, inside guarded(): no PostgreSQL call that can raise; any
//      exception is caught there and kept in a static failure record;
//   3. C part again: make the result (palloc) or raise the kept failure with
//      report_failure(), after every C++ frame has returned.
// Results that need PostgreSQL memory (text) are handed over in
// result_text(), static storage that a longjmp cannot skip a destructor of.
#pragma once

#include <cstddef>
#include <cstdint>
#include <exception>
#include <new>
#include <stdexcept>
#include <string>

#include "postgres_api.h"

namespace almanac::postgres {

// An error with its SQLSTATE (MAKE_SQLSTATE codes, e.g. ERRCODE_INVALID_PARAMETER_VALUE).
class PgError : public std::runtime_error {
  public:
    PgError(int sqlstate, const std::string& message)
        : std::runtime_error(message), sqlstate_(sqlstate) {}
    int sqlstate() const { return sqlstate_; }

  private:
    int sqlstate_;
};

// Keeps the failure for report_failure(). Never allocates or throws: the
// message is cut to a fixed buffer at a character boundary.
void keep_failure(int sqlstate, const char* message) noexcept;
// Raises the kept failure as a PostgreSQL ERROR. Call only from a C part.
[[noreturn]] void report_failure();

// The text result of the last C++ part, for the C part to copy into a text datum.
std::string& result_text();

// Runs a C++ part; false when it failed (the failure is kept).
template <typename Body>
bool guarded(Body&& body) noexcept {
    try {
        body();
        return true;
    } catch (const PgError& error) {
        keep_failure(error.sqlstate(), error.what());
    } catch (const std::bad_alloc&) {
        keep_failure(ERRCODE_OUT_OF_MEMORY, "out of memory");
    } catch (const std::exception& error) {
        keep_failure(ERRCODE_INTERNAL_ERROR, error.what());
    } catch (...) {
        keep_failure(ERRCODE_INTERNAL_ERROR, "almanac: unexpected internal error");
    }
    return false;
}

// A C++ object living in a PostgreSQL memory context: its storage is
// palloc'd there and its destructor runs when the context is reset or
// deleted (MemoryContextRegisterResetCallback). Returns nullptr after
// keeping the failure when the constructor throws. Call from a C part: the
// allocation may raise, and no C++ object is alive on this frame then.
template <typename T>
struct ContextObject {
    MemoryContextCallback callback;
    alignas(T) unsigned char storage[sizeof(T)];

    static void destroy(void* arg) {
        auto* self = static_cast<ContextObject*>(arg);
        reinterpret_cast<T*>(self->storage)->~T();
    }
};

template <typename T, typename Make>
T* make_in_context(MemoryContext context, Make&& make) {
    // palloc aligns to 8 bytes; a state holding 128-bit integers needs 16.
    constexpr std::size_t kAlign = alignof(ContextObject<T>);
    auto raw = reinterpret_cast<std::uintptr_t>(
        MemoryContextAlloc(context, sizeof(ContextObject<T>) + kAlign));
    auto* holder = reinterpret_cast<ContextObject<T>*>((raw + kAlign - 1) / kAlign * kAlign);
    T* object = nullptr;
    if (!guarded([&] { object = make(static_cast<void*>(holder->storage)); })) return nullptr;
    holder->callback.func = &ContextObject<T>::destroy;
    holder->callback.arg = holder;
    MemoryContextRegisterResetCallback(context, &holder->callback);
    return object;
}

template <typename T>
T* new_in_context(MemoryContext context) {
    return make_in_context<T>(context, [](void* storage) { return new (storage) T(); });
}

}  // namespace almanac::postgres

// Declares a SQL-callable C function: exported, C linkage, version-1 calling convention.
#define ALMANAC_PG_FUNCTION(name) \
    extern "C" {                  \
    PG_FUNCTION_INFO_V1(name);    \
    }                             \
    extern "C" PGDLLEXPORT Datum name(PG_FUNCTION_ARGS)
