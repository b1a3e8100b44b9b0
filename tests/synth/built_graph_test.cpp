// The generated region built by our extractor (extract/road_extractor.hpp) with the car profile:
// the junction count must match the request within 5 % (the brief's calibration target) and the
// generator's own prediction exactly; the network must hang together (strongly connected
// components counted independently with the Boost Graph Library); every road class, the turn
// restrictions, barriers and one-way rules must come through as intended.

#include "extract/road_extractor.hpp"
#include "graph/road_graph.hpp"
#include "synth/junction_count.hpp"
#include "tests/synth/synth_test_support.hpp"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/strong_components.hpp>
#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>
#include <map>
#include <set>

using namespace ringroad;
using namespace ringroad::test;

namespace {

graph::RoadGraph build_car_graph(const std::string& path) {
    return extract::extract_and_build_road_graph({path, *extract::profile_from_name("car")}, nullptr);
}

// Share of vertices in the largest strongly connected component, by boost::strong_components.
double main_component_share(const graph::RoadGraph& graph) {
    boost::adjacency_list<boost::vecS, boost::vecS, boost::directedS> reference(graph.vertex_count());
    for (graph::VertexId tail = 0; tail < graph.vertex_count(); ++tail) {
        for (const graph::Edge& edge : graph.out_edges(tail)) boost::add_edge(tail, edge.head, reference);
    }
    std::vector<int> component(graph.vertex_count());
    const int count = boost::strong_components(reference, component.data());
    std::vector<std::size_t> sizes(static_cast<std::size_t>(count), 0);
    for (int id : component) ++sizes[static_cast<std::size_t>(id)];
    return static_cast<double>(*std::max_element(sizes.begin(), sizes.end())) / graph.vertex_count();
}

std::uint64_t metadata_number(const graph::RoadGraph& graph, const char* key) {
    return std::stoull(graph.metadata_value(key));
}

void remove_region(const WrittenRegion& region) { std::filesystem::remove_all(std::filesystem::path(region.path).parent_path()); }

} // namespace

TEST_CASE("the built car graph has the requested junctions within 5 percent") {
    // Requests across the small end of the range, where rounding of the grid matters most.
    for (std::uint64_t requested : {100ull, 250ull, 1000ull, 4321ull, 12000ull, 30000ull}) {
        for (std::uint64_t seed : {1ull, 9ull}) {
            INFO("requested " << requested << ", seed " << seed);
            const WrittenRegion region = write_region(requested, seed, "synth-calibration");
            const graph::RoadGraph graph = build_car_graph(region.path);
            // The generator's prediction, by the extractor's rules (PROFILES.md), is exact...
            CHECK(graph.vertex_count() == region.plan.figures.junctions);
            // ...and the request is met within 5 %.
            CHECK(std::abs(static_cast<double>(graph.vertex_count()) - static_cast<double>(requested)) <= 0.05 * requested);
            remove_region(region);
        }
    }
}

TEST_CASE("the region is one network: the main strongly connected component holds 95 percent") {
    for (std::uint64_t requested : {500ull, 20000ull}) {
        INFO("requested " << requested);
        const WrittenRegion region = write_region(requested, 4, "synth-connected");
        const graph::RoadGraph graph = build_car_graph(region.path);
        CHECK(main_component_share(graph) >= 0.95);
        remove_region(region);
    }
}

TEST_CASE("every road class, the turn restrictions, barriers and one-ways come through the extractor") {
    const WrittenRegion region = write_region(20000, 5, "synth-features");
    const synth::RegionPlan& plan = region.plan;
    const graph::RoadGraph graph = build_car_graph(region.path);

    std::set<graph::RoadClass> classes;
    std::size_t roundabout_edges = 0;
    for (const graph::Edge& edge : graph.edges()) {
        classes.insert(static_cast<graph::RoadClass>(edge.road_class));
        roundabout_edges += (edge.flags & graph::edge_flag::roundabout) != 0;
    }
    using graph::RoadClass;
    CHECK(classes == std::set<RoadClass>{RoadClass::motorway, RoadClass::motorway_link, RoadClass::primary, RoadClass::secondary,
                                         RoadClass::tertiary, RoadClass::residential, RoadClass::service});
    CHECK(roundabout_edges > 0);

    // Every planned restriction is read and matched to segments (metadata of the extractor).
    CHECK(metadata_number(graph, "restrictions_read") == plan.restrictions.size());
    CHECK(metadata_number(graph, "restrictions_unmatched") == 0);
    CHECK(graph.turn_restrictions().size() == plan.restrictions.size());

    std::size_t bollards = 0, gates = 0;
    for (const auto& barrier : plan.barriers) (barrier.kind == synth::BarrierKind::bollard ? bollards : gates) += 1;
    CHECK(bollards > 0);
    CHECK(gates > 0);
    CHECK(metadata_number(graph, "blocking_barriers") == bollards);
    CHECK(metadata_number(graph, "delaying_barriers") == gates);

    // Directions per way id: one-way ways only forwards (oneway=yes) or backwards (oneway=-1),
    // private service roads not at all.
    std::map<std::int64_t, std::pair<std::size_t, std::size_t>> directions;   // forward, backward edges
    for (const graph::Edge& edge : graph.edges()) {
        auto& count = directions[graph.segments()[edge.segment].way_id];
        (edge.reversed ? count.second : count.first) += 1;
    }
    std::size_t wrong = 0, private_in_graph = 0, oneway_checked = 0;
    for (std::size_t index = 0; index < plan.ways.size(); ++index) {
        const synth::PlannedWay& way = plan.ways[index];
        const auto found = directions.find(static_cast<std::int64_t>(index + 1));
        if (way.kind == synth::RoadKind::private_service) {
            private_in_graph += found != directions.end();
            continue;
        }
        REQUIRE(found != directions.end());
        const bool implied = way.kind == synth::RoadKind::motorway || way.kind == synth::RoadKind::motorway_link ||
                             way.kind == synth::RoadKind::roundabout;
        const int oneway = implied ? 1 : way.oneway;
        if (oneway == 0) continue;
        ++oneway_checked;
        wrong += oneway > 0 ? found->second.second != 0 : found->second.first != 0;
    }
    CHECK(oneway_checked > 0);
    CHECK(wrong == 0);
    CHECK(private_in_graph == 0);
    remove_region(region);
}

TEST_CASE("the junction count follows the extractor's rules on a hand-made plan") {
    // Two crossing streets, a private spur and a bollard; counted by hand from PROFILES.md:
    // the crossing (used twice), four street ends, the bollard twice (one vertex per side).
    synth::RegionPlan plan;
    plan.nodes.resize(9);
    plan.way_nodes = {0, 1, 2, /**/ 3, 1, 4, /**/ 4, 5, 6, /**/ 2, 7, 8};
    plan.ways = {{0, 3, 1, synth::RoadKind::residential, 0, 0},
                 {3, 3, 2, synth::RoadKind::residential, 0, 0},
                 {6, 3, 3, synth::RoadKind::residential, 0, 0},
                 {9, 3, 0, synth::RoadKind::private_service, 0, 0}};
    plan.barriers = {{5, synth::BarrierKind::bollard}};
    // Vertices: 0, 2 (ends of way 1), 1 (crossing), 3 (end), 4 (end of two ways), 6 (end),
    // 5 twice (bollard inside way 3). Node 7, 8: private only.
    CHECK(synth::count_car_junctions(plan) == 8);
}
