// SPDX-License-Identifier: MIT
// Names of tables, columns and databases as SQL sees them: quoted as an
// identifier when put into a statement (so a name is never read as SQL), and
// compared as SQLite compares them (ASCII letters without case).
#pragma once

#include <string>

#include "core/text/ascii.h"

namespace almanac::sqlite {

inline std::string quote_identifier(const std::string& name) {
    std::string quoted = "\"";
    for (char c : name) {
        if (c == '"') quoted += '"';
        quoted += c;
    }
    return quoted + "\"";
}

inline bool same_identifier(const std::string& a, const std::string& b) {
    if (a.size() != b.size()) return false;
    for (std::size_t i = 0; i < a.size(); ++i) {
        if (to_ascii_lower(a[i]) != to_ascii_lower(b[i])) return false;
    }
    return true;
}

}  // namespace almanac::sqlite
