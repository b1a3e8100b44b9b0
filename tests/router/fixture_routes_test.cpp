// Hand-written fixtures (fixtures/router/*.osm, read by the real extractor) where one-ways, turn
// restrictions (no_left_turn, only_straight_on), a bollard and mid-edge stops change the answer
// in a way worked out by hand: which streets the route takes, and its length compared with the
// haversine length of those streets (graph/haversine.hpp; the IUGG mean-radius formula).
#include "extract/road_extractor.hpp"
#include "graph/haversine.hpp"
#include "router/road_router.hpp"
#include "tests/router/test_graphs.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::router;

namespace {

graph::RoadGraph fixture_graph(const std::string& name) {
    extract::ExtractOptions options;
    options.input_path = test::fixture_path("router/" + name);
    return extract::extract_and_build_road_graph(options, nullptr);
}

// The OSM ways a route drives, consecutive repeats merged.
std::vector<std::int64_t> ways_of(const RoadRouter& router, const RoutePath& path) {
    std::vector<std::int64_t> ways;
    for (const PathPiece& piece : path.pieces) {
        const std::int64_t way = router.road_graph().segments()[piece.segment].way_id;
        if (ways.empty() || ways.back() != way) ways.push_back(way);
    }
    return ways;
}

double meters(double lat1, double lon1, double lat2, double lon2) { return graph::haversine_meters(lat1, lon1, lat2, lon2); }

RoutePath route_between(const RoadRouter& router, double lat1, double lon1, double lat2, double lon2,
                        Engine engine = Engine::dijkstra) {
    const SnappedStop from = router.snap("from", lat1, lon1);
    const SnappedStop to = router.snap("to", lat2, lon2);
    const auto path = router.route(from, to, Metric::time, engine);
    REQUIRE(path.has_value());
    // Both engines agree on every fixture route.
    const auto other = router.route(from, to, Metric::time, engine == Engine::dijkstra ? Engine::hierarchy : Engine::dijkstra);
    REQUIRE(other.has_value());
    REQUIRE(other->time_ds == path->time_ds);
    REQUIRE(other->length_dm == path->length_dm);
    return *path;
}

// Mid-points of the arms of the junction in turns.osm.
constexpr double kSouthArmLat = 18.00045, kSouthArmLon = -140.9990;   // way 1
constexpr double kNorthArmLat = 18.00135, kNorthArmLon = -140.9990;   // way 2
constexpr double kWestArmLat = 18.0009, kWestArmLon = -140.9995;      // way 3
constexpr double kEastArmLat = 18.0009, kEastArmLon = -140.9985;      // way 4
constexpr double kRow = 0.0009, kColumn = 0.0010;

} // namespace

TEST_CASE("no_left_turn sends the route round the block; ignoring restrictions turns left", "[fixtures]") {
    const graph::RoadGraph graph = fixture_graph("turns.osm");
    REQUIRE(graph.turn_restrictions().size() == 2);
    const RoadRouter honouring(graph);
    const RoutePath detour = route_between(honouring, kSouthArmLat, kSouthArmLon, kWestArmLat, kWestArmLon);
    // Back south along way 1 to node 12, round way 5 (12 -> 11 -> 21), east on way 3.
    REQUIRE(ways_of(honouring, detour) == std::vector<std::int64_t>{1, 5, 3});
    const double expected = meters(18.00045, -140.999, 18.0, -140.999) + meters(18.0, -140.999, 18.0, -141.0) +
                            meters(18.0, -141.0, 18.0009, -141.0) + meters(18.0009, -141.0, 18.0009, -140.9995);
    REQUIRE(detour.meters() == Approx(expected).margin(0.5));

    RouterOptions ignoring;
    ignoring.restrictions = RestrictionPolicy::ignore;
    const RoadRouter free_turns(graph, ignoring);
    const RoutePath left_turn = route_between(free_turns, kSouthArmLat, kSouthArmLon, kWestArmLat, kWestArmLon);
    REQUIRE(ways_of(free_turns, left_turn) == std::vector<std::int64_t>{1, 3});
    REQUIRE(left_turn.meters() == Approx(meters(18.00045, -140.999, 18.0009, -140.999) +
                                         meters(18.0009, -140.999, 18.0009, -140.9995))
                                      .margin(0.5));

    // The restriction forbids only that turn: turning right onto way 4 stays direct.
    const RoutePath right_turn = route_between(honouring, kSouthArmLat, kSouthArmLon, kEastArmLat, kEastArmLon);
    REQUIRE(ways_of(honouring, right_turn) == std::vector<std::int64_t>{1, 4});
}

