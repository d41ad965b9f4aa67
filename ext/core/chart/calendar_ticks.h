// SPDX-License-Identifier: MIT
// Ticks for a time axis, placed on calendar boundaries in UTC (the time
// values a chart reads are instants or UTC calendar days): minutes and hours
// for short spans, then days, weeks (ISO, Monday), months, quarters, years
// and round multiples of years, whichever is the finest that still leaves
// room for every label.
#pragma once

#include "core/chart/axis_ticks.h"
#include "core/time/time_value.h"

namespace almanac {

// The axis runs exactly from low to high (milliseconds since 1970 as doubles
// in the result, like the chart's x values). At most max_ticks ticks.
// Labels read as people write dates: "14:00" / "5 Mar" / "Mar" / "Q2" /
// "2025", with the year (or, for hours, the day) as a second line at the
// first tick and wherever it changes.
// With whole_days (every value is a midnight, as dates are) no tick falls
// between two days: hour ticks would suggest readings the data has not got.
AxisScale calendar_scale(Instant low, Instant high, int max_ticks, bool whole_days = false);

}  // namespace almanac
