// The router on the real extracts fixtures/osm/monaco.osm.pbf and andorra.osm.pbf
// (© OpenStreetMap contributors, ODbL 1.0), read by the project's extractor:
//  * our Dijkstra equals the Boost Graph Library's dijkstra_shortest_paths (outside reference);
//  * the contraction hierarchy equals Dijkstra exactly (point-to-point and whole matrices);
//  * the triangle inequality on matrices (see router/hierarchy/HIERARCHY.md, "Stops");
//  * travel time >= straight-line (haversine) distance / the graph's top speed.
#include "extract/road_extractor.hpp"
#include "graph/haversine.hpp"
#include "router/dijkstra.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/hierarchy/hierarchy_query.hpp"
#include "router/road_router.hpp"
#include "tests/router/bgl_reference.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <map>
#include <random>

using namespace ringroad;
using namespace ringroad::router;
using namespace ringroad::router::hierarchy;

namespace {

const graph::RoadGraph& real_graph(const std::string& name) {
    static std::map<std::string, graph::RoadGraph> cache;
    auto found = cache.find(name);
    if (found == cache.end()) {
        extract::ExtractOptions options;
        options.input_path = test::fixture_path("osm/" + name);
        found = cache.emplace(name, extract::extract_and_build_road_graph(options, nullptr)).first;
    }
    return found->second;
}

const char* const kExtracts[] = {"monaco.osm.pbf", "andorra.osm.pbf"};

// Stops near random main-component junctions: exactly on them, or up to ~50 m off (mid-edge).
std::vector<SnappedStop> random_stops(const RoadRouter& router, std::size_t count, bool on_junctions, std::uint64_t seed) {
    const graph::RoadGraph& graph = router.road_graph();
    std::mt19937_64 random(seed);
    std::vector<SnappedStop> stops;
    while (stops.size() < count) {
        const auto vertex = static_cast<graph::VertexId>(random() % graph.vertex_count());
        if (!graph.in_main_component(vertex)) continue;
        const graph::Coordinate at = graph.coordinate(vertex);
        double lat = at.lat_e7 / 1e7, lon = at.lon_e7 / 1e7;
        if (!on_junctions) {
            lat += (static_cast<double>(random() % 900) - 450.0) * 1e-6;
            lon += (static_cast<double>(random() % 900) - 450.0) * 1e-6;
        }
        stops.push_back(router.snap(std::string("s").append(std::to_string(stops.size())), lat, lon));
    }
    return stops;
}

} // namespace

TEST_CASE("Real extracts: Dijkstra equals BGL dijkstra_shortest_paths from random sources", "[real][dijkstra]") {
    for (const char* name : kExtracts) {
        const RoutingGraph routing_graph(real_graph(name), RestrictionPolicy::automatic);
        REQUIRE(routing_graph.honours_turn_restrictions());
        for (Metric metric : {Metric::time, Metric::distance}) {
            const test::BglGraph reference = test::to_bgl(routing_graph, metric);
            DijkstraWorkspace workspace(routing_graph.node_count());
            std::mt19937_64 random(17);
            for (int round = 0; round < (metric == Metric::time ? 40 : 15); ++round) {
                const NodeId source = static_cast<NodeId>(random() % routing_graph.node_count());
                const WeightedNode start{source, 0};
                run_dijkstra(routing_graph, metric, {&start, 1}, {}, workspace);
                const auto expected = test::bgl_distances(reference, source);
                std::size_t mismatches = 0;
                for (NodeId node = 0; node < routing_graph.node_count(); ++node) {
                    const std::uint64_t theirs =
                        expected[node] == std::numeric_limits<std::uint64_t>::max() ? kUnreachableWeight : expected[node];
                    mismatches += workspace.distance(node) != theirs;
                }
                INFO(name << " source " << source);
                REQUIRE(mismatches == 0);
            }
        }
    }
}

TEST_CASE("Real extracts: hierarchy equals Dijkstra on thousands of pairs and whole matrices", "[real][hierarchy]") {
    for (const char* name : kExtracts) {
        const RoadRouter router(real_graph(name));
        const RoutingGraph& routing_graph = router.routing_graph();
        const ContractionHierarchy hierarchy = ContractionHierarchy::build(routing_graph, Metric::time);
        HierarchySearch search(hierarchy);
        DijkstraWorkspace workspace(routing_graph.node_count());
        std::mt19937_64 random(23);
        for (int pair = 0; pair < 2000; ++pair) {
            const WeightedNode start{static_cast<NodeId>(random() % routing_graph.node_count()), 0};
            const WeightedNode end{static_cast<NodeId>(random() % routing_graph.node_count()), 0};
            const NodeId target = end.node;
            run_dijkstra(routing_graph, Metric::time, {&start, 1}, {&target, 1}, workspace);
            INFO(name << " pair " << start.node << " -> " << end.node);
            REQUIRE(search.shortest({&start, 1}, {&end, 1}) == workspace.distance(target));
        }
        for (Metric metric : {Metric::time, Metric::distance}) {
            const std::vector<SnappedStop> stops = random_stops(router, 120, false, 29);
            const TravelMatrix by_dijkstra = router.matrix(stops, metric, Engine::dijkstra);
            const TravelMatrix by_hierarchy = router.matrix(stops, metric, Engine::hierarchy);
            std::size_t differences = 0;
            for (std::size_t i = 0; i < stops.size(); ++i) {
                for (std::size_t j = 0; j < stops.size(); ++j) differences += by_dijkstra.weight(i, j) != by_hierarchy.weight(i, j);
            }
            INFO(name << " metric " << metric_name(metric));
            REQUIRE(differences == 0);
            REQUIRE(by_dijkstra.unreachable_count() < stops.size() * stops.size() / 10);
        }
    }
}

