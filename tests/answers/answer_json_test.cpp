// answer_json, the answer layer both front doors share, on the invented demo town
// (fixtures/demo, see its README): each question answered, the far-stop policy, the trip-shape
// connectivity rule, the size estimate, and a corpus of bad request bodies each refused with the
// exact field and status.

#include "daemon/answers/json_answer.hpp"
#include "daemon/answers/loaded_region.hpp"
#include "daemon/answers/renderings.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <string>

namespace {

using namespace ringroad;
using answers::Question;
using Json = nlohmann::ordered_json;

// The demo town built once by the real `ringroad build`.
const answers::LoadedRegion& demo() {
    static const std::shared_ptr<const answers::LoadedRegion> region = [] {
        const std::string folder = test::make_scratch_dir("answers-demo");
        const std::string path = folder + "/port-ambrell.rrg";
        const auto built = test::run_ringroad({"build", test::fixture_path("demo/port-ambrell.osm"), "-o", path});
        REQUIRE(built.exit_code == 0);
        return answers::load_region(path);
    }();
    return *region;
}

// The stops of fixtures/demo/stops.csv (copied here so a body is visible in the test).
Json demo_stops() {
    return Json::parse(R"([
        {"id": "depot", "lat": -47.349892, "lon": -125.398009, "name": "Harbour depot"},
        {"id": "s1", "lat": -47.346744, "lon": -125.394027, "name": "Chapel bakery"},
        {"id": "s2", "lat": -47.345324, "lon": -125.390682, "name": "Market hall"},
        {"id": "s3", "lat": -47.343597, "lon": -125.386063, "name": "Orchard school"},
        {"id": "s4", "lat": -47.340449, "lon": -125.378098, "name": "Heath farm"},
        {"id": "s5", "lat": -47.348381, "lon": -125.383912, "name": "Net loft workshop"},
        {"id": "s6", "lat": -47.345324, "lon": -125.375948, "name": "Beacon garage"},
        {"id": "s7", "lat": -47.350288, "lon": -125.367081, "name": "Dune cafe"},
        {"id": "s8", "lat": -47.344964, "lon": -125.364161, "name": "Ridge dairy"},
        {"id": "s9", "lat": -47.353597, "lon": -125.371594, "name": "Lighthouse keeper"},
        {"id": "s10", "lat": -47.342086, "lon": -125.399841, "name": "Saltpan store"},
        {"id": "s11", "lat": -47.364209, "lon": -125.385266, "name": "Skerry jetty"}])");
}

Json answer(Question question, const Json& body, const answers::AnswerLimits& limits = {}) {
    return answers::answer_json(question, body, &demo(), limits);
}

struct Refusal {
    int status = 0;
    std::string code;
    std::string field;
    std::string message;
};

Refusal refusal(Question question, const Json& body, const answers::AnswerLimits& limits = {}) {
    try {
        answers::answer_json(question, body, &demo(), limits);
    } catch (const answers::RequestError& error) {
        return {error.status(), error.code(), error.field(), error.what()};
    }
    return {};
}

} // namespace

TEST_CASE("matrix: every pair of the demo stops, extra fields echoed, the same as a route between them") {
    const Json matrix = answer(Question::matrix, {{"stops", demo_stops()}});
    REQUIRE(matrix.at("ids").size() == 12);
    CHECK(matrix.at("snapped")[0].at("columns").at("name") == "Harbour depot");
    CHECK(matrix.at("seconds")[3][3] == 0.0);
    // Two algorithms must agree exactly: the route from s1 to s8 (a single search) costs what the
    // matrix says.
    const Json route = answer(Question::route, {{"from", {{"lat", -47.346744}, {"lon", -125.394027}}},
                                                {"to", {{"lat", -47.344964}, {"lon", -125.364161}}}});
    CHECK(route.at("seconds") == matrix.at("seconds")[1][8]);
    CHECK(route.at("meters") == matrix.at("meters")[1][8]);
    CHECK(route.at("geometry").at("type") == "LineString");
    // Hierarchy and Dijkstra agree on every cell.
    const Json ch = answer(Question::matrix, {{"stops", demo_stops()}, {"engine", "hierarchy"}});
    CHECK(ch.at("seconds") == matrix.at("seconds"));
    CHECK(ch.at("meters") == matrix.at("meters"));
}

