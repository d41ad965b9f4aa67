// SPDX-License-Identifier: MIT
// PostgreSQL's server headers, included the one way this module does: as C,
// with the entry points exported (the module is built with hidden visibility,
// and PostgreSQL 15 leaves PGDLLEXPORT empty on this platform).
#pragma once

// The server's port.h defines printf, snprintf, strerror and others as
// macros, which break the C++ library's headers included after it; so every
// standard and date-library header this module uses comes first.
#include <date/date.h>

#include <algorithm>
#include <chrono>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <deque>
#include <exception>
#include <map>
#include <memory>
#include <new>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <utility>
#include <variant>
#include <vector>

// The date library and the server's utils/date.h share the include guard
// DATE_H; the date library is in, so the guard is lifted for the server's.
#undef DATE_H

#define PGDLLEXPORT __attribute__((visibility("default")))

// postgres.h comes first, as the server's headers require.
// clang-format off
extern "C" {
#include "postgres.h"

#include "access/htup_details.h"
#include "catalog/pg_type_d.h"
#include "fmgr.h"
#include "funcapi.h"
#include "utils/builtins.h"
#include "utils/date.h"
#include "utils/datetime.h"
#include "utils/memutils.h"
#include "utils/timestamp.h"
}
// clang-format on
