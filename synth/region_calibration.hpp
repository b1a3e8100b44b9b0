#pragma once
// plan_region: the invented region whose car graph has a requested number of junctions.
//
// The grid size is guessed from the request, planned, and rescaled until the junction count
// lies within reach of the one knob that changes it in steps of exactly two: how many
// residential links carry a cul-de-sac or driveway (each adds a T-junction and a dead end).
// The final plan then picks the cul-de-sacs with the smallest hashes, so the count lands on the
// request (within one, or within a few percent when the knob runs out at the smallest sizes).

#include "synth/region_plan.hpp"

#include <cstdint>

namespace ringroad { class Progress; }

namespace ringroad::synth {

inline constexpr std::uint64_t kMinJunctions = 100;
inline constexpr std::uint64_t kMaxJunctions = 20'000'000;

// Throws InputError naming --junctions when `junctions` is outside [kMinJunctions, kMaxJunctions].
// `progress` may be null.
RegionPlan plan_region(std::uint64_t junctions, std::uint64_t seed, Progress* progress);

} // namespace ringroad::synth
