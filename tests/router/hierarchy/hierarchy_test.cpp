// The contraction hierarchy must agree exactly with Dijkstra (itself checked against the Boost
// Graph Library in dijkstra_test.cpp): random pairs, whole matrices, paths, stored sections.
#include "graph/graph_file.hpp"
#include "router/dijkstra.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/hierarchy/hierarchy_query.hpp"
#include "router/road_router.hpp"
#include "tests/router/test_graphs.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cstring>
#include <random>

using namespace ringroad;
using namespace ringroad::router;
using namespace ringroad::router::hierarchy;

namespace {

graph::RoadGraph grid(std::uint64_t seed, std::uint32_t rows = 30, std::uint32_t columns = 30) {
    test::RandomGridOptions options;
    options.seed = seed;
    options.rows = rows;
    options.columns = columns;
    return test::random_grid_graph(options);
}

// Sum of the weights along a node path (entering each node after the first costs its weight).
PackedWeight path_weight(const RoutingGraph& graph, Metric metric, const std::vector<NodeId>& path) {
    PackedWeight sum = 0;
    for (std::size_t i = 1; i < path.size(); ++i) {
        const auto successors = graph.successors(path[i - 1]);
        REQUIRE(std::find(successors.begin(), successors.end(), path[i]) != successors.end());
        sum += graph.node_weight(metric, path[i]);
    }
    return sum;
}

} // namespace

TEST_CASE("Hierarchy point-to-point equals Dijkstra on random grids, with unpacked paths", "[hierarchy]") {
    for (Metric metric : {Metric::time, Metric::distance}) {
        for (std::uint64_t seed : {21u, 22u}) {
            const graph::RoadGraph road_graph = grid(seed);
            const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
            const ContractionHierarchy hierarchy = ContractionHierarchy::build(routing_graph, metric);
            REQUIRE(hierarchy.node_count() == routing_graph.node_count());
            HierarchySearch search(hierarchy);
            DijkstraWorkspace workspace(routing_graph.node_count());
            std::mt19937_64 random(seed);
            for (int pair = 0; pair < 1000; ++pair) {
                const WeightedNode start{static_cast<NodeId>(random() % routing_graph.node_count()), 0};
                const WeightedNode end{static_cast<NodeId>(random() % routing_graph.node_count()), 0};
                const NodeId target = end.node;
                run_dijkstra(routing_graph, metric, {&start, 1}, {&target, 1}, workspace);
                std::vector<NodeId> path;
                const PackedWeight ours = search.shortest({&start, 1}, {&end, 1}, &path);
                INFO("pair " << start.node << " -> " << end.node);
                REQUIRE(ours == workspace.distance(target));
                if (ours != kUnreachableWeight) {
                    REQUIRE(path.front() == start.node);
                    REQUIRE(path.back() == end.node);
                    REQUIRE(path_weight(routing_graph, metric, path) == ours);
                }
            }
        }
    }
}

TEST_CASE("Hierarchy many-to-many equals Dijkstra on whole random matrices with weighted ends", "[hierarchy]") {
    const graph::RoadGraph road_graph = grid(31, 35, 35);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    const ContractionHierarchy hierarchy = ContractionHierarchy::build(routing_graph, Metric::time);
    std::mt19937_64 random(5);
    const auto random_ends = [&] {
        std::vector<WeightedNode> ends;
        for (int k = 0; k < 2; ++k) {
            ends.push_back({static_cast<NodeId>(random() % routing_graph.node_count()),
                            pack_weight(Metric::time, random() % 300, random() % 900)});
        }
        return ends;
    };
    std::vector<std::vector<WeightedNode>> starts(60), ends(70);
    for (auto& start : starts) start = random_ends();
    for (auto& end : ends) end = random_ends();
    const std::vector<PackedWeight> matrix = hierarchy_many_to_many(hierarchy, starts, ends, 2);
    DijkstraWorkspace workspace(routing_graph.node_count());
    for (std::size_t i = 0; i < starts.size(); ++i) {
        run_dijkstra(routing_graph, Metric::time, starts[i], {}, workspace);
        for (std::size_t j = 0; j < ends.size(); ++j) {
            PackedWeight expected = kUnreachableWeight;
            for (const WeightedNode& end : ends[j]) {
                if (workspace.distance(end.node) != kUnreachableWeight) {
                    expected = std::min(expected, workspace.distance(end.node) + end.weight);
                }
            }
            INFO("row " << i << " column " << j);
            REQUIRE(matrix[i * ends.size() + j] == expected);
        }
    }
}

