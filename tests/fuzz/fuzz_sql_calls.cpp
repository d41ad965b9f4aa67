// SPDX-License-Identifier: MIT
// Calls every almanac SQL function with arguments of random types and values:
// as a scalar call, as an aggregate over a table of random rows, as a window
// function over a random frame (ROWS, RANGE or GROUPS, any bounds, any
// EXCLUDE), and every table-valued function with random arguments.
//
// The functions are discovered, not listed: PRAGMA function_list and
// module_list of a connection with almanac registered, minus those of a plain
// connection. A function added to almanac is fuzzed without touching this file.
//
// Besides the sanitizers, two checks: SQLite never reports SQLITE_MISUSE or
// corruption, and every error that names an almanac function has the one
// documented shape (README "Errors"):
//     fn(): argument N (name) = <value>: <what was expected>
//     fn(): <what went wrong and what is allowed>      (about the rows as a whole)
#include <sqlite3.h>

#include <cstdint>
#include <cstring>
#include <limits>
#include <set>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "almanac.h"
#include "refusal_only.h"

namespace {

class Bytes {
  public:
    Bytes(const std::uint8_t* data, std::size_t size) : data_(data), size_(size) {}
    bool empty() const { return at_ == size_; }
    std::uint8_t byte() { return at_ < size_ ? data_[at_++] : 0; }
    std::size_t pick(std::size_t n) { return n == 0 ? 0 : byte() % n; }
    std::uint64_t word() {
        std::uint64_t w = 0;
        for (int i = 0; i < 8; ++i) w = (w << 8) | byte();
        return w;
    }
    std::string take(std::size_t most) {
        std::size_t n = std::min<std::size_t>(pick(most + 1), size_ - at_);
        std::string s(reinterpret_cast<const char*>(data_ + at_), n);
        at_ += n;
        return s;
    }

  private:
    const std::uint8_t* data_;
    std::size_t size_;
    std::size_t at_ = 0;
};

struct Function {
    std::string name;
    int arguments;  // -1: any number
    char type;      // 's' scalar, 'a' aggregate, 'w' window (aggregate too)
};

struct TableFunction {
    std::string name;
    int arguments;  // hidden columns
};

// Words the functions understand, so random calls reach past the first check.
const char* const kWords[] = {
    "2026-03-08 02:30",
    "2026-11-01 01:30:00-06:00",
    "2026-01-01",
    "1970-01-01T00:00:00Z",
    "9999-12-31 23:59:59.999",
    "0000-01-01",
    "2024-02-29T12:00:00.5+05:45",
    "2026-03-29 01:00",
    "day",
    "week",
    "half-month",
    "month",
    "quarter starting april",
    "year starting july",
    "15 minutes",
    "P1W",
    "PT1H",
    "PT1S",
    "month from 2024-01-15",
    "2 weeks starting sunday",
    "3 hours from 2026-01-01 01:00",
    "7 days",
    "year",
    "second",
    "1000000 days",
    "America/Denver",
    "Europe/London",
    "Australia/Lord_Howe",
    "Asia/Kathmandu",
    "UTC",
    "Pacific/Chatham",
    "America/Santiago",
    "Pacific/Apia",
    "../../etc/passwd",
    "/etc/localtime",
    "raw",
    "smooth",
    "{\"title\":\"t\",\"width\":200,\"height\":150}",
    "{}",
    "{\"title\":\"<&>\"}",
    "0.5",
    " 12.5",
    "1,234.50",
    "excel",
    "%Y-%m-%d",
    "%d/%m/%Y %H:%M",
    "%Y-%m-%dT%H:%M:%S%z",
    "\xe2\x82\xac"
    "1.234,56",
    "(12.00)",
    ",",
    "12.3.4",
    "",
    "a",
    "main.t",
    "t",
    "week",
    "1e308",
};

const std::int64_t kIntegers[] = {0,
                                  1,
                                  -1,
                                  2,
                                  7,
                                  1700000000,
                                  2451545,
                                  5373484,
                                  5373485,
                                  -62167219200,
                                  253402300799,
                                  1700000000000,
                                  100000000,
                                  -100000000,
                                  std::numeric_limits<std::int64_t>::min(),
                                  std::numeric_limits<std::int64_t>::max()};

const double kReals[] = {0.0,
                         -0.0,
                         0.5,
                         1.0,
                         2451545.5,
                         1.7e9,
                         5373484.4999,
                         1e-300,
                         5e-324,
                         1e308,
                         -1e308,
                         1e15,
                         1e9 + 0.25,
                         std::numeric_limits<double>::infinity(),
                         -std::numeric_limits<double>::infinity(),
                         std::numeric_limits<double>::quiet_NaN()};

void bind_random(sqlite3_stmt* statement, int index, Bytes& in) {
    switch (in.pick(8)) {
        case 0:
            sqlite3_bind_null(statement, index);
            break;
        case 1:
            sqlite3_bind_int64(statement, index, kIntegers[in.pick(std::size(kIntegers))]);
            break;
        case 2:
            sqlite3_bind_int64(statement, index, static_cast<std::int64_t>(in.word()));
            break;
        case 3:
            sqlite3_bind_double(statement, index, kReals[in.pick(std::size(kReals))]);
            break;
        case 4: {
            std::uint64_t bits = in.word();
            double d;
            std::memcpy(&d, &bits, sizeof d);
            sqlite3_bind_double(statement, index, d);
            break;
        }
        case 5: {
            // Raw bytes as TEXT: invalid UTF-8 and embedded NULs included.
            std::string text = in.take(80);
            sqlite3_bind_text(statement, index, text.data(), static_cast<int>(text.size()),
                              SQLITE_TRANSIENT);
            break;
        }
        case 6: {
            std::string blob = in.take(16);
            sqlite3_bind_blob(statement, index, blob.data(), static_cast<int>(blob.size()),
                              SQLITE_TRANSIENT);
            break;
        }
        default: {
            // A known word, sometimes with random bytes after it.
            std::string text = kWords[in.pick(std::size(kWords))];
            if (in.pick(4) == 0) text += in.take(12);
            sqlite3_bind_text(statement, index, text.data(), static_cast<int>(text.size()),
                              SQLITE_TRANSIENT);
        }
    }
}

// fn(): argument N (name) = <value>: <what was expected>, or fn(): <message>.
void check_error_shape(const std::string& message, const std::set<std::string>& names) {
    std::size_t open = message.find("(): ");
    if (open == std::string::npos || names.count(message.substr(0, open)) == 0) return;
    std::string_view rest = std::string_view(message).substr(open + 4);
    if (rest.empty()) almanac::fuzz::fail(("an empty error: " + message).c_str());
    if (rest.substr(0, 9) != "argument ") return;
    std::size_t i = 9;
    while (i < rest.size() && rest[i] >= '0' && rest[i] <= '9') ++i;
    bool shaped = i > 9 && rest.substr(i, 2) == " (";
    std::size_t close = rest.find(") = ", i);
    // The value may itself contain ": " (a quoted time), so the last part is
    // found after it: a message always has text after the value.
    shaped = shaped && close != std::string_view::npos &&
             rest.find(": ", close + 4) != std::string_view::npos;
    if (!shaped) almanac::fuzz::fail(("an argument error out of shape: " + message).c_str());
}

struct Harness {
    sqlite3* db = nullptr;
    std::vector<Function> functions;
    std::vector<TableFunction> tables;
    std::set<std::string> names;

