// SPDX-License-Identifier: MIT
// An application that sets a locale with a decimal comma, as desktop and
// point-of-sale programs do, must get from almanac exactly what an
// application under the "C" locale gets: numbers in TEXT read the same,
// SVG coordinates keep their decimal points, messages show 1.5 and not 1,5.
//
// The program runs one set of queries under "C", then after
// setlocale(LC_ALL, <locale>) (a locale generated into the test's own folder
// by locale_test.sh, see there), and requires the two records of results to be
// identical byte for byte. REAL results are compared by their bits, so the
// check itself formats no number through the C library.
//
//   almanac_locale_test <locale name>      exit 0: identical; 1: they differ
#include <clocale>
#include <cstdint>
#include <cstring>
#include <iostream>
#include <string>
#include <vector>

#include "almanac.h"

namespace {

// Each query touches a place where a number meets text.
const char* const kQueries[] = {
    // Statistics on numbers written as TEXT.
    "SELECT median('12.5')",
    "SELECT median(x) FROM (SELECT '12.5' AS x UNION ALL SELECT ' 0.25 ' UNION ALL SELECT '1e-3')",
    "SELECT percentile_cont(x, '0.9') FROM (SELECT '1.5' AS x UNION ALL SELECT '2.5')",
    "SELECT var_samp(x), stddev_pop(x) FROM (SELECT '1.5' AS x UNION ALL SELECT '2.25' "
    "UNION ALL SELECT '-3.125')",
    "SELECT regr_slope(y, x), corr(y, x) FROM (SELECT '1.5' AS y, '0.5' AS x UNION ALL "
    "SELECT '2.75', '1.5' UNION ALL SELECT '3.5', '2.5')",
    "SELECT theil_sen_slope(y, x) FROM (SELECT '1.5' AS y, '0.5' AS x UNION ALL "
    "SELECT '2.75', '1.5' UNION ALL SELECT '3.5', '2.5')",
    "SELECT moving_mean(x) FROM (SELECT '0.1' AS x UNION ALL SELECT '0.2')",
    "SELECT ewma(x, t, '1.5') FROM (SELECT '2.5' AS x, '0.5' AS t UNION ALL SELECT '3.5', '1.5')",
    "SELECT exact_sum(x) FROM (SELECT '12.5' AS x UNION ALL SELECT '0.25')",
    // Charts: every coordinate, tick label and option value passes through text.
    "SELECT svg_line_chart(x, y, s) FROM (SELECT 0.5 AS x, 1.25 AS y, 'a' AS s UNION ALL "
    "SELECT 1.5, 2.75, 'a' UNION ALL SELECT 2.5, 0.125, 'b')",
    "SELECT svg_line_chart(x, y, 'a', 'raw', '{\"width\": 640.0, \"title\": \"Umsatz 1,5\"}') "
    "FROM (SELECT '2026-03-05 10:30:15.25' AS x, '41.6' AS y UNION ALL "
    "SELECT '2026-03-07', '-0.004')",
    "SELECT sparkline(y, x) FROM (SELECT '1.5' AS y, 1 AS x UNION ALL SELECT '2.5', 2 "
    "UNION ALL SELECT '0.5', 3)",
    // Error messages that show REAL values.
    "SELECT percentile_cont(1, 1.5)",
    "SELECT percentile_cont(x, p) FROM (SELECT 1 AS x, 0.25 AS p UNION ALL SELECT 2, 0.75)",
    "SELECT period_shift('2026-03-05', 2.5, 'day')",
    "SELECT ewma(1, 1e300, 1)",
    "SELECT median(-0.1e999)",
    "SELECT period_floor(1000.5, 'day')",
    "SELECT svg_line_chart(1, 2, 'a', 'raw', '{\"height\": 20.5}')",
    // Period functions with fractional seconds and REAL times.
    "SELECT period_floor('2026-03-05 10:11:12.345', 'second')",
    "SELECT period_shift('2026-03-05 10:11:12.345', 1, 'minute')",
    "SELECT period_label('2026-03-05 10:11:12.5', 'hour')",
    "SELECT period_floor(2461104.75, 'hour'), period_end(2461104.75, 'day')",
    "SELECT period_floor(1772705472.5, 'minute'), period_serial(1772705472.5, '15 minutes')",
    "SELECT period_floor('1772705472.5', 'hour'), period_floor('2461104.75', 'hour')",
    "SELECT period_shift('1772705472.75', 1, 'minute'), period_end('2461104.75', 'minute')",
    "SELECT valid_time('2461104.5'), valid_time('2461104,5')",
    "SELECT period_shift(1772705472.25, 3, 'hour')",
};

std::string hex_bits(double value) {
    std::uint64_t bits;
    std::memcpy(&bits, &value, sizeof bits);
    static const char digits[] = "0123456789abcdef";
    std::string out = "0x";
    for (int shift = 60; shift >= 0; shift -= 4) out += digits[(bits >> shift) & 0xF];
    return out;
}

// One line per query: its SQL, then every column of every row, or the error.
std::string record_of_results(sqlite3* db) {
    std::string out;
    for (const char* sql : kQueries) {
        out += sql;
        out += "\n";
        sqlite3_stmt* statement = nullptr;
        if (sqlite3_prepare_v2(db, sql, -1, &statement, nullptr) != SQLITE_OK) {
            out += "  prepare error: " + std::string(sqlite3_errmsg(db)) + "\n";
            continue;
        }
        int rc;
        while ((rc = sqlite3_step(statement)) == SQLITE_ROW) {
            for (int i = 0; i < sqlite3_column_count(statement); ++i) {
                switch (sqlite3_column_type(statement, i)) {
                    case SQLITE_NULL:
                        out += "  NULL\n";
                        break;
                    case SQLITE_INTEGER:
                        out += "  INTEGER " + std::to_string(sqlite3_column_int64(statement, i)) +
                               "\n";
                        break;
                    case SQLITE_FLOAT:
                        out += "  REAL " + hex_bits(sqlite3_column_double(statement, i)) + "\n";
                        break;
                    default: {
                        const char* text =
                            reinterpret_cast<const char*>(sqlite3_column_text(statement, i));
                        // One line per value: an SVG document's newlines are escaped.
                        out += "  TEXT ";
                        for (const char* c = text ? text : ""; *c; ++c) {
                            if (*c == '\n')
                                out += "\\n";
                            else
                                out += *c;
                        }
                        out += "\n";
                    }
                }
            }
        }
        if (rc != SQLITE_DONE) out += "  error: " + std::string(sqlite3_errmsg(db)) + "\n";
        sqlite3_finalize(statement);
    }
    return out;
}

std::string run_queries() {
    sqlite3* db = nullptr;
    if (sqlite3_open(":memory:", &db) != SQLITE_OK || almanac_register(db) != SQLITE_OK) {
        std::cerr << "cannot open a database with almanac registered\n";
        std::exit(2);
    }
    std::string text = record_of_results(db);
    sqlite3_close(db);
    return text;
}

std::vector<std::string> lines_of(const std::string& text) {
    std::vector<std::string> lines;
    std::size_t start = 0;
    for (std::size_t end; (end = text.find('\n', start)) != std::string::npos; start = end + 1)
        lines.push_back(text.substr(start, end - start));
    return lines;
}

}  // namespace

