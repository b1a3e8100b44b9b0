#include "tests/support/tsplib_reader.hpp"

#include "common/input_error.hpp"

#include <cctype>
#include <cmath>
#include <fstream>
#include <sstream>
#include <vector>

namespace ringroad::test {
namespace {

std::string trim(std::string_view text) {
    std::size_t first = 0;
    std::size_t last = text.size();
    while (first < last && std::isspace(static_cast<unsigned char>(text[first]))) ++first;
    while (last > first && std::isspace(static_cast<unsigned char>(text[last - 1]))) --last;
    return std::string(text.substr(first, last - first));
}

std::string read_whole_file(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    if (!in) throw InputError(path + ": cannot open TSPLIB file");
    std::ostringstream buffer;
    buffer << in.rdbuf();
    return buffer.str();
}

struct Header {
    std::string name, type, weight_type, weight_format;
    std::size_t dimension = 0;
};

// TSPLIB GEO: coordinates are DDD.MM (degrees and minutes). The documentation writes
// deg = nint(x); truncation toward zero is what the published optima of the GEO instances
// (burma14 3323, ulysses16 6859) require, as the exact-solver tests confirm.
double geographic_radians(double coordinate) {
    const double pi = 3.141592;  // TSPLIB 95 section 2.4 uses exactly this value
    const double degrees = std::trunc(coordinate);
    const double minutes = coordinate - degrees;
    return pi * (degrees + 5.0 * minutes / 3.0) / 180.0;
}

void fill_explicit(planners::matrices::CostMatrix& costs, const Header& header, std::istream& numbers,
                   const std::string& source) {
    const std::size_t n = header.dimension;
    auto next = [&](std::size_t row, std::size_t column) {
        double value = 0.0;
        if (!(numbers >> value))
            throw InputError(source + ": EDGE_WEIGHT_SECTION ends early at row " + std::to_string(row + 1) +
                             ", column " + std::to_string(column + 1));
        return value;
    };
    auto set_both = [&](std::size_t i, std::size_t j, double v) {
        costs(i, j) = v;
        costs(j, i) = v;
    };
    const std::string& format = header.weight_format;
    for (std::size_t i = 0; i < n; ++i) {
        if (format == "FULL_MATRIX") {
            for (std::size_t j = 0; j < n; ++j) costs(i, j) = next(i, j);
        } else if (format == "UPPER_ROW") {
            for (std::size_t j = i + 1; j < n; ++j) set_both(i, j, next(i, j));
        } else if (format == "UPPER_DIAG_ROW") {
            for (std::size_t j = i; j < n; ++j) set_both(i, j, next(i, j));
        } else if (format == "LOWER_ROW") {
            for (std::size_t j = 0; j < i; ++j) set_both(i, j, next(i, j));
        } else if (format == "LOWER_DIAG_ROW") {
            for (std::size_t j = 0; j <= i; ++j) set_both(i, j, next(i, j));
        } else {
            throw InputError(source + ": EDGE_WEIGHT_FORMAT '" + format + "' is not supported");
        }
    }
    // A tour never uses the diagonal; TSPLIB files put 0 or a large filler there.
    for (std::size_t i = 0; i < n; ++i) costs(i, i) = 0.0;
}

void fill_from_coordinates(planners::matrices::CostMatrix& costs, const Header& header, std::istream& lines,
                           const std::string& source) {
    const std::size_t n = header.dimension;
    std::vector<double> x(n), y(n);
    for (std::size_t k = 0; k < n; ++k) {
        std::size_t id = 0;
        if (!(lines >> id >> x[k] >> y[k]) || id < 1 || id > n)
            throw InputError(source + ": NODE_COORD_SECTION entry " + std::to_string(k + 1) +
                             " is malformed or its node number is outside 1.." + std::to_string(n));
        if (id != k + 1) {  // nodes may be listed in any order
            x[id - 1] = x[k];
            y[id - 1] = y[k];
        }
    }
    long (*distance)(double, double, double, double) = nullptr;
    if (header.weight_type == "EUC_2D") distance = tsplib_euclidean;
    else if (header.weight_type == "CEIL_2D") distance = tsplib_ceiling;
    else if (header.weight_type == "ATT") distance = tsplib_pseudo_euclidean;
    else if (header.weight_type == "GEO") distance = tsplib_geographic;
    else throw InputError(source + ": EDGE_WEIGHT_TYPE '" + header.weight_type + "' is not supported");
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j)
            if (i != j) costs(i, j) = static_cast<double>(distance(x[i], y[i], x[j], y[j]));
}

} // namespace

