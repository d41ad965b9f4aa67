// SPDX-License-Identifier: MIT
// The zone data built into almanac: every zone of the tzdata package on the
// build machine, generated at build time (cmake/embed_zones.cmake) into a
// source file, so a machine without zoneinfo (Windows) still knows every
// IANA zone. Empty when the build was configured with ALMANAC_BUILT_IN_ZONES=OFF.
#pragma once

#include <cstddef>
#include <cstdint>

namespace almanac::built_in_zones {

struct Entry {
    const char* name;     // IANA name; the table is sorted by it
    std::uint32_t begin;  // in `data`: the 64-bit part of the zone's TZif file
    std::uint32_t size;   // (links share their target's bytes)
};

extern const char release[];  // "2025b", or "" when nothing is built in
extern const std::size_t entry_count;
extern const Entry entries[];
extern const unsigned char data[];

}  // namespace almanac::built_in_zones
