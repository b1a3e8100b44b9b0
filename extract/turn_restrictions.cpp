#include "extract/turn_restrictions.hpp"

#include <osmium/osm/relation.hpp>
#include <osmium/osm/tag.hpp>

#include <cstring>
#include <string_view>

namespace ringroad::extract {

namespace {

bool exempts_cars(const char* except) {
    if (except == nullptr) return false;
    std::string_view list{except};
    while (!list.empty()) {
        const auto separator = list.find(';');
        std::string_view item = list.substr(0, separator);
        while (!item.empty() && item.front() == ' ') item.remove_prefix(1);
        while (!item.empty() && item.back() == ' ') item.remove_suffix(1);
        if (item == "motorcar" || item == "motor_vehicle" || item == "vehicle") return true;
        if (separator == std::string_view::npos) break;
        list.remove_prefix(separator + 1);
    }
    return false;
}

void read_members(const osmium::Relation& relation, CollectedRestriction& restriction) {
    int via_nodes = 0;
    for (const auto& member : relation.members()) {
        const std::string_view role{member.role()};
        if (role == "from" && member.type() == osmium::item_type::way) {
            restriction.from_ways.push_back(member.ref());
        } else if (role == "to" && member.type() == osmium::item_type::way) {
            restriction.to_ways.push_back(member.ref());
        } else if (role == "via") {
            if (member.type() != osmium::item_type::node) {
                restriction.readable = false;   // via ways are not supported
                continue;
            }
            restriction.via_node = member.ref();
            ++via_nodes;
        }
    }
    if (via_nodes != 1 || restriction.from_ways.empty() || restriction.to_ways.empty()) restriction.readable = false;
}

} // namespace

std::optional<CollectedRestriction> read_turn_restriction(const osmium::Relation& relation, const Profile& profile) {
    if (!profile.reads_turn_restrictions()) return std::nullopt;
    const auto& tags = relation.tags();
    const char* type = tags.get_value_by_key("type");
    if (type == nullptr || (std::strcmp(type, "restriction") != 0 && std::strcmp(type, "restriction:motorcar") != 0)) {
        return std::nullopt;
    }
    const char* value = tags.get_value_by_key("restriction:motorcar");
    if (value == nullptr) value = tags.get_value_by_key("restriction");
    if (value == nullptr) return std::nullopt;   // only for other vehicles (restriction:hgv, ...)
    if (exempts_cars(tags.get_value_by_key("except"))) return std::nullopt;

    CollectedRestriction restriction;
    restriction.relation_id = relation.id();
    const std::string_view kind{value};
    if (kind.starts_with("no_")) {
        restriction.kind = graph::RestrictionKind::no_turn;
    } else if (kind.starts_with("only_")) {
        restriction.kind = graph::RestrictionKind::only_turn;
    } else {
        restriction.readable = false;
    }
    read_members(relation, restriction);
    return restriction;
}

} // namespace ringroad::extract
