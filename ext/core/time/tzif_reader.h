// SPDX-License-Identifier: MIT
// Reads the Time Zone Information Format (TZif, RFC 8536): the files of the
// operating system's zoneinfo and the zone data built into almanac. Only the
// offsets from UTC are kept; abbreviations and leap seconds are not needed.
#pragma once

#include <string_view>

#include "core/time/zone_rules.h"

namespace almanac {

// A whole TZif file of any version (1 to 4). Throws Error when it is not one.
ZoneRules read_tzif_file(std::string_view bytes);

// The part of a version 2+ file from its second header on (64-bit data and
// footer): what the build stores for each built-in zone, since a reader of
// version 2 skips the 32-bit block anyway.
ZoneRules read_tzif_64bit_part(std::string_view bytes);

// The length of a file's first (32-bit) header and data block, so the build
// and tests can cut a file into its two parts.
std::size_t tzif_first_part_size(std::string_view bytes);

}  // namespace almanac
