// SPDX-License-Identifier: MIT
#include "core/time/time_reader.h"

#include "core/time/local_reading.h"
#include "core/time/time_value.h"

namespace almanac {

TimeReader::TimeReader(std::string_view format, std::optional<std::string_view> zone) {
    using Culprit = TimeReaderError::Culprit;
    try {
        format_ = TimeFormat::parse(format);
    } catch (const Error& error) {
        throw TimeReaderError(Culprit::Format, error.what());
    }
    if (!zone) return;
    try {
        zone_ = ZoneClock::named(*zone);
    } catch (const Error& error) {
        throw TimeReaderError(Culprit::Zone, error.what());
    }
    if (format_.has_offset())
        throw TimeReaderError(Culprit::Zone,
                              "expected no zone, because the format reads an offset (%z) and "
                              "each reading is already an instant");
}

std::string TimeReader::read_text(std::string_view text) const {
    return result(format_.read(text), format_.has_time_of_day());
}

std::string TimeReader::read_serial(double serial) const {
    TimeReading reading;
    reading.local = read_spreadsheet_serial(serial);
    return result(reading, format_.has_time_of_day());
}

std::string TimeReader::result(const TimeReading& reading, bool with_time_of_day) const {
    LocalTime t = reading.local;
    if (reading.has_offset || zone_) {
        Instant instant = reading.has_offset
                              ? instant_at_offset(reading.local, reading.offset)
                              : instant_of_local_reading(*zone_, reading.local);
        t = LocalTime{instant.time_since_epoch()};
        with_time_of_day = true;
    }
    if (!in_supported_range(t)) throw Error("the time falls outside years 0000 through 9999");
    if (!with_time_of_day) return format_date(date::floor<date::days>(t));
    bool whole_second = date::floor<std::chrono::seconds>(t) == t;
    return format_date_time(
        t, whole_second ? TextForm::Precision::Seconds : TextForm::Precision::Fraction, false);
}

}  // namespace almanac