TEST_CASE("far_stops skip: the far stop is listed with its distance and the rest is answered as without it") {
    Json stops = demo_stops();
    // 0.02 degrees of latitude (about 2.2 km) south of the Skerry jetty stop: open sea.
    stops.push_back({{"id", "buoy"}, {"lat", -47.384209}, {"lon", -125.385266}});
    const Refusal refused = refusal(Question::matrix, {{"stops", stops}});
    CHECK(refused.status == 422);
    CHECK(refused.code == "far_from_road");
    CHECK(refused.field == "stops[12]");

    const Json skipped = answer(Question::matrix, {{"stops", stops}, {"far_stops", "skip"}});
    REQUIRE(skipped.at("skipped_stops").size() == 1);
    CHECK(skipped.at("skipped_stops")[0].at("id") == "buoy");
    const double meters = skipped.at("skipped_stops")[0].at("meters_to_road").get<double>();
    // Beyond the 500 m radius, and no farther than the jetty stop's road: 0.02 degrees of
    // latitude (1 degree is about 111.2 km, so 2224 m) plus the few metres the README puts the
    // stops off the streets.
    CHECK(meters > 500.0);
    CHECK(meters < 2224.0 + 50.0);
    const Json plain = answer(Question::matrix, {{"stops", demo_stops()}});
    CHECK(skipped.at("ids") == plain.at("ids"));
    CHECK(skipped.at("seconds") == plain.at("seconds"));

    const Json tour = answer(Question::tour, {{"stops", stops}, {"far_stops", "skip"}});
    CHECK(tour.at("order").size() == 12);
    CHECK(tour.at("skipped_stops")[0].at("id") == "buoy");
    const Json network = answer(Question::network, {{"stops", stops}, {"far_stops", "skip"}});
    CHECK(network.at("sites") == 12);
    CHECK(network.at("skipped_stops")[0].at("id") == "buoy");
    // A skipped stop cannot start the tour.
    const Refusal start = refusal(Question::tour, {{"stops", stops}, {"far_stops", "skip"}, {"start", "buoy"}});
    CHECK(start.field == "start");
    CHECK(start.status == 422);
}

TEST_CASE("tour and network on the demo town: all stops, totals that add up, proven optimal") {
    const Json tour = answer(Question::tour, {{"stops", demo_stops()}, {"start", "depot"}, {"geometry", true}});
    CHECK(tour.at("order").size() == 12);
    CHECK(tour.at("order")[0] == "depot");
    CHECK(tour.at("proven_optimal") == true);   // 12 stops: Held–Karp
    double seconds = 0.0;
    for (const auto& hop : tour.at("hops")) {
        seconds += hop.at("seconds").get<double>();
        CHECK(hop.at("geometry").at("coordinates").size() >= 2);
    }
    CHECK(tour.at("total_seconds").get<double>() == Approx(seconds).margin(0.05));
    const std::string gpx = answers::render_tour_gpx(tour, {{"stops", demo_stops()}});
    CHECK(gpx.find("<name>depot</name>") != std::string::npos);

    const Json network = answer(Question::network, {{"stops", demo_stops()}, {"geometry", true}});
    CHECK(network.at("links").size() == 11);   // a tree on 12 sites
    CHECK(network.at("road_meters").get<double>() <= network.at("link_meters_sum").get<double>());
    const Json geojson = Json::parse(answers::render_network_geojson(network, {{"stops", demo_stops()}}));
    CHECK(geojson.at("features")[1].at("properties").at("name") == "Harbour depot");
}

TEST_CASE("an open trip needs no way into its start (issue 13 A.10): a one-way chain a -> b -> c") {
    // Only a -> b and b -> c exist: no closed tour, but the open trips a..c are valid.
    const Json chain = Json::parse(R"({"ids": ["a", "b", "c"], "costs": [[0, 1, null], [null, 0, 1], [null, null, 0]]})");
    const Json open = answers::answer_json(Question::tour, Json{{"matrix", chain}, {"open", true}}, nullptr);
    CHECK(open.at("order") == Json::array({"a", "b", "c"}));
    CHECK(open.at("cost") == 2.0);
    const Json fixed = answers::answer_json(Question::tour, Json{{"matrix", chain}, {"start", "a"}, {"end", "c"}}, nullptr);
    CHECK(fixed.at("order") == Json::array({"a", "b", "c"}));
    // A closed tour is still refused, naming a stop.
    try {
        answers::answer_json(Question::tour, Json{{"matrix", chain}}, nullptr);
        FAIL("a closed tour on a one-way chain was answered");
    } catch (const answers::RequestError& error) {
        CHECK(error.status() == 422);
        CHECK(std::string(error.what()).find("no tour exists") != std::string::npos);
    }
}