TEST_CASE("only_straight_on forbids the left turn from the west arm but allows straight on", "[fixtures]") {
    const graph::RoadGraph graph = fixture_graph("turns.osm");
    const RoadRouter router(graph);
    const RoutePath detour = route_between(router, kWestArmLat, kWestArmLon, kNorthArmLat, kNorthArmLon);
    // West to node 21, north round way 8 (21 -> 31 -> 32), south on way 2.
    REQUIRE(ways_of(router, detour) == std::vector<std::int64_t>{3, 8, 2});
    const double expected = meters(18.0009, -140.9995, 18.0009, -141.0) + meters(18.0009, -141.0, 18.0018, -141.0) +
                            meters(18.0018, -141.0, 18.0018, -140.999) + meters(18.0018, -140.999, 18.00135, -140.999);
    REQUIRE(detour.meters() == Approx(expected).margin(0.5));
    const RoutePath straight = route_between(router, kWestArmLat, kWestArmLon, kEastArmLat, kEastArmLon, Engine::hierarchy);
    REQUIRE(ways_of(router, straight) == std::vector<std::int64_t>{3, 4});
    (void)kRow;
    (void)kColumn;
}

TEST_CASE("A one-way street is driven only its way; mid-edge stops pay only their part", "[fixtures]") {
    const graph::RoadGraph graph = fixture_graph("block.osm");
    const RoadRouter router(graph);
    // Market Street (way 11) runs one way east from 101 (lon -141.0000) to 102 (lon -140.9981).
    const double lat = 18.0100, west = -141.0, east = -140.9981;
    const double quarter = west + 0.25 * (east - west), three_quarters = west + 0.75 * (east - west);
    const RoutePath with_flow = route_between(router, lat, quarter, lat, three_quarters);
    REQUIRE(ways_of(router, with_flow) == std::vector<std::int64_t>{11});
    REQUIRE(with_flow.meters() == Approx(meters(lat, quarter, lat, three_quarters)).margin(0.2));
    // Time: half of the street's edge time, to the rounding of the two partial costs.
    const graph::Segment& market = graph.segments()[router.snap("a", lat, quarter).segment];
    const double street_seconds = graph.edges()[market.forward_edge].time_ds / 10.0;
    REQUIRE(with_flow.seconds() == Approx(street_seconds / 2).margin(0.15));
    REQUIRE(market.backward_edge == graph::kNoEdge);

    // Against the flow: on to 102, round the block (12, 13, 14) and back along way 11.
    const RoutePath against = route_between(router, lat, three_quarters, lat, quarter);
    REQUIRE(ways_of(router, against) == std::vector<std::int64_t>{11, 12, 13, 14, 11});
    const double round_block = meters(lat, three_quarters, lat, east) + meters(lat, east, 18.0109, east) +
                               meters(18.0109, east, 18.0109, west) + meters(18.0109, west, lat, west) +
                               meters(lat, west, lat, quarter);
    REQUIRE(against.meters() == Approx(round_block).margin(0.5));
}

TEST_CASE("A bollard closes the short cut to cars", "[fixtures]") {
    const graph::RoadGraph graph = fixture_graph("block.osm");
    const RoadRouter router(graph);
    // From corner 104 to corner 102: the diagonal (way 15) would be about 224 m; round two sides
    // of the block is about 301 m.
    const RoutePath path = route_between(router, 18.0109, -141.0, 18.0100, -140.9981);
    const auto ways = ways_of(router, path);
    REQUIRE(std::find(ways.begin(), ways.end(), 15) == ways.end());
    const double diagonal = meters(18.0109, -141.0, 18.01045, -140.99905) + meters(18.01045, -140.99905, 18.01, -140.9981);
    const double round_north = meters(18.0109, -141.0, 18.0109, -140.9981) + meters(18.0109, -140.9981, 18.01, -140.9981);
    REQUIRE(diagonal < round_north - 50);
    REQUIRE(path.meters() == Approx(round_north).margin(0.5));
}

