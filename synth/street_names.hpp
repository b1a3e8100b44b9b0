#pragma once
// Invented names for the roads of a synthetic region: three made-up syllables ("Belaford",
// "Corimere") and a suffix that fits the road ("Close" for a cul-de-sac, "Parkway" for an
// arterial). No list of real places is involved; the same key always gives the same name.

#include "synth/region_plan.hpp"

#include <cstdint>
#include <string>

namespace ringroad::synth {

// The bare invented word for a key.
std::string invented_word(std::uint64_t key);

// The name tag of a way of this kind, or an empty string (roundabouts, driveways, private roads).
std::string invented_road_name(RoadKind kind, std::uint32_t name_key, std::uint64_t seed);

} // namespace ringroad::synth
