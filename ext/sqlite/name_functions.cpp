// SPDX-License-Identifier: MIT
// known_name(name, wanted [, noun]): the one check of a report's @item.
//
//  1. An aggregate over the names a report knows (its items): returns
//     `wanted` when it is one of them, or when it is NULL (no choice made) or
//     '*' (every name), so a report can use the result as its choice.
//  2. Otherwise it stops the statement with one message that names the
//     closest known name (core/text/name_distance.h: the most letter pairs in
//     common, ignoring case; ties by name):
//       known_name(): argument 2 (wanted) = 'Pumpkin lof': expected one of
//       the items; the closest is 'Pumpkin loaf'
//     `noun` (default 'name') is the word the message uses, in the plural
//     with an s. With no names at all the message says there are none.
//  3. NULL names are skipped; a number is compared by its text. `wanted`
//     and `noun` are read from the first row; over no rows the result is NULL.
//
// refuse_parameter(name, value, why): NULL when value is NULL (the parameter
// is not set); otherwise stops the statement with `name = value: why`, as in
//   refuse_parameter(): @unit = 'month': trend.sql judges ISO weeks; it takes no @unit
// so a report refuses a parameter that makes no sense for it instead of
// ignoring it (SQLite's RAISE works only in triggers).
#include <memory>
#include <set>
#include <string>
#include <vector>

#include "aggregate_state.h"
#include "arguments.h"
#include "core/text/name_distance.h"
#include "registration.h"

namespace almanac::sqlite {
namespace {

constexpr const char* kName = "known_name";

struct ValueCopy {
    void operator()(sqlite3_value* value) const { sqlite3_value_free(value); }
};

struct KnownNameState {
    bool started = false;
    std::unique_ptr<sqlite3_value, ValueCopy> wanted;  // NULL pointer: no choice made
    std::string wanted_text;
    std::string noun = "name";
    bool found = false;
    std::set<std::string> names;  // kept until wanted is found, for the closest one
};

std::string text_of(sqlite3_value* value) {
    const auto* text = reinterpret_cast<const char*>(sqlite3_value_text(value));
    return text ? std::string(text, static_cast<std::size_t>(sqlite3_value_bytes(value))) : std::string();
}

void known_name_step(sqlite3_context* context, int argc, sqlite3_value** argv) {
    guarded(context, [&] {
        auto& state = aggregate_state<KnownNameState>(context);
        if (!state.started) {
            state.started = true;
            if (sqlite3_value_type(argv[1]) != SQLITE_NULL) {
                if (sqlite3_value_type(argv[1]) == SQLITE_BLOB)
                    raise_argument_error({kName, 2, "wanted"}, argv[1], "expected a name or '*'");
                state.wanted.reset(sqlite3_value_dup(argv[1]));
                if (!state.wanted) throw std::bad_alloc();
                state.wanted_text = text_of(argv[1]);
                state.found = state.wanted_text == "*";
            } else {
                state.found = true;
            }
            if (argc > 2) {
                auto noun = read_text({kName, 3, "noun"}, argv[2]);
                if (noun) state.noun = *noun;
            }
        }
        if (state.found || sqlite3_value_type(argv[0]) == SQLITE_NULL) return;
        std::string name = text_of(argv[0]);
        if (name == state.wanted_text) {
            state.found = true;
            state.names.clear();
        } else {
            state.names.insert(std::move(name));
        }
    });
}

void known_name_final(sqlite3_context* context) {
    guarded(context, [&] {
        auto state = take_state<KnownNameState>(context);
        if (!state || !state->wanted) {
            sqlite3_result_null(context);
            return;
        }
        if (state->found) {
            sqlite3_result_value(context, state->wanted.get());
            return;
        }
        std::vector<std::string> names(state->names.begin(), state->names.end());
        auto closest = closest_name(state->wanted_text, names);
        std::string expected = closest ? "expected one of the " + state->noun + "s; the closest is '" + *closest + "'"
                                       : "expected one of the " + state->noun + "s, but there are none";
        raise_argument_error({kName, 2, "wanted"}, state->wanted.get(), expected);
    });
}

void refuse_parameter(sqlite3_context* context, int, sqlite3_value** argv) {
    guarded(context, [&] {
        if (sqlite3_value_type(argv[1]) == SQLITE_NULL) {
            sqlite3_result_null(context);
            return;
        }
        auto name = read_text({"refuse_parameter", 1, "name"}, argv[0]);
        auto why = read_text({"refuse_parameter", 3, "why"}, argv[2]);
        throw SqlError("refuse_parameter(): " + (name ? *name : std::string("NULL")) + " = " + describe_value(argv[1]) + ": " +
                       (why ? *why : std::string("not a parameter of this report")));
    });
}

}  // namespace

int register_name_functions(sqlite3* db) {
    const int flags = SQLITE_UTF8 | SQLITE_DETERMINISTIC | SQLITE_INNOCUOUS;
    int rc = SQLITE_OK;
    for (int argc = 2; argc <= 3 && rc == SQLITE_OK; ++argc)
        rc = sqlite3_create_function(db, kName, argc, flags, nullptr, nullptr, known_name_step, known_name_final);
    if (rc == SQLITE_OK)
        rc = sqlite3_create_function(db, "refuse_parameter", 3, flags, nullptr, refuse_parameter, nullptr, nullptr);
    return rc;
}

}  // namespace almanac::sqlite
