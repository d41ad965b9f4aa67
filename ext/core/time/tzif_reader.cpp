// SPDX-License-Identifier: MIT
#include "core/time/tzif_reader.h"

#include <cstdint>
#include <string>
#include <vector>

#include "core/text/error.h"

namespace almanac {
namespace {

constexpr std::size_t kHeaderSize = 44;

struct Header {
    char version;  // 0, '2', '3' or '4'
    std::uint32_t isutcnt, isstdcnt, leapcnt, timecnt, typecnt, charcnt;

    std::size_t data_size(std::size_t time_size) const {
        return std::size_t{timecnt} * time_size + timecnt + std::size_t{typecnt} * 6 + charcnt +
               std::size_t{leapcnt} * (time_size + 4) + isstdcnt + isutcnt;
    }
};

[[noreturn]] void malformed(const char* what) {
    throw Error(std::string("not a valid TZif zone file: ") + what);
}

std::uint32_t big_endian_32(const unsigned char* p) {
    return std::uint32_t{p[0]} << 24 | std::uint32_t{p[1]} << 16 | std::uint32_t{p[2]} << 8 | p[3];
}

std::int64_t big_endian_64(const unsigned char* p) {
    return static_cast<std::int64_t>(std::uint64_t{big_endian_32(p)} << 32 | big_endian_32(p + 4));
}

Header read_header(std::string_view bytes) {
    if (bytes.size() < kHeaderSize || bytes.substr(0, 4) != "TZif") malformed("no TZif header");
    const auto* p = reinterpret_cast<const unsigned char*>(bytes.data());
    Header h{};
    h.version = bytes[4];
    if (h.version != 0 && (h.version < '2' || h.version > '4')) malformed("unknown version");
    h.isutcnt = big_endian_32(p + 20);
    h.isstdcnt = big_endian_32(p + 24);
    h.leapcnt = big_endian_32(p + 28);
    h.timecnt = big_endian_32(p + 32);
    h.typecnt = big_endian_32(p + 36);
    h.charcnt = big_endian_32(p + 40);
    // RFC 8536 section 3.1: at least one type; the indicator counts are zero
    // or equal to the type count. Large counts are refused before any size
    // arithmetic, so a corrupt file cannot make it wrap.
    if (h.typecnt == 0 || h.typecnt > 256 || h.timecnt > 1000000 || h.charcnt > 100000 ||
        h.leapcnt > 100000)
        malformed("implausible counts");
    if ((h.isutcnt != 0 && h.isutcnt != h.typecnt) || (h.isstdcnt != 0 && h.isstdcnt != h.typecnt))
        malformed("indicator counts differ from the type count");
    return h;
}

// One header and its data block, then (for 64-bit data) the footer.
ZoneRules read_block(std::string_view bytes, std::size_t time_size) {
    Header h = read_header(bytes);
    if (bytes.size() - kHeaderSize < h.data_size(time_size)) malformed("truncated data");
    const auto* p = reinterpret_cast<const unsigned char*>(bytes.data()) + kHeaderSize;
    const unsigned char* times = p;
    const unsigned char* indices = times + std::size_t{h.timecnt} * time_size;
    const unsigned char* types = indices + h.timecnt;

    std::vector<std::int32_t> offsets(h.typecnt);
    for (std::uint32_t i = 0; i < h.typecnt; ++i) {
        auto offset = static_cast<std::int32_t>(big_endian_32(types + 6 * i));
        // RFC 8536: -2^31 is not allowed; real zones stay within a day.
        if (offset <= -25 * 3600 || offset >= 26 * 3600) malformed("an offset beyond a day");
        offsets[i] = offset;
    }
    std::vector<ZoneRules::Change> changes;
    changes.reserve(h.timecnt);
    for (std::uint32_t i = 0; i < h.timecnt; ++i) {
        std::int64_t at =
            time_size == 8 ? big_endian_64(times + 8 * i)
                           : std::int64_t{static_cast<std::int32_t>(big_endian_32(times + 4 * i))};
        if (!changes.empty() && at <= changes.back().at) malformed("changes out of order");
        if (indices[i] >= h.typecnt) malformed("a change names a type that does not exist");
        changes.push_back({at, offsets[indices[i]]});
    }

    std::optional<PosixTzRule> footer;
    if (time_size == 8) {
        std::string_view rest = bytes.substr(kHeaderSize + h.data_size(time_size));
        if (rest.size() < 2 || rest.front() != '\n') malformed("no footer");
        std::size_t close = rest.find('\n', 1);
        if (close == std::string_view::npos) malformed("an unterminated footer");
        std::string_view rule = rest.substr(1, close - 1);
        if (!rule.empty()) footer = PosixTzRule::parse(rule);
    }
    // Before the first change, the first type holds (RFC 8536 section 3.2).
    return ZoneRules(offsets[0], changes, std::move(footer));
}

}  // namespace

std::size_t tzif_first_part_size(std::string_view bytes) {
    Header h = read_header(bytes);
    std::size_t size = kHeaderSize + h.data_size(4);
    if (bytes.size() < size) malformed("truncated data");
    return size;
}

ZoneRules read_tzif_file(std::string_view bytes) {
    Header h = read_header(bytes);
    if (h.version == 0) return read_block(bytes, 4);
    return read_tzif_64bit_part(bytes.substr(tzif_first_part_size(bytes)));
}

ZoneRules read_tzif_64bit_part(std::string_view bytes) {
    if (read_header(bytes).version == 0)
        malformed("a version 1 header where version 2+ was expected");
    return read_block(bytes, 8);
}

}  // namespace almanac