long tsplib_euclidean(double x1, double y1, double x2, double y2) {
    const double dx = x1 - x2, dy = y1 - y2;
    return static_cast<long>(std::sqrt(dx * dx + dy * dy) + 0.5);
}

long tsplib_ceiling(double x1, double y1, double x2, double y2) {
    const double dx = x1 - x2, dy = y1 - y2;
    return static_cast<long>(std::ceil(std::sqrt(dx * dx + dy * dy)));
}

long tsplib_pseudo_euclidean(double x1, double y1, double x2, double y2) {
    const double dx = x1 - x2, dy = y1 - y2;
    const double r = std::sqrt((dx * dx + dy * dy) / 10.0);
    const long t = static_cast<long>(r + 0.5);
    return t < r ? t + 1 : t;
}

long tsplib_geographic(double x1, double y1, double x2, double y2) {
    const double radius = 6378.388;  // RRR of TSPLIB 95 section 2.4
    const double latitude1 = geographic_radians(x1), longitude1 = geographic_radians(y1);
    const double latitude2 = geographic_radians(x2), longitude2 = geographic_radians(y2);
    const double q1 = std::cos(longitude1 - longitude2);
    const double q2 = std::cos(latitude1 - latitude2);
    const double q3 = std::cos(latitude1 + latitude2);
    return static_cast<long>(radius * std::acos(0.5 * ((1.0 + q1) * q2 - (1.0 - q1) * q3)) + 1.0);
}

TsplibInstance parse_tsplib(std::string_view text, const std::string& source) {
    Header header;
    std::istringstream in{std::string(text)};
    std::string line;
    TsplibInstance instance;
    bool have_weights = false;
    while (std::getline(in, line)) {
        const std::string trimmed = trim(line);
        if (trimmed.empty()) continue;
        const auto colon = trimmed.find(':');
        const std::string keyword = trim(trimmed.substr(0, colon == std::string::npos ? trimmed.size() : colon));
        const std::string value = colon == std::string::npos ? std::string() : trim(trimmed.substr(colon + 1));
        if (keyword == "EOF") break;
        if (keyword == "NAME") header.name = value;
        else if (keyword == "TYPE") header.type = value;
        else if (keyword == "EDGE_WEIGHT_TYPE") header.weight_type = value;
        else if (keyword == "EDGE_WEIGHT_FORMAT") header.weight_format = value;
        else if (keyword == "DIMENSION") {
            try {
                header.dimension = std::stoul(value);
            } catch (const std::exception&) {
                throw InputError(source + ": DIMENSION '" + value + "' is not a number");
            }
        } else if (keyword == "NODE_COORD_SECTION" || keyword == "EDGE_WEIGHT_SECTION") {
            if (header.dimension == 0) throw InputError(source + ": " + keyword + " before DIMENSION");
            if (header.type != "TSP" && header.type != "ATSP")
                throw InputError(source + ": TYPE '" + header.type + "' is not TSP or ATSP");
            if (instance.costs.size() == 0) instance.costs = planners::matrices::CostMatrix(header.dimension, 0.0);
            if (keyword == "NODE_COORD_SECTION") fill_from_coordinates(instance.costs, header, in, source);
            else fill_explicit(instance.costs, header, in, source);
            have_weights = true;
        } else if (keyword == "DISPLAY_DATA_SECTION") {
            for (std::size_t k = 0; k < header.dimension && std::getline(in, line); ++k) {
            }
        }
    }
    if (!have_weights) throw InputError(source + ": no NODE_COORD_SECTION or EDGE_WEIGHT_SECTION");
    instance.name = header.name;
    instance.asymmetric = header.type == "ATSP";
    return instance;
}

TsplibInstance read_tsplib_file(const std::string& path) { return parse_tsplib(read_whole_file(path), path); }

std::map<std::string, long> read_tsplib_optima(const std::string& path) {
    std::istringstream in(read_whole_file(path));
    std::string line;
    std::map<std::string, long> optima;
    std::size_t line_number = 0;
    while (std::getline(in, line)) {
        ++line_number;
        if (trim(line).empty()) continue;
        const auto colon = line.find(':');
        if (colon == std::string::npos)
            throw InputError(path + ":" + std::to_string(line_number) + ": expected 'name : length'");
        std::istringstream value(line.substr(colon + 1));
        long length = 0;
        if (!(value >> length))
            throw InputError(path + ":" + std::to_string(line_number) + ": length is not a number");
        optima[trim(line.substr(0, colon))] = length;
    }
    return optima;
}

} // namespace ringroad::test
