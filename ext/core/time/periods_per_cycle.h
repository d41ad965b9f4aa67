// SPDX-License-Identifier: MIT
// How many `spec` periods a `cycle` holds, as a seasonal method needs one
// number for it: the ratio of their mean lengths, rounded. A day counts 24
// hours and a year 365.2425 days (the Gregorian mean); half-months, months
// and quarters are 1/24, 1/12 and 1/4 of it. So day/week is 7, hour/day 24,
// hour/week 168, day/year 365, week/year 52, half-month/year 24, month/year
// 12, quarter/year 4, month/quarter 3 — the season lengths analysts use,
// although a local day with a daylight-saving change has 23 or 25 hours and
// some years have 53 weeks.
#pragma once

#include <cstdint>

#include "core/time/period_spec.h"

namespace almanac {

// The spec and cycle are assumed to nest (PeriodPosition checks that).
std::int64_t periods_per_cycle(const PeriodSpec& spec, const PeriodSpec& cycle);

}  // namespace almanac