TEST_CASE("the size of a request is estimated before anything is allocated (issue 13 A.17)") {
    Json many = Json::array();
    for (int i = 0; i < 100000; ++i) many.push_back({{"id", std::to_string(i)}, {"lat", -47.35}, {"lon", -125.39}});
    const Refusal stops = refusal(Question::matrix, {{"stops", many}});
    CHECK(stops.status == 413);
    CHECK(stops.code == "too_large");
    CHECK(stops.field == "stops");
    CHECK(stops.message.find("limit of 10000 stops") != std::string::npos);

    answers::AnswerLimits limits;
    limits.max_stops = 200000;
    const Refusal cells = refusal(Question::matrix, {{"stops", many}}, limits);
    CHECK(cells.status == 413);
    CHECK(cells.message.find("100000 x 100000") != std::string::npos);
    CHECK(cells.message.find("the limit is 25000000 cells (5000 stops") != std::string::npos);
    limits.max_matrix_cells = 100;   // 10 stops
    CHECK(refusal(Question::tour, {{"stops", demo_stops()}}, limits).code == "too_large");
}

TEST_CASE("bad request bodies: each refused with the exact field and status") {
    const Json stops = demo_stops();
    const auto with = [&](Json body, const std::string& key, Json value) {
        body[key] = std::move(value);
        return body;
    };
    Json bad_lat = stops;
    bad_lat[3]["lat"] = 95;
    Json string_lat = stops;
    string_lat[2]["lat"] = "47";
    Json no_id = stops;
    no_id[4].erase("id");
    Json twice = stops;
    twice[5]["id"] = "s1";
    const Json base{{"stops", stops}};
    struct Case {
        Question question;
        Json body;
        int status;
        std::string field;
    };
    const std::vector<Case> cases = {
        {Question::matrix, Json::array(), 400, "body"},
        {Question::matrix, Json::object(), 400, "stops"},
        {Question::matrix, {{"stops", Json::array()}}, 400, "stops"},
        {Question::matrix, {{"stops", "depot"}}, 400, "stops"},
        {Question::matrix, {{"stops", bad_lat}}, 400, "stops[3].lat"},
        {Question::matrix, {{"stops", string_lat}}, 400, "stops[2].lat"},
        {Question::matrix, {{"stops", no_id}}, 400, "stops[4].id"},
        {Question::matrix, {{"stops", twice}}, 400, "stops[5].id"},
        {Question::matrix, with(base, "metrics", "time"), 400, "metrics"},
        {Question::matrix, with(base, "metric", "fastest"), 400, "metric"},
        {Question::matrix, with(base, "engine", 1), 400, "engine"},
        {Question::matrix, with(base, "snap_radius", 0), 400, "snap_radius"},
        {Question::matrix, with(base, "snap_radius", -5), 400, "snap_radius"},
        {Question::matrix, with(base, "far_stops", "drop"), 400, "far_stops"},
        {Question::route, {{"from", {{"lat", -47.35}}}, {"to", {{"lat", -47.35}, {"lon", -125.39}}}}, 400, "from.lon"},
        {Question::route, {{"from", Json::array({-47.35, -125.39})}, {"to", {{"lat", -47.35}, {"lon", -125.39}}}}, 400, "from"},
        {Question::route, {{"from", {{"lat", -47.35}, {"lon", -125.39}}}, {"to", {{"lat", -47.35}, {"lon", 190}}}}, 400, "to.lon"},
        {Question::route, {{"from", {{"lat", -47.35}, {"lon", -125.39}}}, {"to", {{"lat", -47.35}, {"lon", -125.39}, {"alt", 3}}}}, 400, "to.alt"},
        {Question::route, {{"from", {{"lat", -47.35}, {"lon", -125.39}}}, {"to", {{"lat", -47.0}, {"lon", -125.39}}}}, 422, "to"},
        {Question::tour, with(base, "start", "nowhere"), 404, "start"},
        {Question::tour, with(base, "end", "nowhere"), 404, "end"},
        {Question::tour, with(with(base, "end", "s1"), "open", true), 400, "end"},
        {Question::tour, with(base, "time_limit", 1e9), 400, "time_limit"},
        {Question::tour, with(base, "time_limit", -1), 400, "time_limit"},
        {Question::tour, with(base, "seed", -1), 400, "seed"},
        {Question::tour, with(base, "seed", 1.5), 400, "seed"},
        {Question::tour, with(base, "exact_limit", 21), 400, "exact_limit"},
        {Question::tour, with(base, "method", "greedy"), 400, "method"},
        {Question::tour, with(base, "open", "yes"), 400, "open"},
        {Question::tour, with(base, "matrix", {{"ids", {"a"}}, {"costs", {{0}}}}), 400, "stops"},
        {Question::tour, {{"matrix", {{"ids", {"a", "b"}}, {"costs", {{0, 1}}}}}}, 400, "matrix.costs"},
        {Question::tour, {{"matrix", {{"ids", {"a", "b"}}, {"costs", {{0, 1}, {-2, 0}}}}}}, 400, "matrix.costs[1][0]"},
        {Question::tour, {{"matrix", {{"ids", {"a", "b"}}, {"costs", {{0, 1}, {"2", 0}}}}}}, 400, "matrix.costs[1][0]"},
        {Question::tour, {{"matrix", {{"ids", {"a", "a"}}, {"costs", {{0, 1}, {1, 0}}}}}}, 400, "matrix.ids[1]"},
        {Question::tour, {{"matrix", {{"ids", {"a", "b"}}, {"costs", {{0, 1}, {1, 0}}}, {"rows", 2}}}}, 400, "matrix.rows"},
        {Question::tour, {{"matrix", {{"ids", {"a", "b"}}, {"costs", {{0, 1}, {1, 0}}}}}, {"geometry", true}}, 400, "geometry"},
        {Question::network, with(base, "metric_closure", true), 400, "metric_closure"},
        {Question::network, with(base, "link_cost", "average"), 400, "link_cost"},
        {Question::network, {{"matrix", {{"ids", {"a", "b", "c"}}, {"costs", {{0, 1, nullptr}, {1, 0, nullptr}, {nullptr, nullptr, 0}}}}}}, 422, "matrix"},
    };
    for (const Case& c : cases) {
        INFO(c.body.dump());
        const Refusal refused = refusal(c.question, c.body);
        CHECK(refused.status == c.status);
        CHECK(refused.field == c.field);
        // The message names the field too (the service shows only the message to a person).
        CHECK(refused.message.rfind(c.field, 0) == 0);
    }
}

