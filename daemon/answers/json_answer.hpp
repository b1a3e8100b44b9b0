#pragma once
// The one entry point both front doors share for the four questions. A JSON request body (the
// service's, or the one the command line builds from its options) is checked field by field,
// turned into the typed request and answered on a loaded region; the answer document is the
// same whichever door asked, apart from timing fields.

#include "common/input_error.hpp"
#include "daemon/answers/loaded_region.hpp"

#include <nlohmann/json.hpp>

#include <cstddef>
#include <string>

namespace ringroad::answers {

enum class Question { matrix, tour, network, route };

// Limits a request must stay within; the service sets them from its flags and shows them in its
// status, the command line uses the defaults.
struct AnswerLimits {
    std::size_t max_stops = 10000;
    std::size_t max_matrix_cells = 25'000'000;
    double default_time_limit_seconds = 1.0;
    double max_time_limit_seconds = 60.0;
    unsigned matrix_threads = 0;  // 0 = all cores
};

// A request the answer layer refuses: `status` is the HTTP status the service answers with (400,
// 404 for an unknown stop, 413 over a size limit, 422 for a well-formed request that cannot be
// answered), `code` a short stable word ("invalid_field", "unknown_stop", "too_large",
// "unreachable", ...), field() the exact JSON path ("stops[3].lat").
class RequestError : public InputError {
public:
    RequestError(int status, std::string code, const std::string& message, std::string field = {})
        : InputError(message, std::move(field)), status_(status), code_(std::move(code)) {}
    int status() const noexcept { return status_; }
    const std::string& code() const noexcept { return code_; }

private:
    int status_;
    std::string code_;
};

// Answers `question` for `body` on `region` (which may be null for a tour or network on a bare
// matrix). Throws RequestError (or InputError) for anything wrong with the request; anything
// else that escapes is an internal error.
nlohmann::ordered_json answer_json(Question question, const nlohmann::json& body, const LoadedRegion* region,
                                   const AnswerLimits& limits = {});
// The same for a body parsed as ordered_json: further fields of a stop are echoed in the order
// given (nlohmann::json sorts object fields by name). The command line uses this one.
nlohmann::ordered_json answer_json(Question question, const nlohmann::ordered_json& body, const LoadedRegion* region,
                                   const AnswerLimits& limits = {});

} // namespace ringroad::answers
