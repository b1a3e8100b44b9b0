#include "daemon/service/request_stats.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>

namespace ringroad::service {

std::string_view endpoint_name(Endpoint endpoint) {
    switch (endpoint) {
    case Endpoint::matrix: return "matrix";
    case Endpoint::tour: return "tour";
    case Endpoint::network: return "network";
    case Endpoint::route: return "route";
    case Endpoint::status: return "status";
    case Endpoint::reload: return "reload";
    case Endpoint::other: return "other";
    }
    return "other";
}

namespace {

// Bucket b holds latencies up to kSmallest * kGrowth^b milliseconds; 420 buckets reach an hour.
constexpr double kSmallest = 0.01;
constexpr double kGrowth = 1.05;
constexpr std::size_t kBuckets = 420;

std::size_t bucket_of(double milliseconds) {
    if (!(milliseconds > kSmallest)) return 0;
    const double b = std::ceil(std::log(milliseconds / kSmallest) / std::log(kGrowth));
    return std::min<std::size_t>(static_cast<std::size_t>(b), kBuckets - 1);
}

double bucket_top(std::size_t bucket) { return kSmallest * std::pow(kGrowth, static_cast<double>(bucket)); }

double rounded(double milliseconds) { return std::round(milliseconds * 1000.0) / 1000.0; }

// Nearest rank: the top of the first bucket by which p% of the requests are counted, never above
// the largest latency seen.
double percentile(const std::vector<std::uint64_t>& buckets, std::uint64_t total, double p, double max) {
    const auto rank = static_cast<std::uint64_t>(std::ceil(p / 100.0 * static_cast<double>(total)));
    std::uint64_t seen = 0;
    for (std::size_t b = 0; b < buckets.size(); ++b) {
        seen += buckets[b];
        if (seen >= std::max<std::uint64_t>(rank, 1)) return std::min(bucket_top(b), max);
    }
    return max;
}

} // namespace

void RequestStats::record(Endpoint endpoint, int http_status, double milliseconds) {
    std::lock_guard lock(mutex_);
    PerEndpoint& counts = endpoints_[static_cast<std::size_t>(endpoint)];
    (http_status >= 200 && http_status < 300 ? counts.served : counts.failed) += 1;
    if (counts.buckets.empty()) counts.buckets.assign(kBuckets, 0);
    counts.buckets[bucket_of(milliseconds)] += 1;
    counts.max_milliseconds = std::max(counts.max_milliseconds, milliseconds);
}

std::uint64_t RequestStats::served(Endpoint endpoint) const {
    std::lock_guard lock(mutex_);
    return endpoints_[static_cast<std::size_t>(endpoint)].served;
}

std::uint64_t RequestStats::failed(Endpoint endpoint) const {
    std::lock_guard lock(mutex_);
    return endpoints_[static_cast<std::size_t>(endpoint)].failed;
}

nlohmann::json RequestStats::to_json() const {
    std::array<PerEndpoint, kEndpointCount> copy;
    {
        std::lock_guard lock(mutex_);
        copy = endpoints_;
    }
    nlohmann::json all = nlohmann::json::object();
    for (std::size_t i = 0; i < kEndpointCount; ++i) {
        const PerEndpoint& counts = copy[i];
        const std::uint64_t total = counts.served + counts.failed;
        nlohmann::json latency = nlohmann::json::object();
        if (total > 0) {
            for (const auto& [name, p] : {std::pair{"p50", 50.0}, {"p90", 90.0}, {"p99", 99.0}, {"p999", 99.9}}) {
                latency[name] = rounded(percentile(counts.buckets, total, p, counts.max_milliseconds));
            }
            latency["max"] = rounded(counts.max_milliseconds);
        }
        all[std::string(endpoint_name(static_cast<Endpoint>(i)))] = {
            {"served", counts.served}, {"failed", counts.failed}, {"latency_ms", latency}};
    }
    return all;
}

} // namespace ringroad::service