TEST_CASE("the command line prints the answer layer's document (timing fields apart)") {
    const std::string folder = test::make_scratch_dir("answers-cli");
    const std::string region = folder + "/port-ambrell.rrg";
    REQUIRE(test::run_ringroad({"build", test::fixture_path("demo/port-ambrell.osm"), "-o", region}).exit_code == 0);
    const std::string stops = test::fixture_path("demo/stops.csv");

    const auto matrix = test::run_ringroad({"matrix", region, "--stops", stops, "--format", "json"});
    REQUIRE(matrix.exit_code == 0);
    CHECK(Json::parse(matrix.out) == answer(Question::matrix, {{"stops", demo_stops()}}));

    const auto tour = test::run_ringroad({"tour", region, "--stops", stops, "--open"});
    REQUIRE(tour.exit_code == 0);
    Json printed = Json::parse(tour.out);
    Json answered = answer(Question::tour, {{"stops", demo_stops()}, {"open", true}});
    printed.erase("elapsed_seconds");
    answered.erase("elapsed_seconds");
    CHECK(printed == answered);

    const auto network = test::run_ringroad({"network", region, "--stops", stops});
    REQUIRE(network.exit_code == 0);
    CHECK(Json::parse(network.out) == answer(Question::network, {{"stops", demo_stops()}}));
}
