#pragma once
// Way rules: whether an OSM way is a road for a profile, in which directions it may be travelled,
// how fast, and which flags its edges carry. Pure functions of the way's tags; the rules and their
// values are written down in extract/PROFILES.md.

#include "extract/profile.hpp"
#include "graph/road_graph.hpp"

#include <cstdint>
#include <optional>

namespace osmium { class TagList; }

namespace ringroad::extract {

struct WayRule {
    bool is_road = false;           // false: the way is ignored by this profile
    bool forward = false;           // travel along the way's node order is allowed
    bool backward = false;          // travel against it is allowed
    double forward_speed_kmh = 0;
    double backward_speed_kmh = 0;
    graph::RoadClass road_class = graph::RoadClass::other;
    std::uint16_t flags = 0;        // graph::edge_flag bits
    // A ferry with a readable duration=* tag: the whole crossing takes this long, shared among
    // its segments in proportion to their lengths.
    std::optional<double> ferry_duration_seconds;
};

WayRule evaluate_way(const osmium::TagList& tags, const Profile& profile);

// How an access value reads: "no"/"private" and kin close the road, "destination" and kin open it
// for access to places along it only, "yes"/"designated" and kin open it. unknown: ignored.
enum class AccessVerdict : std::uint8_t { unknown, allowed, destination, denied };
AccessVerdict access_verdict(const char* value);

// The verdict of the most specific access key of `profile` with a known value on `tags`.
AccessVerdict profile_access(const osmium::TagList& tags, const Profile& profile);

} // namespace ringroad::extract
