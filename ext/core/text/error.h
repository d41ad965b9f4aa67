// SPDX-License-Identifier: MIT
// The one error type the core throws. Its message says what was expected, in
// words a user can act on; the SQLite binding prefixes the function, the
// argument and the offending value, so the core never needs to know them.
#pragma once

#include <stdexcept>
#include <string>

namespace almanac {

class Error : public std::runtime_error {
  public:
    explicit Error(const std::string& what_was_expected) : std::runtime_error(what_was_expected) {}
};

}  // namespace almanac
