// maxspeed=* (fixtures/extract/maxspeed.osm and the parser directly). Value forms follow the OSM
// wiki page Key:maxspeed: a number is km/h; "mph" and "knots" units; "none", "signals",
// "walk" and country-class values such as "DE:urban" ("implicit" limits that depend on national
// law, for which we fall back to the class default). Unit factors: 1 mile = 1.609344 km
// (international yard and pound agreement, 1959, exact); 1 nautical mile = 1.852 km (exact by
// international definition).

#include "tests/extract/extract_test_support.hpp"

#include "extract/maxspeed.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using namespace ringroad::test;

TEST_CASE("parse_maxspeed_kmh reads units and refuses the rest") {
    using extract::parse_maxspeed_kmh;
    CHECK(parse_maxspeed_kmh("50") == Approx(50.0));
    CHECK(parse_maxspeed_kmh("25 km/h") == Approx(25.0));
    CHECK(parse_maxspeed_kmh("30 mph") == Approx(30 * 1.609344));
    CHECK(parse_maxspeed_kmh("10 knots") == Approx(18.52));
    CHECK(parse_maxspeed_kmh("walk") == Approx(extract::kWalkingPaceKmh));
    CHECK(parse_maxspeed_kmh("60;40") == Approx(60.0));
    CHECK_FALSE(parse_maxspeed_kmh("none"));
    CHECK_FALSE(parse_maxspeed_kmh("signals"));
    CHECK_FALSE(parse_maxspeed_kmh("variable"));
    CHECK_FALSE(parse_maxspeed_kmh("DE:urban"));
    CHECK_FALSE(parse_maxspeed_kmh("FR:rural"));
    CHECK_FALSE(parse_maxspeed_kmh("fast"));
    CHECK_FALSE(parse_maxspeed_kmh("-30"));
    CHECK_FALSE(parse_maxspeed_kmh("0"));
    CHECK_FALSE(parse_maxspeed_kmh("5000"));
    CHECK_FALSE(parse_maxspeed_kmh(""));
}

TEST_CASE("parse_duration_seconds reads the forms of the OSM duration tag") {
    using extract::parse_duration_seconds;
    CHECK(parse_duration_seconds("00:30") == Approx(1800));
    CHECK(parse_duration_seconds("1:15:30") == Approx(4530));
    CHECK(parse_duration_seconds("45") == Approx(2700));      // bare minutes
    CHECK(parse_duration_seconds("PT1H15M") == Approx(4500)); // ISO 8601
    CHECK(parse_duration_seconds("PT20M30S") == Approx(1230));
    CHECK_FALSE(parse_duration_seconds("soon"));
    CHECK_FALSE(parse_duration_seconds("1:2:3:4"));
    CHECK_FALSE(parse_duration_seconds("00:00"));
}

namespace {

void check_speed(const graph::RoadGraph& graph, std::int64_t way, double speed_kmh) {
    INFO("way " << way << " at " << speed_kmh << " km/h");
    const auto edges = edges_of_way(graph, way);
    REQUIRE(!edges.empty());
    for (const auto& directed : edges) CHECK(directed.edge.time_ds == expected_time_ds(directed.edge.length_dm, speed_kmh));
}

} // namespace

TEST_CASE("car: maxspeed replaces the class default when it is a number") {
    const auto graph = build_fixture("extract/maxspeed.osm", "car");
    check_speed(graph, 1, 50);                 // 50
    check_speed(graph, 2, 30 * 1.609344);      // 30 mph
    check_speed(graph, 3, 110);                // none: motorway default
    check_speed(graph, 4, 5);                  // walk
    check_speed(graph, 5, 70);                 // DE:urban: primary default
    check_speed(graph, 6, 60);                 // RU:rural: secondary default
    check_speed(graph, 7, 50);                 // signals: tertiary default
    check_speed(graph, 8, 30);                 // unreadable: residential default
    check_speed(graph, 10, 25);                // 25 km/h
    check_speed(graph, 11, 18.52);             // 10 knots
    check_speed(graph, 12, 30);                // no maxspeed

    // maxspeed:forward / :backward apply to their own direction only.
    for (const auto& directed : edges_of_way(graph, 9)) {
        const double speed = directed.edge.reversed ? 40 : 60;
        CHECK(directed.edge.time_ds == expected_time_ds(directed.edge.length_dm, speed));
    }
}

TEST_CASE("bicycle: maxspeed only ever slows the bicycle's own pace") {
    const auto graph = build_fixture("extract/maxspeed.osm", "bicycle");
    check_speed(graph, 1, 18);
    check_speed(graph, 4, 5);                  // living_street, maxspeed=walk
    check_speed(graph, 11, 18);                // 18.52 > 18
    check_speed(graph, 10, 18);
}

TEST_CASE("foot: maxspeed does not matter to a pedestrian") {
    const auto graph = build_fixture("extract/maxspeed.osm", "foot");
    check_speed(graph, 1, 5);
    check_speed(graph, 4, 5);
    check_speed(graph, 11, 5);
}
