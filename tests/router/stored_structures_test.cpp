// The structures `ringroad build` stores for queries (router/STORED.md), against what a file
// without them derives at load:
//  * the stored snapping index (our packed Hilbert R-tree) gives exactly the results of the
//    Boost.Geometry R-tree (the outside reference, built at load as the fallback): same segment,
//    fraction, distance and point on the road, for thousands of random stops on the invented demo
//    town and the real extracts fixtures/osm/monaco.osm.pbf and andorra.osm.pbf
//    (© OpenStreetMap contributors, ODbL 1.0), with ties between equally near roads broken by
//    piece order in both;
//  * the stored routing graph equals the derived one record for record, and matrices are
//    identical with either, on Andorra and on an invented region from `ringroad synth`;
//  * damaged or inconsistent stored records are refused with one line naming the section and
//    the record.
#include "common/input_error.hpp"
#include "extract/road_extractor.hpp"
#include "graph/graph_file.hpp"
#include "router/road_router.hpp"
#include "router/routing_graph.hpp"
#include "router/snap_index.hpp"
#include "router/snapping.hpp"
#include "router/stored_sections.hpp"
#include "tests/router/test_graphs.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <cstring>
#include <functional>
#include <map>
#include <random>
#include <sstream>

using namespace ringroad;
using namespace ringroad::router;

namespace {

graph::RoadGraph extracted(const std::string& path) {
    extract::ExtractOptions options;
    options.input_path = path;
    return extract::extract_and_build_road_graph(options, nullptr);
}

// The graph written with its query sections and mapped back, as `ringroad build` leaves it.
graph::RoadGraph stored_copy(const graph::RoadGraph& graph, const std::string& label) {
    const std::string path = test::make_scratch_dir(label) + "/region.rrg";
    graph::write_road_graph(graph::attach_sections(graph, build_query_sections(graph)), path);
    return graph::load_road_graph(path);
}

// Random stops: a third exactly on junctions (every road there is equally near: ties), a third
// within about 50 m of one, a third anywhere in the bounds.
std::vector<std::pair<double, double>> random_points(const graph::RoadGraph& graph, std::size_t count,
                                                     std::uint64_t seed) {
    std::mt19937_64 random(seed);
    double min_lat = 90, max_lat = -90, min_lon = 180, max_lon = -180;
    for (const graph::Coordinate& c : graph.coordinates()) {
        min_lat = std::min(min_lat, c.lat()), max_lat = std::max(max_lat, c.lat());
        min_lon = std::min(min_lon, c.lon()), max_lon = std::max(max_lon, c.lon());
    }
    std::uniform_real_distribution<double> unit(0.0, 1.0);
    std::vector<std::pair<double, double>> points;
    while (points.size() < count) {
        const graph::Coordinate at = graph.coordinate(static_cast<graph::VertexId>(random() % graph.vertex_count()));
        switch (points.size() % 3) {
        case 0: points.emplace_back(at.lat_e7 / 1e7, at.lon_e7 / 1e7); break;
        case 1: points.emplace_back(at.lat() + (unit(random) - 0.5) * 9e-4, at.lon() + (unit(random) - 0.5) * 9e-4); break;
        default: points.emplace_back(min_lat + unit(random) * (max_lat - min_lat), min_lon + unit(random) * (max_lon - min_lon));
        }
    }
    return points;
}

void require_identical_snapping(const graph::RoadGraph& stored_graph, std::size_t count) {
    const RoadSnapper stored(stored_graph);
    const RoadSnapper reference(stored_graph, SnapIndexSource::built);   // Boost.Geometry R-tree
    REQUIRE(stored.uses_stored_index());
    REQUIRE_FALSE(reference.uses_stored_index());
    std::size_t mid_edge = 0;
    for (const auto& [lat, lon] : random_points(stored_graph, count, 99)) {
        SnappedStop ours, theirs;
        REQUIRE(stored.nearest(lat, lon, ours));
        REQUIRE(reference.nearest(lat, lon, theirs));
        INFO("stop at " << lat << "," << lon);
        REQUIRE(ours.segment == theirs.segment);
        REQUIRE(ours.fraction == theirs.fraction);
        REQUIRE(ours.snap_distance_meters == theirs.snap_distance_meters);
        REQUIRE(ours.on_road == theirs.on_road);
        mid_edge += ours.fraction > 0.0 && ours.fraction < 1.0;
    }
    REQUIRE(mid_edge > count / 4);   // not only junctions
}

} // namespace

