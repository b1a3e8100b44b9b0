#include "router/stops.hpp"

#include "common/csv_reader.hpp"
#include "common/input_error.hpp"
#include "common/utf8.hpp"

#include <cmath>
#include <sstream>
#include <unordered_map>

namespace ringroad::router {

namespace {

std::string format_number(double value) {
    std::ostringstream text;
    text << value;
    return text.str();
}

std::string trim(const std::string& text) {
    const auto begin = text.find_first_not_of(" \t");
    if (begin == std::string::npos) return {};
    const auto end = text.find_last_not_of(" \t");
    return text.substr(begin, end - begin + 1);
}

int required_column(const CsvTable& table, const char* name) {
    const int index = table.column(name);
    if (index < 0) {
        throw InputError(table.source + ":" + std::to_string(table.header_line) + ": missing column '" +
                             name + "' (the header must name id, lat and lon)",
                         name);
    }
    return index;
}

double coordinate_cell(const CsvTable& table, const CsvRow& row, int column, const char* name) {
    const std::string where = table.source + ":" + std::to_string(row.line) + ": column '" + name + "'";
    if (static_cast<std::size_t>(column) >= row.fields.size() || trim(row.fields[column]).empty()) {
        throw InputError(where + ": empty value", name);
    }
    double value = 0.0;
    if (!parse_double_cell(row.fields[column], value)) {
        throw InputError(where + ": '" + row.fields[column] + "' is not a number", name);
    }
    return value;
}

// Each column once: `id,lat,lon,lat` would leave the second 'lat' silently unused.
void check_header_names(const CsvTable& table) {
    std::unordered_map<std::string, std::size_t> first_column;
    for (std::size_t c = 0; c < table.header.size(); ++c) {
        const std::string name = trim(table.header[c]);
        const auto [existing, inserted] = first_column.emplace(name, c + 1);
        if (!inserted) {
            throw InputError(table.source + ":" + std::to_string(table.header_line) + ": column " + std::to_string(c + 1) +
                                 ": column name '" + name + "' repeats column " + std::to_string(existing->second),
                             name);
        }
    }
}

// Every answer is JSON or XML, which must be UTF-8: a cell that is not is refused where it is.
void check_utf8(const CsvTable& table, std::size_t line, const std::vector<std::string>& fields) {
    for (std::size_t c = 0; c < fields.size(); ++c) {
        const auto bad = first_invalid_utf8(fields[c]);
        if (!bad) continue;
        const std::string column = c < table.header.size() && !first_invalid_utf8(table.header[c])
                                       ? "'" + table.header[c] + "'"
                                       : std::to_string(c + 1);
        throw InputError(table.source + ":" + std::to_string(line) + ": column " + column +
                             ": not valid UTF-8 (byte " + std::to_string(*bad + 1) + " of the value); save the file as UTF-8",
                         c < table.header.size() ? table.header[c] : std::string());
    }
}

} // namespace

void check_coordinate_range(double lat, double lon, const std::string& what) {
    if (!std::isfinite(lat) || lat < -90.0 || lat > 90.0) {
        throw InputError(what + ": latitude " + format_number(lat) + " is outside [-90, 90]", "lat");
    }
    if (!std::isfinite(lon) || lon < -180.0 || lon > 180.0) {
        throw InputError(what + ": longitude " + format_number(lon) + " is outside [-180, 180]", "lon");
    }
}

namespace {

StopList stops_from_table(const CsvTable& table) {
    const std::string& source_name = table.source;
    check_utf8(table, table.header_line, table.header);
    check_header_names(table);
    const int id_column = required_column(table, "id");
    const int lat_column = required_column(table, "lat");
    const int lon_column = required_column(table, "lon");

    StopList list;
    list.source = source_name;
    std::vector<int> extra_indices;
    for (std::size_t c = 0; c < table.header.size(); ++c) {
        const int index = static_cast<int>(c);
        if (index == id_column || index == lat_column || index == lon_column) continue;
        extra_indices.push_back(index);
        list.extra_columns.push_back(table.header[c]);
    }

    std::unordered_map<std::string, std::size_t> first_line_of_id;
    for (const CsvRow& row : table.rows) {
        const std::string line_prefix = source_name + ":" + std::to_string(row.line);
        if (row.fields.size() > table.header.size()) {
            throw InputError(line_prefix + ": " + std::to_string(row.fields.size()) +
                             " fields but the header has " + std::to_string(table.header.size()));
        }
        check_utf8(table, row.line, row.fields);
        Stop stop;
        stop.line = row.line;
        stop.id = static_cast<std::size_t>(id_column) < row.fields.size() ? trim(row.fields[id_column]) : "";
        if (stop.id.empty()) throw InputError(line_prefix + ": column 'id': empty id", "id");
        const auto [existing, inserted] = first_line_of_id.emplace(stop.id, row.line);
        if (!inserted) {
            throw InputError(line_prefix + ": column 'id': duplicate id '" + stop.id + "' (first on line " +
                                 std::to_string(existing->second) + ")",
                             "id");
        }
        stop.lat = coordinate_cell(table, row, lat_column, "lat");
        stop.lon = coordinate_cell(table, row, lon_column, "lon");
        check_coordinate_range(stop.lat, stop.lon, line_prefix + ": stop '" + stop.id + "'");
        for (int index : extra_indices) {
            stop.extra_values.push_back(static_cast<std::size_t>(index) < row.fields.size() ? row.fields[index] : "");
        }
        list.stops.push_back(std::move(stop));
    }
    if (list.stops.empty()) throw InputError(source_name + ": no stops (only a header)");
    return list;
}

} // namespace

StopList parse_stops_csv(std::string_view text, const std::string& source_name) {
    return stops_from_table(parse_csv(text, source_name));
}

StopList read_stops_csv(const std::string& path) {
    return stops_from_table(read_csv_file(path));
}

} // namespace ringroad::router
