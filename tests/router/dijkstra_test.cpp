// Our Dijkstra against the Boost Graph Library's dijkstra_shortest_paths (the outside
// reference) on the same edge-based routing graph, for random street grids.
#include "router/dijkstra.hpp"
#include "router/routing_graph.hpp"
#include "tests/router/bgl_reference.hpp"
#include "tests/router/test_graphs.hpp"

#include <catch2/catch.hpp>

#include <random>

using namespace ringroad;
using namespace ringroad::router;

namespace {

void check_against_bgl(const RoutingGraph& routing_graph, Metric metric, std::uint32_t sources, std::uint64_t seed) {
    const test::BglGraph reference = test::to_bgl(routing_graph, metric);
    DijkstraWorkspace workspace(routing_graph.node_count());
    std::mt19937_64 random(seed);
    for (std::uint32_t round = 0; round < sources; ++round) {
        const NodeId source = static_cast<NodeId>(random() % routing_graph.node_count());
        const WeightedNode start{source, 0};
        run_dijkstra(routing_graph, metric, {&start, 1}, {}, workspace);
        const std::vector<std::uint64_t> expected = test::bgl_distances(reference, source);
        std::size_t mismatches = 0;
        for (NodeId node = 0; node < routing_graph.node_count(); ++node) {
            const std::uint64_t ours = workspace.distance(node);
            const std::uint64_t theirs =
                expected[node] == std::numeric_limits<std::uint64_t>::max() ? kUnreachableWeight : expected[node];
            mismatches += ours != theirs;
        }
        INFO("source node " << source);
        REQUIRE(mismatches == 0);
    }
}

} // namespace

TEST_CASE("Dijkstra equals BGL dijkstra_shortest_paths on random grids, both metrics", "[dijkstra]") {
    for (std::uint64_t seed : {1u, 2u, 3u}) {
        test::RandomGridOptions options;
        options.seed = seed;
        options.rows = 25;
        options.columns = 30;
        const graph::RoadGraph road_graph = test::random_grid_graph(options);
        const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
        REQUIRE(routing_graph.node_count() > 1000);
        check_against_bgl(routing_graph, Metric::time, 30, seed);
        check_against_bgl(routing_graph, Metric::distance, 10, seed + 100);
    }
}

TEST_CASE("Dijkstra's early stop leaves the targets exact and the workspace reusable", "[dijkstra]") {
    test::RandomGridOptions options;
    options.seed = 7;
    const graph::RoadGraph road_graph = test::random_grid_graph(options);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    const test::BglGraph reference = test::to_bgl(routing_graph, Metric::time);
    DijkstraWorkspace workspace(routing_graph.node_count());
    std::mt19937_64 random(99);
    std::uint64_t settled_full = 0, settled_early = 0;
    for (int round = 0; round < 50; ++round) {
        const NodeId source = static_cast<NodeId>(random() % routing_graph.node_count());
        std::vector<NodeId> targets;
        for (int t = 0; t < 3; ++t) targets.push_back(static_cast<NodeId>(random() % routing_graph.node_count()));
        const WeightedNode start{source, 0};
        run_dijkstra(routing_graph, Metric::time, {&start, 1}, targets, workspace);
        settled_early += workspace.settled_count();
        const std::vector<std::uint64_t> expected = test::bgl_distances(reference, source);
        for (NodeId target : targets) {
            const std::uint64_t theirs =
                expected[target] == std::numeric_limits<std::uint64_t>::max() ? kUnreachableWeight : expected[target];
            REQUIRE(workspace.distance(target) == theirs);
            if (theirs != kUnreachableWeight) {
                REQUIRE(workspace.is_settled(target));
                // The tree path's weights add up to the label.
                const std::vector<NodeId> path = workspace.tree_path(target);
                REQUIRE(path.front() == source);
                std::uint64_t sum = 0;
                for (std::size_t i = 1; i < path.size(); ++i) sum += routing_graph.node_weight(Metric::time, path[i]);
                REQUIRE(sum == theirs);
            }
        }
        run_dijkstra(routing_graph, Metric::time, {&start, 1}, {}, workspace);
        settled_full += workspace.settled_count();
    }
    // Stopping early must actually save work on average.
    REQUIRE(settled_early < settled_full);
}

