// How ways become vertices, segments and shape points (fixtures/extract/junctions.osm), and ways
// with nodes missing from the extract (fixtures/extract/missing_nodes.osm). Lengths are checked
// against libosmium's haversine distance (osmium::geom::haversine::distance), rescaled to the
// project's Earth radius.

#include "tests/extract/extract_test_support.hpp"

#include "common/input_error.hpp"

#include <catch2/catch.hpp>

#include <set>

using namespace ringroad;
using namespace ringroad::test;

namespace {

struct NodePoint {
    std::int64_t id;
    double lat;
    double lon;
};

// The fixture's node positions, copied from junctions.osm.
const std::vector<NodePoint> kNodes{
    {1, 18.0000, -140.0000}, {2, 18.0000, -139.9990}, {3, 18.0000, -139.9980}, {4, 18.0005, -139.9970},
    {5, 18.0000, -139.9960}, {6, 18.0010, -139.9980}, {7, 18.0020, -139.9980}, {8, 18.0100, -140.0000},
    {9, 18.0100, -139.9990}, {10, 18.0110, -139.9995}, {11, 18.0200, -140.0000}, {12, 18.0200, -139.9990},
    {13, 18.0210, -139.9990}, {14, 18.0200, -139.9980}, {15, 18.0300, -140.0000}, {16, 18.0300, -139.9990},
};

double path_length(std::initializer_list<std::int64_t> ids) {
    double metres = 0;
    const NodePoint* previous = nullptr;
    for (std::int64_t id : ids) {
        const NodePoint* point = &*std::find_if(kNodes.begin(), kNodes.end(), [id](const NodePoint& p) { return p.id == id; });
        if (previous) metres += libosmium_distance_on_mean_radius(previous->lat, previous->lon, point->lat, point->lon);
        previous = point;
    }
    return metres;
}

// The segment of `way` running between the two nodes, in either order.
const graph::Segment& segment_between(const graph::RoadGraph& graph, std::int64_t way, std::int64_t a, std::int64_t b) {
    for (const auto& segment : graph.segments()) {
        const auto first = graph.vertex_osm_ids()[segment.first_vertex];
        const auto last = graph.vertex_osm_ids()[segment.last_vertex];
        if (segment.way_id == way && ((first == a && last == b) || (first == b && last == a))) return segment;
    }
    FAIL("no segment of way " << way << " between " << a << " and " << b);
    return graph.segments()[0];
}

} // namespace

TEST_CASE("vertices are junctions, road ends and nodes a way uses twice") {
    const auto graph = build_fixture("extract/junctions.osm", "car");
    std::set<std::int64_t> vertices(graph.vertex_osm_ids().begin(), graph.vertex_osm_ids().end());
    CHECK(vertices == std::set<std::int64_t>{1, 3, 5, 7, 8, 11, 12, 14, 15, 16});
    CHECK(graph.vertex_count() == 10);
    // way 1: 2, way 2: 1, way 3: 1 (a ring), way 4: 3 (11-12, the spur 12-13-12, 12-14), way 5: 1
    CHECK(graph.segment_count() == 8);
    CHECK(graph.edge_count() == 16);
}

TEST_CASE("segments carry their shape points and haversine lengths in decimetres") {
    const auto graph = build_fixture("extract/junctions.osm", "car");
    struct Expected { std::int64_t way, a, b; std::initializer_list<std::int64_t> path; std::uint32_t shape_points; };
    const Expected expected[] = {
        {1, 1, 3, {1, 2, 3}, 1},
        {1, 3, 5, {3, 4, 5}, 1},
        {2, 3, 7, {3, 6, 7}, 1},
        {3, 8, 8, {8, 9, 10, 8}, 2},
        {4, 11, 12, {11, 12}, 0},
        {5, 15, 16, {15, 16}, 0},
    };
    for (const auto& e : expected) {
        INFO("way " << e.way << " " << e.a << "-" << e.b);
        const auto& segment = segment_between(graph, e.way, e.a, e.b);
        CHECK(segment.shape_end - segment.shape_begin == e.shape_points);
        // Rounded to whole decimetres; the rescaled libosmium distance agrees to well under 1 dm.
        CHECK(static_cast<double>(segment.length_dm) == Approx(path_length(e.path) * 10).margin(0.6));
    }
    // Way 4 goes 11-12-13-12-14: node 12 is used twice, so the spur 12-13-12 is its own segment
    // (a loop at vertex 12, with node 13 as its shape point) and 12-14 another.
    CHECK(static_cast<double>(segment_between(graph, 4, 12, 12).length_dm) == Approx(path_length({12, 13, 12}) * 10).margin(0.6));
    CHECK(static_cast<double>(segment_between(graph, 4, 12, 14).length_dm) == Approx(path_length({12, 14}) * 10).margin(0.6));
    // Names: both pieces of way 1 and way 2 share the one stored "Long Street"; way 4 uses its ref.
    const auto& long_street = segment_between(graph, 1, 1, 3);
    CHECK(graph.name(long_street.name) == "Long Street");
    CHECK(segment_between(graph, 2, 3, 7).name == long_street.name);
    CHECK(graph.name(segment_between(graph, 4, 11, 12).name) == "S 4");
    // The shape point of 1-3 is node 2's position.
    CHECK(graph.shape_points()[long_street.shape_begin] == graph::Coordinate::from_degrees(18.0, -139.999));
}

TEST_CASE("ways referring to nodes missing from the extract are skipped and counted") {
    const auto graph = build_fixture("extract/missing_nodes.osm", "car");
    CHECK(graph.segment_count() == 1);
    CHECK(graph.segments()[0].way_id == 1);
    CHECK(metadata(graph, "ways_missing_nodes") == "1");
    CHECK(metadata(graph, "road_ways") == "1");
}

TEST_CASE("an extract without roads is a clear input error naming the file") {
    try {
        build_fixture("extract/no_roads.osm", "car");
        FAIL("no error");
    } catch (const InputError& error) {
        const std::string message = error.what();
        CHECK(message.find("no_roads.osm") != std::string::npos);
        CHECK(message.find("no roads") != std::string::npos);
    }
}

TEST_CASE("metadata records provenance") {
    const auto graph = build_fixture("extract/junctions.osm", "foot");
    CHECK(metadata(graph, "source") == "junctions.osm");
    CHECK(metadata(graph, "profile") == "foot");
    CHECK(metadata(graph, "source_timestamp").empty());   // an XML file without replication header
    const std::string built_at = metadata(graph, "built_at");
    REQUIRE(built_at.size() == 20);                       // YYYY-MM-DDTHH:MM:SSZ
    CHECK(built_at[10] == 'T');
    CHECK(built_at.back() == 'Z');
}
