// SPDX-License-Identifier: MIT
#include "core/time/period_spec.h"

#include <array>
#include <vector>

#include "core/text/ascii.h"
#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/text/utf8.h"
#include "core/time/calendar_names.h"

namespace almanac {
namespace {

constexpr const char* kGrammar =
    "expected [count] unit [starting weekday|month] [from YYYY-MM-DD[ HH:MM[:SS]]] with unit one "
    "of "
    "second, minute, hour, day, week, half-month, month, quarter, year, or an ISO 8601 duration "
    "such as P1W or PT15M";
constexpr std::int64_t kLargestCount = 1000000;

[[noreturn]] void fail(const std::string& reason) { throw Error(reason); }

bool is_letter(char c) { return is_ascii_lower(c) || c == '-'; }

using UnitWord = std::pair<const char*, PeriodUnit>;

// A unit word, singular or plural.
template <std::size_t N>
std::optional<PeriodUnit> unit_among(const std::array<UnitWord, N>& units,
                                     const std::string& word) {
    for (const auto& [name, unit] : units) {
        std::string singular = name;
        if (word == singular || word == singular + "s") return unit;
    }
    return std::nullopt;
}

std::optional<PeriodUnit> unit_named(const std::string& word) {
    static const std::array<UnitWord, 9> units = {{
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
    if (auto unit = unit_among(units, word)) return unit;
    if (word == "halfmonth" || word == "halfmonths") return PeriodUnit::HalfMonth;
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
        case PeriodUnit::RetailWeek:
            return "retail week";
        case PeriodUnit::RetailMonth:
            return "retail month";
        case PeriodUnit::RetailQuarter:
            return "retail quarter";
        case PeriodUnit::RetailYear:
            return "retail year";
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
bool PeriodSpec::is_retail() const {
    return unit == PeriodUnit::RetailWeek || unit == PeriodUnit::RetailMonth ||
           unit == PeriodUnit::RetailQuarter || unit == PeriodUnit::RetailYear;
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
    if (is_retail()) {
        std::string text = unit_word(unit);
        if (unit == PeriodUnit::RetailMonth) text += " " + retail_pattern.describe();
        return text + " ending " + retail_anchor.describe();
    }
    std::string text =
        (count == 1 ? "" : std::to_string(count) + " ") + unit_word(unit) + (count == 1 ? "" : "s");
    if (explicit_start) {
        if (unit == PeriodUnit::Week) {
            text += " starting " + lowercase_weekday_name(week_start);
        } else {
            text += " starting " + lowercase_month_name(year_start);
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

namespace {

constexpr const char* kRetailGrammar =
    "expected retail year|quarter|month|week [4-4-5|4-5-4|5-4-4 for months] ending last "
    "<weekday> of <month>, or ending <weekday> nearest end of <month>";

// Words are letters and '-'; a number may be a month pattern (4-4-5), one
// word of digits joined by dashes.
std::size_t end_of_number(const std::string& text, std::size_t i) {
    while (i < text.size() && is_ascii_digit(text[i])) ++i;
    while (i + 1 < text.size() && text[i] == '-' && is_ascii_digit(text[i + 1])) {
        ++i;
        while (i < text.size() && is_ascii_digit(text[i])) ++i;
    }
    return i;
}

// Numbers and words; spaces are optional between them.
std::vector<std::string> tokenise(const std::string& text) {
    std::vector<std::string> tokens;
    for (std::size_t i = 0; i < text.size();) {
        if (is_ascii_space(text[i])) {
            ++i;
        } else if (is_ascii_digit(text[i]) || is_letter(text[i])) {
            std::size_t j = i;
            if (is_ascii_digit(text[i])) {
                j = end_of_number(text, i);
            } else {
                while (j < text.size() && is_letter(text[j])) ++j;
            }
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
    return tokens;
}

// Splits off "from ...": the rest of the text is the moment.
std::optional<LocalTime> split_off_from(std::string& text) {
    for (std::size_t i = 0; i + 4 <= text.size(); ++i) {
        if (text.compare(i, 4, "from") == 0 && (i == 0 || !is_letter(text[i - 1])) &&
            (i + 4 == text.size() || !is_letter(text[i + 4]))) {
            // The moment is read from the lower-cased text; digits and separators are unaffected.
            LocalTime from = parse_from_moment(std::string_view(text).substr(i + 4));
            text = text.substr(0, i);
            return from;
        }
    }
    return std::nullopt;
}

// The words of a spec, read left to right.
class Words {
  public:
    explicit Words(std::vector<std::string> tokens) : tokens_(std::move(tokens)) {}
    bool done() const { return pos_ >= tokens_.size(); }
    const std::string& peek() const { return tokens_[pos_]; }
    bool next_is(const char* word) const { return !done() && peek() == word; }
    std::string take() { return tokens_[pos_++]; }
    void expect_end(const char* grammar) const {
        if (!done()) fail("unexpected '" + peek() + "'; " + grammar);
    }

  private:
    std::vector<std::string> tokens_;
    std::size_t pos_ = 0;
};

std::optional<PeriodUnit> retail_unit_named(const std::string& word) {
    static const std::array<UnitWord, 4> units = {{
        {"year", PeriodUnit::RetailYear},
        {"quarter", PeriodUnit::RetailQuarter},
        {"month", PeriodUnit::RetailMonth},
        {"week", PeriodUnit::RetailWeek},
    }};
    return unit_among(units, word);
}

RetailMonthPattern read_month_pattern(const std::string& word) {
    for (const char* known : {"4-4-5", "4-5-4", "5-4-4"}) {
        if (word == known)
            return RetailMonthPattern{
                {{unsigned(word[0] - '0'), unsigned(word[2] - '0'), unsigned(word[4] - '0')}}};
    }
    fail("'" + word +
         "' is not a month pattern; expected 4-4-5, 4-5-4 or 5-4-4 (the weeks of the three "
         "months of a 13-week quarter)");
}

date::weekday read_anchor_weekday(Words& words) {
    if (words.done()) fail(std::string("the anchor needs a weekday; ") + kRetailGrammar);
    std::string word = words.take();
    auto weekday = weekday_named(word);
    if (!weekday) fail("'" + word + "' is not a weekday; " + kRetailGrammar);
    return *weekday;
}

date::month read_anchor_month(Words& words) {
    if (words.done()) fail(std::string("the anchor needs a month; ") + kRetailGrammar);
    std::string word = words.take();
    auto month = month_named(word);
    if (!month) fail("'" + word + "' is not a month; " + kRetailGrammar);
    return *month;
}

void expect_word(Words& words, const char* word) {
    if (words.done()) fail(std::string("the anchor ends before '") + word + "'; " + kRetailGrammar);
    std::string got = words.take();
    if (got != word)
        fail("unexpected '" + got + "' where the anchor has '" + word + "'; " + kRetailGrammar);
}

// "last saturday of january" or "saturday nearest end of january".
RetailAnchor read_anchor(Words& words) {
    RetailAnchor anchor;
    if (words.next_is("last")) {
        words.take();
        anchor.weekday = read_anchor_weekday(words);
        expect_word(words, "of");
    } else {
        anchor.weekday = read_anchor_weekday(words);
        expect_word(words, "nearest");
        expect_word(words, "end");
        expect_word(words, "of");
        anchor.nearest = true;
    }
    anchor.month = read_anchor_month(words);
    return anchor;
}

// After "retail": the unit, a month pattern, and the anchor.
PeriodSpec read_retail_words(Words& words) {
    PeriodSpec spec;
    if (words.done()) fail(std::string("'retail' needs a unit; ") + kRetailGrammar);
    std::string unit_word_written = words.take();
    auto unit = retail_unit_named(unit_word_written);
    if (!unit) fail("unknown retail unit '" + unit_word_written + "'; " + kRetailGrammar);
    spec.unit = *unit;
    if (!words.done() && is_ascii_digit(words.peek()[0])) {
        std::string written = words.take();
        spec.retail_pattern = read_month_pattern(written);
        if (spec.unit != PeriodUnit::RetailMonth)
            fail("a month pattern (" + written + ") applies to retail month only, not " +
                 std::string(unit_word(spec.unit)));
    }
    if (words.next_is("starting"))
        fail("a retail unit takes no 'starting': its anchor says where every retail year ends; " +
             std::string(kRetailGrammar));
    if (!words.next_is("ending"))
        fail(std::string(unit_word(spec.unit)) + " needs an anchor; " + kRetailGrammar);
    words.take();
    spec.retail_anchor = read_anchor(words);
    words.expect_end(kRetailGrammar);
    return spec;
}

// [count] unit [starting weekday|month].
PeriodSpec read_words(Words& words) {
    PeriodSpec spec;
    bool counted = false;
    if (!words.done() && is_ascii_digit(words.peek()[0])) {
        std::string count = words.take();
        if (count.find('-') != std::string::npos) fail("unexpected '" + count + "'; " + kGrammar);
        spec.count = parse_count(count);
        counted = true;
    } else if (!words.done() && words.peek()[0] == '-') {
        fail("the count must be a positive whole number");
    }
    if (words.done()) fail(kGrammar);
    if (words.next_is("retail")) {
        if (counted)
            fail("a retail unit takes no count: its periods are the retail calendar's own; " +
                 std::string(kRetailGrammar));
        words.take();
        return read_retail_words(words);
    }
    std::string written = words.take();
    auto unit = unit_named(written);
    if (!unit) fail("unknown unit '" + written + "'; " + kGrammar);
    spec.unit = *unit;
    if (spec.unit == PeriodUnit::HalfMonth && counted)
        fail("half-month takes no count: its periods are the 1st-15th and the 16th-last day");

    if (words.next_is("starting")) {
        words.take();
        if (words.done())
            fail("'starting' needs a weekday (for weeks) or a month (for quarters and years)");
        const std::string word = words.take();
        if (spec.unit == PeriodUnit::Week) {
            auto weekday = weekday_named(word);
            if (!weekday)
                fail("'starting " + word + "': weeks start on a weekday, monday to sunday");
            spec.week_start = *weekday;
        } else if (spec.unit == PeriodUnit::Quarter || spec.unit == PeriodUnit::Year) {
            auto month = month_named(word);
            if (!month)
                fail("'starting " + word +
                     "': quarters and years start in a month, january to december");
            spec.year_start = *month;
        } else {
            fail(std::string("'starting' applies to week, quarter and year, not ") +
                 unit_word(spec.unit));
        }
        spec.explicit_start = true;
    }
    words.expect_end(kGrammar);
    return spec;
}

// A `from` must agree with the rest of the spec.
void check_from(PeriodSpec& spec, LocalTime from) {
    auto day = date::floor<date::days>(from);
    if (spec.is_retail())
        fail("a retail unit takes no 'from': its anchor says where every retail year ends; " +
             std::string(kRetailGrammar));
    if (spec.unit == PeriodUnit::HalfMonth)
        fail("half-month takes no 'from': its periods are the 1st-15th and the 16th-last day");
    if (spec.unit == PeriodUnit::Week) {
        date::weekday weekday{day};
        if (spec.explicit_start && weekday != spec.week_start) {
            fail("'from " + format_date(day) + "' is a " + lowercase_weekday_name(weekday) +
                 ", which contradicts 'starting " + lowercase_weekday_name(spec.week_start) + "'");
        }
        spec.week_start = weekday;
    }
    if (spec.unit == PeriodUnit::Quarter || spec.unit == PeriodUnit::Year) {
        date::year_month_day ymd{day};
        unsigned from_month = unsigned(ymd.month());
        unsigned start_month = unsigned(spec.year_start);
        unsigned step = spec.unit == PeriodUnit::Quarter ? 3 : 12;
        if (spec.explicit_start && (from_month + 12 - start_month) % step != 0) {
            const std::string start_name = lowercase_month_name(spec.year_start);
            fail("'from " + format_date(day) + "' contradicts 'starting " + start_name +
                 "': a period must start in " + start_name +
                 (step == 3 ? " or a month a whole number of quarters away" : ""));
        }
    }
    spec.from = from;
}

}  // namespace

PeriodSpec parse_period_spec(std::string_view raw) {
    if (raw.size() > kLongestSpec)
        fail("a spec is at most " + std::to_string(kLongestSpec) + " bytes long; this one has " +
             std::to_string(raw.size()));
    std::string text(trim_ascii_space(ascii_lowercase(raw)));
    if (text.empty()) fail("the spec is empty; " + std::string(kGrammar));
    if (text[0] == 'p' && text.size() > 1 && (is_ascii_digit(text[1]) || text[1] == 't'))
        return parse_iso_duration(text, trim_ascii_space(raw));
    std::optional<LocalTime> from = split_off_from(text);
    Words words(tokenise(text));
    PeriodSpec spec = read_words(words);
    if (from) check_from(spec, *from);
    return spec;
}

}  // namespace almanac
