#include "extract/profile.hpp"

#include <array>
#include <utility>

namespace ringroad::extract {

namespace {

struct ClassEntry {
    std::string_view highway;
    std::optional<ClassRule> car;
    std::optional<ClassRule> bicycle;
    std::optional<ClassRule> foot;
};

constexpr ClassRule open(double speed) { return {speed, false}; }
constexpr ClassRule with_permission(double speed) { return {speed, true}; }
constexpr std::optional<ClassRule> closed = std::nullopt;

// Default speeds in km/h: common practice (typical free-flow speeds used by routing tools for
// roads without a maxspeed tag), not taken from any one source. Mirrored in extract/PROFILES.md.
const std::array<ClassEntry, 22> kClassTable{{
    {"motorway",       open(110), closed,                   closed},
    {"motorway_link",  open(60),  closed,                   closed},
    {"trunk",          open(90),  open(18),                 open(5)},
    {"trunk_link",     open(50),  open(18),                 open(5)},
    {"primary",        open(70),  open(18),                 open(5)},
    {"primary_link",   open(45),  open(18),                 open(5)},
    {"secondary",      open(60),  open(18),                 open(5)},
    {"secondary_link", open(40),  open(18),                 open(5)},
    {"tertiary",       open(50),  open(18),                 open(5)},
    {"tertiary_link",  open(35),  open(18),                 open(5)},
    {"unclassified",   open(40),  open(18),                 open(5)},
    {"residential",    open(30),  open(18),                 open(5)},
    {"living_street",  open(10),  open(10),                 open(5)},
    {"service",        open(20),  open(15),                 open(5)},
    {"road",           open(30),  open(15),                 open(5)},
    {"track",          open(15),  open(12),                 open(5)},
    {"pedestrian",     closed,    with_permission(10),      open(5)},
    {"footway",        closed,    with_permission(10),      open(5)},
    {"path",           closed,    open(12),                 open(5)},
    {"cycleway",       closed,    open(18),                 open(5)},
    {"bridleway",      closed,    with_permission(8),       open(5)},
    {"steps",          closed,    closed,                   open(3)},
}};

constexpr std::array<std::string_view, 4> kCarAccessKeys{"access", "vehicle", "motor_vehicle", "motorcar"};
constexpr std::array<std::string_view, 3> kBicycleAccessKeys{"access", "vehicle", "bicycle"};
constexpr std::array<std::string_view, 2> kFootAccessKeys{"access", "foot"};

} // namespace

std::string_view Profile::name() const noexcept {
    switch (kind) {
        case ProfileKind::car: return "car";
        case ProfileKind::bicycle: return "bicycle";
        case ProfileKind::foot: return "foot";
    }
    return "car";
}

std::optional<ClassRule> Profile::class_rule(std::string_view highway) const {
    for (const auto& entry : kClassTable) {
        if (entry.highway != highway) continue;
        switch (kind) {
            case ProfileKind::car: return entry.car;
            case ProfileKind::bicycle: return entry.bicycle;
            case ProfileKind::foot: return entry.foot;
        }
    }
    return std::nullopt;
}

double Profile::ferry_speed_kmh() const noexcept {
    // Common practice: a slow ferry including boarding, for ferries without a duration tag.
    switch (kind) {
        case ProfileKind::car: return 15;
        case ProfileKind::bicycle: return 15;
        case ProfileKind::foot: return 15;
    }
    return 15;
}

std::span<const std::string_view> Profile::access_keys() const noexcept {
    switch (kind) {
        case ProfileKind::car: return kCarAccessKeys;
        case ProfileKind::bicycle: return kBicycleAccessKeys;
        case ProfileKind::foot: return kFootAccessKeys;
    }
    return kCarAccessKeys;
}

std::optional<Profile> profile_from_name(std::string_view name) {
    if (name == "car") return Profile{ProfileKind::car};
    if (name == "bicycle") return Profile{ProfileKind::bicycle};
    if (name == "foot") return Profile{ProfileKind::foot};
    return std::nullopt;
}

graph::RoadClass road_class_of(std::string_view highway) {
    using graph::RoadClass;
    static constexpr std::array<std::pair<std::string_view, RoadClass>, 22> kClasses{{
        {"motorway", RoadClass::motorway}, {"motorway_link", RoadClass::motorway_link},
        {"trunk", RoadClass::trunk}, {"trunk_link", RoadClass::trunk_link},
        {"primary", RoadClass::primary}, {"primary_link", RoadClass::primary_link},
        {"secondary", RoadClass::secondary}, {"secondary_link", RoadClass::secondary_link},
        {"tertiary", RoadClass::tertiary}, {"tertiary_link", RoadClass::tertiary_link},
        {"unclassified", RoadClass::unclassified}, {"residential", RoadClass::residential},
        {"living_street", RoadClass::living_street}, {"service", RoadClass::service},
        {"track", RoadClass::track}, {"road", RoadClass::road},
        {"pedestrian", RoadClass::pedestrian}, {"footway", RoadClass::footway},
        {"path", RoadClass::path}, {"cycleway", RoadClass::cycleway},
        {"bridleway", RoadClass::bridleway}, {"steps", RoadClass::steps},
    }};
    for (const auto& [name, road_class] : kClasses) {
        if (name == highway) return road_class;
    }
    return RoadClass::other;
}

} // namespace ringroad::extract
