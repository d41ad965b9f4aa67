// SPDX-License-Identifier: MIT
// The fixed-place shortcut for the common time texts (parse_time_text,
// common_form_day) and the day-number shortcut of the period keys
// (PeriodCalendar::utc_period_start_day / utc_period_serial_of_day) against
// the general paths they stand in for. The general reader is itself compared
// with Python's datetime (tests/sql/test_time_values*.py); here the reference
// is the date library's civil calendar and that reader.
#include <catch2/catch.hpp>
#include <random>
#include <string>
#include <vector>

#include "core/text/error.h"
#include "core/time/common_form.h"
#include "core/time/period_calendar.h"
#include "core/time/period_spec.h"
#include "core/time/time_value.h"

using namespace almanac;

namespace {

std::string two(unsigned v) { return std::string{char('0' + v / 10 % 10), char('0' + v % 10)}; }

// Texts near the common forms: fields just inside and just outside their
// ranges, both separators and some that are not, then random bytes put in.
std::string near_common_text(std::mt19937_64& random) {
    auto pick = [&](unsigned low, unsigned high) {
        return unsigned(std::uniform_int_distribution<unsigned>(low, high)(random));
    };
    unsigned year = pick(0, 9999);
    std::string text = std::string{char('0' + year / 1000), char('0' + year / 100 % 10)} +
                       two(year % 100) + "-" + two(pick(0, 13)) + "-" + two(pick(0, 32));
    unsigned shape = pick(0, 2);
    if (shape > 0) {
        const char separators[] = {' ', 'T', 't', '_'};
        text += separators[pick(0, 3) == 3 ? pick(0, 3) : pick(0, 1)];
        text += two(pick(0, 25)) + ":" + two(pick(0, 61));
        if (shape == 2) text += ":" + two(pick(0, 61));
    }
    if (pick(0, 3) == 0) {
        const char bytes[] = {
            '0',        '9',        '-', ':', ' ', 'T',           '/',           '\0',
            char(0xFA), char(0xFF), '+', 'Z', '.', char('0' - 1), char('9' + 1), char(0x36 + 0xC0)};
        text[pick(0, unsigned(text.size()) - 1)] = bytes[pick(0, sizeof bytes - 1)];
    }
    return text;
}

bool same_value(const TimeValue& a, const TimeValue& b) {
    return a.when == b.when && a.representation == b.representation &&
           a.integer_input == b.integer_input && a.form.precision == b.form.precision &&
           a.form.t_separator == b.form.t_separator && a.form.suffix == b.form.suffix &&
           a.form.offset == b.form.offset;
}

}  // namespace

TEST_CASE("the shortcut reads every text exactly as the general reader does") {
    std::mt19937_64 random(20261202);
    int accepted = 0, refused = 0;
    for (int i = 0; i < 400000; ++i) {
        std::string text = near_common_text(random);
        INFO(text);
        std::string shortcut_error, full_error;
        TimeValue shortcut, full;
        try {
            shortcut = parse_time_text(text);
        } catch (const Error& error) {
            shortcut_error = error.what();
        }
        try {
            full = parse_time_text_in_full(text);
        } catch (const Error& error) {
            full_error = error.what();
        }
        REQUIRE(shortcut_error == full_error);
        if (full_error.empty()) {
            REQUIRE(same_value(shortcut, full));
            ++accepted;
        } else {
            ++refused;
        }
        // common_form_day gives the (UTC) day of exactly the texts it takes.
        if (auto day = common_form_day(text)) {
            REQUIRE(full_error.empty());
            REQUIRE(*day == date::floor<date::days>(full.is_calendar_day()
                                                        ? full.day()
                                                        : date::local_days{date::floor<date::days>(
                                                              full.instant().time_since_epoch())}));
        }
    }
    // Both kinds were really tried.
    CHECK(accepted > 100000);
    CHECK(refused > 100000);
}

TEST_CASE("the common forms' days agree with the date library's calendar") {
    // Every day of years 0000-9999 written as YYYY-MM-DD; reference: date::year_month_day.
    date::local_days first{date::year{0} / 1 / 1}, last{date::year{9999} / 12 / 31};
    for (auto day = first; day <= last; day += date::days{1}) {
        date::year_month_day ymd{day};
        std::string text = std::string{char('0' + int(ymd.year()) / 1000),
                                       char('0' + int(ymd.year()) / 100 % 10)} +
                           two(unsigned(int(ymd.year()) % 100)) + "-" + two(unsigned(ymd.month())) +
                           "-" + two(unsigned(ymd.day()));
        auto read = common_form_day(text + " 23:59:59");
        REQUIRE(read);
        REQUIRE(*read == day);
    }
}

