#include "common/csv_writer.hpp"
#include "common/input_error.hpp"
#include "daemon/answers/renderings.hpp"
#include "daemon/answers/request_stop_lookup.hpp"

#include <cmath>
#include <cstdio>

namespace ringroad::answers {

using Json = nlohmann::ordered_json;

namespace {

std::string decimal(double value) {
    char text[32];
    std::snprintf(text, sizeof text, "%.1f", value);
    return text;
}

std::string format_number(double value) {
    if (!std::isfinite(value)) return "";
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.10g", value);
    return buffer;
}

double tenths(double value) { return std::round(value * 10.0) / 10.0; }

// Further fields of a stop as CSV cells: strings as they are, anything else as JSON text.
std::string cell_text(const Json& value) { return value.is_string() ? value.get<std::string>() : value.dump(); }

} // namespace

std::string render_json(const Json& answer) { return answer.dump(2) + "\n"; }

std::string render_matrix_csv(const Json& answer, bool seconds) {
    const Json& ids = answer.at("ids");
    const Json& table = answer.at(seconds ? "seconds" : "meters");
    std::string out;
    std::vector<std::string> row{"id"};
    for (const auto& id : ids) row.push_back(id.get<std::string>());
    append_csv_row(out, row);
    for (std::size_t from = 0; from < ids.size(); ++from) {
        row.assign(1, ids[from].get<std::string>());
        for (const auto& value : table[from]) row.push_back(value.is_null() ? std::string() : decimal(value.get<double>()));
        append_csv_row(out, row);
    }
    return out;
}

std::string render_tour_csv(const Json& answer, const Json& request) {
    const bool on_roads = answer.contains("total_seconds");
    const Json& order = answer.at("order");
    const Json& hops = answer.at("hops");
    std::string out;
    std::vector<std::string> extra_columns;
    const RequestStopLookup stops(request);
    if (on_roads) {
        // The further columns are those of the first stop (a CSV file gives every stop the same).
        for (const auto& [key, value] : request.at("stops").at(0).items()) {
            if (key != "id" && key != "lat" && key != "lon") extra_columns.push_back(key);
        }
        std::vector<std::string> header{"visit", "stop", "lat", "lon", "seconds_from_previous",
                                        "meters_from_previous", "total_seconds", "total_meters"};
        header.insert(header.end(), extra_columns.begin(), extra_columns.end());
        append_csv_row(out, header);
    } else {
        append_csv_row(out, {"visit", "stop", "cost_from_previous", "total_cost"});
    }
    const auto row = [&](std::size_t visit, const std::string& id, double cost, double meters, double total_cost,
                         double total_meters) {
        if (on_roads) {
            const StopEcho& stop = stops[id];
            std::vector<std::string> fields{std::to_string(visit), id, format_number(stop.position.lat()),
                                            format_number(stop.position.lon()), format_number(tenths(cost)),
                                            format_number(tenths(meters)), format_number(tenths(total_cost)),
                                            format_number(tenths(total_meters))};
            for (const std::string& column : extra_columns) {
                const auto value = stop.stop->find(column);
                fields.push_back(value == stop.stop->end() ? std::string() : cell_text(*value));
            }
            append_csv_row(out, fields);
        } else {
            append_csv_row(out, {std::to_string(visit), id, format_number(cost), format_number(total_cost)});
        }
    };
    row(0, order.at(0).get<std::string>(), 0.0, 0.0, 0.0, 0.0);
    double total_cost = 0.0;
    double total_meters = 0.0;
    for (std::size_t i = 0; i < hops.size(); ++i) {
        const Json& hop = hops[i];
        const double cost = hop.at(on_roads ? "seconds" : "cost").get<double>();
        const double meters = on_roads ? hop.at("meters").get<double>() : 0.0;
        total_cost += cost;
        total_meters += meters;
        row(i + 1, hop.at("to").get<std::string>(), cost, meters, total_cost, total_meters);
    }
    return out;
}

} // namespace ringroad::answers
