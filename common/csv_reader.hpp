#pragma once
// RFC 4180 CSV reading for stop lists and matrices. Quoted fields may hold commas, quotes ("")
// and line breaks; nothing but the field's end may follow a closing quote; CRLF, LF and CR alone
// end lines; a UTF-8 byte-order mark is skipped.
// Every row remembers the line it started on so errors can say "FILE:LINE: column ...".

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace ringroad {

struct CsvRow {
    std::size_t line = 0;               // 1-based line number where the row starts
    std::vector<std::string> fields;
};

struct CsvTable {
    std::string source;                 // file name used in error messages
    std::vector<std::string> header;    // the first row
    std::size_t header_line = 1;
    std::vector<CsvRow> rows;           // data rows; wholly blank lines are skipped

    // Index of a header column, or -1 if absent.
    int column(std::string_view name) const;
};

// Throws InputError ("FILE: cannot open ...", "FILE: is a folder", "FILE:LINE: unterminated quoted
// field", "FILE:LINE: column C: text after the closing quote", "FILE: empty").
CsvTable read_csv_file(const std::string& path);
CsvTable parse_csv(std::string_view text, const std::string& source_name);

// Strict number parsing for cells: the whole trimmed cell must be a finite number.
// Returns false instead of throwing so callers can name the line and column.
bool parse_double_cell(std::string_view cell, double& value);

} // namespace ringroad
