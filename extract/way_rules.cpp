#include "extract/way_rules.hpp"

#include "extract/maxspeed.hpp"

#include <osmium/osm/tag.hpp>

#include <algorithm>
#include <array>
#include <cstring>
#include <string_view>

namespace ringroad::extract {

namespace {

bool is_one_of(const char* value, std::initializer_list<std::string_view> choices) {
    if (value == nullptr) return false;
    return std::find(choices.begin(), choices.end(), std::string_view(value)) != choices.end();
}

std::string_view tag(const osmium::TagList& tags, const char* key) {
    const char* value = tags.get_value_by_key(key);
    return value == nullptr ? std::string_view{} : std::string_view{value};
}

enum class Direction : std::uint8_t { both, forward, backward, excluded };

// oneway=* and its bicycle exceptions. Implied one-way: motorway, motorway_link and
// junction=roundabout|circular, unless oneway=* says otherwise.
Direction travel_direction(const osmium::TagList& tags, const Profile& profile, std::string_view highway) {
    if (!profile.follows_oneway()) return Direction::both;
    const char* oneway = tags.get_value_by_key("oneway");
    Direction direction = Direction::both;
    if (is_one_of(oneway, {"yes", "true", "1"})) {
        direction = Direction::forward;
    } else if (is_one_of(oneway, {"-1", "reverse"})) {
        direction = Direction::backward;
    } else if (is_one_of(oneway, {"no", "false", "0"})) {
        direction = Direction::both;
    } else if (is_one_of(oneway, {"reversible", "alternating"})) {
        // The open direction changes with the time of day; a static graph cannot say which.
        return Direction::excluded;
    } else {
        const bool implied = highway == "motorway" || highway == "motorway_link" ||
                             is_one_of(tags.get_value_by_key("junction"), {"roundabout", "circular"});
        direction = implied ? Direction::forward : Direction::both;
    }
    if (profile.kind != ProfileKind::bicycle) return direction;

    const char* bicycle_oneway = tags.get_value_by_key("oneway:bicycle");
    if (is_one_of(bicycle_oneway, {"yes", "true", "1"})) return Direction::forward;
    if (is_one_of(bicycle_oneway, {"-1", "reverse"})) return Direction::backward;
    if (is_one_of(bicycle_oneway, {"no", "false", "0"})) return Direction::both;
    for (const char* key : {"cycleway", "cycleway:left", "cycleway:right", "cycleway:both"}) {
        if (tag(tags, key).starts_with("opposite")) return Direction::both;   // opposite, opposite_lane, opposite_track
    }
    return direction;
}

// Speed in one direction: the class default, bounded by maxspeed (or maxspeed:forward /
// maxspeed:backward). A car drives at the posted limit; a bicycle at most at its own pace.
double directed_speed_kmh(const osmium::TagList& tags, const Profile& profile, double class_speed,
                          const char* directed_key) {
    if (!profile.uses_maxspeed()) return class_speed;
    std::optional<double> limit;
    if (const char* directed = tags.get_value_by_key(directed_key)) limit = parse_maxspeed_kmh(directed);
    if (!limit) {
        if (const char* general = tags.get_value_by_key("maxspeed")) limit = parse_maxspeed_kmh(general);
    }
    if (!limit) return class_speed;
    if (profile.kind == ProfileKind::car) return *limit;
    return std::min(class_speed, *limit);
}

std::uint16_t common_flags(const osmium::TagList& tags, const Profile& profile, AccessVerdict access) {
    std::uint16_t flags = 0;
    const bool toll = is_one_of(tags.get_value_by_key("toll"), {"yes"}) ||
                      (profile.kind == ProfileKind::car && is_one_of(tags.get_value_by_key("toll:motorcar"), {"yes"}));
    if (toll) flags |= graph::edge_flag::toll;
    if (access == AccessVerdict::destination) flags |= graph::edge_flag::destination_only;
    if (is_one_of(tags.get_value_by_key("junction"), {"roundabout", "circular"})) flags |= graph::edge_flag::roundabout;
    if (is_one_of(tags.get_value_by_key("surface"),
                  {"unpaved", "gravel", "fine_gravel", "compacted", "dirt", "earth", "ground", "grass",
                   "mud", "sand", "pebblestone", "rock"})) {
        flags |= graph::edge_flag::unpaved;
    }
    return flags;
}

// route=ferry: a car boards only where a vehicle access tag says so (many ferries carry
// pedestrians only); a bicycle or a pedestrian boards unless told not to.
WayRule evaluate_ferry(const osmium::TagList& tags, const Profile& profile, AccessVerdict access) {
    WayRule rule;
    const bool boards = profile.kind == ProfileKind::car
                            ? (access == AccessVerdict::allowed || access == AccessVerdict::destination)
                            : access != AccessVerdict::denied;
    if (!boards) return rule;
    rule.is_road = true;
    rule.forward = rule.backward = true;
    rule.forward_speed_kmh = rule.backward_speed_kmh = profile.ferry_speed_kmh();
    rule.road_class = graph::RoadClass::ferry;
    rule.flags = common_flags(tags, profile, access) | graph::edge_flag::ferry;
    if (const char* duration = tags.get_value_by_key("duration")) {
        rule.ferry_duration_seconds = parse_duration_seconds(duration);
    }
    return rule;
}

} // namespace

AccessVerdict access_verdict(const char* value) {
    if (is_one_of(value, {"yes", "designated", "permissive", "official"})) return AccessVerdict::allowed;
    if (is_one_of(value, {"destination", "delivery", "customers"})) return AccessVerdict::destination;
    if (is_one_of(value, {"no", "private", "agricultural", "forestry", "emergency", "military",
                          "use_sidepath"})) {
        return AccessVerdict::denied;
    }
    return AccessVerdict::unknown;
}

AccessVerdict profile_access(const osmium::TagList& tags, const Profile& profile) {
    AccessVerdict verdict = AccessVerdict::unknown;
    for (std::string_view key : profile.access_keys()) {
        // The keys are string literals, so data() is NUL-terminated.
        const auto value = access_verdict(tags.get_value_by_key(key.data()));
        if (value != AccessVerdict::unknown) verdict = value;
    }
    return verdict;
}

WayRule evaluate_way(const osmium::TagList& tags, const Profile& profile) {
    WayRule rule;
    // Most ways of an extract are buildings, land use and the like: settle those first.
    const std::string_view highway = tag(tags, "highway");
    const bool ferry = highway.empty() && tag(tags, "route") == "ferry";
    if (highway.empty() && !ferry) return rule;
    if (is_one_of(tags.get_value_by_key("area"), {"yes"})) return rule;
    const AccessVerdict access = profile_access(tags, profile);
    if (access == AccessVerdict::denied) return rule;
    if (ferry) return evaluate_ferry(tags, profile, access);

    const auto class_rule = profile.class_rule(highway);   // construction, proposed: no rule
    if (!class_rule) return rule;
    if (class_rule->needs_permission && access != AccessVerdict::allowed && access != AccessVerdict::destination) {
        return rule;
    }
    if (profile.kind != ProfileKind::car && is_one_of(tags.get_value_by_key("motorroad"), {"yes"})) return rule;

    const Direction direction = travel_direction(tags, profile, highway);
    if (direction == Direction::excluded) return rule;

    rule.is_road = true;
    rule.forward = direction != Direction::backward;
    rule.backward = direction != Direction::forward;
    rule.forward_speed_kmh = directed_speed_kmh(tags, profile, class_rule->speed_kmh, "maxspeed:forward");
    rule.backward_speed_kmh = directed_speed_kmh(tags, profile, class_rule->speed_kmh, "maxspeed:backward");
    rule.road_class = road_class_of(highway);
    rule.flags = common_flags(tags, profile, access);
    return rule;
}

} // namespace ringroad::extract
