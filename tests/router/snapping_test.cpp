// Snapping a stop to the nearest road of the main component; distances checked with the
// haversine formula (graph/haversine.hpp) on hand-placed points, errors naming the stop.
#include "common/input_error.hpp"
#include "graph/haversine.hpp"
#include "router/road_router.hpp"
#include "router/snapping.hpp"
#include "tests/router/test_graphs.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::router;

namespace {

// An east-west street of about 211 m at 18.03 N with a bend (shape point) in the middle, a
// north-south street off its east end, and far away a short one-way stub that is its own
// (smaller) strongly connected component.
graph::RoadGraph small_town() {
    test::GraphBuilder builder;
    const auto west = builder.add_vertex(18.03, -141.0);
    const auto east = builder.add_vertex(18.03, -140.998);
    const auto north = builder.add_vertex(18.032, -140.998);
    builder.add_road(west, east, 50, true, true, "High Street", {graph::Coordinate::from_degrees(18.0301, -140.999)});
    builder.add_road(east, north, 50, true, true, "Hill Road");
    builder.add_road(north, west, 50, true, true, "Back Road");
    const auto stub_start = builder.add_vertex(18.035, -141.0);
    const auto stub_end = builder.add_vertex(18.035, -140.9995);
    builder.add_road(stub_start, stub_end, 30, true, false, "Stub");
    return builder.build();
}

std::string error_of(const std::function<void()>& action) {
    try {
        action();
    } catch (const InputError& error) {
        return error.what();
    }
    return "(no error)";
}

} // namespace

TEST_CASE("A stop snaps to the nearest point of the nearest road, with fraction and distance", "[snapping]") {
    const graph::RoadGraph graph = small_town();
    const RoadSnapper snapper(graph);
    // 30 m south of the shape point of High Street (0.00027 degrees of latitude ~ 30.0 m).
    const SnappedStop stop = snapper.snap("depot", 18.0301 - 0.00027, -140.999, 500);
    REQUIRE(stop.id == "depot");
    REQUIRE(graph.name(graph.segments()[stop.segment].name) == "High Street");
    // The foot of the perpendicular on a bent street is near the bend, about half way along.
    REQUIRE(stop.fraction == Approx(0.5).margin(0.02));
    const double to_road = graph::haversine_meters(stop.requested, stop.on_road);
    REQUIRE(stop.snap_distance_meters == Approx(to_road).margin(1e-6));
    REQUIRE(stop.snap_distance_meters < 30.1);
    REQUIRE(stop.snap_distance_meters > 25.0);   // the street slopes away from the bend
}

TEST_CASE("A stop exactly on a junction snaps to fraction 0 or 1 of a road there", "[snapping]") {
    const graph::RoadGraph graph = small_town();
    const RoadSnapper snapper(graph);
    const SnappedStop stop = snapper.snap("corner", 18.03, -140.998, 500);
    REQUIRE(stop.snap_distance_meters == Approx(0.0).margin(0.01));
    REQUIRE((stop.fraction == 0.0 || stop.fraction == 1.0));
}

TEST_CASE("Only the main component is snapped to", "[snapping]") {
    const graph::RoadGraph graph = small_town();
    REQUIRE(graph.component_count() >= 2);
    const RoadSnapper snapper(graph);
    // Right on the stub (its own component): snaps to Back Road instead, about 300 m south-ish.
    const SnappedStop stop = snapper.snap("stub", 18.035, -140.99975, 1000);
    REQUIRE(graph.name(graph.segments()[stop.segment].name) != "Stub");
    REQUIRE(stop.snap_distance_meters > 200);
}

TEST_CASE("Snapping errors name the stop and the distance", "[snapping]") {
    const graph::RoadGraph graph = small_town();
    const RoadSnapper snapper(graph);
    // About 2.8 km north of the region's bounds: outside them.
    const std::string far = error_of([&] { snapper.snap("farm", 18.06, -140.999, 500); });
    REQUIRE_THAT(far, Catch::Contains("stop 'farm'"));
    REQUIRE_THAT(far, Catch::Contains("outside the region's bounds"));
    // About 300 m from the nearest road of the main component (the stub does not count).
    const std::string beyond_radius = error_of([&] { snapper.snap("farm", 18.0345, -140.999, 200); });
    REQUIRE_THAT(beyond_radius, Catch::Contains("stop 'farm' is"));
    REQUIRE_THAT(beyond_radius, Catch::Contains("m from the nearest road (snap radius 200 m)"));
    REQUIRE_NOTHROW(snapper.snap("farm", 18.0345, -140.999, 500));
    REQUIRE_THAT(error_of([&] { snapper.snap("pole", 91.0, 0.0, 500); }), Catch::Contains("stop 'pole': latitude 91"));
    REQUIRE_THAT(error_of([&] { snapper.snap("dateline", 18.03, -181.0, 500); }),
                 Catch::Contains("stop 'dateline': longitude -181"));
    REQUIRE_THAT(error_of([&] { snapper.snap("nan", std::nan(""), 0.0, 500); }), Catch::Contains("stop 'nan'"));
}

TEST_CASE("The router's snap radius is configurable", "[snapping]") {
    const graph::RoadGraph graph = small_town();
    RouterOptions tight;
    tight.snap_radius_meters = 10;
    const RoadRouter router(graph, tight);
    REQUIRE_THAT(error_of([&] { router.snap("shop", 18.0301 - 0.00027, -140.999); }),
                 Catch::Contains("snap radius 10 m"));
    REQUIRE_NOTHROW(router.snap("shop", 18.0301 - 0.00005, -140.999));
}
