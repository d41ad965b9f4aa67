// SPDX-License-Identifier: MIT
#include "boundary.h"

#include <cstring>
#include <string_view>

#include "core/text/utf8.h"

extern "C" {
PG_MODULE_MAGIC;
}

namespace almanac::postgres {
namespace {

// Static storage: a longjmp out of report_failure leaves nothing to destroy.
struct Failure {
    int sqlstate = ERRCODE_INTERNAL_ERROR;
    char message[2048] = {};
};
Failure failure;

}  // namespace

void keep_failure(int sqlstate, const char* message) noexcept {
    failure.sqlstate = sqlstate;
    std::string_view whole(message ? message : "");
    std::string_view kept = utf8_prefix(whole, sizeof failure.message - 1);
    std::memcpy(failure.message, kept.data(), kept.size());
    failure.message[kept.size()] = '\0';
}

void report_failure() {
    ereport(ERROR, (errcode(failure.sqlstate), errmsg_internal("%s", failure.message)));
    pg_unreachable();
}

std::string& result_text() {
    static std::string text;
    return text;
}

}  // namespace almanac::postgres