TEST_CASE("U-turns happen only at dead ends", "[fixtures]") {
    // W --P (one way)--> J --Q-- N --R-- W, and a spur J --S-- E. No left turn from P onto Q.
    // Leaving P at J, the only way on is the spur: a car drives to its end, turns round there
    // and comes back to turn into Q. When the spur continues (T) to X, E is no longer a dead end
    // and the turn round moves to X.
    for (const bool spur_continues : {false, true}) {
        test::GraphBuilder builder;
        const auto w = builder.add_vertex(18.02, -141.0);
        const auto j = builder.add_vertex(18.02, -140.999);
        const auto n = builder.add_vertex(18.021, -140.999);
        const auto e = builder.add_vertex(18.02, -140.998);
        const auto p = builder.add_road(w, j, 30, true, false, "P");
        const auto q = builder.add_road(j, n, 30, true, true, "Q");
        builder.add_road(n, w, 30, true, true, "R");
        builder.add_road(j, e, 30, true, true, "S");
        if (spur_continues) {
            const auto x = builder.add_vertex(18.02, -140.997);
            builder.add_road(e, x, 30, true, true, "T");
        }
        builder.add_restriction(p, j, q, graph::RestrictionKind::no_turn);
        const graph::RoadGraph graph = builder.build();
        const RoadRouter router(graph);
        const RoutePath path = route_between(router, 18.02, -140.9995, 18.0205, -140.999);
        std::vector<std::string> names;
        for (const PathPiece& piece : path.pieces) {
            names.emplace_back(graph.name(graph.segments()[piece.segment].name));
        }
        const std::vector<std::string> expected =
            spur_continues ? std::vector<std::string>{"P", "S", "T", "T", "S", "Q"}
                           : std::vector<std::string>{"P", "S", "S", "Q"};
        REQUIRE(names == expected);
        const double spur = meters(18.02, -140.999, 18.02, -140.998) +
                            (spur_continues ? meters(18.02, -140.998, 18.02, -140.997) : 0.0);
        REQUIRE(path.meters() == Approx(meters(18.02, -140.9995, 18.02, -140.999) + 2 * spur +
                                        meters(18.02, -140.999, 18.0205, -140.999))
                                     .margin(0.5));
    }
}

TEST_CASE("A stop is a standstill: a turn-around there can beat a restricted junction", "[fixtures][triangle]") {
    // The documented rule (router/hierarchy/HIERARCHY.md, "Stops"): a trip may leave a stop either way its
    // road allows, so the triangle inequality can fail through a stop where a vehicle turns
    // round: south arm -> north arm (straight on), then north arm -> west arm (turn round at the
    // stop, right turn) is shorter than the direct trip, whose left turn is forbidden.
    const graph::RoadGraph graph = fixture_graph("turns.osm");
    const RoadRouter router(graph);
    const std::vector<SnappedStop> stops{router.snap("x", kSouthArmLat, kSouthArmLon),
                                         router.snap("y", 18.00100, -140.9990),
                                         router.snap("z", kWestArmLat, kWestArmLon)};
    const TravelMatrix matrix = router.matrix(stops, Metric::distance, Engine::dijkstra);
    REQUIRE(matrix.length_dm(0, 2) > matrix.length_dm(0, 1) + matrix.length_dm(1, 2));
    const double via_y = meters(18.00045, -140.999, 18.001, -140.999) + meters(18.001, -140.999, 18.0009, -140.999) +
                         meters(18.0009, -140.999, 18.0009, -140.9995);
    REQUIRE((matrix.length_dm(0, 1) + matrix.length_dm(1, 2)) / 10.0 == Approx(via_y).margin(0.5));
    // Without the restriction the inequality holds again.
    RouterOptions ignoring;
    ignoring.restrictions = RestrictionPolicy::ignore;
    const RoadRouter free_turns(graph, ignoring);
    const TravelMatrix free_matrix = free_turns.matrix(stops, Metric::distance, Engine::dijkstra);
    REQUIRE(free_matrix.length_dm(0, 2) <= free_matrix.length_dm(0, 1) + free_matrix.length_dm(1, 2));
}
