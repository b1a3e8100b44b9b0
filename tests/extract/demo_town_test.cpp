// The invented demo town (fixtures/demo/port-ambrell.osm) has what its README promises, so the
// demo shows every rule: this guards the demo data, the rules themselves are tested elsewhere.

#include "tests/extract/extract_test_support.hpp"

#include "common/csv_reader.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

using namespace ringroad;
using namespace ringroad::test;

namespace {

bool any_edge_with(const graph::RoadGraph& graph, std::uint16_t flag) {
    for (const auto& edge : graph.edges()) {
        if (edge.flags & flag) return true;
    }
    return false;
}

bool has_street(const graph::RoadGraph& graph, std::string_view name) {
    for (const auto& segment : graph.segments()) {
        if (segment.name != graph::kNoName && graph.name(segment.name) == name) return true;
    }
    return false;
}

} // namespace

TEST_CASE("demo town: 40 to 80 junctions, all in one component, for every profile") {
    for (const char* profile : {"car", "bicycle", "foot"}) {
        INFO(profile);
        const auto graph = build_fixture("demo/port-ambrell.osm", profile);
        CHECK(graph.vertex_count() >= 40);
        CHECK(graph.vertex_count() <= 80);
        CHECK(graph.component_count() == 1);
    }
}

TEST_CASE("demo town: main road, roundabout, one-way loop, toll, ferry, restrictions, private lane") {
    const auto car = build_fixture("demo/port-ambrell.osm", "car");
    CHECK(has_street(car, "Harbour Road"));
    CHECK(any_edge_with(car, graph::edge_flag::roundabout));
    CHECK(any_edge_with(car, graph::edge_flag::toll));
    CHECK(any_edge_with(car, graph::edge_flag::ferry));
    CHECK(any_edge_with(car, graph::edge_flag::barrier_delay));   // the quarry's lift gate
    CHECK(car.turn_restrictions().size() == 2);
    CHECK(metadata(car, "restrictions_unmatched") == "0");
    CHECK_FALSE(has_street(car, "Manor Drive"));                  // private
    CHECK_FALSE(has_street(car, "Park Walk"));                    // footway
    std::size_t loop_segments = 0;   // the loop is split where Market Street meets it, south and north
    for (const auto& segment : car.segments()) {
        if (car.name(segment.name) != "Market Loop") continue;
        CHECK((segment.forward_edge == graph::kNoEdge) != (segment.backward_edge == graph::kNoEdge));
        ++loop_segments;
    }
    CHECK(loop_segments == 2);
    CHECK(metadata(car, "blocking_barriers") == "1");             // Cooper Street's bollard

    const auto foot = build_fixture("demo/port-ambrell.osm", "foot");
    CHECK(has_street(foot, "Park Walk"));
}

// Distance in metres from a point to the segment a-b, on a local flat projection (fine at town scale).
static double distance_to_piece(double lat, double lon, graph::Coordinate a, graph::Coordinate b) {
    const double metres_per_degree = 111195.0, cos_lat = std::cos(lat * 3.14159265358979 / 180.0);
    const double ax = (a.lon() - lon) * metres_per_degree * cos_lat, ay = (a.lat() - lat) * metres_per_degree;
    const double bx = (b.lon() - lon) * metres_per_degree * cos_lat, by = (b.lat() - lat) * metres_per_degree;
    const double dx = bx - ax, dy = by - ay, length2 = dx * dx + dy * dy;
    const double t = length2 > 0 ? std::clamp(-(ax * dx + ay * dy) / length2, 0.0, 1.0) : 0.0;
    return std::hypot(ax + t * dx, ay + t * dy);
}

TEST_CASE("demo stops: id,lat,lon,name, every stop within 30 m of a car road") {
    const auto table = read_csv_file(fixture_path("demo/stops.csv"));
    REQUIRE(table.header == std::vector<std::string>{"id", "lat", "lon", "name"});
    CHECK(table.rows.size() >= 10);
    const auto car = build_fixture("demo/port-ambrell.osm", "car");
    for (const auto& row : table.rows) {
        const double lat = std::stod(row.fields[1]), lon = std::stod(row.fields[2]);
        double nearest = 1e9;
        for (graph::SegmentId s = 0; s < car.segment_count(); ++s) {
            const auto points = car.segment_geometry(s);
            for (std::size_t i = 1; i < points.size(); ++i) nearest = std::min(nearest, distance_to_piece(lat, lon, points[i - 1], points[i]));
        }
        INFO("stop " << row.fields[0]);
        CHECK(nearest < 30.0);
    }
}
