#pragma once
// Profile: what one mode of travel (car, bicycle, foot) may use and how fast it goes there.
// The values are documented in extract/PROFILES.md; changing one here means changing it there.

#include "graph/road_graph.hpp"

#include <cstdint>
#include <optional>
#include <span>
#include <string_view>

namespace ringroad::extract {

enum class ProfileKind : std::uint8_t { car, bicycle, foot };

// How a profile treats one highway=* class.
struct ClassRule {
    double speed_kmh = 0;          // default speed when no usable maxspeed applies
    bool needs_permission = false; // a road only when an access tag of the profile says yes
};

struct Profile {
    ProfileKind kind = ProfileKind::car;

    std::string_view name() const noexcept;

    // The rule for a highway=* class, or nullopt when the class is never a road for this profile
    // (motorway for a bicycle, steps for a car, construction and proposed for everyone).
    std::optional<ClassRule> class_rule(std::string_view highway) const;

    // Speed on a ferry without a usable duration tag (km/h).
    double ferry_speed_kmh() const noexcept;

    // Whether legal speed limits (maxspeed) bound the speed; a pedestrian ignores them.
    bool uses_maxspeed() const noexcept { return kind != ProfileKind::foot; }

    // Whether oneway=* binds this profile; a pedestrian may walk both ways on a one-way street.
    bool follows_oneway() const noexcept { return kind != ProfileKind::foot; }

    // Access tags read for this profile, from the most general to the most specific; the most
    // specific one present with a known value decides (access < vehicle < motor_vehicle <
    // motorcar for a car).
    std::span<const std::string_view> access_keys() const noexcept;

    // Turn restrictions bind motor vehicles; the other profiles ignore them.
    bool reads_turn_restrictions() const noexcept { return kind == ProfileKind::car; }
};

// "car", "bicycle" or "foot"; nullopt for anything else.
std::optional<Profile> profile_from_name(std::string_view name);

// The road class kept on an edge for a highway=* value (RoadClass::other when unknown).
graph::RoadClass road_class_of(std::string_view highway);

} // namespace ringroad::extract
