#pragma once
// Reply: what the service sends back for one request, before it meets HTTP; and the JSON error
// document every refusal carries: {"error": {"code": ..., "field": ..., "message": ...}}, with
// "field" the exact JSON path at fault ("stops[3].lat") or null when the request as a whole is.

#include <string>
#include <string_view>

namespace ringroad::service {

struct Reply {
    int status = 200;
    std::string body;                 // JSON
    bool close_connection = false;    // after a framing error the rest of the stream means nothing
    std::string incident;             // set on a 500: the id in the reply and in the log
    std::string internal_message;     // set on a 500: what went wrong, for the log only
};

Reply error_reply(int status, std::string_view code, std::string_view message, std::string_view field = {});

// The reason phrase of a status code this service uses ("Not Found").
std::string_view reason_phrase(int status);

// A fresh identifier for an unexpected failure, unique within the process and unlikely to repeat
// across restarts: 16 hex digits.
std::string new_incident_id();

} // namespace ringroad::service
