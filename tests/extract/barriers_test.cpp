// Barrier nodes (fixtures/extract/barriers.osm). Which barrier stops whom follows the OSM wiki's
// Key:barrier descriptions (a bollard or a block keeps motor vehicles out; a stile needs to be
// climbed; a gate or lift gate is opened and closed); the delays are common practice.
// A blocking barrier gets one vertex per segment end touching it, so nothing passes; a delaying
// one is paid by every edge ARRIVING at its vertex.

#include "tests/extract/extract_test_support.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::test;

namespace {

std::vector<graph::VertexId> vertices_of_node(const graph::RoadGraph& graph, std::int64_t node) {
    std::vector<graph::VertexId> vertices;
    for (graph::VertexId v = 0; v < graph.vertex_count(); ++v) {
        if (graph.vertex_osm_ids()[v] == node) vertices.push_back(v);
    }
    return vertices;
}

// Whether any route leads from node `from` to node `to` (breadth-first over the edges).
bool reachable(const graph::RoadGraph& graph, std::int64_t from, std::int64_t to) {
    std::vector<char> seen(graph.vertex_count(), 0);
    std::vector<graph::VertexId> queue = vertices_of_node(graph, from);
    for (auto v : queue) seen[v] = 1;
    while (!queue.empty()) {
        const auto v = queue.back();
        queue.pop_back();
        if (graph.vertex_osm_ids()[v] == to) return true;
        for (const auto& edge : graph.out_edges(v)) {
            if (!seen[edge.head]) {
                seen[edge.head] = 1;
                queue.push_back(edge.head);
            }
        }
    }
    return false;
}

graph::Edge edge_between(const graph::RoadGraph& graph, std::int64_t tail, std::int64_t head) {
    for (const auto& directed : all_edges(graph)) {
        if (graph.vertex_osm_ids()[directed.tail] == tail && graph.vertex_osm_ids()[directed.edge.head] == head) {
            return directed.edge;
        }
    }
    FAIL("no edge " << tail << " -> " << head);
    return {};
}

} // namespace

TEST_CASE("car: bollards and blocks split the road; the block's three street ends stay apart") {
    const auto graph = build_fixture("extract/barriers.osm", "car");
    CHECK(vertices_of_node(graph, 12).size() == 2);
    CHECK_FALSE(reachable(graph, 11, 13));
    CHECK_FALSE(reachable(graph, 13, 11));
    CHECK(reachable(graph, 11, 12));             // up to the bollard, from either side
    CHECK(reachable(graph, 13, 12));
    CHECK(vertices_of_node(graph, 62).size() == 3);
    CHECK_FALSE(reachable(graph, 61, 63));
    CHECK_FALSE(reachable(graph, 61, 64));
    CHECK_FALSE(reachable(graph, 63, 64));
    CHECK(metadata(graph, "blocking_barriers") == "3");   // bollard, gate+access=private, block (the stile is on a path)
}

TEST_CASE("car: access tags on the barrier node decide first") {
    const auto graph = build_fixture("extract/barriers.osm", "car");
    CHECK(reachable(graph, 41, 43));              // bollard + motorcar=yes
    CHECK(vertices_of_node(graph, 42).empty());   // no effect left: a plain shape point
    CHECK_FALSE(reachable(graph, 51, 53));        // gate + access=private
}

TEST_CASE("car: gates are passed with a delay paid on arrival at the gate") {
    const auto graph = build_fixture("extract/barriers.osm", "car");
    REQUIRE(reachable(graph, 21, 23));
    // gate: 30 s
    const auto into_gate = edge_between(graph, 21, 22);
    CHECK(into_gate.time_ds == expected_time_ds(into_gate.length_dm, 30) + 300);
    CHECK((into_gate.flags & graph::edge_flag::barrier_delay) != 0);
    const auto out_of_gate = edge_between(graph, 22, 23);
    CHECK(out_of_gate.time_ds == expected_time_ds(out_of_gate.length_dm, 30));
    CHECK((out_of_gate.flags & graph::edge_flag::barrier_delay) == 0);
    const auto back_into_gate = edge_between(graph, 23, 22);
    CHECK(back_into_gate.time_ds == expected_time_ds(back_into_gate.length_dm, 30) + 300);
    // lift_gate: 20 s
    const auto into_lift_gate = edge_between(graph, 31, 32);
    CHECK(into_lift_gate.time_ds == expected_time_ds(into_lift_gate.length_dm, 30) + 200);
    // a cattle grid is no barrier to anyone: node 72 is only a shape point
    CHECK(vertices_of_node(graph, 72).empty());
    CHECK(reachable(graph, 71, 73));
    CHECK(metadata(graph, "delaying_barriers") == "2");
}

TEST_CASE("bicycle passes bollards and blocks, waits 10 s at a gate, stops at a stile") {
    const auto graph = build_fixture("extract/barriers.osm", "bicycle");
    CHECK(reachable(graph, 11, 13));
    CHECK(reachable(graph, 61, 64));
    CHECK(vertices_of_node(graph, 12).empty());   // no effect: a plain shape point
    const auto into_gate = edge_between(graph, 21, 22);
    CHECK(into_gate.time_ds == expected_time_ds(into_gate.length_dm, 18) + 100);
    CHECK(reachable(graph, 31, 33));
    CHECK_FALSE(reachable(graph, 81, 83));        // stile on a path
}

TEST_CASE("foot climbs the stile with a 5 s delay") {
    const auto graph = build_fixture("extract/barriers.osm", "foot");
    CHECK(reachable(graph, 81, 83));
    const auto into_stile = edge_between(graph, 81, 82);
    CHECK(into_stile.time_ds == expected_time_ds(into_stile.length_dm, 5) + 50);
    CHECK_FALSE(reachable(graph, 51, 53));        // the private gate is private for walkers too
}