    static std::set<std::pair<std::string, std::string>> listed(sqlite3* db, const char* sql) {
        std::set<std::pair<std::string, std::string>> out;
        sqlite3_stmt* statement = nullptr;
        sqlite3_prepare_v2(db, sql, -1, &statement, nullptr);
        while (sqlite3_step(statement) == SQLITE_ROW) {
            auto text = [&](int column) {
                const unsigned char* t = sqlite3_column_text(statement, column);
                return std::string(t ? reinterpret_cast<const char*>(t) : "");
            };
            out.insert({text(0), text(1)});
        }
        sqlite3_finalize(statement);
        return out;
    }

    Harness() {
        const char* kFunctions = "SELECT name, type || ' ' || narg FROM pragma_function_list";
        const char* kModules = "SELECT name, '' FROM pragma_module_list";
        sqlite3* plain = nullptr;
        sqlite3_open(":memory:", &plain);
        auto plain_functions = listed(plain, kFunctions);
        auto plain_modules = listed(plain, kModules);
        sqlite3_close(plain);

        sqlite3_open(":memory:", &db);
        if (almanac_register(db) != SQLITE_OK) almanac::fuzz::fail("almanac_register");
        for (auto& [name, shape] : listed(db, kFunctions)) {
            if (plain_functions.count({name, shape})) continue;
            functions.push_back({name, std::stoi(shape.substr(2)), shape[0]});
            names.insert(name);
        }
        for (auto& [name, unused] : listed(db, kModules)) {
            if (plain_modules.count({name, unused})) continue;
            std::string sql =
                "SELECT count(*) FROM pragma_table_xinfo('" + name + "') WHERE hidden";
            sqlite3_stmt* statement = nullptr;
            sqlite3_prepare_v2(db, sql.c_str(), -1, &statement, nullptr);
            int hidden =
                sqlite3_step(statement) == SQLITE_ROW ? sqlite3_column_int(statement, 0) : 0;
            sqlite3_finalize(statement);
            tables.push_back({name, hidden});
            names.insert(name);
        }
        if (functions.empty() || tables.empty()) almanac::fuzz::fail("no almanac functions found");
        sqlite3_exec(db, "CREATE TABLE t(i INTEGER PRIMARY KEY, a, b, c, d)", nullptr, nullptr,
                     nullptr);
    }

