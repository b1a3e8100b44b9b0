#pragma once
// plan_street_grid: lays out one invented region of a given grid size (see SYNTH.md): a
// jittered street grid with collectors, arterials (some dual carriageways), roundabouts,
// cul-de-sacs, barriers, private service roads, turn restrictions and a sparse motorway network
// joined to the arterials at diamond interchanges. Pure computation, no I/O.

#include "synth/region_plan.hpp"

#include <cstdint>
#include <vector>

namespace ringroad::synth {

struct GridRequest {
    std::uint32_t rows = 10;        // street lines running east-west (at least 4)
    std::uint32_t columns = 10;     // street lines running north-south (at least 4)
    std::uint64_t seed = 1;
    // A residential link that may hold a cul-de-sac (or driveway) gets one when its own hash is
    // below this: the knob the calibration turns to hit a junction count exactly.
    std::uint64_t cul_de_sac_threshold = 0;
};

// The plan, with figures.junctions filled in. When `candidate_hashes` is given, it receives the
// hash of every link that could hold a cul-de-sac (whether or not it got one).
RegionPlan plan_street_grid(const GridRequest& request, std::vector<std::uint64_t>* candidate_hashes = nullptr);

} // namespace ringroad::synth
