#pragma once
// Barrier rules: what a barrier=* node on a road does to a profile. A blocking barrier (a bollard
// for a car) splits the road there so that no route passes; a delaying one (a gate) lets traffic
// through and adds a fixed delay. Values and where the delay is paid: extract/PROFILES.md.

#include "extract/profile.hpp"

#include <cstdint>

namespace osmium { class TagList; }

namespace ringroad::extract {

enum class BarrierEffect : std::uint8_t { none, blocks, delays };

struct BarrierRule {
    BarrierEffect effect = BarrierEffect::none;
    double delay_seconds = 0;   // only for BarrierEffect::delays
};

// The rule for a node's tags (a node without barrier=* has no effect). Access tags on the node
// decide first: no/private block, yes/designated/destination let the profile pass (a gate still
// costs its delay).
BarrierRule evaluate_barrier(const osmium::TagList& tags, const Profile& profile);

} // namespace ringroad::extract
