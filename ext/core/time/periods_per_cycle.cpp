// SPDX-License-Identifier: MIT
#include "core/time/periods_per_cycle.h"

#include <cmath>

namespace almanac {
namespace {

constexpr double kDaySeconds = 86400.0;
constexpr double kYearSeconds = 365.2425 * kDaySeconds;

double mean_seconds(const PeriodSpec& spec) {
    switch (spec.unit) {
        case PeriodUnit::HalfMonth:
            return kYearSeconds / 24.0;
        case PeriodUnit::Month:
        case PeriodUnit::Quarter:
        case PeriodUnit::Year:
            return kYearSeconds / 12.0 * static_cast<double>(spec.months());
        default:
            // Second to week: a day counts 24 hours.
            return static_cast<double>(spec.fixed_length().count()) / 1000.0;
    }
}

}  // namespace

std::int64_t periods_per_cycle(const PeriodSpec& spec, const PeriodSpec& cycle) {
    return static_cast<std::int64_t>(std::llround(mean_seconds(cycle) / mean_seconds(spec)));
}

}  // namespace almanac
