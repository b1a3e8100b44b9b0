#pragma once
// The service's endpoints, apart from HTTP: which endpoint a method and path name (404 for an
// unknown path, 405 for a known path with the wrong method), and the answer to one of the four
// questions as a Reply. answer_request runs on a worker thread; every failure becomes a JSON
// error reply: RequestError keeps its status, code and field, InputError is a 400, anything else
// a 500 with an incident id (the caller logs it with internal_message).

#include "daemon/answers/json_answer.hpp"
#include "daemon/service/reply.hpp"
#include "daemon/service/request_stats.hpp"
#include "daemon/service/service_options.hpp"

#include <optional>
#include <string_view>

namespace ringroad::service {

struct RouteMatch {
    Endpoint endpoint = Endpoint::other;
    std::optional<answers::Question> question;   // for the four questions
    std::optional<Reply> refusal;                // 404 or 405
};

RouteMatch route_request(std::string_view method, std::string_view target);

// `answer` empty: answers::answer_json.
Reply answer_request(answers::Question question, std::string_view body, const answers::LoadedRegion* region,
                     const answers::AnswerLimits& limits, std::size_t max_json_depth, const AnswerFunction& answer = {});

} // namespace ringroad::service
