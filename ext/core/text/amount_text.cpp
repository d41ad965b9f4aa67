// SPDX-License-Identifier: MIT
#include "core/text/amount_text.h"

#include <array>
#include <cmath>
#include <string>

#include "core/text/ascii.h"
#include "core/text/character_position.h"
#include "core/text/error.h"
#include "core/text/number_text.h"
#include "core/text/utf8.h"

namespace almanac {
namespace {

// Spaces that exports put around and inside amounts: ASCII space and tab,
// no-break space U+00A0, thin space U+2009, narrow no-break space U+202F.
constexpr std::array<std::string_view, 5> kSpaces = {" ", "\t", "\xC2\xA0", "\xE2\x80\x89",
                                                     "\xE2\x80\xAF"};
// Grouping separators besides the two marks: apostrophe (Swiss), the right
// single quotation mark word processors turn it into, and the spaces.
constexpr std::array<std::string_view, 6> kGroupingOthers = {
    "'", "\xE2\x80\x99", " ", "\xC2\xA0", "\xE2\x80\x89", "\xE2\x80\xAF"};
constexpr std::string_view kUnicodeMinus = "\xE2\x88\x92";  // U+2212
// Currency signs, longest first so "US$" is not read as "$" after "US".
constexpr std::array<std::string_view, 20> kCurrencySigns = {"NZ$",
                                                             "HK$",
                                                             "US$",
                                                             "Rs.",
                                                             "A$",
                                                             "C$",
                                                             "S$",
                                                             "R$",
                                                             "Rs",
                                                             "$",
                                                             "\xE2\x82\xAC" /* € */,
                                                             "\xC2\xA3" /* £ */,
                                                             "\xC2\xA5" /* ¥ */,
                                                             "\xE2\x82\xB9" /* ₹ */,
                                                             "\xE2\x82\xA9" /* ₩ */,
                                                             "\xE2\x82\xBD" /* ₽ */,
                                                             "\xE2\x82\xBA" /* ₺ */,
                                                             "\xE2\x82\xAA" /* ₪ */,
                                                             "\xE2\x82\xB1" /* ₱ */,
                                                             "\xE2\x82\xA6" /* ₦ */};

bool is_upper(char c) { return c >= 'A' && c <= 'Z'; }
bool is_letter(char c) { return is_upper(c) || (c >= 'a' && c <= 'z'); }

bool starts_with(std::string_view s, std::string_view prefix) {
    return s.substr(0, prefix.size()) == prefix;
}
bool ends_with(std::string_view s, std::string_view suffix) {
    return s.size() >= suffix.size() && s.substr(s.size() - suffix.size()) == suffix;
}

std::string_view trim(std::string_view s) {
    for (bool changed = true; changed;) {
        changed = false;
        for (std::string_view space : kSpaces) {
            if (starts_with(s, space)) s.remove_prefix(space.size()), changed = true;
            if (ends_with(s, space)) s.remove_suffix(space.size()), changed = true;
        }
    }
    return s;
}

// Length of a currency sign or code at the front of s, 0 if none. A code is
// three capital letters not followed by another letter.
std::size_t currency_prefix(std::string_view s) {
    if (s.size() >= 3 && is_upper(s[0]) && is_upper(s[1]) && is_upper(s[2]) &&
        (s.size() == 3 || !is_letter(s[3])))
        return 3;
    for (std::string_view sign : kCurrencySigns)
        if (starts_with(s, sign) && (s.size() == sign.size() || !is_letter(s[sign.size()])))
            return sign.size();
    return 0;
}

std::size_t currency_suffix(std::string_view s) {
    std::size_t n = s.size();
    if (n >= 3 && is_upper(s[n - 1]) && is_upper(s[n - 2]) && is_upper(s[n - 3]) &&
        (n == 3 || !is_letter(s[n - 4])))
        return 3;
    for (std::string_view sign : kCurrencySigns)
        if (ends_with(s, sign) && (n == sign.size() || !is_letter(s[n - sign.size() - 1])))
            return sign.size();
    return 0;
}

// The separator at s[pos] (its bytes), or empty when there is none.
std::string_view separator_at(std::string_view s, std::size_t pos, char decimal_mark) {
    char other_mark = decimal_mark == '.' ? ',' : '.';
    if (s[pos] == other_mark) return s.substr(pos, 1);
    for (std::string_view separator : kGroupingOthers)
        if (starts_with(s.substr(pos), separator)) return separator;
    return {};
}

std::string shown(std::string_view separator) {
    if (separator == " ") return "a space";
    if (separator == "\xC2\xA0") return "a no-break space";
    if (separator == "\xE2\x80\x89") return "a thin space";
    if (separator == "\xE2\x80\xAF") return "a narrow no-break space";
    return "'" + std::string(separator) + "'";
}

// The ends of an amount: signs, parentheses and the currency, peeled off
// in any order ("-$12.00", "$-12.00", "(12,00 €)", "12.00-"), each kind counted.
struct PeeledEnds {
    std::string_view number;  // what is left: the number itself
    bool negative = false;
};

PeeledEnds peel_sign_and_currency(std::string_view s) {
    int signs = 0, currencies = 0;
    bool negative = false, parentheses = false;
    // Most amounts are bare numbers: nothing to peel when both ends are digits.
    bool bare = is_ascii_digit(s.front()) && is_ascii_digit(s.back());
    for (bool changed = !bare; changed && !s.empty();) {
        changed = true;
        if (!parentheses && s.size() >= 2 && s.front() == '(' && s.back() == ')') {
            parentheses = negative = true;
            ++signs;
            s = s.substr(1, s.size() - 2);
        } else if (s.front() == '-' || s.front() == '+') {
            negative = negative || s.front() == '-';
            ++signs;
            s.remove_prefix(1);
        } else if (starts_with(s, kUnicodeMinus)) {
            negative = true;
            ++signs;
            s.remove_prefix(kUnicodeMinus.size());
        } else if (s.back() == '-') {
            negative = true;
            ++signs;
            s.remove_suffix(1);
        } else if (ends_with(s, kUnicodeMinus)) {
            negative = true;
            ++signs;
            s.remove_suffix(kUnicodeMinus.size());
        } else if (std::size_t n = currency_prefix(s); n) {
            ++currencies;
            s.remove_prefix(n);
        } else if (std::size_t m = currency_suffix(s); m) {
            ++currencies;
            s.remove_suffix(m);
        } else {
            changed = false;
        }
        s = trim(s);
    }
    if (signs > 1)
        throw Error("expected at most one sign (a minus, or parentheses), found " +
                    std::to_string(signs));
    if (currencies > 1) throw Error("expected at most one currency sign or code");
    return PeeledEnds{s, negative};
}

// The number's digits between its separators, read as they come (no list
// kept): thousands need every group after the first to be 3 long; lakhs
// need every group between the first and the last to be 2 long.
struct DigitGroups {
    std::string digits;  // the number without separators, as parse_decimal reads it
    std::size_t first_group = 0, last_group = 0, group_count = 0;
    bool threes = true, twos_between = true;
    std::string_view separator;
    std::size_t first_separator = 0;
    bool has_fraction = false;
};

// What messages say about the text; built only on failure, as this runs once per row.
struct MessagePlace {
    std::string_view text;
    std::size_t offset;  // where the number starts in text: positions count from text's start
    char decimal_mark;
    std::string operator()(std::size_t pos) const {
        return "at " + character_at(text, offset + pos) + ": ";
    }
    std::string swap_hint() const {
        const char other_mark = decimal_mark == '.' ? ',' : '.';
        return std::string("; if '") + other_mark + "' is the decimal mark, give '" + other_mark +
               "' as decimal_mark";
    }
};

DigitGroups read_digit_groups(std::string_view s, char decimal_mark, const MessagePlace& at) {
    const std::string mark(1, decimal_mark);
    const char other_mark = decimal_mark == '.' ? ',' : '.';
    DigitGroups groups;
    std::size_t pos = 0;
    auto digit_run = [&]() {
        std::size_t start = pos;
        while (pos < s.size() && is_ascii_digit(s[pos])) groups.digits += s[pos++];
        return pos - start;
    };
    groups.first_group = groups.last_group = digit_run();
    groups.group_count = 1;
    while (pos < s.size() && s[pos] != decimal_mark) {
        std::string_view here = separator_at(s, pos, decimal_mark);
        if (here.empty())
            throw Error(at(pos) + "expected digits, a grouping separator or the decimal mark '" +
                        mark + "'");
        if (groups.separator.empty()) {
            groups.separator = here;
            groups.first_separator = pos;
        } else if (here != groups.separator) {
            throw Error(at(pos) + "expected one kind of grouping separator, found " +
                        shown(groups.separator) + " and " + shown(here));
        }
        pos += here.size();
        std::size_t length = digit_run();
        if (length == 0)
            throw Error(at(pos < s.size() ? pos : pos - here.size()) +
                        "expected digits after a grouping separator");
        if (groups.group_count >= 2)
            groups.twos_between = groups.twos_between && groups.last_group == 2;
        groups.threes = groups.threes && length == 3;
        groups.last_group = length;
        ++groups.group_count;
    }
    groups.has_fraction = pos < s.size();
    if (groups.has_fraction) {
        groups.digits += groups.first_group == 0 && groups.group_count == 1 ? "0." : ".";
        ++pos;
        std::size_t length = digit_run();
        if (pos < s.size()) {
            bool looks_swapped = s[pos] == decimal_mark || s[pos] == other_mark;
            if (s[pos] == decimal_mark)
                throw Error(at(pos) + "expected one decimal mark '" + mark + "', found a second");
            throw Error(at(pos) + "expected only digits after the decimal mark '" + mark + "'" +
                        (looks_swapped ? at.swap_hint() : ""));
        }
        if (length == 0) throw Error("expected digits after the decimal mark '" + mark + "'");
        if (groups.first_group == 0 && groups.group_count > 1)
            throw Error(at(0) + "expected digits before a grouping separator");
    } else if (groups.first_group == 0) {
        throw Error(at(0) + "expected digits");
    }
    return groups;
}

// Thousands: 1-3 digits, then groups of three. Lakhs (Indian English): 1-2
// digits, groups of two, and three at the end. No leading zero before a separator.
void check_grouping(const DigitGroups& groups, std::string_view s, char decimal_mark,
                    const MessagePlace& at) {
    if (groups.group_count <= 1) return;
    const char other_mark = decimal_mark == '.' ? ',' : '.';
    const bool thousands = groups.first_group >= 1 && groups.first_group <= 3 && groups.threes;
    const bool lakhs = groups.separator == "," && groups.first_group >= 1 &&
                       groups.first_group <= 2 && groups.last_group == 3 && groups.twos_between;
    // Grouped by the other mark, with no fraction: perhaps the marks were swapped.
    const bool swapped =
        !groups.has_fraction && groups.separator == std::string_view(&other_mark, 1);
    auto hint = [&]() { return swapped ? at.swap_hint() : std::string(); };
    if (!thousands && !lakhs)
        throw Error(at(groups.first_separator) +
                    "expected groups of three digits between grouping separators "
                    "(1,234,567.89)" +
                    hint());
    if (s[0] == '0')
        throw Error(at(0) + "expected no leading zero before a grouping separator" + hint());
}

}  // namespace

std::optional<double> read_amount(std::string_view text, char decimal_mark) {
    std::string_view s = trim(text);
    if (s.empty()) return std::nullopt;
    const PeeledEnds ends = peel_sign_and_currency(s);
    if (ends.number.empty()) throw Error("expected digits");
    const MessagePlace at{text, std::size_t(ends.number.data() - text.data()), decimal_mark};
    const DigitGroups groups = read_digit_groups(ends.number, decimal_mark, at);
    check_grouping(groups, ends.number, decimal_mark, at);

    // Beyond a REAL's range the number reads as infinite; below it as zero,
    // which as money is nothing.
    auto parsed = parse_decimal(groups.digits);
    if (!parsed) throw Error("expected digits");
    if (std::isinf(*parsed)) throw Error("expected an amount that fits a REAL (below 1.8e308)");
    double value = *parsed;
    // A zero stays zero: "-0.00" or "(0.00)" is no amount, not a negative one.
    if (value == 0) return 0.0;
    return ends.negative ? -value : value;
}

}  // namespace almanac