TEST_CASE("The stored snapping index gives the Boost.Geometry R-tree's results on the demo town and real extracts",
          "[stored][snapping]") {
    for (const char* fixture : {"demo/port-ambrell.osm", "osm/monaco.osm.pbf", "osm/andorra.osm.pbf"}) {
        INFO(fixture);
        require_identical_snapping(stored_copy(extracted(test::fixture_path(fixture)), "stored-snap"), 3000);
    }
}

TEST_CASE("The stored snapping index gives the Boost.Geometry R-tree's results on a random grid", "[stored][snapping]") {
    test::RandomGridOptions options;
    options.rows = 40;
    options.columns = 40;
    require_identical_snapping(stored_copy(test::random_grid_graph(options), "stored-snap-grid"), 3000);
}

namespace {

void require_same_routing_graph(const RoutingGraph& stored, const RoutingGraph& derived) {
    REQUIRE(stored.is_stored());
    REQUIRE_FALSE(derived.is_stored());
    REQUIRE(stored.node_count() == derived.node_count());
    REQUIRE(stored.arc_count() == derived.arc_count());
    REQUIRE(stored.fingerprint() == derived.fingerprint());
    REQUIRE(stored.honours_turn_restrictions() == derived.honours_turn_restrictions());
    for (NodeId node = 0; node < stored.node_count(); ++node) {
        const auto a = stored.successors(node), b = derived.successors(node);
        REQUIRE(std::equal(a.begin(), a.end(), b.begin(), b.end()));
        const auto c = stored.predecessors(node), d = derived.predecessors(node);
        REQUIRE(std::equal(c.begin(), c.end(), d.begin(), d.end()));
    }
    for (Metric metric : {Metric::time, Metric::distance}) {
        REQUIRE(stored.search_block_shift(metric) == derived.search_block_shift(metric));
        REQUIRE(stored.smallest_node_weight(metric) == derived.smallest_node_weight(metric));
        const auto a = stored.search_nodes(metric), b = derived.search_nodes(metric);
        REQUIRE(std::memcmp(a.data(), b.data(), a.size_bytes()) == 0);
    }
}

std::vector<SnappedStop> random_stops(const RoadRouter& router, std::size_t count, std::uint64_t seed) {
    std::vector<SnappedStop> stops;
    for (const auto& [lat, lon] : random_points(router.road_graph(), count * 4, seed)) {
        if (stops.size() == count) break;
        try {
            stops.push_back(router.snap("s" + std::to_string(stops.size()), lat, lon));
        } catch (const InputError&) {   // far from every road: not a stop
        }
    }
    return stops;
}

// Matrices from a router on the stored sections and one deriving everything, per engine.
void require_identical_matrices(const graph::RoadGraph& plain, const std::string& label, std::size_t stop_count,
                                bool with_hierarchy) {
    const graph::RoadGraph stored_graph = stored_copy(plain, label);
    const RoadRouter stored(stored_graph);
    const RoadRouter derived(plain);
    REQUIRE(stored.uses_stored_snap_index());
    REQUIRE_FALSE(derived.uses_stored_snap_index());
    require_same_routing_graph(stored.routing_graph(), derived.routing_graph());
    const std::vector<SnappedStop> stops = random_stops(stored, stop_count, 5);
    REQUIRE(stops.size() == stop_count);
    std::vector<Engine> engines{Engine::dijkstra};
    if (with_hierarchy) engines.push_back(Engine::hierarchy);
    for (Metric metric : {Metric::time, Metric::distance}) {
        for (Engine engine : engines) {
            const TravelMatrix ours = stored.matrix(stops, metric, engine);
            const TravelMatrix theirs = derived.matrix(stops, metric, engine);
            std::size_t reachable = 0;
            for (std::size_t i = 0; i < stops.size(); ++i) {
                for (std::size_t j = 0; j < stops.size(); ++j) {
                    REQUIRE(ours.weight(i, j) == theirs.weight(i, j));
                    reachable += ours.weight(i, j) != kUnreachableWeight;
                }
            }
            REQUIRE(reachable > stops.size() * stops.size() / 2);
        }
    }
}

} // namespace

