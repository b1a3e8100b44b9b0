// The parallel, round-based contraction (router/hierarchy/contraction_rounds.hpp): the hierarchy it builds
// answers exactly what our Dijkstra answers (itself checked against the Boost Graph Library in
// dijkstra_test.cpp), including on graphs made of equal-cost alternatives, where two nodes of
// one round are each other's only witness; and the stored sections are byte for byte the same
// whatever the number of threads.
#include "router/dijkstra.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/hierarchy/hierarchy_query.hpp"
#include "tests/router/test_graphs.hpp"

#include <catch2/catch.hpp>

#include <random>

using namespace ringroad;
using namespace ringroad::router;
using namespace ringroad::router::hierarchy;

namespace {

graph::RoadGraph random_grid(std::uint64_t seed, std::uint32_t rows) {
    test::RandomGridOptions options;
    options.seed = seed;
    options.rows = rows;
    options.columns = rows;
    options.restrictions = rows * rows / 50;
    return test::random_grid_graph(options);
}

// A chain of junctions joined by pairs of identical parallel roads (same ends, length and
// speed): every trip along the chain has two equally cheap ways through each link, and the two
// routing nodes of a link are not adjacent, so a round may contract both at once. Each must then
// not rely on the other as its witness. Invented data in the open Pacific.
graph::RoadGraph twin_road_chain(int links) {
    test::GraphBuilder builder;
    std::vector<graph::VertexId> junctions;
    for (int k = 0; k <= links; ++k) junctions.push_back(builder.add_vertex(16.0, -141.0 + k * 0.001));
    for (int k = 0; k < links; ++k) {
        builder.add_road(junctions[k], junctions[k + 1], 50);
        builder.add_road(junctions[k], junctions[k + 1], 50);
    }
    builder.data().metadata.push_back({"profile", "car"});
    return builder.build();
}

// Every node to every node, hierarchy many-to-many against one Dijkstra per source.
void require_all_pairs_equal_dijkstra(const RoutingGraph& routing_graph, Metric metric, unsigned threads) {
    const ContractionHierarchy hierarchy = ContractionHierarchy::build(routing_graph, metric, nullptr, threads);
    const std::uint32_t n = routing_graph.node_count();
    std::vector<std::vector<WeightedNode>> nodes(n);
    for (NodeId node = 0; node < n; ++node) nodes[node] = {{node, 0}};
    const std::vector<PackedWeight> matrix = hierarchy_many_to_many(hierarchy, nodes, nodes, threads);
    DijkstraWorkspace workspace(n);
    for (NodeId source = 0; source < n; ++source) {
        run_dijkstra(routing_graph, metric, nodes[source], {}, workspace);
        for (NodeId target = 0; target < n; ++target) {
            INFO("from " << source << " to " << target);
            REQUIRE(matrix[std::size_t{source} * n + target] == workspace.distance(target));
        }
    }
}

std::vector<std::byte> section_bytes(const ContractionHierarchy& hierarchy) {
    std::vector<std::byte> bytes;
    for (const graph::ExtraSection& section : hierarchy.to_sections()) {
        bytes.insert(bytes.end(), section.bytes.begin(), section.bytes.end());
    }
    return bytes;
}

} // namespace

TEST_CASE("Rounds: twin roads (equal-cost alternatives everywhere) give Dijkstra's answer for every pair", "[hierarchy][rounds]") {
    const graph::RoadGraph road_graph = twin_road_chain(30);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    REQUIRE(routing_graph.node_count() == 120);
    for (Metric metric : {Metric::time, Metric::distance}) {
        for (unsigned threads : {1u, 2u}) require_all_pairs_equal_dijkstra(routing_graph, metric, threads);
    }
}

// Time metric only: test::random_grid_graph gives bent roads a midpoint whose longitude
// overflows int32, so they measure thousands of kilometres, and distance sums over a dozen of
// them pass 2^64 (beyond the packed-weight contract of router/metric.hpp), where no two engines
// can be asked to agree. The twin-road chain above covers the distance metric.
TEST_CASE("Rounds: every pair of a random grid with turn restrictions equals Dijkstra", "[hierarchy][rounds]") {
    const graph::RoadGraph road_graph = random_grid(77, 14);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    require_all_pairs_equal_dijkstra(routing_graph, Metric::time, 2);
}

TEST_CASE("Rounds: the sections are byte-identical on 1, 2 and 3 threads and from run to run", "[hierarchy][rounds]") {
    const graph::RoadGraph road_graph = random_grid(78, 45);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    for (Metric metric : {Metric::time, Metric::distance}) {
        const std::vector<std::byte> one = section_bytes(ContractionHierarchy::build(routing_graph, metric, nullptr, 1));
        REQUIRE(one == section_bytes(ContractionHierarchy::build(routing_graph, metric, nullptr, 2)));
        REQUIRE(one == section_bytes(ContractionHierarchy::build(routing_graph, metric, nullptr, 3)));
        REQUIRE(one == section_bytes(ContractionHierarchy::build(routing_graph, metric, nullptr, 2)));
    }
    // The whole build command's sections, too.
    REQUIRE(build_hierarchy_sections(road_graph).size() == 18);   // 9 per metric (router/hierarchy/HIERARCHY.md)
    const auto first = build_hierarchy_sections(road_graph);
    const auto second = build_hierarchy_sections(road_graph);
    for (std::size_t k = 0; k < first.size(); ++k) {
        REQUIRE(first[k].tag == second[k].tag);
        REQUIRE(first[k].bytes == second[k].bytes);
    }
}
