// SPDX-License-Identifier: MIT
#include "core/time/zone_database.h"

#include <algorithm>
#include <cstdlib>
#include <cstring>
#include <fstream>
#include <map>
#include <memory>
#include <mutex>

#include "core/text/error.h"
#include "core/time/built_in_zones.h"
#include "core/time/tzif_reader.h"

namespace almanac {
namespace {

#ifdef _WIN32
constexpr const char* kSystemZoneinfo = nullptr;  // Windows keeps no IANA zone files
#else
constexpr const char* kSystemZoneinfo = "/usr/share/zoneinfo";
#endif

std::string read_whole_file(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    if (!in) return {};
    std::string bytes;
    char buffer[8192];
    while (in.read(buffer, sizeof buffer) || in.gcount() > 0)
        bytes.append(buffer, static_cast<std::size_t>(in.gcount()));
    return bytes;
}

// The zone data chosen for this process.
struct Source {
    bool system = false;
    std::string folder;
    std::string release;
    // System data: every name tzdata.zi lists, with the zone whose file holds
    // its rules (a link's target, so a link works even where the OS package
    // leaves the link's own file out).
    std::map<std::string, std::string, std::less<>> system_files;
};

// tzdata.zi is the tz project's own list of every zone and link, installed
// beside the compiled files; its first line names the release.
bool read_system_list(const char* folder, Source& source) {
    std::string text = read_whole_file(std::string(folder) + "/tzdata.zi");
    std::size_t pos = 0;
    while (pos < text.size()) {
        std::size_t end = text.find('\n', pos);
        if (end == std::string::npos) end = text.size();
        std::string_view line(text.data() + pos, end - pos);
        pos = end + 1;
        auto word = [&line](std::size_t index) {
            std::size_t start = 0;
            for (std::size_t i = 0; i < index; ++i) {
                start = line.find(' ', start);
                if (start == std::string_view::npos) return std::string_view{};
                ++start;
            }
            return line.substr(start, line.find(' ', start) - start);
        };
        if (line.substr(0, 10) == "# version ") {
            source.release = std::string(line.substr(10));
        } else if (line.substr(0, 2) == "Z ") {
            std::string name(word(1));
            source.system_files[name] = name;
        } else if (line.substr(0, 2) == "L ") {
            source.system_files[std::string(word(2))] = std::string(word(1));
        }
    }
    if (source.system_files.empty() || source.release.empty()) return false;
    source.system = true;
    source.folder = folder;
    return true;
}

Source choose_source() {
    Source source;
    const char* forced = std::getenv("ALMANAC_ZONE_DATA");
    bool built_in_forced = forced && std::strcmp(forced, "built-in") == 0;
    if (!built_in_forced && kSystemZoneinfo && read_system_list(kSystemZoneinfo, source))
        return source;
    source = Source{};
    source.release = built_in_zones::release;
    return source;
}

const Source& source() {
    static const Source chosen = choose_source();
    return chosen;
}

const built_in_zones::Entry* find_built_in(std::string_view name) {
    const auto* begin = built_in_zones::entries;
    const auto* end = begin + built_in_zones::entry_count;
    const auto* found = std::lower_bound(
        begin, end, name,
        [](const auto& entry, std::string_view n) { return std::string_view(entry.name) < n; });
    return found != end && std::string_view(found->name) == name ? found : nullptr;
}

std::unique_ptr<const ZoneRules> load(const Source& from, std::string_view name) {
    if (from.system) {
        auto file = from.system_files.find(name);
        if (file == from.system_files.end()) return nullptr;
        std::string bytes = read_whole_file(from.folder + "/" + file->second);
        if (bytes.empty())
            throw Error("the zone file of '" + std::string(name) + "' cannot be read");
        return std::make_unique<const ZoneRules>(read_tzif_file(bytes));
    }
    const auto* entry = find_built_in(name);
    if (!entry) return nullptr;
    std::string_view bytes(reinterpret_cast<const char*>(built_in_zones::data) + entry->begin,
                           entry->size);
    return std::make_unique<const ZoneRules>(read_tzif_64bit_part(bytes));
}

}  // namespace

const ZoneRules* find_zone_rules(std::string_view iana_name) {
    // Loaded rules live until the process ends, so the pointers handed out
    // stay valid for every clock on every thread; the lock covers only the
    // map, which statements on other threads may be filling at the same time.
    static std::mutex lock;
    static std::map<std::string, std::unique_ptr<const ZoneRules>, std::less<>> loaded;
    const Source& from = source();
    std::lock_guard<std::mutex> guard(lock);
    auto found = loaded.find(iana_name);
    if (found != loaded.end()) return found->second.get();
    auto rules = load(from, iana_name);
    if (!rules) return nullptr;
    return loaded.emplace(std::string(iana_name), std::move(rules)).first->second.get();
}

std::string zone_data_description() {
    const Source& from = source();
    if (from.release.empty()) return "none (no zone data built into this module, and the OS's not used)";
    return from.release + (from.system ? " (" + from.folder + ")" : std::string(" (built in)"));
}

}  // namespace almanac
