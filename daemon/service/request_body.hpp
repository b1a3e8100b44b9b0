#pragma once
// Reading a request body as JSON, with the exact path of the first fault. A syntax error, a
// number that overflows a double (1e999), invalid UTF-8 or nesting deeper than `max_depth` throws
// answers::RequestError(400, "invalid_json" or "too_deep", message, path), the path naming
// where the parser stood ("stops[3].lat"), empty when the fault is at the top level. The parser is
// nlohmann-json's own SAX parser, which keeps its stack on the heap, so no body can exhaust the
// thread's stack.

#include <nlohmann/json_fwd.hpp>

#include <cstddef>
#include <string_view>

namespace ringroad::service {

// Parsed as ordered_json: further fields of a stop are echoed in the order the client gave them.
nlohmann::ordered_json parse_request_body(std::string_view body, std::size_t max_depth);

} // namespace ringroad::service
