#include "common/csv_reader.hpp"

#include "common/input_error.hpp"

#include <cerrno>
#include <charconv>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace ringroad {

int CsvTable::column(std::string_view name) const {
    for (std::size_t i = 0; i < header.size(); ++i) {
        if (header[i] == name) return static_cast<int>(i);
    }
    return -1;
}

namespace {

bool is_line_end(char c) { return c == '\n' || c == '\r'; }

bool is_blank(const std::vector<std::string>& fields) {
    return fields.size() == 1 && fields[0].find_first_not_of(" \t") == std::string::npos;
}

} // namespace

CsvTable parse_csv(std::string_view text, const std::string& source_name) {
    CsvTable table;
    table.source = source_name;
    if (text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);

    std::size_t line = 1;
    std::size_t position = 0;
    bool have_header = false;
    while (position < text.size()) {
        CsvRow row;
        row.line = line;
        std::string field;
        bool row_done = false;
        while (!row_done) {
            if (position < text.size() && text[position] == '"') {
                // Quoted field: runs to the closing quote; "" is a literal quote.
                const std::size_t opened_line = line;
                ++position;
                while (true) {
                    if (position >= text.size()) {
                        throw InputError(source_name + ":" + std::to_string(opened_line) +
                                         ": unterminated quoted field");
                    }
                    const char c = text[position++];
                    if (c == '"') {
                        if (position < text.size() && text[position] == '"') {
                            field += '"';
                            ++position;
                        } else {
                            break;
                        }
                    } else {
                        if (c == '\n' || (c == '\r' && (position >= text.size() || text[position] != '\n'))) ++line;
                        field += c;
                    }
                }
                // Only the field's end may follow its closing quote: "ab"cd is not a field.
                while (position < text.size() && (text[position] == ' ' || text[position] == '\t')) ++position;
                if (position < text.size() && !is_line_end(text[position]) && text[position] != ',') {
                    throw InputError(source_name + ":" + std::to_string(line) + ": column " +
                                     std::to_string(row.fields.size() + 1) +
                                     ": text after the closing quote (write a quote inside a quoted field as \"\")");
                }
            }
            // Unquoted part up to a comma or line end.
            while (position < text.size() && text[position] != ',' && !is_line_end(text[position])) {
                field += text[position];
                ++position;
            }
            row.fields.push_back(std::move(field));
            field.clear();
            if (position >= text.size()) {
                row_done = true;
            } else if (text[position] == ',') {
                ++position;
            } else {  // LF, CRLF, or CR alone (old Mac files)
                if (text[position] == '\r' && position + 1 < text.size() && text[position + 1] == '\n') ++position;
                ++position;
                ++line;
                row_done = true;
            }
        }
        if (is_blank(row.fields)) continue;
        if (!have_header) {
            table.header = std::move(row.fields);
            table.header_line = row.line;
            have_header = true;
        } else {
            table.rows.push_back(std::move(row));
        }
    }
    if (!have_header) throw InputError(source_name + ": the file is empty (a header row is required)");
    return table;
}

CsvTable read_csv_file(const std::string& path) {
    std::error_code ignored;
    if (std::filesystem::is_directory(path, ignored)) throw InputError(path + ": is a folder, not a CSV file");
    std::ifstream in(path, std::ios::binary);
    if (!in) throw InputError(path + ": cannot open: " + std::strerror(errno));
    std::ostringstream content;
    errno = 0;
    content << in.rdbuf();
    if (in.bad()) throw InputError(path + ": cannot read: " + std::strerror(errno != 0 ? errno : EIO));
    return parse_csv(content.str(), path);
}

bool parse_double_cell(std::string_view cell, double& value) {
    while (!cell.empty() && (cell.front() == ' ' || cell.front() == '\t')) cell.remove_prefix(1);
    while (!cell.empty() && (cell.back() == ' ' || cell.back() == '\t')) cell.remove_suffix(1);
    if (cell.empty()) return false;
    // One sign at most: "+-47.3" is not a number.
    if (cell.front() == '+') {
        cell.remove_prefix(1);
        if (cell.empty() || cell.front() == '-' || cell.front() == '+') return false;
    }
    const auto [end, error] = std::from_chars(cell.data(), cell.data() + cell.size(), value);
    return error == std::errc() && end == cell.data() + cell.size() && std::isfinite(value);
}

} // namespace ringroad
