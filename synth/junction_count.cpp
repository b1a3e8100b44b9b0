#include "synth/junction_count.hpp"

#include <vector>

namespace ringroad::synth {

bool is_car_road(RoadKind kind) { return kind != RoadKind::private_service; }

namespace {

// Per node: how often car roads use it (saturating at 2), whether one ends there, its barrier.
constexpr std::uint8_t kUsedOnce = 1;
constexpr std::uint8_t kUsedTwice = 2;
constexpr std::uint8_t kUseMask = 3;
constexpr std::uint8_t kRoadEnd = 4;
constexpr std::uint8_t kBollard = 8;
constexpr std::uint8_t kGate = 16;

} // namespace

std::uint64_t count_car_junctions(const RegionPlan& plan) {
    std::vector<std::uint8_t> state(plan.nodes.size(), 0);
    for (const PlannedBarrier& barrier : plan.barriers) {
        state[barrier.node] |= barrier.kind == BarrierKind::bollard ? kBollard : kGate;
    }
    std::uint64_t bollard_vertices = 0;
    for (const PlannedWay& way : plan.ways) {
        if (!is_car_road(way.kind)) continue;
        for (std::uint32_t position = 0; position < way.node_count; ++position) {
            std::uint8_t& node = state[plan.way_nodes[way.first_ref + position]];
            const bool at_end = position == 0 || position + 1 == way.node_count;
            if ((node & kUseMask) < kUsedTwice) ++node;
            if (at_end) node |= kRoadEnd;
            if (node & kBollard) bollard_vertices += at_end ? 1 : 2;   // one vertex per piece ending there
        }
    }
    std::uint64_t junctions = bollard_vertices;
    for (const std::uint8_t node : state) {
        if ((node & kUseMask) == 0 || (node & kBollard)) continue;
        if ((node & kUseMask) == kUsedTwice || (node & (kRoadEnd | kGate))) ++junctions;
    }
    return junctions;
}

} // namespace ringroad::synth
