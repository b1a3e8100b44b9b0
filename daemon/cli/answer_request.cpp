#include "daemon/cli/answer_request.hpp"

#include "daemon/answers/request_stops.hpp"

#include <unistd.h>

#include <algorithm>
#include <cstdlib>

namespace ringroad::cli {

nlohmann::ordered_json stops_body(const router::StopList& stops) {
    nlohmann::ordered_json list = nlohmann::ordered_json::array();
    for (const router::Stop& stop : stops.stops) {
        nlohmann::ordered_json item{{"id", stop.id}, {"lat", stop.lat}, {"lon", stop.lon}};
        for (std::size_t c = 0; c < stops.extra_columns.size(); ++c) {
            // A further column named like ours cannot be a JSON field; the CSV keeps it unread.
            if (!item.contains(stops.extra_columns[c])) item[stops.extra_columns[c]] = stop.extra_values[c];
        }
        list.push_back(std::move(item));
    }
    return list;
}

nlohmann::ordered_json matrix_body(const planners::matrices::LabelledMatrix& matrix) {
    nlohmann::ordered_json costs = nlohmann::ordered_json::array();
    for (std::size_t from = 0; from < matrix.ids.size(); ++from) {
        nlohmann::ordered_json row = nlohmann::ordered_json::array();
        for (std::size_t to = 0; to < matrix.ids.size(); ++to) {
            if (matrix.costs.has(from, to)) row.push_back(matrix.costs(from, to));
            else row.push_back(nullptr);
        }
        costs.push_back(std::move(row));
    }
    return {{"ids", matrix.ids}, {"costs", costs}};
}

answers::AnswerLimits command_line_limits() {
    answers::AnswerLimits limits;
    const long pages = sysconf(_SC_PHYS_PAGES);
    const long page_size = sysconf(_SC_PAGE_SIZE);
    if (pages > 0 && page_size > 0) {
        const double half = static_cast<double>(pages) * static_cast<double>(page_size) / 2.0;
        limits.max_matrix_cells = std::max<std::size_t>(
            limits.max_matrix_cells, static_cast<std::size_t>(half / static_cast<double>(answers::kMatrixBytesPerCell)));
    }
    limits.max_stops = 1'000'000;
    limits.max_time_limit_seconds = 86400.0;
    return limits;
}

namespace {

// "stops[12]..." -> 12, or -1.
long stop_index(const std::string& field) {
    if (field.rfind("stops[", 0) != 0) return -1;
    char* end = nullptr;
    const long index = std::strtol(field.c_str() + 6, &end, 10);
    return end != nullptr && *end == ']' ? index : -1;
}

std::string option_name(std::string field) {
    std::replace(field.begin(), field.end(), '_', '-');
    return "--" + field;
}

} // namespace

nlohmann::ordered_json answer_for_command_line(const std::function<nlohmann::ordered_json()>& answer,
                                               const router::StopList* stops) {
    try {
        return answer();
    } catch (const answers::RequestError& error) {
        const std::string& field = error.field();
        std::string message = error.what();
        const long index = stop_index(field);
        if (index >= 0 && stops != nullptr && static_cast<std::size_t>(index) < stops->stops.size()) {
            const std::string prefix = "stops[" + std::to_string(index) + "]: ";
            const router::Stop& stop = stops->stops[static_cast<std::size_t>(index)];
            if (message.rfind(prefix, 0) == 0 && stop.line > 0) {
                message = stops->source + ":" + std::to_string(stop.line) + ": " + message.substr(prefix.size());
            }
        } else if ((field == "stops" || field == "matrix") && message.rfind(field + ": ", 0) == 0) {
            // The files are named by the options; the message says what is wrong with them.
            message = message.substr(field.size() + 2);
        } else if (!field.empty() && field.find_first_of(".[") == std::string::npos && field != "stops" &&
                   message.rfind(field + ": ", 0) == 0) {
            message = option_name(field) + message.substr(field.size());
        }
        throw InputError(message, field);
    }
}

} // namespace ringroad::cli
