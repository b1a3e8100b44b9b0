#pragma once
// Counters for GET /v1/status: requests served (2xx) and failed (anything else) per endpoint, and
// latency percentiles since start-up from a histogram of logarithmic buckets 5 % wide (so memory
// stays flat however long the service runs and a status request costs the same after a billion
// requests). Safe to record from several threads at once.

#include <nlohmann/json_fwd.hpp>

#include <array>
#include <cstddef>
#include <cstdint>
#include <mutex>
#include <string_view>
#include <vector>

namespace ringroad::service {

enum class Endpoint : std::uint8_t { matrix, tour, network, route, status, reload, other };
inline constexpr std::size_t kEndpointCount = 7;

std::string_view endpoint_name(Endpoint endpoint);

class RequestStats {
public:
    void record(Endpoint endpoint, int http_status, double milliseconds);
    // {"matrix": {"served": n, "failed": n, "latency_ms": {"p50", "p90", "p99", "p999", "max"}}, ...}
    nlohmann::json to_json() const;
    std::uint64_t served(Endpoint endpoint) const;
    std::uint64_t failed(Endpoint endpoint) const;

private:
    struct PerEndpoint {
        std::uint64_t served = 0;
        std::uint64_t failed = 0;
        std::vector<std::uint64_t> buckets;   // bucket_of(milliseconds) -> count
        double max_milliseconds = 0.0;
    };
    mutable std::mutex mutex_;
    std::array<PerEndpoint, kEndpointCount> endpoints_;
};

} // namespace ringroad::service
