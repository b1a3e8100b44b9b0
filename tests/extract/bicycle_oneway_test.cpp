// Bicycle exceptions to one-way streets (fixtures/extract/bicycle_oneway.osm), as the OSM wiki
// describes them on Key:oneway:bicycle and Key:cycleway (opposite, opposite_lane, opposite_track).

#include "tests/extract/extract_test_support.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::test;

TEST_CASE("bicycle: oneway:bicycle and cycleway=opposite* open the other direction") {
    const auto graph = build_fixture("extract/bicycle_oneway.osm", "bicycle");
    CHECK(directions_of_way(graph, 1) == one_way(11, 12));    // oneway=yes
    CHECK(directions_of_way(graph, 2) == both_ways(21, 22));  // + oneway:bicycle=no
    CHECK(directions_of_way(graph, 3) == both_ways(31, 32));  // + cycleway=opposite
    CHECK(directions_of_way(graph, 4) == both_ways(41, 42));  // + cycleway=opposite_lane
    CHECK(directions_of_way(graph, 5) == both_ways(51, 52));  // + cycleway:left=opposite_track
    CHECK(directions_of_way(graph, 6) == one_way(61, 62));    // oneway:bicycle=yes on a two-way street
    CHECK(directions_of_way(graph, 7) == both_ways(71, 72));  // oneway=-1 + oneway:bicycle=no
}

TEST_CASE("car: the bicycle exceptions do not apply") {
    const auto graph = build_fixture("extract/bicycle_oneway.osm", "car");
    CHECK(directions_of_way(graph, 2) == one_way(21, 22));
    CHECK(directions_of_way(graph, 3) == one_way(31, 32));
    CHECK(directions_of_way(graph, 4) == one_way(41, 42));
    CHECK(directions_of_way(graph, 5) == one_way(51, 52));
    CHECK(directions_of_way(graph, 6) == both_ways(61, 62));
    CHECK(directions_of_way(graph, 7) == one_way(72, 71));
}

TEST_CASE("bicycle: residential streets at the bicycle's own 18 km/h") {
    const auto graph = build_fixture("extract/bicycle_oneway.osm", "bicycle");
    for (const auto& directed : edges_of_way(graph, 2)) {
        CHECK(directed.edge.time_ds == expected_time_ds(directed.edge.length_dm, 18));
    }
}
