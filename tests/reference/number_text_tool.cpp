// SPDX-License-Identifier: MIT
// Serves tests/reference/test_number_text.py: reads doubles as 16 hex digits
// of their bits, one a line, and writes for each, tab-separated:
//   shortest_double(v)  readable_double(v)  fixed_double(v, 2)
//   the bits parse_decimal reads back from shortest_double(v)
// so Python can compare them with repr(), '%.15g'..'%.17g' and '%.2f'.
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <string>

#include "core/text/number_text.h"

namespace {
std::string hex(std::uint64_t bits) {
    static const char digits[] = "0123456789abcdef";
    std::string out(16, '0');
    for (int i = 15; i >= 0; --i, bits >>= 4) out[std::size_t(i)] = digits[bits & 0xF];
    return out;
}
}  // namespace

int main() {
    char line[64];
    std::string out;
    while (std::fgets(line, sizeof line, stdin)) {
        std::uint64_t bits = 0;
        for (const char* c = line; *c && *c != '\n'; ++c)
            bits = bits * 16 + std::uint64_t(*c <= '9' ? *c - '0' : *c - 'a' + 10);
        double value;
        std::memcpy(&value, &bits, sizeof value);
        std::string shortest = almanac::shortest_double(value);
        auto back = almanac::parse_decimal(shortest);
        std::uint64_t back_bits = 0;
        if (back) std::memcpy(&back_bits, &*back, sizeof back_bits);
        out = shortest + "\t" + almanac::readable_double(value) + "\t" +
              almanac::fixed_double(value, 2) + "\t" + (back ? hex(back_bits) : "none") + "\n";
        std::fputs(out.c_str(), stdout);
    }
    return 0;
}
