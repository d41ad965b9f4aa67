// SPDX-License-Identifier: MIT
#include "core/time/tzif_reader.h"

#include <catch2/catch.hpp>
#include <string>
#include <vector>

#include "core/text/error.h"

using namespace almanac;

namespace {

// Writes a TZif file by RFC 8536 section 3: a header, a data block of
// transition times (4 or 8 bytes), their type indices, the local time type
// records (utoff, isdst, desigidx), the designations; the footer follows the
// 64-bit block.
struct TypeRecord {
    std::int32_t offset;
    bool dst;
};

void put_32(std::string& out, std::uint32_t v) {
    for (int shift = 24; shift >= 0; shift -= 8) out.push_back(char((v >> shift) & 0xff));
}
void put_64(std::string& out, std::int64_t v) {
    put_32(out, std::uint32_t(std::uint64_t(v) >> 32));
    put_32(out, std::uint32_t(std::uint64_t(v)));
}

std::string block(char version, const std::vector<std::int64_t>& times,
                  const std::vector<unsigned char>& indices, const std::vector<TypeRecord>& types,
                  bool wide) {
    std::string out = "TZif";
    out.push_back(version);
    out.append(15, '\0');
    std::string designations = "LMT\0STD\0DST\0";
    for (std::uint32_t count : {0u, 0u, 0u, std::uint32_t(times.size()),
                                std::uint32_t(types.size()), std::uint32_t(designations.size())})
        put_32(out, count);
    for (auto t : times) wide ? put_64(out, t) : put_32(out, std::uint32_t(std::int32_t(t)));
    for (auto i : indices) out.push_back(char(i));
    for (const auto& type : types) {
        put_32(out, std::uint32_t(type.offset));
        out.push_back(type.dst ? 1 : 0);
        out.push_back(0);
    }
    out += designations;
    return out;
}

std::string file_v2(const std::vector<std::int64_t>& times,
                    const std::vector<unsigned char>& indices, const std::vector<TypeRecord>& types,
                    const std::string& footer) {
    return block('2', times, indices, types, false) + block('2', times, indices, types, true) +
           "\n" + footer + "\n";
}

}  // namespace

TEST_CASE("a zone file's listed changes come first, then its footer") {
    // Local mean time until 1900, then standard time with a footer rule.
    std::vector<TypeRecord> types{{-17000, false}, {-7 * 3600, false}, {-6 * 3600, true}};
    std::string bytes = file_v2({-2208988800, 2000000000}, {1, 2}, types, "MST7MDT,M3.2.0,M11.1.0");
    ZoneRules rules = read_tzif_file(bytes);
    CHECK(rules.span_at(-3000000000).offset == -17000);  // before the first: type 0
    auto standard = rules.span_at(0);
    CHECK(standard.offset == -7 * 3600);
    CHECK(standard.begin == -2208988800);
    CHECK(standard.end == 2000000000);
    CHECK(rules.span_at(2000000000).offset == -6 * 3600);
    // 2040-06-30 12:00 UTC, after the last listed change: the footer's summer.
    CHECK(rules.span_at(2224670400).offset == -6 * 3600);
    // 2040-01-01 12:00 UTC: the footer's winter.
    CHECK(rules.span_at(2209032000).offset == -7 * 3600);
    // The 64-bit part alone (what the build embeds) reads the same.
    ZoneRules part = read_tzif_64bit_part(bytes.substr(tzif_first_part_size(bytes)));
    CHECK(part.span_at(2224670400).offset == -6 * 3600);
    CHECK(part.span_at(0).begin == -2208988800);
}

TEST_CASE("a file without changes follows its footer throughout") {
    // RFC 8536 section 3.2: with no transitions the footer governs all times.
    std::string bytes = file_v2({}, {}, {{-5 * 3600, false}}, "EST5EDT,M3.2.0,M11.1.0");
    ZoneRules rules = read_tzif_file(bytes);
    CHECK(rules.span_at(0).offset == -5 * 3600);         // 1970-01-01
    CHECK(rules.span_at(15552000).offset == -4 * 3600);  // 1970-06-30
    // An empty footer: type 0 for all time.
    ZoneRules fixed = read_tzif_file(file_v2({}, {}, {{3600, false}}, ""));
    CHECK(fixed.span_at(4102444800).offset == 3600);
}

TEST_CASE("a version 1 file has no footer and keeps its last offset") {
    std::string bytes = block('\0', {0}, {1}, {{0, false}, {3600, false}}, false);
    ZoneRules rules = read_tzif_file(bytes);
    CHECK(rules.span_at(-1).offset == 0);
    CHECK(rules.span_at(4102444800).offset == 3600);
}

TEST_CASE("a changed abbreviation alone is no change of offset") {
    std::vector<TypeRecord> types{{3600, false}, {3600, true}, {7200, true}};
    ZoneRules rules = read_tzif_file(file_v2({100, 200}, {1, 2}, types, ""));
    auto first = rules.span_at(150);
    CHECK(first.begin == PosixTzRule::kFarPast);
    CHECK(first.end == 200);
}

TEST_CASE("a damaged zone file is an error, never a crash") {
    std::vector<TypeRecord> types{{0, false}, {3600, true}};
    std::string good = file_v2({100, 200}, {1, 0}, types, "CET-1CEST,M3.5.0,M10.5.0/3");
    REQUIRE_NOTHROW(read_tzif_file(good));
    // Every truncation of a good file is refused (the last byte ends the footer).
    for (std::size_t size = 0; size < good.size(); ++size) {
        CAPTURE(size);
        CHECK_THROWS_AS(read_tzif_file(good.substr(0, size)), Error);
    }
    CHECK_THROWS_AS(read_tzif_file(file_v2({200, 100}, {1, 0}, types, "")), Error);  // out of order
    CHECK_THROWS_AS(read_tzif_file(file_v2({100}, {7}, types, "")), Error);          // no type 7
    CHECK_THROWS_AS(read_tzif_file(file_v2({100}, {1}, types, "CET")), Error);       // bad footer
    std::string wrong = good;
    wrong[4] = '9';
    CHECK_THROWS_AS(read_tzif_file(wrong), Error);
}
