#pragma once
// Everything `ringroad serve` is configured with: the region file named at start-up, where to
// listen, how many worker threads compute, the limits a request must stay within and the
// timeouts that keep slow or silent clients from holding connections. Every limit has a default
// that suits one dispatcher's office on a small machine (common practice; the README lists them)
// and is shown by GET /v1/status.

#include "daemon/answers/json_answer.hpp"
#include "daemon/service/listen_address.hpp"

#include <chrono>
#include <cstddef>
#include <functional>
#include <ostream>
#include <string>

namespace ringroad::service {

struct ServiceLimits {
    std::size_t max_body_bytes = 8u << 20;        // 413 beyond
    std::size_t max_header_bytes = 16u << 10;     // 431 beyond
    std::size_t max_stops = 10000;                // 413 beyond (per request)
    std::size_t max_matrix_cells = 4'000'000;     // 413 beyond: a 2000 x 2000 matrix
    std::size_t max_queued = 64;                  // requests waiting for a worker; 429 beyond
    std::size_t max_json_depth = 64;              // 400 beyond: no request needs more than a few levels
    double default_time_limit_seconds = 1.0;      // a tour's budget when the request names none
    double max_time_limit_seconds = 30.0;         // the cap on a request's "time_limit"
    std::chrono::milliseconds header_timeout{10'000};  // from the first byte to the end of the headers
    std::chrono::milliseconds body_timeout{30'000};    // from the end of the headers to the end of the body
    std::chrono::milliseconds idle_timeout{60'000};    // between requests on a kept-alive connection
    std::chrono::milliseconds stop_wait{30'000};       // how long a stop waits for requests in flight
};

// What answers the four questions: answers::answer_json unless a test puts in a slow or failing
// one (fault injection: the 500 path, a full queue, a stop with work in flight).
using AnswerFunction = std::function<nlohmann::ordered_json(answers::Question, const nlohmann::ordered_json&,
                                                            const answers::LoadedRegion*, const answers::AnswerLimits&)>;

struct ServiceOptions {
    std::string region_path;        // loaded at start-up and on every reload; never from a request
    ListenAddress listen;
    unsigned threads = 0;           // worker threads; 0 = one per core
    ServiceLimits limits;
    std::string token;              // non-empty: every request needs "Authorization: Bearer <token>"
    std::ostream* log = nullptr;    // one line per request and the service's notices; null = silent
    AnswerFunction answer;          // empty: answers::answer_json
};

} // namespace ringroad::service
