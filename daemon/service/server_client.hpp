#pragma once
// The command line's way to a running service (`--server URL`): posts the JSON request body the
// command built to /v1/<question> and returns the answer document, so the command prints it
// exactly as if it had computed it. URL: http://HOST:PORT (an IP literal or localhost, IPv6 in
// brackets) or unix:/path/to.sock. A refusal from the service comes back as the same
// answers::RequestError the command would have raised itself (exit 1); a service that cannot be
// reached, or a 5xx, is an InputError naming the URL. If the environment variable RINGROAD_TOKEN
// is set it is sent as the bearer token.

#include "daemon/answers/json_answer.hpp"

#include <nlohmann/json.hpp>

#include <string>

namespace ringroad::service {

nlohmann::ordered_json answer_from_server(const std::string& url, answers::Question question,
                                          const nlohmann::ordered_json& body);

} // namespace ringroad::service
