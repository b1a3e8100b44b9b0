// oneway=* and implied one-way streets (fixtures/extract/oneway.osm). The rules are those of the
// OSM wiki's Key:oneway page (yes/true/1, -1/reverse, no, reversible/alternating) and its
// statement that motorways and junction=roundabout imply oneway=yes; motorway_link and
// junction=circular are implied too (common practice).

#include "tests/extract/extract_test_support.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::test;

TEST_CASE("car: oneway values decide the directions of travel") {
    const auto graph = build_fixture("extract/oneway.osm", "car");
    CHECK(directions_of_way(graph, 1) == one_way(11, 12));    // oneway=yes
    CHECK(directions_of_way(graph, 2) == one_way(21, 22));    // oneway=true
    CHECK(directions_of_way(graph, 3) == one_way(31, 32));    // oneway=1
    CHECK(directions_of_way(graph, 4) == one_way(42, 41));    // oneway=-1
    CHECK(directions_of_way(graph, 5) == one_way(52, 51));    // oneway=reverse
    CHECK(directions_of_way(graph, 6) == both_ways(61, 62));  // oneway=no
    CHECK(directions_of_way(graph, 7) == no_way());           // oneway=reversible: excluded
    CHECK(directions_of_way(graph, 13) == both_ways(131, 132)); // no oneway tag
    CHECK(directions_of_way(graph, 14) == no_way());          // oneway=alternating: excluded
}

TEST_CASE("car: motorways and roundabouts are one-way unless tagged otherwise") {
    const auto graph = build_fixture("extract/oneway.osm", "car");
    CHECK(directions_of_way(graph, 8) == one_way(81, 82));    // motorway
    CHECK(directions_of_way(graph, 9) == both_ways(91, 92));  // motorway + oneway=no
    CHECK(directions_of_way(graph, 10) == one_way(101, 102)); // motorway_link

    for (std::int64_t roundabout : {11, 12}) {                 // junction=roundabout, =circular
        const auto edges = edges_of_way(graph, roundabout);
        REQUIRE(edges.size() == 1);                            // a closed ring: one segment, one direction
        const auto& segment = graph.segments()[edges[0].edge.segment];
        CHECK(segment.first_vertex == segment.last_vertex);
        CHECK(segment.shape_end - segment.shape_begin == 2);
        CHECK(edges[0].edge.reversed == 0);                    // along the drawing direction
        CHECK((edges[0].edge.flags & graph::edge_flag::roundabout) != 0);
    }
}

TEST_CASE("bicycle follows one-way streets too, and never uses motorways") {
    const auto graph = build_fixture("extract/oneway.osm", "bicycle");
    CHECK(directions_of_way(graph, 1) == one_way(11, 12));
    CHECK(directions_of_way(graph, 4) == one_way(42, 41));
    CHECK(directions_of_way(graph, 7) == no_way());
    CHECK(directions_of_way(graph, 8) == no_way());
    CHECK(directions_of_way(graph, 9) == no_way());
    CHECK(directions_of_way(graph, 10) == no_way());
}

TEST_CASE("foot walks both ways on one-way streets, reversible ones included") {
    const auto graph = build_fixture("extract/oneway.osm", "foot");
    CHECK(directions_of_way(graph, 1) == both_ways(11, 12));
    CHECK(directions_of_way(graph, 4) == both_ways(41, 42));
    CHECK(directions_of_way(graph, 7) == both_ways(71, 72));
    CHECK(directions_of_way(graph, 8) == no_way());            // motorway: not for pedestrians
    CHECK(edges_of_way(graph, 11).size() == 2);                // the roundabout, both ways
}

TEST_CASE("one-way edges keep the class speed: residential 30 km/h, motorway 110 km/h (car)") {
    const auto graph = build_fixture("extract/oneway.osm", "car");
    const auto street = edges_of_way(graph, 1).at(0).edge;
    CHECK(street.time_ds == expected_time_ds(street.length_dm, 30));
    CHECK(street.road_class == static_cast<std::uint8_t>(graph::RoadClass::residential));
    const auto motorway = edges_of_way(graph, 8).at(0).edge;
    CHECK(motorway.time_ds == expected_time_ds(motorway.length_dm, 110));
    CHECK(motorway.road_class == static_cast<std::uint8_t>(graph::RoadClass::motorway));
}
