// Reading stop lists: every bad input gets one line naming the file, the line and the column.
#include "common/input_error.hpp"
#include "router/road_router.hpp"
#include "router/stops.hpp"
#include "tests/router/test_graphs.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::router;

namespace {

std::string error_of(const std::string& text) {
    try {
        parse_stops_csv(text, "stops.csv");
    } catch (const InputError& error) {
        const std::string message = error.what();
        REQUIRE(message.find('\n') == std::string::npos);   // one line
        return message;
    }
    return "(no error)";
}

} // namespace

TEST_CASE("A good stops file keeps ids, coordinates, extra columns and lines", "[stops]") {
    const StopList list = parse_stops_csv("id,name,lat,lon,window\r\ndepot,\"Main, Depot\",18.03,-141.0,8-12\r\n"
                                          "\r\nshop,Shop,18.031,-140.999,\r\n",
                                          "stops.csv");
    REQUIRE(list.stops.size() == 2);
    REQUIRE(list.extra_columns == std::vector<std::string>{"name", "window"});
    REQUIRE(list.stops[0].id == "depot");
    REQUIRE(list.stops[0].extra_values == std::vector<std::string>{"Main, Depot", "8-12"});
    REQUIRE(list.stops[1].lat == 18.031);
    REQUIRE(list.stops[1].lon == -140.999);
    REQUIRE(list.stops[1].line == 4);
}

TEST_CASE("Bad stops files are refused with the line and the field", "[stops]") {
    REQUIRE_THAT(error_of("id,lat\na,1\n"), Catch::Contains("stops.csv:1: missing column 'lon'"));
    REQUIRE_THAT(error_of("name,lat,lon\na,1,2\n"), Catch::Contains("missing column 'id'"));
    REQUIRE_THAT(error_of("id,lat,lon\na,1,2\nb,north,2\n"), Catch::Contains("stops.csv:3: column 'lat': 'north' is not a number"));
    REQUIRE_THAT(error_of("id,lat,lon\na,1,\n"), Catch::Contains("stops.csv:2: column 'lon': empty value"));
    REQUIRE_THAT(error_of("id,lat,lon\na,1\n"), Catch::Contains("stops.csv:2: column 'lon': empty value"));
    REQUIRE_THAT(error_of("id,lat,lon\na,95,2\n"), Catch::Contains("stops.csv:2: stop 'a': latitude 95 is outside [-90, 90]"));
    REQUIRE_THAT(error_of("id,lat,lon\na,5,200\n"), Catch::Contains("stops.csv:2: stop 'a': longitude 200 is outside"));
    REQUIRE_THAT(error_of("id,lat,lon\na,1,2\nb,1,2\na,3,4\n"),
                 Catch::Contains("stops.csv:4: column 'id': duplicate id 'a' (first on line 2)"));
    REQUIRE_THAT(error_of("id,lat,lon\n,1,2\n"), Catch::Contains("stops.csv:2: column 'id': empty id"));
    REQUIRE_THAT(error_of("id,lat,lon\n"), Catch::Contains("stops.csv: no stops"));
    REQUIRE_THAT(error_of("id,lat,lon\na,1,2,3\n"), Catch::Contains("stops.csv:2: 4 fields but the header has 3"));
}

TEST_CASE("A stop far from every road is refused naming its line, id and distance", "[stops]") {
    test::GraphBuilder builder;
    const auto a = builder.add_vertex(18.03, -141.0);
    const auto b = builder.add_vertex(18.03, -140.99);
    builder.add_road(a, b, 50);
    const RoadRouter router(builder.build());
    const StopList list = parse_stops_csv("id,lat,lon\nnear,18.0301,-140.995\nfar,18.0345,-140.995\n", "stops.csv");
    try {
        router.snap_stops(list);
        FAIL("no error");
    } catch (const InputError& error) {
        // 0.0045 degrees of latitude is about 500.4 m (haversine), beyond the 500 m default.
        REQUIRE_THAT(std::string(error.what()),
                     Catch::Contains("stops.csv:3: stop 'far' is 500 m from the nearest road (snap radius 500 m)") ||
                         Catch::Contains("stops.csv:3: stop 'far' is 501 m from the nearest road (snap radius 500 m)"));
    }
}
