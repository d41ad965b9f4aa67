// SPDX-License-Identifier: MIT
#include "argument_table.h"

namespace almanac::sqlite {

int set_table_error(sqlite3_vtab* table, const std::string& message) {
    sqlite3_free(table->zErrMsg);
    table->zErrMsg = sqlite3_mprintf("%s", message.c_str());
    return SQLITE_ERROR;
}

int connect_argument_table(sqlite3* db, const char* schema, bool direct_only, sqlite3_vtab** out) {
    int rc = sqlite3_declare_vtab(db, schema);
    if (rc != SQLITE_OK) return rc;
    auto* table = static_cast<ArgumentTable*>(sqlite3_malloc(sizeof(ArgumentTable)));
    if (!table) return SQLITE_NOMEM;
    *table = ArgumentTable{};
    table->db = db;
    *out = &table->base;
    if (direct_only) sqlite3_vtab_config(db, SQLITE_VTAB_DIRECTONLY);
    return SQLITE_OK;
}

int disconnect_argument_table(sqlite3_vtab* table) {
    sqlite3_free(table);
    return SQLITE_OK;
}

int best_index_for_arguments(sqlite3_index_info* info, int first_argument, int count,
                             int extra_bits) {
    constexpr int kMostArguments = 16;
    int where[kMostArguments];
    for (int& w : where) w = -1;
    for (int i = 0; i < info->nConstraint; ++i) {
        const auto& constraint = info->aConstraint[i];
        const int argument = constraint.iColumn - first_argument;
        if (argument < 0 || argument >= count || argument >= kMostArguments) continue;
        if (constraint.op != SQLITE_INDEX_CONSTRAINT_EQ) continue;
        if (!constraint.usable) return SQLITE_CONSTRAINT;
        where[argument] = i;
    }
    int mask = 0, next = 1;
    for (int argument = 0; argument < count && argument < kMostArguments; ++argument) {
        if (where[argument] < 0) continue;
        info->aConstraintUsage[where[argument]].argvIndex = next++;
        info->aConstraintUsage[where[argument]].omit = 1;
        mask |= 1 << argument;
    }
    info->idxNum = mask | extra_bits;
    info->estimatedCost = 1e6;
    info->estimatedRows = 10000;
    return SQLITE_OK;
}

}  // namespace almanac::sqlite
