// Ways that are never roads (fixtures/extract/excluded.osm): highway=construction and
// highway=proposed (OSM wiki: not yet usable), area=yes (a square, not a line to follow),
// steps for vehicles, buildings and unknown highway values.

#include "tests/extract/extract_test_support.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::test;

TEST_CASE("only the ordinary street is a road for a car") {
    const auto graph = build_fixture("extract/excluded.osm", "car");
    REQUIRE(graph.segment_count() == 1);
    CHECK(graph.segments()[0].way_id == 7);
    CHECK(graph.vertex_count() == 2);
    CHECK(metadata(graph, "road_ways") == "1");
}

TEST_CASE("a pedestrian also takes the steps, but no area or unbuilt road") {
    const auto graph = build_fixture("extract/excluded.osm", "foot");
    std::vector<std::int64_t> ways;
    for (const auto& segment : graph.segments()) ways.push_back(segment.way_id);
    std::sort(ways.begin(), ways.end());
    CHECK(ways == std::vector<std::int64_t>{5, 7});
    const auto steps = edges_of_way(graph, 5).at(0).edge;
    CHECK(steps.time_ds == expected_time_ds(steps.length_dm, 3));
    CHECK(steps.road_class == static_cast<std::uint8_t>(graph::RoadClass::steps));
}