TEST_CASE("Real extracts: the triangle inequality holds on time matrices without restrictions", "[real][triangle]") {
    // Junction stops and mid-edge stops alike (router/hierarchy/HIERARCHY.md, "Stops": turn-around at a
    // stop allowed at 0 s, U-turns at junctions only at dead ends). With turn restrictions a
    // stop may legally bypass a forbidden turn; fixture_routes_test.cpp shows that case.
    RouterOptions options;
    options.restrictions = RestrictionPolicy::ignore;
    for (const char* name : kExtracts) {
        const RoadRouter router(real_graph(name), options);
        for (const bool on_junctions : {true, false}) {
            const std::vector<SnappedStop> stops = random_stops(router, 45, on_junctions, 31);
            const TravelMatrix matrix = router.matrix(stops, Metric::time, Engine::hierarchy);
            std::size_t violations = 0, checked = 0;
            for (std::size_t x = 0; x < stops.size(); ++x) {
                for (std::size_t y = 0; y < stops.size(); ++y) {
                    for (std::size_t z = 0; z < stops.size(); ++z) {
                        if (!matrix.reachable(x, y) || !matrix.reachable(y, z)) continue;
                        ++checked;
                        violations += !matrix.reachable(x, z) || matrix.time_ds(x, z) > matrix.time_ds(x, y) + matrix.time_ds(y, z);
                    }
                }
            }
            INFO(name << (on_junctions ? " junction stops" : " mid-edge stops"));
            REQUIRE(checked > 40000);
            REQUIRE(violations == 0);
        }
    }
}

TEST_CASE("Real extracts: travel time is at least the straight-line distance at top speed", "[real]") {
    for (const char* name : kExtracts) {
        const RoadRouter router(real_graph(name));
        const double top_speed = router.top_speed_meters_per_second();
        // A car profile's fastest road is a motorway or trunk: between 50 and 150 km/h here
        // (extract/PROFILES.md, common practice).
        REQUIRE(top_speed * 3.6 > 50);
        REQUIRE(top_speed * 3.6 <= 150);
        const std::vector<SnappedStop> stops = random_stops(router, 100, false, 37);
        const TravelMatrix matrix = router.matrix(stops, Metric::time);
        for (std::size_t i = 0; i < stops.size(); ++i) {
            for (std::size_t j = 0; j < stops.size(); ++j) {
                if (!matrix.reachable(i, j)) continue;
                const double straight = graph::haversine_meters(stops[i].on_road, stops[j].on_road);
                // 0.2 s: the two partial edges are rounded to a tenth of a second each.
                REQUIRE(matrix.seconds(i, j) + 0.2 >= straight / top_speed);
                REQUIRE(matrix.meters(i, j) + 0.2 >= straight * 0.999);
            }
        }
    }
}

TEST_CASE("Real extracts: unpacked routes are connected road pieces whose geometry has the route's length",
          "[real][paths]") {
    // The outside reference for lengths is the haversine formula over the extract's own node
    // positions (the polyline ringroad draws), compared with the integer lengths summed by the
    // search: unpacking shortcuts must give back exactly the roads that were paid for.
    for (const char* name : kExtracts) {
        const RoadRouter router(real_graph(name));
        const graph::RoadGraph& graph = router.road_graph();
        const std::vector<SnappedStop> stops = random_stops(router, 40, false, 41);
        for (std::size_t i = 0; i + 1 < stops.size(); ++i) {
            const auto path = router.route(stops[i], stops[i + 1], Metric::time, Engine::hierarchy);
            if (!path) continue;
            INFO(name << " route " << i);
            std::uint64_t time_sum = 0, length_sum = 0;
            for (std::size_t k = 0; k < path->pieces.size(); ++k) {
                const PathPiece& piece = path->pieces[k];
                time_sum += piece.time_ds;
                length_sum += piece.length_dm;
                REQUIRE((piece.from_fraction == piece.to_fraction || piece.forward == (piece.from_fraction < piece.to_fraction)));
                if (k == 0) continue;
                // Each piece starts where the previous one ended.
                const PathPiece& previous = path->pieces[k - 1];
                const graph::Segment& before = graph.segments()[previous.segment];
                const graph::Segment& after = graph.segments()[piece.segment];
                const graph::VertexId left = previous.forward ? before.last_vertex : before.first_vertex;
                const graph::VertexId entered = piece.forward ? after.first_vertex : after.last_vertex;
                REQUIRE(left == entered);
            }
            REQUIRE(time_sum == path->time_ds);
            REQUIRE(length_sum == path->length_dm);
            REQUIRE(graph::haversine_meters(path->geometry.front(), stops[i].on_road) < 0.5);
            REQUIRE(graph::haversine_meters(path->geometry.back(), stops[i + 1].on_road) < 0.5);
            double polyline = 0.0;
            for (std::size_t k = 1; k < path->geometry.size(); ++k) {
                polyline += graph::haversine_meters(path->geometry[k - 1], path->geometry[k]);
            }
            REQUIRE(polyline == Approx(path->meters()).epsilon(0.005).margin(1.0));
        }
    }
}