TEST_CASE("Matrices are identical with the stored and the derived routing graph on Andorra", "[stored][matrix]") {
    require_identical_matrices(extracted(test::fixture_path("osm/andorra.osm.pbf")), "stored-andorra", 60, false);
}

TEST_CASE("Matrices are identical with the stored and the derived routing graph on an invented region",
          "[stored][matrix]") {
    const std::string pbf = test::make_scratch_dir("stored-synth") + "/region.osm.pbf";
    const test::CommandResult synth = test::run_ringroad({"synth", "--junctions", "20000", "--seed", "7", "-o", pbf});
    REQUIRE(synth.exit_code == 0);
    require_identical_matrices(extracted(pbf), "stored-synth", 60, true);
}

TEST_CASE("A routing graph stored for other restriction settings is not used; one of another layout neither",
          "[stored]") {
    test::RandomGridOptions options;
    options.rows = 8;
    options.columns = 8;
    options.restrictions = 6;
    const graph::RoadGraph graph = stored_copy(test::random_grid_graph(options), "stored-policy");
    REQUIRE(RoutingGraph::from_sections(graph, RestrictionPolicy::automatic).has_value());
    REQUIRE_FALSE(RoutingGraph::from_sections(graph, RestrictionPolicy::ignore).has_value());
    REQUIRE_FALSE(RoutingGraph::stored_or_derived(graph, RestrictionPolicy::ignore).is_stored());
}

namespace {

// A small grid's sections with one record changed by `damage`, attached to the grid; the grid
// has enough pieces for two levels of the snapping index.
template <typename Record>
graph::RoadGraph damaged(const std::string& tag, const std::function<void(std::span<Record>)>& damage) {
    test::RandomGridOptions options;
    options.rows = 8;
    options.columns = 8;
    const graph::RoadGraph graph = test::random_grid_graph(options);
    std::vector<graph::ExtraSection> sections = build_query_sections(graph);
    bool found = false;
    for (graph::ExtraSection& section : sections) {
        if (section.tag != tag) continue;
        found = true;
        damage({reinterpret_cast<Record*>(section.bytes.data()), section.bytes.size() / sizeof(Record)});
    }
    REQUIRE(found);
    return graph::attach_sections(graph, std::move(sections));
}

std::string load_error(const graph::RoadGraph& graph) {
    try {
        RoadRouter router(graph);
    } catch (const InputError& error) {
        return error.what();
    }
    return "(no error)";
}

} // namespace

TEST_CASE("Damaged stored routing graphs are refused naming the section and record", "[stored][damage]") {
    SECTION("a node id out of range") {
        const auto graph = damaged<std::uint32_t>("rg.arc_head", [](auto arcs) { arcs[5] = 1000000; });
        REQUIRE(load_error(graph) == "stored section 'rg.arc_head' record 5: node 1000000 is out of range (" +
                                         std::to_string(graph.edge_count()) +
                                         " nodes); rebuild the region file with `ringroad build`");
    }
    SECTION("a predecessor out of range") {
        const auto graph = damaged<std::uint32_t>("rg.rev_tail", [](auto tails) { tails[7] = 1u << 30; });
        REQUIRE_THAT(load_error(graph), Catch::StartsWith("stored section 'rg.rev_tail' record 7: node 1073741824 is out of range"));
    }
    SECTION("offsets that do not ascend") {
        const auto graph = damaged<std::uint32_t>("rg.first_arc", [](auto first) { first[4] = first[3] - 1; });
        REQUIRE_THAT(load_error(graph), Catch::StartsWith("stored section 'rg.first_arc' record 4: offsets do not ascend"));
    }
    SECTION("reverse offsets that do not ascend") {
        const auto graph = damaged<std::uint32_t>("rg.first_rev", [](auto first) { first[9] = first[10] + 1; });
        REQUIRE_THAT(load_error(graph), Catch::StartsWith("stored section 'rg.first_rev' record 10: offsets do not ascend"));
    }
    SECTION("a search record whose weight is not its edge's cost") {
        const auto graph = damaged<RoutingGraph::SearchNode>("rg.search.t", [](auto nodes) { nodes[3].weight += 1; });
        REQUIRE_THAT(load_error(graph),
                     Catch::StartsWith("stored section 'rg.search.t' record 3: its weight is not the cost of edge 3"));
    }
    SECTION("a search record whose successor range leaves the graph") {
        const auto graph = damaged<RoutingGraph::SearchNode>("rg.search.d", [](auto nodes) {
            nodes[2].successors = RoutingGraph::kFirstSuccessorElsewhere << 9 | 3u << 1;
            nodes[2].first_successor = static_cast<std::uint32_t>(nodes.size()) - 1;
        });
        REQUIRE_THAT(load_error(graph), Catch::StartsWith("stored section 'rg.search.d' record 2: successor range"));
    }
    SECTION("a node count that is not the road graph's edge count") {
        const auto graph = damaged<std::uint32_t>("rg.header", [](auto words) { words[1] += 1; });
        REQUIRE_THAT(load_error(graph), Catch::StartsWith("stored section 'rg.header' record 0: "));
    }
    SECTION("a section of the wrong size") {
        test::RandomGridOptions options;
        options.rows = 8;
        options.columns = 8;
        const graph::RoadGraph graph = test::random_grid_graph(options);
        std::vector<graph::ExtraSection> sections = build_query_sections(graph);
        for (auto& section : sections) {
            if (section.tag == "rg.arc_head") section.bytes.resize(section.bytes.size() - 4);
        }
        REQUIRE_THAT(load_error(graph::attach_sections(graph, std::move(sections))),
                     Catch::StartsWith("stored section 'rg.arc_head': "));
    }
}

