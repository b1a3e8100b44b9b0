#pragma once
// RegionPlan: an invented region as plain arrays, ready to be written as OSM data. Node i has
// OSM id i + 1, way i id i + 1, restriction i relation id i + 1, so every list is already sorted
// by id. The plan also says how many junctions `ringroad build --profile car` will find in it
// (junction_count.hpp counts them with the extractor's rules).

#include <cstdint>
#include <vector>

namespace ringroad::synth {

// The roads the generator draws; each maps to one set of OSM tags (see SYNTH.md).
enum class RoadKind : std::uint8_t {
    motorway,           // one carriageway of a motorway: oneway=yes, bridge=yes, layer=1
    motorway_link,      // ramp or turnaround (one-way by implication)
    primary,
    secondary,
    tertiary,
    residential,
    cul_de_sac,         // highway=residential ending in the block, named "... Close"
    driveway,           // highway=service, service=driveway, open to cars
    private_service,    // highway=service, access=private: not a car road
    roundabout          // junction=roundabout on a collector (highway=tertiary)
};

enum class BarrierKind : std::uint8_t { bollard, gate };

enum class RestrictionValue : std::uint8_t { no_left_turn, no_right_turn, no_u_turn, only_straight_on };

struct PlannedNode {
    std::int32_t lat;   // 1e-7 degrees
    std::int32_t lon;
};

struct PlannedWay {
    std::uint32_t first_ref;    // into RegionPlan::way_nodes
    std::uint32_t node_count;
    std::uint32_t name_key;     // seed of the invented name (motorways: their number); 0 = no name
    RoadKind kind;
    std::int8_t oneway;         // 0: no tag, +1: oneway=yes, -1: oneway=-1
    std::uint8_t maxspeed;      // km/h; 0 = no tag
};

struct PlannedBarrier {
    std::uint32_t node;
    BarrierKind kind;
};

struct PlannedRestriction {
    std::uint32_t from_way;
    std::uint32_t via_node;
    std::uint32_t to_way;
    RestrictionValue value;
};

// How the layout came out: reported in the summary and checked by the tests.
struct PlanFigures {
    std::uint32_t grid_rows = 0;        // street lines running east-west (before dual carriageways split)
    std::uint32_t grid_columns = 0;
    std::uint32_t roundabouts = 0;
    std::uint32_t motorways = 0;        // carriageway pairs
    std::uint32_t interchanges = 0;
    std::uint32_t cul_de_sacs = 0;      // cul-de-sacs and driveways (the calibration knob)
    std::uint64_t junctions = 0;        // graph vertices `ringroad build --profile car` will make
    double width_m = 0;
    double height_m = 0;
    double min_lat = 0, min_lon = 0, max_lat = 0, max_lon = 0;
};

struct RegionPlan {
    std::vector<PlannedNode> nodes;
    std::vector<std::uint32_t> way_nodes;    // node indices of all ways, concatenated
    std::vector<PlannedWay> ways;
    std::vector<PlannedBarrier> barriers;    // sorted by node
    std::vector<PlannedRestriction> restrictions;
    std::uint64_t seed = 1;
    PlanFigures figures;
};

} // namespace ringroad::synth