TEST_CASE("Dijkstra from several weighted starts takes the best start", "[dijkstra]") {
    test::RandomGridOptions options;
    options.seed = 11;
    const graph::RoadGraph road_graph = test::random_grid_graph(options);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    const test::BglGraph reference = test::to_bgl(routing_graph, Metric::time);
    const NodeId a = 5, b = routing_graph.node_count() / 2;
    const std::uint64_t offset_a = pack_weight(Metric::time, 120, 300);
    const std::uint64_t offset_b = pack_weight(Metric::time, 40, 100);
    const WeightedNode starts[] = {{a, offset_a}, {b, offset_b}};
    DijkstraWorkspace workspace(routing_graph.node_count());
    run_dijkstra(routing_graph, Metric::time, starts, {}, workspace);
    const auto from_a = test::bgl_distances(reference, a);
    const auto from_b = test::bgl_distances(reference, b);
    for (NodeId node = 0; node < routing_graph.node_count(); ++node) {
        const std::uint64_t inf = std::numeric_limits<std::uint64_t>::max();
        const std::uint64_t via_a = from_a[node] == inf ? inf : from_a[node] + offset_a;
        const std::uint64_t via_b = from_b[node] == inf ? inf : from_b[node] + offset_b;
        const std::uint64_t expected = std::min(via_a, via_b);
        REQUIRE(workspace.distance(node) == (expected == inf ? kUnreachableWeight : expected));
    }
}

TEST_CASE("Dijkstra: starts on nodes with a single incoming arc are still improved through it", "[dijkstra]") {
    // Such nodes bypass the heap once their only predecessor is scanned; a start label there
    // may be beaten by the path through that predecessor. Reference: BGL from each start.
    test::RandomGridOptions options;
    options.seed = 5;
    const graph::RoadGraph road_graph = test::random_grid_graph(options);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    const test::BglGraph reference = test::to_bgl(routing_graph, Metric::time);
    // The free start: a node reaching most of the graph (the grid has one-ways and gaps).
    const std::uint64_t inf = std::numeric_limits<std::uint64_t>::max();
    NodeId hub = 0;
    std::vector<std::uint64_t> from_hub;
    for (;; ++hub) {
        from_hub = test::bgl_distances(reference, hub);
        const auto reached = std::count_if(from_hub.begin(), from_hub.end(), [&](std::uint64_t d) { return d != inf; });
        if (2 * static_cast<std::size_t>(reached) > from_hub.size()) break;
    }
    std::vector<WeightedNode> starts{{hub, 0}};
    for (NodeId node = 1; node < routing_graph.node_count() && starts.size() < 6; node += 7) {
        // 5 s more than the way from the hub, which (through the only predecessor) must win.
        if (routing_graph.predecessors(node).size() == 1 && from_hub[node] != inf) {
            starts.push_back({node, from_hub[node] + pack_weight(Metric::time, 50, 0)});
        }
    }
    REQUIRE(starts.size() == 6);
    DijkstraWorkspace workspace(routing_graph.node_count());
    run_dijkstra(routing_graph, Metric::time, starts, {}, workspace);
    std::vector<std::uint64_t> expected(routing_graph.node_count(), inf);
    for (const WeightedNode& start : starts) {
        const std::vector<std::uint64_t> from = test::bgl_distances(reference, start.node);
        for (NodeId node = 0; node < routing_graph.node_count(); ++node) {
            if (from[node] != inf) expected[node] = std::min(expected[node], from[node] + start.weight);
        }
    }
    std::size_t improved_starts = 0;
    for (const WeightedNode& start : starts) improved_starts += expected[start.node] < start.weight;
    REQUIRE(improved_starts == starts.size() - 1);   // the case this test is about occurs
    for (NodeId node = 0; node < routing_graph.node_count(); ++node) {
        REQUIRE(workspace.distance(node) == (expected[node] == inf ? kUnreachableWeight : expected[node]));
    }
}

