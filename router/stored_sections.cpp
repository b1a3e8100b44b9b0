#include "router/stored_sections.hpp"

#include "router/snap_index.hpp"

namespace ringroad::router {

std::vector<graph::ExtraSection> build_query_sections(const graph::RoadGraph& road_graph, RestrictionPolicy policy) {
    std::vector<graph::ExtraSection> sections = RoutingGraph(road_graph, policy).to_sections();
    for (auto& section : snapping::PackedPieceIndex::build_sections(road_graph)) sections.push_back(std::move(section));
    return sections;
}

} // namespace ringroad::router
