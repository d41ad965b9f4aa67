// SPDX-License-Identifier: MIT
#include "core/time/posix_tz_rule.h"

#include <algorithm>
#include <array>
#include <string>

#include "core/text/error.h"
#include "core/time/civil_days.h"

namespace almanac {
namespace {

constexpr std::int64_t kDay = 86400;

bool is_letter(char c) { return (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z'); }
bool is_digit(char c) { return c >= '0' && c <= '9'; }

// A cursor over the TZ string; every reader either consumes what it expects
// or throws, so a malformed footer can never be half-read.
class Cursor {
  public:
    explicit Cursor(std::string_view text) : text_(text) {}

    bool at_end() const { return pos_ == text_.size(); }
    bool peek(char c) const { return pos_ < text_.size() && text_[pos_] == c; }
    bool take(char c) {
        if (!peek(c)) return false;
        ++pos_;
        return true;
    }
    bool starts_name() const {
        return pos_ < text_.size() && (text_[pos_] == '<' || is_letter(text_[pos_]));
    }

    // "<...>" (letters, digits, '+', '-') or at least three letters.
    void name() {
        if (take('<')) {
            std::size_t start = pos_;
            while (pos_ < text_.size() && text_[pos_] != '>') {
                char c = text_[pos_];
                if (!is_letter(c) && !is_digit(c) && c != '+' && c != '-')
                    fail("a zone abbreviation");
                ++pos_;
            }
            if (pos_ - start < 3 || !take('>'))
                fail("a zone abbreviation of three or more characters");
            return;
        }
        std::size_t start = pos_;
        while (pos_ < text_.size() && is_letter(text_[pos_])) ++pos_;
        if (pos_ - start < 3) fail("a zone abbreviation of three or more letters");
    }

    // [+-]hh[:mm[:ss]], in seconds; hours up to max_hours.
    std::int32_t signed_time(int max_hours) {
        int sign = 1;
        if (take('-')) {
            sign = -1;
        } else {
            take('+');
        }
        std::int32_t seconds = number(0, max_hours) * 3600;
        if (take(':')) {
            seconds += number(0, 59) * 60;
            if (take(':')) seconds += number(0, 59);
        }
        return sign * seconds;
    }

    int number(int low, int high) {
        if (pos_ >= text_.size() || !is_digit(text_[pos_])) fail("a number");
        int value = 0;
        int digits = 0;
        while (pos_ < text_.size() && is_digit(text_[pos_])) {
            value = value * 10 + (text_[pos_] - '0');
            if (++digits > 3) fail("a number of at most three digits");
            ++pos_;
        }
        if (value < low || value > high) fail("a number in range");
        return value;
    }

    [[noreturn]] void fail(const char* expected) const {
        throw Error("zone rule '" + std::string(text_) + "' at character " +
                    std::to_string(pos_ + 1) + ": expected " + expected);
    }

  private:
    std::string_view text_;
    std::size_t pos_ = 0;
};

}  // namespace

std::int64_t PosixTzRule::ChangeDate::local_day_seconds(int year) const {
    std::int64_t january_first = day_number_from_civil(year, 1, 1);
    std::int64_t day_number = 0;
    switch (kind) {
        case Kind::JulianNoLeap:
            // Jn counts 1-365 and never names February 29.
            day_number = january_first + day - 1 + (is_leap_year(year) && day >= 60 ? 1 : 0);
            break;
        case Kind::ZeroBasedDay:
            day_number = january_first + day;
            break;
        case Kind::MonthWeekDay: {
            std::int64_t first = day_number_from_civil(year, unsigned(month), 1);
            std::int64_t next = month == 12 ? day_number_from_civil(year + 1, 1, 1)
                                            : day_number_from_civil(year, unsigned(month + 1), 1);
            // 1970-01-01 was a Thursday (weekday 4, Sunday being 0).
            int first_weekday = int(((first + 4) % 7 + 7) % 7);
            day_number = first + (day - first_weekday + 7) % 7 + 7 * (week - 1);
            while (day_number >= next) day_number -= 7;  // week 5 means the last one
            break;
        }
    }
    return day_number * kDay;
}

PosixTzRule PosixTzRule::parse(std::string_view text) {
    Cursor in(text);
    PosixTzRule rule;
    in.name();
    // POSIX offsets are hours west of Greenwich; ours are local minus UTC.
    rule.std_offset_ = -in.signed_time(24);
    if (in.at_end()) return rule;
    if (!in.starts_name()) in.fail("a daylight-saving abbreviation");
    in.name();
    Daylight dst{rule.std_offset_ + 3600, {}, {}};
    if (!in.peek(',')) dst.offset = -in.signed_time(24);
    auto change_date = [&in]() {
        ChangeDate date{};
        if (!in.take(',')) in.fail("',' and the date daylight saving starts or ends");
        if (in.take('J')) {
            date.kind = ChangeDate::Kind::JulianNoLeap;
            date.day = in.number(1, 365);
        } else if (in.take('M')) {
            date.kind = ChangeDate::Kind::MonthWeekDay;
            date.month = in.number(1, 12);
            if (!in.take('.')) in.fail("'.' after the month");
            date.week = in.number(1, 5);
            if (!in.take('.')) in.fail("'.' after the week");
            date.day = in.number(0, 6);
        } else {
            date.kind = ChangeDate::Kind::ZeroBasedDay;
            date.day = in.number(0, 365);
        }
        // RFC 8536 3.3.1: the time of a change may be negative or beyond 24h.
        if (in.take('/')) date.time = in.signed_time(167);
        return date;
    };
    dst.start = change_date();
    dst.end = change_date();
    if (!in.at_end()) in.fail("the end of the rule");
    rule.dst_ = dst;
    return rule;
}

OffsetSpan PosixTzRule::span_at(std::int64_t t) const {
    if (!dst_) return OffsetSpan{kFarPast, kFarFuture, std_offset_};
    auto floor_div = [](std::int64_t a, std::int64_t b) {
        return a / b - ((a % b != 0) && ((a < 0) != (b < 0)));
    };
    int year = civil_from_day_number(std::int32_t(floor_div(t + std_offset_, kDay))).year;
    // The changes of the years around t, in order; at equal instants the
    // earlier year's change comes first (a rule with daylight saving all year
    // ends one year's at the instant it starts the next's).
    struct Change {
        std::int64_t at;
        std::int32_t offset;
    };
    std::array<Change, 8> changes{};
    std::size_t n = 0;
    for (int y = year - 2; y <= year + 1; ++y) {
        // A start is read on the standard clock, an end on the daylight one.
        changes[n++] = {dst_->start.local_day_seconds(y) + dst_->start.time - std_offset_,
                        dst_->offset};
        changes[n++] = {dst_->end.local_day_seconds(y) + dst_->end.time - dst_->offset,
                        std_offset_};
    }
    std::stable_sort(changes.begin(), changes.end(),
                     [](const Change& a, const Change& b) { return a.at < b.at; });
    std::size_t i = n;
    for (std::size_t k = 0; k < n; ++k) {
        if (changes[k].at <= t) i = k;
    }
    if (i == n) throw Error("zone rule: no change found before the instant");
    std::int64_t end = kFarFuture;
    for (std::size_t k = i + 1; k < n; ++k) {
        if (changes[k].at > changes[i].at) {
            end = changes[k].at;
            break;
        }
    }
    return OffsetSpan{changes[i].at, end, changes[i].offset};
}

}  // namespace almanac
