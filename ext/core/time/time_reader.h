// SPDX-License-Identifier: MIT
// to_time's work in every binding: a format (strptime directives, or the word
// excel) and an optional zone, made once per statement, that turn a text or
// a spreadsheet serial into the text to_time returns. Without a zone a
// reading comes back as written, or as its UTC instant when the format reads
// an offset (%z); with a zone it is that zone's wall clock and comes back as
// the UTC instant (fold=0 for repeated and skipped readings, local_reading.h).
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "core/text/error.h"
#include "core/time/time_format.h"
#include "core/time/zone_clock.h"

namespace almanac {

class TimeReaderError : public Error {
  public:
    enum class Culprit { Format, Zone };
    TimeReaderError(Culprit culprit, const std::string& what_was_expected)
        : Error(what_was_expected), culprit_(culprit) {}
    Culprit culprit() const { return culprit_; }

  private:
    Culprit culprit_;
};

class TimeReader {
  public:
    // Throws TimeReaderError: a format that does not parse, a zone not in the
    // tz database, or a zone beside a format that reads an offset (Zone).
    TimeReader(std::string_view format, std::optional<std::string_view> zone);

    bool reads_serials() const { return format_.is_spreadsheet_serial(); }
    // The result for a text (formats other than excel) or a serial (excel):
    // 'YYYY-MM-DD HH:MM:SS' with '.fff' when the milliseconds are not zero,
    // or 'YYYY-MM-DD' when the format has no time of day and there is no zone.
    // Throws Error (the text argument's fault) for a text that does not match,
    // an impossible date or serial, a time outside years 0000 through 9999.
    std::string read_text(std::string_view text) const;
    std::string read_serial(double serial) const;

  private:
    std::string result(const TimeReading& reading, bool with_time_of_day) const;

    TimeFormat format_;
    std::optional<ZoneClock> zone_;
};

}  // namespace almanac