TEST_CASE("period starts and serials by day number equal the general path's") {
    const char* specs[] = {"day",
                           "week",
                           "week starting sunday",
                           "2 weeks from 2025-12-29",
                           "10 days from 2026-01-03",
                           "month",
                           "half-month",
                           "quarter",
                           "quarter starting april",
                           "year",
                           "3 months from 2025-11-15",
                           "year starting july",
                           "retail week ending saturday nearest end of january",
                           "retail month 5-4-4 ending last sunday of march",
                           "retail quarter ending friday nearest end of december",
                           "retail year ending last saturday of january"};
    std::mt19937_64 random(7);
    std::uniform_int_distribution<std::int64_t> any_day(-719528,
                                                        2932896);  // 0000-01-01..9999-12-31
    for (const char* spec : specs) {
        INFO(spec);
        PeriodCalendar calendar(parse_period_spec(spec), ZoneClock::utc());
        for (int i = 0; i < 20000; ++i) {
            date::local_days day{date::days{i < 10 ? -719528 + i : any_day(random)}};
            Instant midnight{day.time_since_epoch()};
            auto serial = calendar.utc_period_serial_of_day(day);
            REQUIRE(serial);
            REQUIRE(*serial == calendar.period_of(midnight).serial);
            REQUIRE(*serial == calendar.period_of(midnight + std::chrono::hours{23}).serial);
            auto start = calendar.utc_period_start_day(day);
            Instant general = calendar.period_of(midnight).start;
            if (!in_supported_range(general)) {
                REQUIRE_FALSE(start);  // the general path gives the error
            } else {
                REQUIRE(start);
                REQUIRE(Instant{start->time_since_epoch()} == general);
            }
        }
    }
    // Zoned calendars, sub-day units and `from` with a time of day take the general path.
    CHECK_FALSE(PeriodCalendar(parse_period_spec("week"), ZoneClock::named("America/Denver"))
                    .utc_period_start_day(date::local_days{}));
    CHECK_FALSE(PeriodCalendar(parse_period_spec("hour"), ZoneClock::utc())
                    .utc_period_serial_of_day(date::local_days{}));
    CHECK_FALSE(PeriodCalendar(parse_period_spec("day from 2026-01-01 06:00"), ZoneClock::utc())
                    .utc_period_start_day(date::local_days{}));
}

TEST_CASE("a zoned period's serial by one offset look-up equals period_of's") {
    // Zones with the hard cases: a day repeated (Alaska's switch of 1867), a
    // day skipped (Samoa, 2011-12-30), half-hour changes (Lord Howe),
    // midnight changes (Santiago, Havana), and an ordinary one (Denver).
    // Reference: period_of, the general path, itself compared with Python's
    // zoneinfo in tests/sql/.
    const char* zones[] = {"America/Juneau",      "America/Sitka",    "Pacific/Apia",
                           "Australia/Lord_Howe", "America/Santiago", "America/Havana",
                           "America/Denver",      "Asia/Kolkata"};
    const char* specs[] = {"day",
                           "week",
                           "month",
                           "half-month",
                           "quarter starting april",
                           "2 days",
                           "retail month ending saturday nearest end of january",
                           "retail week ending last sunday of october"};
    std::mt19937_64 random(11);
    // 1860-2040 by random instants, plus every hour around each change.
    std::uniform_int_distribution<std::int64_t> any_second(-3471292800LL, 2209075200LL);
    for (const char* zone : zones) {
        ZoneClock clock = ZoneClock::named(zone);
        for (const char* spec : specs) {
            INFO(zone << " " << spec);
            PeriodCalendar calendar(parse_period_spec(spec), clock);
            std::vector<Instant> instants;
            for (int i = 0; i < 3000; ++i)
                instants.push_back(Instant{std::chrono::seconds{any_second(random)}});
            Instant t{std::chrono::seconds{-3471292800LL}};
            for (int changes = 0; changes < 400; ++changes) {
                ZoneClock::Regime regime = clock.regime_at(t);
                if (regime.end > Instant{std::chrono::seconds{2209075200LL}}) break;
                for (int h = -30; h <= 30; ++h)
                    instants.push_back(regime.end + std::chrono::minutes{h * 60 + 7 * (h % 3)});
                t = regime.end;
            }
            for (Instant instant : instants) {
                REQUIRE(calendar.serial_of(instant) == calendar.period_of(instant).serial);
            }
        }
    }
}
