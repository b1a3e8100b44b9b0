#pragma once
// How a command hands its question to the answer layer (daemon/answers/): the stops CSV or
// MATRIX.csv becomes the same JSON request body the service takes, the answer comes back as a
// document, and a refusal is reworded for the command line: a field path that came from a file
// ("stops[3]") names the file and line, an option ("start", "snap_radius") its flag.

#include "daemon/answers/json_answer.hpp"
#include "planners/matrices/cost_matrix.hpp"
#include "router/stops.hpp"

#include <nlohmann/json.hpp>

#include <functional>
#include <string>

namespace ringroad::cli {

// [{"id", "lat", "lon", <further columns as strings>}, ...] in file order.
nlohmann::ordered_json stops_body(const router::StopList& stops);
// {"ids": [...], "costs": [[...]]} with null for an empty cell.
nlohmann::ordered_json matrix_body(const planners::matrices::LabelledMatrix& matrix);

// The limits of a one-shot command: the answer layer's defaults, with the table size raised to
// what half of this machine's memory holds and the tour time limit capped at a day.
answers::AnswerLimits command_line_limits();

// Runs `answer` and rethrows a RequestError as an InputError in command-line terms (`stops` may
// be null when the stops did not come from a file).
nlohmann::ordered_json answer_for_command_line(const std::function<nlohmann::ordered_json()>& answer,
                                               const router::StopList* stops);

} // namespace ringroad::cli