TEST_CASE("Damaged stored snapping indexes are refused naming the section and record", "[stored][damage]") {
    using Piece = snapping::PackedPieceIndex::Piece;
    using Box = snapping::PackedPieceIndex::Box;
    SECTION("a segment out of range") {
        const auto graph = damaged<Piece>("snap.pieces", [](auto pieces) { pieces[11].segment = 70000; });
        REQUIRE_THAT(load_error(graph), Catch::StartsWith("stored section 'snap.pieces' record 11: segment 70000 is out of range"));
    }
    SECTION("a point out of range") {
        const auto graph = damaged<Piece>("snap.pieces", [](auto pieces) { pieces[4].first_point = 2; });
        REQUIRE_THAT(load_error(graph), Catch::StartsWith("stored section 'snap.pieces' record 4: point 2 of segment"));
    }
    SECTION("a leaf box that does not contain its pieces") {
        const auto graph = damaged<Box>("snap.boxes", [](auto boxes) { boxes[1].max_x = boxes[1].min_x; });
        REQUIRE_THAT(load_error(graph),
                     Catch::StartsWith("stored section 'snap.boxes' record 1: the box does not contain its piece"));
    }
    SECTION("an inner box that does not contain its children") {
        const auto graph = damaged<Box>("snap.boxes", [](auto boxes) { boxes.back().min_y = boxes.back().max_y; });
        REQUIRE_THAT(load_error(graph), Catch::Matches("stored section 'snap\\.boxes' record [0-9]+: the box does not "
                                                       "contain its child node [0-9]+; rebuild .*"));
    }
}

TEST_CASE("Commands refuse a region file whose stored structure is inconsistent, in one line, exit 1", "[stored][damage]") {
    // The checksums are right (the writer computed them over the damaged bytes): only the
    // structure check can catch this.
    const auto graph = damaged<std::uint32_t>("rg.arc_head", [](auto arcs) { arcs[5] = 1000000; });
    const std::string folder = test::make_scratch_dir("stored-cli");
    const std::string path = folder + "/region.rrg";
    graph::write_road_graph(graph, path);
    const graph::Coordinate at = graph.coordinate(0);
    test::write_file(folder + "/stops.csv", "id,lat,lon\na," + std::to_string(at.lat()) + "," + std::to_string(at.lon()) + "\n");
    for (const std::vector<std::string>& arguments :
         {std::vector<std::string>{"info", path}, std::vector<std::string>{"matrix", path, "--stops", folder + "/stops.csv"}}) {
        const test::CommandResult result = test::run_ringroad(arguments);
        INFO(arguments[0] << ": " << result.err);
        REQUIRE(result.exit_code == 1);
        REQUIRE(result.out.empty());
        REQUIRE(result.err == "ringroad: stored section 'rg.arc_head' record 5: node 1000000 is out of range (" +
                                  std::to_string(graph.edge_count()) +
                                  " nodes); rebuild the region file with `ringroad build`\n");
    }
}
