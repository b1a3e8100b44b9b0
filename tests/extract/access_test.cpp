// Access tags (fixtures/extract/access.osm): the key hierarchy access < vehicle < motor_vehicle <
// motorcar (car), access < vehicle < bicycle, access < foot, is the one the OSM wiki gives on
// Key:access ("land-based transportation" tree); the most specific key present decides.
// no/private (and agricultural, ...) close the road; destination opens it with a flag.

#include "tests/extract/extract_test_support.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::test;

namespace {

bool destination_flagged(const graph::RoadGraph& graph, std::int64_t way) {
    const auto edges = edges_of_way(graph, way);
    REQUIRE(!edges.empty());
    for (const auto& directed : edges) {
        if ((directed.edge.flags & graph::edge_flag::destination_only) == 0) return false;
    }
    return true;
}

std::vector<std::pair<std::int64_t, std::int64_t>> open(std::int64_t way) { return both_ways(way * 10 + 1, way * 10 + 2); }

} // namespace

TEST_CASE("car access") {
    const auto graph = build_fixture("extract/access.osm", "car");
    CHECK(directions_of_way(graph, 1) == no_way());     // access=no
    CHECK(directions_of_way(graph, 2) == no_way());     // access=private
    CHECK(directions_of_way(graph, 3) == open(3));      // access=destination
    CHECK(destination_flagged(graph, 3));
    CHECK(directions_of_way(graph, 4) == no_way());     // motor_vehicle=no
    CHECK(directions_of_way(graph, 5) == open(5));      // access=no + motorcar=yes
    CHECK_FALSE(destination_flagged(graph, 5));
    CHECK(directions_of_way(graph, 6) == no_way());     // vehicle=no
    CHECK(directions_of_way(graph, 7) == open(7));      // bicycle=no
    CHECK(directions_of_way(graph, 8) == open(8));      // foot=no
    CHECK(directions_of_way(graph, 9) == no_way());     // access=no + foot=yes
    CHECK(directions_of_way(graph, 10) == no_way());    // footway + bicycle=yes
    CHECK(directions_of_way(graph, 11) == no_way());    // footway
    CHECK(directions_of_way(graph, 12) == open(12));    // motor_vehicle=destination
    CHECK(destination_flagged(graph, 12));
    CHECK(directions_of_way(graph, 13) == open(13));    // access=private + motorcar=destination
    CHECK(destination_flagged(graph, 13));
    CHECK(directions_of_way(graph, 14) == open(14));
    CHECK(directions_of_way(graph, 15) == no_way());    // cycleway
    CHECK(directions_of_way(graph, 16) == open(16));    // trunk + motorroad=yes
    CHECK(directions_of_way(graph, 17) == no_way());    // access=agricultural
    CHECK(directions_of_way(graph, 18) == open(18));    // an unknown access value is ignored
}

TEST_CASE("bicycle access") {
    const auto graph = build_fixture("extract/access.osm", "bicycle");
    CHECK(directions_of_way(graph, 1) == no_way());
    CHECK(directions_of_way(graph, 2) == no_way());
    CHECK(directions_of_way(graph, 3) == open(3));
    CHECK(destination_flagged(graph, 3));
    CHECK(directions_of_way(graph, 4) == open(4));      // motor_vehicle=no does not bind bicycles
    CHECK(directions_of_way(graph, 5) == no_way());
    CHECK(directions_of_way(graph, 6) == no_way());     // vehicle=no does
    CHECK(directions_of_way(graph, 7) == no_way());
    CHECK(directions_of_way(graph, 8) == open(8));
    CHECK(directions_of_way(graph, 9) == no_way());
    CHECK(directions_of_way(graph, 10) == open(10));    // footway opened by bicycle=yes
    CHECK(directions_of_way(graph, 11) == no_way());    // footway without permission
    CHECK(directions_of_way(graph, 12) == open(12));
    CHECK_FALSE(destination_flagged(graph, 12));
    CHECK(directions_of_way(graph, 13) == no_way());
    CHECK(directions_of_way(graph, 15) == open(15));
    CHECK(directions_of_way(graph, 16) == no_way());    // motorroad=yes
    const auto footway = edges_of_way(graph, 10).at(0).edge;
    CHECK(footway.time_ds == expected_time_ds(footway.length_dm, 10));
    const auto cycleway = edges_of_way(graph, 15).at(0).edge;
    CHECK(cycleway.time_ds == expected_time_ds(cycleway.length_dm, 18));
}

TEST_CASE("foot access") {
    const auto graph = build_fixture("extract/access.osm", "foot");
    CHECK(directions_of_way(graph, 1) == no_way());
    CHECK(directions_of_way(graph, 2) == no_way());
    CHECK(directions_of_way(graph, 3) == open(3));
    CHECK(directions_of_way(graph, 4) == open(4));
    CHECK(directions_of_way(graph, 5) == no_way());
    CHECK(directions_of_way(graph, 6) == open(6));      // vehicle=no does not bind pedestrians
    CHECK(directions_of_way(graph, 7) == open(7));
    CHECK(directions_of_way(graph, 8) == no_way());     // foot=no
    CHECK(directions_of_way(graph, 9) == open(9));      // access=no + foot=yes
    CHECK(directions_of_way(graph, 11) == open(11));
    CHECK(directions_of_way(graph, 16) == no_way());
    CHECK(directions_of_way(graph, 17) == no_way());
    for (std::int64_t way : {3, 11, 14}) {
        const auto edge = edges_of_way(graph, way).at(0).edge;
        CHECK(edge.time_ds == expected_time_ds(edge.length_dm, 5));
    }
}