    void fill_table(Bytes& in) {
        sqlite3_exec(db, "DELETE FROM t", nullptr, nullptr, nullptr);
        sqlite3_stmt* insert = nullptr;
        sqlite3_prepare_v2(db, "INSERT INTO t(i, a, b, c, d) VALUES (?, ?, ?, ?, ?)", -1, &insert,
                           nullptr);
        std::size_t rows = in.pick(40);
        for (std::size_t row = 0; row < rows; ++row) {
            sqlite3_bind_int64(insert, 1, static_cast<std::int64_t>(row));
            for (int column = 2; column <= 5; ++column) bind_random(insert, column, in);
            sqlite3_step(insert);
            sqlite3_reset(insert);
        }
        sqlite3_finalize(insert);
    }

    // An argument: a bound random value, or a column of t.
    static std::string argument(Bytes& in, bool columns) {
        static const char* const kColumns[] = {"a", "b", "c", "d", "i"};
        if (columns && in.pick(3) != 0) return kColumns[in.pick(std::size(kColumns))];
        return "?";
    }

    static std::string frame(Bytes& in) {
        static const char* const kUnits[] = {"ROWS", "RANGE", "GROUPS"};
        static const char* const kStarts[] = {"UNBOUNDED PRECEDING", "CURRENT ROW", "1 PRECEDING",
                                              "3 PRECEDING",         "0 FOLLOWING", "2 FOLLOWING"};
        static const char* const kEnds[] = {"UNBOUNDED FOLLOWING", "CURRENT ROW", "1 FOLLOWING",
                                            "4 FOLLOWING",         "0 PRECEDING", "2 PRECEDING"};
        static const char* const kExclude[] = {"", " EXCLUDE NO OTHERS", " EXCLUDE CURRENT ROW",
                                               " EXCLUDE GROUP", " EXCLUDE TIES"};
        static const char* const kOrder[] = {"i", "a", "b", "c % 3", "d DESC"};
        static const char* const kPartition[] = {"", "PARTITION BY i % 2 ", "PARTITION BY a "};
        std::string out = "OVER (";
        out += kPartition[in.pick(std::size(kPartition))];
        out += "ORDER BY ";
        out += kOrder[in.pick(std::size(kOrder))];
        if (in.pick(4) == 0) return out + ")";  // the default frame
        out += std::string(" ") + kUnits[in.pick(3)] + " BETWEEN " +
               kStarts[in.pick(std::size(kStarts))] + " AND " + kEnds[in.pick(std::size(kEnds))] +
               kExclude[in.pick(std::size(kExclude))] + ")";
        return out;
    }

    std::string call(Bytes& in, const Function& f, bool columns) {
        int count = f.arguments >= 0 ? f.arguments : static_cast<int>(in.pick(6));
        std::string out = f.name + "(";
        for (int i = 0; i < count; ++i) out += (i ? ", " : "") + argument(in, columns);
        return out + ")";
    }

    void run(const std::string& sql, Bytes& in) {
        sqlite3_stmt* statement = nullptr;
        if (sqlite3_prepare_v2(db, sql.c_str(), -1, &statement, nullptr) != SQLITE_OK) {
            sqlite3_finalize(statement);  // a frame SQLite refuses, say: not ours to judge
            return;
        }
        for (int i = 1; i <= sqlite3_bind_parameter_count(statement); ++i)
            bind_random(statement, i, in);
        int rc;
        int rows = 0;
        while ((rc = sqlite3_step(statement)) == SQLITE_ROW && ++rows < 2000) {
            for (int column = 0; column < sqlite3_column_count(statement); ++column)
                (void)sqlite3_column_text(statement, column);  // touch every result
        }
        if (rc == SQLITE_MISUSE || rc == SQLITE_CORRUPT || rc == SQLITE_INTERNAL)
            almanac::fuzz::fail(
                ("SQLite reported " + std::string(sqlite3_errstr(rc)) + " for: " + sql).c_str());
        if (rc != SQLITE_ROW && rc != SQLITE_DONE) check_error_shape(sqlite3_errmsg(db), names);
        sqlite3_finalize(statement);
    }

    void one(Bytes& in) {
        fill_table(in);
        std::size_t choice = in.pick(functions.size() + tables.size());
        if (choice >= functions.size()) {
            const TableFunction& f = tables[choice - functions.size()];
            std::string sql = "SELECT * FROM " + f.name + "(";
            std::size_t count = in.pick(static_cast<std::size_t>(f.arguments) + 1);
            for (std::size_t i = 0; i < count; ++i) sql += i ? ", ?" : "?";
            run(sql + ") LIMIT 500", in);
            return;
        }
        const Function& f = functions[choice];
        switch (f.type == 's' ? 0 : in.pick(3)) {
            case 0:  // scalar, or an aggregate over one row of bound values
                run("SELECT " + call(in, f, false), in);
                break;
            case 1:
                run("SELECT " + call(in, f, true) + " FROM t" +
                        (in.pick(2) ? " GROUP BY i % 3" : ""),
                    in);
                break;
            default:
                run("SELECT " + call(in, f, true) + " " + frame(in) + " FROM t", in);
        }
    }
};

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    static Harness harness;
    Bytes in(data, size);
    harness.one(in);
    return 0;
}
