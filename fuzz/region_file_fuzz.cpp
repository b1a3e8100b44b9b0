// Fuzz target: the region-file loader (graph::load_road_graph) and what every command does next
// with the graph it returns: walk it, check its stored hierarchies as `info` does, build the
// router, snap two points, route between them and make a 2 x 2 matrix on each metric. The loader
// promises that a file it accepts is consistent (graph/FORMAT.md), so any crash after a load that
// did not throw is a finding, whichever component it happens in. InputError is the expected way
// out; any other exception is a finding too (the command line would call it an internal error).
// Every input is sealed first (region_file_seal.hpp: this build's version, right checksums), and
// findings are kept sealed: each is a region file the loader accepts today.

#include "common/input_error.hpp"
#include "fuzz/region_file_seal.hpp"
#include "fuzz/scratch_file.hpp"
#include "graph/graph_file.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/road_router.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <vector>

namespace {

using namespace ringroad;

// Touches every record the way the commands do: adjacency, edge heads, segment geometry, names,
// restrictions and components.
std::uint64_t walk(const graph::RoadGraph& road_graph) {
    std::uint64_t sum = road_graph.component_count();
    for (graph::VertexId v = 0; v < road_graph.vertex_count(); ++v) {
        sum += road_graph.components()[v];
        for (const graph::Edge& edge : road_graph.out_edges(v)) {
            sum += static_cast<std::uint64_t>(road_graph.coordinate(edge.head).lat_e7);
            sum += road_graph.segments()[edge.segment].length_dm;
        }
    }
    for (graph::SegmentId s = 0; s < road_graph.segment_count(); ++s) {
        sum += road_graph.segment_geometry(s).size();
        sum += road_graph.name(road_graph.segments()[s].name).size();
    }
    for (const graph::TurnRestriction& restriction : road_graph.turn_restrictions()) {
        sum += road_graph.segments()[restriction.from_segment].length_dm;
        sum += road_graph.segments()[restriction.to_segment].length_dm;
        sum += static_cast<std::uint64_t>(road_graph.coordinate(restriction.via_vertex).lon_e7);
    }
    return sum;
}

void check_hierarchies(const graph::RoadGraph& road_graph) {
    std::optional<router::RoutingGraph> routing_graph;
    for (const router::Metric metric : {router::Metric::time, router::Metric::distance}) {
        if (!router::hierarchy::has_hierarchy_sections(road_graph, metric)) continue;
        if (!routing_graph) routing_graph.emplace(road_graph, router::RestrictionPolicy::automatic);
        (void)router::hierarchy::ContractionHierarchy::from_sections(road_graph, *routing_graph, metric);
    }
}

void route_and_match(graph::RoadGraph road_graph) {
    if (road_graph.vertex_count() == 0) return;
    const graph::Coordinate first = road_graph.coordinate(0);
    const graph::Coordinate last = road_graph.coordinate(road_graph.vertex_count() - 1);
    router::RouterOptions options;
    options.threads = 1;
    const router::RoadRouter router(std::move(road_graph), options);
    std::vector<router::SnappedStop> stops;
    stops.push_back(router.snap("a", first.lat(), first.lon()));
    stops.push_back(router.snap("b", last.lat(), last.lon()));
    for (const router::Metric metric : {router::Metric::time, router::Metric::distance}) {
        (void)router.route(stops[0], stops[1], metric);
        (void)router.matrix(stops, metric);
    }
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    static fuzz::ScratchFile scratch(".rrg");
    std::vector<std::uint8_t> sealed(data, data + size);
    fuzz::seal_region_file(sealed.data(), sealed.size());
    try {
        graph::RoadGraph road_graph = graph::load_road_graph(scratch.write(sealed.data(), sealed.size()));
        volatile std::uint64_t sink = walk(road_graph);
        (void)sink;
        check_hierarchies(road_graph);
        route_and_match(std::move(road_graph));
    } catch (const InputError&) {
        // A refusal with a message: what a bad file should get.
    }
    return 0;
}
