// `ringroad route` end to end on a small invented town: JSON, GeoJSON (RFC 7946: lon, lat) and
// GPX 1.1 shapes, the roads taken, engines agreeing, and bad input.
#include "common/safety_notice.hpp"
#include "graph/graph_file.hpp"
#include "graph/haversine.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "tests/router/test_graphs.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

using namespace ringroad;
using ringroad::test::run_ringroad;

namespace {

const std::string& region() {
    static const std::string path = [] {
        const std::string folder = test::make_scratch_dir("route-cli");
        const graph::RoadGraph graph = test::small_test_town(/*trap_spur=*/true);
        graph::write_road_graph(graph::attach_sections(graph, router::hierarchy::build_hierarchy_sections(graph)), folder + "/town.rrg");
        return folder + "/town.rrg";
    }();
    return path;
}

// From the middle of Row Street 0 (south) to the middle of Row Street 2 (north).
const std::vector<std::string> kTrip{"--from", "18.05,-140.99952", "--to", "18.0518,-140.99952"};

std::vector<std::string> with(std::vector<std::string> first, const std::vector<std::string>& more) {
    first.insert(first.end(), more.begin(), more.end());
    return first;
}

} // namespace

TEST_CASE("route JSON: totals, roads taken with names, lon/lat geometry, caution", "[cli][route]") {
    const auto result = run_ringroad(with({"route", region()}, kTrip));
    REQUIRE(result.exit_code == 0);
    const auto route = nlohmann::json::parse(result.out);
    REQUIRE(route["caution"] == kSafetyNotice);
    const double meters = route["meters"].get<double>();
    // Half a block (0.000475 degrees of longitude, about 50.2 m) west or east, two blocks north
    // (0.0018 degrees of latitude, about 200.2 m), half a block back.
    REQUIRE(meters == Approx(50.2 + 200.2 + 50.2).margin(2.0));
    REQUIRE(route["seconds"].get<double>() > 0);
    const auto& roads = route["roads"];
    REQUIRE(roads.size() == 3);
    REQUIRE(roads[0]["name"] == "Row Street 0");
    REQUIRE(roads[2]["name"] == "Row Street 2");
    REQUIRE_THAT(roads[1]["name"].get<std::string>(), Catch::StartsWith("Column Road"));
    double sum = 0;
    for (const auto& road : roads) sum += road["meters"].get<double>();
    REQUIRE(sum == Approx(meters).margin(0.2));
    const auto& line = route["geometry"];
    REQUIRE(line["type"] == "LineString");
    // RFC 7946 order: longitude first.
    REQUIRE(line["coordinates"][0][0].get<double>() == Approx(-140.99952).margin(1e-6));
    REQUIRE(line["coordinates"][0][1].get<double>() == Approx(18.05).margin(1e-6));
    const auto& last = line["coordinates"].back();
    REQUIRE(last[1].get<double>() == Approx(18.0518).margin(1e-6));
    // The polyline's haversine length is the route's length.
    double polyline = 0;
    for (std::size_t i = 1; i < line["coordinates"].size(); ++i) {
        const auto& p = line["coordinates"][i - 1];
        const auto& q = line["coordinates"][i];
        polyline += graph::haversine_meters(p[1].get<double>(), p[0].get<double>(), q[1].get<double>(), q[0].get<double>());
    }
    REQUIRE(polyline == Approx(meters).margin(1.0));

    const auto by_dijkstra = run_ringroad(with({"route", region(), "--engine", "dijkstra"}, kTrip));
    REQUIRE(nlohmann::json::parse(by_dijkstra.out)["seconds"] == route["seconds"]);
}

TEST_CASE("route GeoJSON and GPX 1.1", "[cli][route]") {
    const auto geojson = run_ringroad(with({"route", region(), "--format", "geojson"}, kTrip));
    REQUIRE(geojson.exit_code == 0);
    const auto collection = nlohmann::json::parse(geojson.out);
    REQUIRE(collection["type"] == "FeatureCollection");
    REQUIRE(collection["features"][0]["type"] == "Feature");
    REQUIRE(collection["features"][0]["geometry"]["type"] == "LineString");
    REQUIRE(collection["features"][0]["properties"]["caution"] == kSafetyNotice);

    const std::string out = test::make_scratch_dir("route-gpx") + "/trip.gpx";
    const auto gpx = run_ringroad(with({"route", region(), "--format", "gpx", "-o", out}, kTrip));
    REQUIRE(gpx.exit_code == 0);
    const std::string text = test::read_file(out);
    REQUIRE_THAT(text, Catch::Contains("<gpx version=\"1.1\""));
    REQUIRE_THAT(text, Catch::Contains("xmlns=\"http://www.topografix.com/GPX/1/1\""));
    REQUIRE_THAT(text, Catch::Contains("<trkpt lat=\"18.0500000\" lon=\"-140.9995200\"/>"));
    REQUIRE_THAT(text, Catch::Contains("Obey road signs"));
}

TEST_CASE("route refuses bad input and unreachable ends with exit 1", "[cli][route]") {
    auto result = run_ringroad({"route", region(), "--from", "north", "--to", "18.05,-141.0"});
    REQUIRE(result.exit_code == 1);
    REQUIRE_THAT(result.err, Catch::Contains("--from: 'north' is not LAT,LON"));
    result = run_ringroad({"route", region(), "--from", "18.05,-141.0", "--to", "18.0575,-141.0"});
    REQUIRE(result.exit_code == 1);
    REQUIRE_THAT(result.err, Catch::Contains("stop 'to' is"));
    // Spur Lane can be left but not entered (every turn into it is forbidden).
    result = run_ringroad({"route", region(), "--from", "18.05,-141.0", "--to", "18.0509,-140.9975"});
    REQUIRE(result.exit_code == 1);
    REQUIRE_THAT(result.err, Catch::Contains("no route"));
    result = run_ringroad({"route", region(), "--from", "18.0509,-140.9975", "--to", "18.05,-141.0"});
    REQUIRE(result.exit_code == 0);
    result = run_ringroad({"route", region(), "--from", "18.05,-141.0"});
    REQUIRE(result.exit_code == 2);
}
