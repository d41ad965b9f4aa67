// SPDX-License-Identifier: MIT
// The x value of a chart or sparkline: a plain number, or a time value
// (TEXT that is not a number) read as an instant; a bar chart also takes
// categories (other TEXT). One chart takes one kind.
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "core/time/time_value.h"
#include "core/time/zone_clock.h"

namespace almanac {

enum class AxisKind { Number, Time, Category };

// A time value on the x axis: milliseconds since 1970-01-01 UTC, as a double
// (exact: every supported instant is below 2^53 ms). A calendar day counts
// from its UTC midnight, as a bare date without a zone reads (README "Time values").
double time_axis_value(const TimeValue& value);
// The same on a zone's wall clock: an instant is placed at its local reading
// (as if that reading were UTC), a calendar day at its midnight, so that a
// UTC calendar axis over these values is the zone's local calendar.
double time_axis_value(const TimeValue& value, const ZoneClock& zone);
Instant instant_from_axis_value(double value);

// TEXT that begins like YYYY-MM-DD: meant as a date, so a bar chart reports
// it when it does not read as one rather than taking it for a category.
bool looks_like_a_date(std::string_view text);

const char* describe_axis_kind(AxisKind kind);

// An x value read from TEXT, as every binding reads it: a number when the
// whole text is one; for a bar chart (categories), a category when it is
// neither a number nor a time value and does not begin like a date; else a
// time value, on the zone's wall clock when one is given. Throws Error
// saying what was expected (for a time value that does not read, with the
// hint that period labels do not order a chart's rows).
struct AxisValue {
    AxisKind kind;
    double value;  // 0 for a category (the caller keeps its text)
};
AxisValue axis_value_of_text(std::string_view text, const ZoneClock* zone,
                             bool categories);  // "a number", "a time value", "a category"

// Remembers the kind of the first x value and refuses the other kind later:
// a chart cannot put numbers and dates on one axis.
class AxisKindGuard {
  public:
    // Throws almanac::Error saying what was expected.
    void accept(AxisKind kind);
    std::optional<AxisKind> kind() const { return kind_; }

  private:
    std::optional<AxisKind> kind_;
};

}  // namespace almanac
