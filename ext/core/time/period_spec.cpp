// SPDX-License-Identifier: MIT
#include "core/time/period_spec.h"

#include <array>
#include <vector>

#include "core/text/ascii.h"
#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/text/utf8.h"

namespace almanac {
namespace {

constexpr const char* kGrammar =
    "expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one "
    "of "
    "second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration "
    "such as P1W or PT15M";
constexpr std::int64_t kLargestCount = 1000000;

constexpr std::array<const char*, 7> kWeekdays = {"sunday",   "monday", "tuesday", "wednesday",
                                                  "thursday", "friday", "saturday"};
constexpr std::array<const char*, 12> kMonths = {"january",   "february", "march",    "april",
                                                 "may",       "june",     "july",     "august",
                                                 "september", "october",  "november", "december"};

[[noreturn]] void fail(const std::string& reason) { throw Error(reason); }

bool is_letter(char c) { return is_ascii_lower(c) || c == '-'; }

std::optional<PeriodUnit> unit_named(const std::string& word) {
    static const std::array<std::pair<const char*, PeriodUnit>, 9> units = {{
        {"second", PeriodUnit::Second},
        {"minute", PeriodUnit::Minute},
        {"hour", PeriodUnit::Hour},
        {"day", PeriodUnit::Day},
        {"week", PeriodUnit::Week},
        {"half-month", PeriodUnit::HalfMonth},
        {"month", PeriodUnit::Month},
        {"quarter", PeriodUnit::Quarter},
        {"year", PeriodUnit::Year},
    }};
    for (const auto& [name, unit] : units) {
        std::string singular = name;
        if (word == singular || word == singular + "s") return unit;
    }
    if (word == "halfmonth" || word == "halfmonths") return PeriodUnit::HalfMonth;
    return std::nullopt;
}

// Full names, or their first three letters.
template <std::size_t N>
std::optional<unsigned> index_of_name(const std::array<const char*, N>& names,
                                      const std::string& word) {
    for (unsigned i = 0; i < N; ++i) {
        std::string name = names[i];
        if (word == name || (word.size() == 3 && name.compare(0, 3, word) == 0)) return i;
    }
    return std::nullopt;
}

const char* unit_word(PeriodUnit unit) {
    switch (unit) {
        case PeriodUnit::Second:
            return "second";
        case PeriodUnit::Minute:
            return "minute";
        case PeriodUnit::Hour:
            return "hour";
        case PeriodUnit::Day:
            return "day";
        case PeriodUnit::Week:
            return "week";
        case PeriodUnit::HalfMonth:
            return "half-month";
        case PeriodUnit::Month:
            return "month";
        case PeriodUnit::Quarter:
            return "quarter";
        case PeriodUnit::Year:
            return "year";
    }
    return "?";
}

std::int64_t parse_count(const std::string& digits) {
    if (digits.size() > 7) fail("count " + digits + " is too large; counts run 1 to 1000000");
    std::int64_t count = parse_int64(digits).value_or(0);
    if (count == 0) fail("count 0: the count must be a positive whole number");
    if (count > kLargestCount) fail("count " + digits + " is too large; counts run 1 to 1000000");
    return count;
}

// P1W, PT15M ...: one component only.
PeriodSpec parse_iso_duration(const std::string& text, std::string_view as_written) {
    const std::string expected =
        "expected an ISO 8601 duration of one component: PnY, PnM, PnW, PnD, PTnH, PTnM or PTnS";
    std::size_t pos = 1;
    bool time_part = false;
    if (pos < text.size() && text[pos] == 't') {
        time_part = true;
        ++pos;
    }
    std::size_t digits_start = pos;
    while (pos < text.size() && is_ascii_digit(text[pos])) ++pos;
    if (pos == digits_start) fail(expected);
    std::string digits = text.substr(digits_start, pos - digits_start);
    if (pos + 1 != text.size()) {
        fail("'" + std::string(as_written) + "' is a mixed or malformed duration; " + expected);
    }
    PeriodSpec spec;
    spec.count = parse_count(digits);
    char designator = text[pos];
    if (time_part) {
        switch (designator) {
            case 'h':
                spec.unit = PeriodUnit::Hour;
                break;
            case 'm':
                spec.unit = PeriodUnit::Minute;
                break;
            case 's':
                spec.unit = PeriodUnit::Second;
                break;
            default:
                fail(expected);
        }
    } else {
        switch (designator) {
            case 'y':
                spec.unit = PeriodUnit::Year;
                break;
            case 'm':
                spec.unit = PeriodUnit::Month;
                break;
            case 'w':
                spec.unit = PeriodUnit::Week;
                break;
            case 'd':
                spec.unit = PeriodUnit::Day;
                break;
            default:
                fail(expected);
        }
    }
    return spec;
}

LocalTime parse_from_moment(std::string_view text) {
    const char* expected = "'from' takes a moment YYYY-MM-DD[ HH:MM[:SS]] on the wall clock";
    TimeValue value;
    try {
        value = parse_time_text(text);
    } catch (const Error& error) {
        // Say why a well-shaped date failed (2024-02-30); otherwise the shape.
        std::string why = error.what();
        if (why.rfind("no such date", 0) == 0 || why.find("does not exist") != std::string::npos)
            fail(std::string(expected) + " (" + why.substr(0, why.find(';')) + ")");
        fail(expected);
    }
    if (value.representation != Representation::Text) fail(expected);
    if (value.is_calendar_day()) return LocalTime{value.day().time_since_epoch()};
    if (value.form.suffix != TextForm::Suffix::None)
        fail(std::string(expected) + ", without a zone offset (the zone argument gives the zone)");
    return LocalTime{value.instant().time_since_epoch()};
}

}  // namespace

bool PeriodSpec::is_sub_day() const {
    return unit == PeriodUnit::Second || unit == PeriodUnit::Minute || unit == PeriodUnit::Hour;
}
bool PeriodSpec::is_month_based() const {
    return unit == PeriodUnit::Month || unit == PeriodUnit::Quarter || unit == PeriodUnit::Year;
}
bool PeriodSpec::is_fiscal() const {
    return (unit == PeriodUnit::Quarter || unit == PeriodUnit::Year) && year_start != date::January;
}
std::int64_t PeriodSpec::months() const {
    switch (unit) {
        case PeriodUnit::Month:
            return count;
        case PeriodUnit::Quarter:
            return 3 * count;
        case PeriodUnit::Year:
            return 12 * count;
        default:
            return 0;
    }
}
std::int64_t PeriodSpec::days() const {
    if (unit == PeriodUnit::Day) return count;
    if (unit == PeriodUnit::Week) return 7 * count;
    return 0;
}
Millis PeriodSpec::sub_day_length() const {
    switch (unit) {
        case PeriodUnit::Second:
            return Millis{1000 * count};
        case PeriodUnit::Minute:
            return Millis{60000 * count};
        case PeriodUnit::Hour:
            return Millis{3600000 * count};
        default:
            return Millis{0};
    }
}
Millis PeriodSpec::fixed_length() const {
    if (is_sub_day()) return sub_day_length();
    if (unit == PeriodUnit::Day || unit == PeriodUnit::Week) return Millis{86400000 * days()};
    throw Error("'" + describe() +
                "' has no fixed length; expected seconds, minutes, hours, days or weeks");
}

std::string PeriodSpec::describe() const {
    std::string text =
        (count == 1 ? "" : std::to_string(count) + " ") + unit_word(unit) + (count == 1 ? "" : "s");
    if (explicit_start) {
        if (unit == PeriodUnit::Week) {
            text += std::string(" starting ") + kWeekdays[week_start.c_encoding()];
        } else {
            text += std::string(" starting ") + kMonths[unsigned(year_start) - 1];
        }
    }
    if (from) {
        auto day = date::floor<date::days>(*from);
        bool midnight = *from == LocalTime{day.time_since_epoch()};
        text +=
            " from " +
            format_date_time(
                *from, midnight ? TextForm::Precision::Date : TextForm::Precision::Seconds, false);
    }
    return text;
}

PeriodSpec parse_period_spec(std::string_view raw) {
    if (raw.size() > kLongestSpec)
        fail("a spec is at most " + std::to_string(kLongestSpec) + " bytes long; this one has " +
             std::to_string(raw.size()));
    std::string text = ascii_lowercase(raw);
    // Trim.
    std::size_t first = 0, last = text.size();
    while (first < last && is_ascii_space(text[first])) ++first;
    while (last > first && is_ascii_space(text[last - 1])) --last;
    text = text.substr(first, last - first);
    if (text.empty()) fail("the spec is empty; " + std::string(kGrammar));

    if (text[0] == 'p' && text.size() > 1 && (is_ascii_digit(text[1]) || text[1] == 't')) {
        std::string_view as_written = raw;
        while (!as_written.empty() && is_ascii_space(as_written.front()))
            as_written.remove_prefix(1);
        while (!as_written.empty() && is_ascii_space(as_written.back()))
            as_written.remove_suffix(1);
        return parse_iso_duration(text, as_written);
    }

    // Split off "from ...": the rest of the text is the moment.
    std::optional<LocalTime> from;
    std::size_t from_at = std::string::npos;
    for (std::size_t i = 0; i + 4 <= text.size(); ++i) {
        if (text.compare(i, 4, "from") == 0 && (i == 0 || !is_letter(text[i - 1])) &&
            (i + 4 == text.size() || !is_letter(text[i + 4]))) {
            from_at = i;
            break;
        }
    }
    if (from_at != std::string::npos) {
        // The moment is read from the lower-cased text; digits and separators are unaffected.
        from = parse_from_moment(std::string_view(text).substr(from_at + 4));
        text = text.substr(0, from_at);
    }

    // Tokens: numbers and words; spaces are optional between them.
    std::vector<std::string> tokens;
    for (std::size_t i = 0; i < text.size();) {
        if (is_ascii_space(text[i])) {
            ++i;
        } else if (is_ascii_digit(text[i])) {
            std::size_t j = i;
            while (j < text.size() && is_ascii_digit(text[j])) ++j;
            tokens.push_back(text.substr(i, j - i));
            i = j;
        } else if (is_letter(text[i])) {
            std::size_t j = i;
            while (j < text.size() && is_letter(text[j])) ++j;
            tokens.push_back(text.substr(i, j - i));
            i = j;
        } else {
            // Quote the whole character: half a UTF-8 sequence is not text, a
            // byte that is not UTF-8 is shown as U+FFFD and a NUL as U+2400, so
            // the message stays valid text (found by the bad-input catalogue).
            std::size_t length = utf8_sequence_length(text, i);
            std::string shown = text[i] == '\0' ? "\xE2\x90\x80"
                                : length == 0   ? "\xEF\xBF\xBD"
                                                : text.substr(i, length);
            fail("unexpected character '" + shown + "'; " + kGrammar);
        }
    }
    // "half month" written as two words.
    for (std::size_t i = 0; i + 1 < tokens.size(); ++i) {
        if (tokens[i] == "half" && (tokens[i + 1] == "month" || tokens[i + 1] == "months")) {
            tokens[i] = "half-month";
            tokens.erase(tokens.begin() + static_cast<long>(i) + 1);
        }
    }

    PeriodSpec spec;
    std::size_t pos = 0;
    bool counted = false;
    if (pos < tokens.size() && is_ascii_digit(tokens[pos][0])) {
        spec.count = parse_count(tokens[pos]);
        counted = true;
        ++pos;
    } else if (pos < tokens.size() && tokens[pos][0] == '-') {
        fail("the count must be a positive whole number");
    }
    if (pos >= tokens.size()) fail(kGrammar);
    auto unit = unit_named(tokens[pos]);
    if (!unit) fail("unknown unit '" + tokens[pos] + "'; " + kGrammar);
    spec.unit = *unit;
    ++pos;
    if (spec.unit == PeriodUnit::HalfMonth && counted)
        fail("half-month takes no count: its periods are the 1st-15th and the 16th-last day");

    if (pos < tokens.size() && tokens[pos] == "starting") {
        ++pos;
        if (pos >= tokens.size())
            fail("'starting' needs a weekday (for weeks) or a month (for quarters and years)");
        const std::string& word = tokens[pos];
        if (spec.unit == PeriodUnit::Week) {
            auto weekday = index_of_name(kWeekdays, word);
            if (!weekday)
                fail("'starting " + word + "': weeks start on a weekday, monday to sunday");
            spec.week_start = date::weekday{*weekday};
        } else if (spec.unit == PeriodUnit::Quarter || spec.unit == PeriodUnit::Year) {
            auto month = index_of_name(kMonths, word);
            if (!month)
                fail("'starting " + word +
                     "': quarters and years start in a month, january to december");
            spec.year_start = date::month{*month + 1};
        } else {
            fail(std::string("'starting' applies to week, quarter and year, not ") +
                 unit_word(spec.unit));
        }
        spec.explicit_start = true;
        ++pos;
    }
    if (pos < tokens.size()) fail("unexpected '" + tokens[pos] + "'; " + kGrammar);

    if (from) {
        auto day = date::floor<date::days>(*from);
        if (spec.unit == PeriodUnit::HalfMonth)
            fail("half-month takes no 'from': its periods are the 1st-15th and the 16th-last day");
        if (spec.unit == PeriodUnit::Week) {
            date::weekday weekday{day};
            if (spec.explicit_start && weekday != spec.week_start) {
                fail("'from " + format_date(day) + "' is a " + kWeekdays[weekday.c_encoding()] +
                     ", which contradicts 'starting " + kWeekdays[spec.week_start.c_encoding()] +
                     "'");
            }
            spec.week_start = weekday;
        }
        if (spec.unit == PeriodUnit::Quarter || spec.unit == PeriodUnit::Year) {
            date::year_month_day ymd{day};
            unsigned from_month = unsigned(ymd.month());
            unsigned start_month = unsigned(spec.year_start);
            unsigned step = spec.unit == PeriodUnit::Quarter ? 3 : 12;
            if (spec.explicit_start && (from_month + 12 - start_month) % step != 0) {
                fail("'from " + format_date(day) + "' contradicts 'starting " +
                     kMonths[start_month - 1] + "': a period must start in " +
                     kMonths[start_month - 1] +
                     (step == 3 ? " or a month a whole number of quarters away" : ""));
            }
        }
        spec.from = from;
    }
    return spec;
}

}  // namespace almanac