TEST_CASE("Dijkstra's block queue: weights spanning many blocks and far start offsets, exactly as BGL", "[dijkstra]") {
    // Roads from walking pace to motorway speed, a few of them hundreds of times slower than the
    // median, put queue keys in many blocks and buckets at once; start offsets far beyond the
    // graph's own distances start the queue in a late block. Reference: BGL from each start.
    std::mt19937_64 random(31);
    test::GraphBuilder builder;
    const std::uint32_t side = 18;
    for (std::uint32_t row = 0; row < side; ++row) {
        for (std::uint32_t column = 0; column < side; ++column) builder.add_vertex(17.5 + row * 0.001, -141.5 + column * 0.001);
    }
    const double speeds[] = {0.2, 5.0, 30.0, 50.0, 50.0, 50.0, 90.0, 130.0};
    for (std::uint32_t row = 0; row < side; ++row) {
        for (std::uint32_t column = 0; column < side; ++column) {
            const graph::VertexId here = row * side + column;
            if (column + 1 < side) builder.add_road(here, here + 1, speeds[random() % 8], true, random() % 4 != 0);
            if (row + 1 < side) builder.add_road(here, here + side, speeds[random() % 8], random() % 4 != 0, true);
        }
    }
    // Short spurs and triangles of 0.1 to 1 m (0 ds: keys differing in the secondary quantity
    // only, within one slot of the current block, so the order inside a slot matters).
    for (graph::VertexId vertex = 0; vertex < side * side; vertex += 3) {
        const graph::Coordinate at = builder.data().coordinates[vertex];
        const double lat = at.lat() + 0.000001 * static_cast<double>(1 + random() % 9);
        const graph::VertexId near = builder.add_vertex(lat, at.lon());
        const graph::VertexId nearer = builder.add_vertex(lat, at.lon() + 0.000004);
        builder.add_road(vertex, near, 130.0);
        builder.add_road(near, nearer, 130.0);
        builder.add_road(nearer, vertex, 130.0, true, random() % 2 == 0);
    }
    builder.data().metadata.push_back({"profile", "car"});
    const graph::RoadGraph road_graph = builder.build();
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    for (Metric metric : {Metric::time, Metric::distance}) {
        check_against_bgl(routing_graph, metric, 30, 77);
        const test::BglGraph reference = test::to_bgl(routing_graph, metric);
        const NodeId a = 3, b = routing_graph.node_count() / 2;
        const WeightedNode starts[] = {{a, pack_weight(metric, 5'000'000, 7)}, {b, pack_weight(metric, 5'000'900, 0)}};
        DijkstraWorkspace workspace(routing_graph.node_count());
        run_dijkstra(routing_graph, metric, starts, {}, workspace);
        const auto from_a = test::bgl_distances(reference, a);
        const auto from_b = test::bgl_distances(reference, b);
        const std::uint64_t inf = std::numeric_limits<std::uint64_t>::max();
        for (NodeId node = 0; node < routing_graph.node_count(); ++node) {
            const std::uint64_t via_a = from_a[node] == inf ? inf : from_a[node] + starts[0].weight;
            const std::uint64_t via_b = from_b[node] == inf ? inf : from_b[node] + starts[1].weight;
            const std::uint64_t expected = std::min(via_a, via_b);
            REQUIRE(workspace.distance(node) == (expected == inf ? kUnreachableWeight : expected));
        }
    }
}

TEST_CASE("The search records describe exactly each node's successors and weight", "[dijkstra]") {
    // The successor ranges (with one skipped entry) and the lists they fall back to must list
    // the same turns as the routing graph's own adjacency, restrictions included (the grid has
    // `no_*` and `only_*` restrictions). Self-consistency; exactness against BGL is checked above.
    test::RandomGridOptions options;
    options.seed = 13;
    options.restrictions = 120;
    const graph::RoadGraph road_graph = test::random_grid_graph(options);
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::honour);
    std::size_t ranges = 0, skips = 0, lists = 0;
    for (Metric metric : {Metric::time, Metric::distance}) {
        const auto records = routing_graph.search_nodes(metric);
        for (NodeId node = 0; node < routing_graph.node_count(); ++node) {
            REQUIRE(records[node].weight == routing_graph.node_weight(metric, node));
            const std::uint32_t code = records[node].successors;
            REQUIRE((code & 1u) == (routing_graph.predecessors(node).size() == 1 ? 1u : 0u));
            const auto expected = routing_graph.successors(node);
            const std::uint32_t length = (code >> 1) & 15u;
            if (length == RoutingGraph::kSuccessorList) {
                ++lists;
                continue;   // the search reads successors() itself
            }
            std::uint32_t first = code >> 9;
            if (first == RoutingGraph::kFirstSuccessorElsewhere) first = records[node].first_successor;
            const std::uint32_t skipped = (code >> 5) & 15u;
            std::vector<NodeId> decoded;
            for (std::uint32_t position = 0; position < length; ++position) {
                if (position != skipped) decoded.push_back(first + position);
            }
            ++ranges;
            skips += skipped != RoutingGraph::kNoSkippedSuccessor;
            REQUIRE(std::vector<NodeId>(expected.begin(), expected.end()) == decoded);
        }
    }
    REQUIRE(ranges > 0);
    REQUIRE(skips > 0);
    REQUIRE(lists > 0);
}