int main(int argc, char** argv) {
    if (argc != 2) {
        std::cerr << "usage: almanac_locale_test <locale with a decimal comma>\n";
        return 2;
    }
    std::setlocale(LC_ALL, "C");
    const std::string under_c = run_queries();

    if (!std::setlocale(LC_ALL, argv[1])) {
        std::cerr << "setlocale(LC_ALL, \"" << argv[1] << "\") failed: the locale was not found\n";
        return 2;
    }
    // The check means nothing unless the C library now writes a comma.
    if (std::strcmp(std::localeconv()->decimal_point, ",") != 0) {
        std::cerr << "locale " << argv[1] << " has no decimal comma\n";
        return 2;
    }
    const std::string under_locale = run_queries();
    std::setlocale(LC_ALL, "C");

    const std::size_t queries = sizeof kQueries / sizeof kQueries[0];
    if (under_c == under_locale) {
        std::cout << "identical under C and " << argv[1] << ": " << queries << " queries, "
                  << under_c.size() << " bytes of results\n";
        return 0;
    }
    // Show the first lines that differ, each with the query it belongs to.
    auto c_lines = lines_of(under_c), locale_lines = lines_of(under_locale);
    std::string query;
    int shown = 0;
    for (std::size_t i = 0; i < std::max(c_lines.size(), locale_lines.size()) && shown < 40; ++i) {
        const std::string a = i < c_lines.size() ? c_lines[i] : "<none>";
        const std::string b = i < locale_lines.size() ? locale_lines[i] : "<none>";
        if (a.rfind("  ", 0) != 0) query = a;
        if (a == b) continue;
        // Long values (an SVG) are shown from a little before their first difference.
        std::size_t first = 0;
        while (first < a.size() && first < b.size() && a[first] == b[first]) ++first;
        std::size_t from = first > 60 ? first - 40 : 0;
        std::cout << "query:       " << query << "\n  C:           " << a.substr(from, 160)
                  << "\n  " << argv[1] << ":  " << b.substr(from, 160) << "\n";
        ++shown;
    }
    std::cout << "FAILED: results differ between C and " << argv[1] << "\n";
    return 1;
}
