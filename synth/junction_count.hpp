#pragma once
// count_car_junctions: the number of graph vertices `ringroad build --profile car` makes from a
// plan, by the extractor's rules (extract/PROFILES.md, "Graph construction"): a node is a vertex
// when car roads use it twice or more, when it ends a car road, or when it is a barrier on one; a
// blocking barrier (bollard) becomes one vertex per road piece ending at it. Private service
// roads are not car roads.

#include "synth/region_plan.hpp"

#include <cstdint>

namespace ringroad::synth {

bool is_car_road(RoadKind kind);

std::uint64_t count_car_junctions(const RegionPlan& plan);

} // namespace ringroad::synth
