// SPDX-License-Identifier: MIT
#include "aggregate_state.h"

#include "core/text/error.h"

namespace almanac::postgres {

MemoryContext aggregate_context(FunctionCallInfo fcinfo, const char* function) {
    MemoryContext context = nullptr;
    if (!AggCheckCallContext(fcinfo, &context))
        ereport(ERROR, (errcode(ERRCODE_FEATURE_NOT_SUPPORTED),
                        errmsg_internal("%s(): called outside an aggregate", function)));
    return context;
}

void read_state_header(ByteReader& in, std::uint8_t tag, const char* function) {
    try {
        std::uint8_t version = in.u8();
        if (version != kStateFormatVersion)
            throw Error("a state in format " + std::to_string(version) + "; this module reads " +
                        std::to_string(kStateFormatVersion));
        if (in.u8() != tag) throw Error("a state of another aggregate");
    } catch (const Error& error) {
        raise_function_error(function, error.what(), ERRCODE_DATA_CORRUPTED);
    }
}

}  // namespace almanac::postgres
