// SPDX-License-Identifier: MIT
#include "core/text/number_text.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

using namespace almanac;

TEST_CASE("decimal text reads as the correctly rounded double") {
    // Exact decimal values, from memory: 12.5 = 25/2, 0.1 is the double nearest 1/10.
    CHECK(parse_decimal("12.5") == 12.5);
    CHECK(parse_decimal("+12.5") == 12.5);
    CHECK(parse_decimal("-0.1") == -0.1);
    CHECK(parse_decimal(".5") == 0.5);
    CHECK(parse_decimal("5.") == 5.0);
    CHECK(parse_decimal("1e3") == 1000.0);
    CHECK(parse_decimal("1E-3") == 0.001);
    CHECK(parse_decimal("2.5e+2") == 250.0);
    // IEEE 754 binary64 limits (from memory): smallest subnormal 4.9406564584124654e-324.
    CHECK(parse_decimal("5e-324") == std::numeric_limits<double>::denorm_min());
    CHECK(parse_decimal("1.7976931348623157e308") == std::numeric_limits<double>::max());
}

TEST_CASE("decimal text beyond a double's range is infinite, below it zero, as strtod gives") {
    // C11 7.22.1.3 (strtod): overflow gives HUGE_VAL, underflow a value no larger than
    // the smallest normal; SQLite reads '1e999' as Inf (common practice).
    CHECK(parse_decimal("1e999") == std::numeric_limits<double>::infinity());
    CHECK(parse_decimal("-1e999") == -std::numeric_limits<double>::infinity());
    CHECK(parse_decimal("123456789e400") == std::numeric_limits<double>::infinity());
    CHECK(parse_decimal("1e-999") == 0.0);
    CHECK(std::signbit(*parse_decimal("-1e-999")));
    CHECK(parse_decimal("0.000001e-400") == 0.0);
    CHECK(parse_decimal("0e999") == 0.0);
}

TEST_CASE("only SQLite's shape of a decimal number is a number") {
    for (const char* text : {"", "+", "-", ".", "e5", "1e", "1e+", "1,5", "1.2.3", "0x10", "inf",
                             "nan", "12 ", " 12", "--1", "+-1", "1e5.5"}) {
        INFO(text);
        CHECK_FALSE(parse_decimal(text));
    }
}

TEST_CASE("numeric TEXT may have ASCII white space around it, nothing else") {
    CHECK(numeric_text(" 12.5 ") == 12.5);
    CHECK(numeric_text("\t\n12\r\v\f") == 12.0);
    CHECK_FALSE(numeric_text("1,234.50"));
    CHECK_FALSE(
        numeric_text("\xC2\xA0"
                     "12"));  // a no-break space is not ASCII white space
    CHECK_FALSE(numeric_text("   "));
}

TEST_CASE("whole numbers read within int64 and refuse the rest") {
    // int64 limits: -2^63 and 2^63 - 1 (from memory, confirmed by numeric_limits).
    CHECK(parse_int64("0") == 0);
    CHECK(parse_int64("-0") == 0);
    CHECK(parse_int64("+42") == 42);
    CHECK(parse_int64("-42") == -42);
    CHECK(parse_int64("007") == 7);
    CHECK(parse_int64("9223372036854775807") == std::numeric_limits<std::int64_t>::max());
    CHECK(parse_int64("-9223372036854775808") == std::numeric_limits<std::int64_t>::min());
    for (const char* text :
         {"9223372036854775808", "-9223372036854775809", "99999999999999999999", "", "+", "-",
          "+-1", "-+1", "++1", "1.0", "1e3", " 1", "1 ", "0x1F", "12a"}) {
        INFO(text);
        CHECK_FALSE(parse_int64(text));
    }
}

TEST_CASE("messages show a double as typed, in printf's %g layout") {
    // Expected texts: printf("%.15g") / ("%.17g") under the C locale (from memory).
    CHECK(readable_double(0.9) == "0.9");
    CHECK(readable_double(100.0) == "100");
    CHECK(readable_double(1e300) == "1e+300");
    CHECK(readable_double(-2.5) == "-2.5");
    CHECK(readable_double(0.1 + 0.2) == "0.30000000000000004");
    CHECK(readable_double(1e15) == "1e+15");
    CHECK(readable_double(1234567890123456.0) == "1234567890123456");
    CHECK(readable_double(std::numeric_limits<double>::infinity()) == "inf");
    CHECK(readable_double(-std::numeric_limits<double>::infinity()) == "-inf");
}

TEST_CASE("shortest form is laid out as Python's repr") {
    // Expected texts: Python 3 repr(float) (from memory; the 100,000-value check
    // against Python itself is tests/reference/test_shortest_double.py).
    CHECK(shortest_double(100.0) == "100.0");
    CHECK(shortest_double(0.0001) == "0.0001");
    CHECK(shortest_double(0.00001) == "1e-05");
    CHECK(shortest_double(1e15) == "1000000000000000.0");
    CHECK(shortest_double(1e16) == "1e+16");
    CHECK(shortest_double(-0.0) == "-0.0");
    CHECK(shortest_double(0.1 + 0.2) == "0.30000000000000004");
    CHECK(shortest_double(5e-324) == "5e-324");
    CHECK(shortest_double(1.5e300) == "1.5e+300");
    CHECK(shortest_double(std::nan("")) == "nan");
}

TEST_CASE("fixed and general layouts match printf's %.*f and %.*g") {
    // Expected texts: printf under the C locale (from memory).
    CHECK(fixed_double(41.6, 2) == "41.60");
    CHECK(fixed_double(2.5, 0) == "2");  // round half to even, as glibc's printf
    CHECK(fixed_double(-0.004, 2) == "-0.00");
    CHECK(general_double(123456.0, 3) == "1.23e+05");
    CHECK(general_double(0.5, 17) == "0.5");
}

TEST_CASE("padded digits are exactly as wide as asked") {
    CHECK(padded(7, 2) == "07");
    CHECK(padded(2026, 4) == "2026");
    CHECK(padded(5, 3) == "005");
    CHECK(padded(0, 1) == "0");
}
