// Edge flags and ferries (fixtures/extract/flags.osm): toll=yes, surface=* unpaved values,
// junction=roundabout, route=ferry with duration=* (OSM wiki Key:duration: "HH:MM" or ISO 8601)
// and without it, and who may board (OSM wiki Tag:route=ferry: vehicle access tags say whether
// cars are carried).

#include "tests/extract/extract_test_support.hpp"

#include <catch2/catch.hpp>

#include <numeric>

using namespace ringroad;
using namespace ringroad::test;

namespace {

std::uint16_t flags_of(const graph::RoadGraph& graph, std::int64_t way) {
    const auto edges = edges_of_way(graph, way);
    REQUIRE(!edges.empty());
    return edges[0].edge.flags;
}

std::uint32_t forward_time_ds(const graph::RoadGraph& graph, std::int64_t way) {
    std::uint32_t total = 0;
    for (const auto& directed : edges_of_way(graph, way)) {
        if (!directed.edge.reversed) total += directed.edge.time_ds;
    }
    return total;
}

} // namespace

TEST_CASE("toll, unpaved and roundabout flags; road class and names are kept") {
    const auto graph = build_fixture("extract/flags.osm", "car");
    CHECK(flags_of(graph, 1) == graph::edge_flag::toll);
    CHECK(flags_of(graph, 2) == graph::edge_flag::unpaved);
    CHECK(flags_of(graph, 6) == graph::edge_flag::roundabout);
    CHECK(directions_of_way(graph, 6) == both_ways(61, 62));   // roundabout with explicit oneway=no
    CHECK(flags_of(graph, 7) == 0);
    const auto track = edges_of_way(graph, 2).at(0).edge;
    CHECK(track.road_class == static_cast<std::uint8_t>(graph::RoadClass::track));
    CHECK(track.time_ds == expected_time_ds(track.length_dm, 15));
    const auto lane = edges_of_way(graph, 7).at(0).edge;
    CHECK(graph.name(graph.segments()[lane.segment].name) == "Test Lane");
    CHECK(graph.segments()[edges_of_way(graph, 1).at(0).edge.segment].name == graph::kNoName);
}

TEST_CASE("car ferries: the duration tag is the crossing time, shared among segments by length") {
    const auto graph = build_fixture("extract/flags.osm", "car");
    // Way 3 (duration 00:30) is split at node 32, where a service road lands: two segments whose
    // times add up to 30 minutes (each rounded to a tenth of a second).
    const auto ferry = edges_of_way(graph, 3);
    REQUIRE(ferry.size() == 4);
    CHECK(forward_time_ds(graph, 3) == Approx(18000).margin(1));
    for (const auto& directed : ferry) {
        CHECK(directed.edge.flags == (graph::edge_flag::ferry | graph::edge_flag::toll));
        CHECK(directed.edge.road_class == static_cast<std::uint8_t>(graph::RoadClass::ferry));
        CHECK(directed.edge.time_ds == Approx(9000).margin(20));   // the two halves are almost equal
    }
    CHECK(forward_time_ds(graph, 8) == 45000);                   // PT1H15M
    // Without a duration: the ferry speed of 15 km/h (common practice).
    const auto slow = edges_of_way(graph, 4).at(0).edge;
    CHECK(slow.time_ds == expected_time_ds(slow.length_dm, 15));
    // A ferry without vehicle tags carries no cars.
    CHECK(directions_of_way(graph, 5) == no_way());
}

TEST_CASE("pedestrians and cyclists board any ferry not closed to them") {
    for (const char* profile : {"foot", "bicycle"}) {
        const auto graph = build_fixture("extract/flags.osm", profile);
        CHECK(directions_of_way(graph, 5) == both_ways(51, 52));
        const auto ferry = edges_of_way(graph, 5).at(0).edge;
        CHECK(ferry.time_ds == expected_time_ds(ferry.length_dm, 15));
        CHECK(forward_time_ds(graph, 8) == 45000);
    }
}
