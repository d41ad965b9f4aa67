// SPDX-License-Identifier: MIT
// Where zone rules come from: the operating system's zoneinfo when it has
// one (the OS keeps it current), otherwise the data built into almanac. The
// environment variable ALMANAC_ZONE_DATA=built-in forces the built-in data,
// so tests can compare the two on one machine. The choice is made once per
// process, at the first zone looked up.
#pragma once

#include <string>
#include <string_view>

#include "core/time/zone_rules.h"

namespace almanac {

// The rules of the zone with that IANA name, loaded at most once per process
// and shared by every thread (they are never changed after loading); nullptr
// for a name the database does not list. A name is only ever compared with
// the database's list of names, never used as a path.
const ZoneRules* find_zone_rules(std::string_view iana_name);

// The tz release in use and where it came from, such as
// "2025b (/usr/share/zoneinfo)" or "2025b (built in)".
std::string zone_data_description();

}  // namespace almanac
