// SPDX-License-Identifier: MIT
// What every core harness checks besides the sanitizers: bad input is refused
// with almanac::Error and nothing else. Any other exception (std::out_of_range
// from a stray .at(), std::length_error, ...) would surface in SQL as the
// catch-all "unexpected internal error" instead of a message a user can act on.
#pragma once

#include <cstdio>
#include <cstdlib>
#include <exception>

#include "core/text/error.h"

namespace almanac::fuzz {

template <typename Body>
void refusal_only(Body&& body) {
    try {
        body();
    } catch (const almanac::Error&) {
        // the documented refusal
    } catch (const std::exception& other) {
        std::fprintf(stderr, "not an almanac::Error: %s\n", other.what());
        std::abort();
    }
}

// A harness's own check failed: stop so libFuzzer keeps the input.
[[noreturn]] inline void fail(const char* what) {
    std::fprintf(stderr, "harness check failed: %s\n", what);
    std::abort();
}

}  // namespace almanac::fuzz
