// SPDX-License-Identifier: MIT
// The options of a seasonal decomposition, read from JSON:
// {"seasonal": odd ≥ 7, "robust": true|false}; either may be left out (or
// null) for its default. Strict: another key, a wrong type, an even or
// shorter seasonal span, or text that is not one JSON object is an error
// saying what was expected.
#pragma once

#include <cstddef>
#include <optional>
#include <string_view>

namespace almanac {

struct DecompositionOptions {
    std::size_t seasonal = 7;    // the cycle-subseries smoother's span, in cycles
    std::optional<bool> robust;  // absent: robust from four whole cycles on
};

// Throws almanac::Error.
DecompositionOptions parse_decomposition_options(std::string_view json);

}  // namespace almanac