TEST_CASE("RoadRouter matrices and routes agree between engines for snapped mid-edge stops", "[hierarchy]") {
    const graph::RoadGraph road_graph = grid(41);
    RoadRouter router(road_graph);
    std::mt19937_64 random(8);
    std::uniform_real_distribution<double> lat(17.0, 17.0 + 29 * 0.0009), lon(-140.0, -140.0 + 29 * 0.00095);
    std::vector<SnappedStop> stops;
    for (int k = 0; k < 80; ++k) stops.push_back(router.snap(std::string("s").append(std::to_string(k)), lat(random), lon(random)));
    for (Metric metric : {Metric::time, Metric::distance}) {
        const TravelMatrix by_dijkstra = router.matrix(stops, metric, Engine::dijkstra);
        const TravelMatrix by_hierarchy = router.matrix(stops, metric, Engine::hierarchy);
        for (std::size_t i = 0; i < stops.size(); ++i) {
            for (std::size_t j = 0; j < stops.size(); ++j) {
                INFO("stops " << i << " -> " << j);
                REQUIRE(by_dijkstra.weight(i, j) == by_hierarchy.weight(i, j));
            }
        }
        for (int k = 0; k < 60; ++k) {
            const std::size_t i = random() % stops.size(), j = random() % stops.size();
            const auto path_dijkstra = router.route(stops[i], stops[j], metric, Engine::dijkstra);
            const auto path_hierarchy = router.route(stops[i], stops[j], metric, Engine::hierarchy);
            REQUIRE(path_dijkstra.has_value() == by_dijkstra.reachable(i, j));
            REQUIRE(path_hierarchy.has_value() == by_dijkstra.reachable(i, j));
            if (!path_dijkstra) continue;
            REQUIRE(path_dijkstra->time_ds == by_dijkstra.time_ds(i, j));
            REQUIRE(path_dijkstra->length_dm == by_dijkstra.length_dm(i, j));
            REQUIRE(path_hierarchy->time_ds == by_dijkstra.time_ds(i, j));
            REQUIRE(path_hierarchy->length_dm == by_dijkstra.length_dm(i, j));
            REQUIRE(path_hierarchy->geometry.size() >= 1);
        }
        // routes_from (one-to-many with paths) gives the same costs.
        const auto paths = router.routes_from(stops[3], stops, metric);
        for (std::size_t j = 0; j < stops.size(); ++j) {
            REQUIRE(paths[j].reachable == by_dijkstra.reachable(3, j));
            if (paths[j].reachable) REQUIRE(paths[j].path.time_ds == by_dijkstra.time_ds(3, j));
        }
    }
}

TEST_CASE("A stored hierarchy survives the .rrg file and is used; a stale one is ignored", "[hierarchy]") {
    const graph::RoadGraph road_graph = grid(51, 15, 15);
    const std::string folder = test::make_scratch_dir("hierarchy");
    const std::string path = folder + "/grid.rrg";
    graph::write_road_graph(graph::attach_sections(road_graph, build_hierarchy_sections(road_graph)), path);
    const graph::RoadGraph loaded = graph::load_road_graph(path);
    REQUIRE(has_hierarchy_sections(loaded, Metric::time));
    REQUIRE(has_hierarchy_sections(loaded, Metric::distance));
    RoadRouter router(loaded);
    REQUIRE(router.has_stored_hierarchy(Metric::time));
    REQUIRE(router.has_stored_hierarchy(Metric::distance));
    // Built for the graph with restrictions: a router ignoring them must not use it.
    RouterOptions ignoring;
    ignoring.restrictions = RestrictionPolicy::ignore;
    RoadRouter other(loaded, ignoring);
    REQUIRE_FALSE(other.has_stored_hierarchy(Metric::time));

    const RoutingGraph routing_graph(loaded, RestrictionPolicy::automatic);
    const auto stored = ContractionHierarchy::from_sections(loaded, routing_graph, Metric::time);
    REQUIRE(stored.has_value());
    HierarchySearch search(*stored);
    DijkstraWorkspace workspace(routing_graph.node_count());
    std::mt19937_64 random(3);
    for (int pair = 0; pair < 300; ++pair) {
        const WeightedNode start{static_cast<NodeId>(random() % routing_graph.node_count()), 0};
        const WeightedNode end{static_cast<NodeId>(random() % routing_graph.node_count()), 0};
        run_dijkstra(routing_graph, Metric::time, {&start, 1}, {}, workspace);
        REQUIRE(search.shortest({&start, 1}, {&end, 1}) == workspace.distance(end.node));
    }
}

TEST_CASE("A stored hierarchy that fails a check is refused, not searched", "[hierarchy]") {
    const graph::RoadGraph road_graph = grid(52, 12, 12);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::automatic);
    const std::vector<graph::ExtraSection> good = ContractionHierarchy::build(routing_graph, Metric::time).to_sections();
    REQUIRE(ContractionHierarchy::from_sections(graph::attach_sections(road_graph, good), routing_graph, Metric::time));
    // Each damage, applied alone to a copy of the sections (layout in router/hierarchy/HIERARCHY.md).
    const auto damaged = [&](const std::string& tag, auto&& damage) {
        std::vector<graph::ExtraSection> sections = good;
        const auto section = std::find_if(sections.begin(), sections.end(), [&](const auto& s) { return s.tag == tag; });
        REQUIRE(section != sections.end());
        damage(section->bytes);
        return ContractionHierarchy::from_sections(graph::attach_sections(road_graph, sections), routing_graph,
                                                   Metric::time);
    };
    const auto set_u32 = [](std::vector<std::byte>& bytes, std::size_t offset, std::uint32_t value) {
        std::memcpy(bytes.data() + offset, &value, sizeof value);
    };
    // An older layout version (1: mixed arcs per routing node).
    CHECK_FALSE(damaged("ch.t.header", [&](auto& bytes) { set_u32(bytes, 0, 1); }));
    // A climbing arc of rank 0 that leads to rank 0 (not higher): a search could loop on it.
    CHECK_FALSE(damaged("ch.t.up.arcs", [&](auto& bytes) { set_u32(bytes, 0, 0); }));
    // A descending arc from a rank past the last node.
    CHECK_FALSE(damaged("ch.t.down.arcs", [&](auto& bytes) { set_u32(bytes, 0, 0xFFFFFFF0u); }));
    // rank and node_at no longer inverse permutations: rank 0 names rank 1's node.
    CHECK_FALSE(damaged("ch.t.node", [&](auto& bytes) { std::memcpy(bytes.data(), bytes.data() + 4, 4); }));
    // Offsets that go backwards.
    CHECK_FALSE(damaged("ch.t.up.first", [&](auto& bytes) { set_u32(bytes, 4, 0xFFFFu); }));
    // A shortcut whose middle is not lower than its ends.
    CHECK_FALSE(damaged("ch.t.down.mid", [&](auto& bytes) { set_u32(bytes, 0, 0xFFFFFFF0u); }));
}
