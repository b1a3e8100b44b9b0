#pragma once
// Metrics and the packed integer weight every engine minimises.
//
// A path cost is a pair (travel time in tenths of a second, length in decimetres). The metric
// `time` minimises time first and length second; `distance` the other way round. Packing the
// primary quantity into the high 32 bits and the secondary into the low 32 bits of one uint64
// makes plain integer addition and comparison exactly that lexicographic order, as long as a
// path's secondary total stays below 2^32 (430 000 km or 13.6 years): Dijkstra and the
// hierarchy then agree not only on the optimum but on the length reported alongside it.

#include <cstdint>
#include <limits>
#include <optional>
#include <string_view>

namespace ringroad::router {

enum class Metric : std::uint8_t { time = 0, distance = 1 };

// "time" / "distance"; nullopt otherwise.
std::optional<Metric> metric_from_name(std::string_view name);
std::string_view metric_name(Metric metric);

using PackedWeight = std::uint64_t;
inline constexpr PackedWeight kUnreachableWeight = std::numeric_limits<PackedWeight>::max();

inline PackedWeight pack_weight(Metric metric, std::uint64_t time_ds, std::uint64_t length_dm) {
    return metric == Metric::time ? (time_ds << 32) | length_dm : (length_dm << 32) | time_ds;
}
inline std::uint64_t weight_time_ds(Metric metric, PackedWeight weight) {
    return metric == Metric::time ? weight >> 32 : weight & 0xffffffffu;
}
inline std::uint64_t weight_length_dm(Metric metric, PackedWeight weight) {
    return metric == Metric::time ? weight & 0xffffffffu : weight >> 32;
}

} // namespace ringroad::router
