#include "planners/matrices/matrix_csv.hpp"

#include "common/atomic_file.hpp"
#include "common/csv_reader.hpp"
#include "common/csv_writer.hpp"
#include "common/input_error.hpp"
#include "common/utf8.hpp"

#include <charconv>
#include <cmath>
#include <string_view>
#include <unordered_map>
#include <vector>

namespace ringroad::planners::matrices {

namespace {

std::string trimmed(std::string_view text) {
    const auto first = text.find_first_not_of(" \t");
    if (first == std::string_view::npos) return {};
    const auto last = text.find_last_not_of(" \t");
    return std::string(text.substr(first, last - first + 1));
}

// "FILE:LINE: column C: " — columns are 1-based like a spreadsheet's.
std::string place(const CsvTable& table, std::size_t line, std::size_t column) {
    return table.source + ":" + std::to_string(line) + ": column " + std::to_string(column) + ": ";
}

std::vector<std::string> header_ids(const CsvTable& table) {
    if (table.header.empty()) throw InputError(table.source + ": empty matrix file");
    const std::string corner = trimmed(table.header[0]);
    if (!corner.empty() && corner != "id") {
        throw InputError(place(table, table.header_line, 1) + "header must start with 'id' (found '" +
                         corner + "')");
    }
    if (table.header.size() < 2) {
        throw InputError(table.source + ":" + std::to_string(table.header_line) +
                         ": header names no stops (expected id,<stop id>,<stop id>,...)");
    }
    for (std::size_t column = 0; column < table.header.size(); ++column) {
        if (const auto bad = first_invalid_utf8(table.header[column])) {
            throw InputError(place(table, table.header_line, column + 1) + "not valid UTF-8 (byte " +
                             std::to_string(*bad + 1) + "); save the file as UTF-8");
        }
    }
    std::vector<std::string> ids;
    std::unordered_map<std::string, std::size_t> column_of;
    for (std::size_t column = 1; column < table.header.size(); ++column) {
        std::string id = trimmed(table.header[column]);
        if (id.empty()) throw InputError(place(table, table.header_line, column + 1) + "empty stop id");
        const auto [where, inserted] = column_of.emplace(id, column + 1);
        if (!inserted) {
            throw InputError(place(table, table.header_line, column + 1) + "duplicate stop id '" + id +
                             "' (also column " + std::to_string(where->second) + ")");
        }
        ids.push_back(std::move(id));
    }
    return ids;
}

double parse_cost(const CsvTable& table, const CsvRow& row, std::size_t column,
                  const std::string& row_id, const std::string& column_id) {
    const std::string cell = trimmed(row.fields[column]);
    if (cell.empty()) return kMissingCost;
    double value = 0.0;
    const std::string where = place(table, row.line, column + 1) + "(from '" + row_id + "' to '" +
                              column_id + "') ";
    if (!parse_double_cell(cell, value)) throw InputError(where + "'" + cell + "' is not a number");
    if (value < 0.0) throw InputError(where + "negative cost " + cell);
    if (value > kLargestMatrixCost) throw InputError(where + "cost " + cell + " is above the largest allowed, 1e12");
    return value;
}

LabelledMatrix matrix_from_table(const CsvTable& table) {
    LabelledMatrix matrix;
    matrix.ids = header_ids(table);
    const std::size_t size = matrix.ids.size();
    matrix.costs = CostMatrix(size);

    std::unordered_map<std::string, std::size_t> index_of;
    for (std::size_t i = 0; i < size; ++i) index_of.emplace(matrix.ids[i], i);
    std::vector<std::size_t> line_of_row(size, 0);

    for (const CsvRow& row : table.rows) {
        if (row.fields.size() != size + 1) {
            throw InputError(table.source + ":" + std::to_string(row.line) + ": " +
                             std::to_string(row.fields.size()) + " fields, expected " +
                             std::to_string(size + 1) + " (the id and one cost per stop in the header)");
        }
        const std::string id = trimmed(row.fields[0]);
        const auto found = index_of.find(id);
        if (found == index_of.end()) {
            throw InputError(place(table, row.line, 1) + "stop '" + id + "' is not in the header");
        }
        const std::size_t from = found->second;
        if (line_of_row[from] != 0) {
            throw InputError(place(table, row.line, 1) + "duplicate row for stop '" + id +
                             "' (also line " + std::to_string(line_of_row[from]) + ")");
        }
        line_of_row[from] = row.line;
        for (std::size_t to = 0; to < size; ++to) {
            const double cost = parse_cost(table, row, to + 1, id, matrix.ids[to]);
            if (to == from) {
                if (cost != 0.0 && std::isfinite(cost)) {
                    throw InputError(place(table, row.line, to + 2) + "the cost from '" + id +
                                     "' to itself must be 0 or empty");
                }
                continue;
            }
            matrix.costs(from, to) = cost;
        }
    }
    for (std::size_t i = 0; i < size; ++i) {
        if (line_of_row[i] == 0) {
            throw InputError(table.source + ": not square: " + std::to_string(size) +
                             " stops in the header but " + std::to_string(table.rows.size()) +
                             " rows; no row for stop '" + matrix.ids[i] + "'");
        }
    }
    return matrix;
}

} // namespace

LabelledMatrix parse_matrix_csv(std::string_view text, const std::string& source_name) {
    return matrix_from_table(parse_csv(text, source_name));
}

LabelledMatrix read_matrix_csv(const std::string& path) {
    return matrix_from_table(read_csv_file(path));
}

namespace {

// Shortest text that reads back to the same double ("12.5", "3323", "0.1").
std::string format_cost(double cost) {
    char buffer[64];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, cost);
    return std::string(buffer, result.ptr);
}

} // namespace

std::string matrix_to_csv(const LabelledMatrix& matrix) {
    const std::size_t size = matrix.costs.size();
    std::string out;
    std::vector<std::string> fields;
    fields.reserve(size + 1);
    fields.push_back("id");
    fields.insert(fields.end(), matrix.ids.begin(), matrix.ids.end());
    append_csv_row(out, fields);
    for (std::size_t from = 0; from < size; ++from) {
        fields.clear();
        fields.push_back(matrix.ids[from]);
        for (std::size_t to = 0; to < size; ++to) {
            fields.push_back(matrix.costs.has(from, to) ? format_cost(matrix.costs(from, to)) : "");
        }
        append_csv_row(out, fields);
    }
    return out;
}

void write_matrix_csv(const LabelledMatrix& matrix, const std::string& path) {
    write_file_atomically(path, matrix_to_csv(matrix));
}

} // namespace ringroad::planners::matrices
