// The service answers the four questions exactly as the command line does: for the same stops and
// options, the JSON document from POST /v1/<question> equals the one `ringroad <question>
// --format json` prints, apart from timing fields (elapsed_seconds). Both go through the answer
// layer, so this checks the service's parsing, passing of limits and printing; the answers
// themselves are checked against outside references in the command tests. The demo town is
// invented (fixtures/demo).
#include "tests/daemon/service_test_support.hpp"

using namespace ringroad::test;
using nlohmann::json;

namespace {

// Removes the timing fields, wherever they are.
json without_timing(json document) {
    if (document.is_object()) {
        document.erase("elapsed_seconds");
        for (auto& [key, value] : document.items()) value = without_timing(value);
    } else if (document.is_array()) {
        for (json& value : document) value = without_timing(value);
    }
    return document;
}

json cli_answer(const std::vector<std::string>& arguments) {
    const CommandResult result = run_ringroad(arguments);
    INFO(result.err);
    REQUIRE(result.exit_code == 0);
    return json::parse(result.out);
}

json service_answer(std::uint16_t port, const std::string& path, const json& body) {
    const HttpAnswer answer = http_exchange(port, "POST", path, body.dump());
    INFO(answer.body);
    REQUIRE(answer.status == 200);
    return answer.json();
}

} // namespace

TEST_CASE("matrix, tour, network and route: the service's answer is the command line's") {
    RunningService running;
    const std::string region = demo_region_path();
    const std::string stops_csv = fixture_path("demo/stops.csv");
    const json stops = demo_stops_json();
    REQUIRE(stops.size() >= 5);

    SECTION("matrix") {
        CHECK(without_timing(service_answer(running.port(), "/v1/matrix", {{"stops", stops}})) ==
              without_timing(cli_answer({"matrix", region, "--stops", stops_csv, "--format", "json"})));
        CHECK(without_timing(service_answer(running.port(), "/v1/matrix", {{"stops", stops}, {"metric", "distance"}})) ==
              without_timing(cli_answer({"matrix", region, "--stops", stops_csv, "--format", "json", "--metric", "distance"})));
    }
    SECTION("tour") {
        CHECK(without_timing(service_answer(running.port(), "/v1/tour", {{"stops", stops}, {"seed", 3}})) ==
              without_timing(cli_answer({"tour", region, "--stops", stops_csv, "--format", "json", "--seed", "3"})));
        CHECK(without_timing(service_answer(running.port(), "/v1/tour", {{"stops", stops}, {"open", true}})) ==
              without_timing(cli_answer({"tour", region, "--stops", stops_csv, "--format", "json", "--open"})));
    }
    SECTION("network") {
        CHECK(without_timing(service_answer(running.port(), "/v1/network", {{"stops", stops}})) ==
              without_timing(cli_answer({"network", region, "--stops", stops_csv, "--format", "json"})));
    }
    SECTION("route") {
        const json& from = stops[0];
        const json& to = stops[4];
        const std::string from_text = std::to_string(from["lat"].get<double>()) + "," + std::to_string(from["lon"].get<double>());
        const std::string to_text = std::to_string(to["lat"].get<double>()) + "," + std::to_string(to["lon"].get<double>());
        const json body = {{"from", {{"lat", std::stod(from_text.substr(0, from_text.find(',')))},
                                     {"lon", std::stod(from_text.substr(from_text.find(',') + 1))}}},
                           {"to", {{"lat", std::stod(to_text.substr(0, to_text.find(',')))},
                                   {"lon", std::stod(to_text.substr(to_text.find(',') + 1))}}}};
        CHECK(without_timing(service_answer(running.port(), "/v1/route", body)) ==
              without_timing(cli_answer({"route", region, "--from", from_text, "--to", to_text, "--format", "json"})));
    }
    SECTION("a tour on a bare matrix needs no region") {
        const json matrix = {{"ids", {"a", "b", "c", "d"}},
                             {"costs", {{0, 5, 9, 4}, {5, 0, 3, 8}, {9, 3, 0, 6}, {4, 8, 6, 0}}}};
        const std::string folder = make_scratch_dir("service-answers");
        write_file(folder + "/matrix.csv", "id,a,b,c,d\na,0,5,9,4\nb,5,0,3,8\nc,9,3,0,6\nd,4,8,6,0\n");
        CHECK(without_timing(service_answer(running.port(), "/v1/tour", {{"matrix", matrix}})) ==
              without_timing(cli_answer({"tour", "--matrix", folder + "/matrix.csv", "--format", "json"})));
    }
}

TEST_CASE("the answer layer's refusals keep their status, code and exact field") {
    RunningService running;
    json stops = demo_stops_json(6);
    auto post = [&](const std::string& path, const json& body) { return http_exchange(running.port(), "POST", path, body.dump()); };
    auto check = [](const HttpAnswer& answer, int status, const std::string& field) {
        INFO(answer.body);
        REQUIRE(answer.status == status);
        CHECK(answer.json().at("error").at("field") == field);
    };
    json bad = stops;
    bad[3]["lat"] = 91.0;   // latitudes stop at 90 (WGS84)
    check(post("/v1/tour", {{"stops", bad}}), 400, "stops[3].lat");
    bad = stops;
    bad[2]["lon"] = "east";
    check(post("/v1/matrix", {{"stops", bad}}), 400, "stops[2].lon");
    bad = stops;
    bad[1].erase("lat");
    check(post("/v1/network", {{"stops", bad}}), 400, "stops[1].lat");
    check(post("/v1/tour", {{"stops", stops}, {"colour", "red"}}), 400, "colour");
    check(post("/v1/tour", {{"stops", stops}, {"start", "nobody"}}), 404, "start");
    bad = stops;
    bad[4]["lat"] = 0.0;   // the Gulf of Guinea: far from the demo town's roads
    bad[4]["lon"] = 0.0;
    check(post("/v1/matrix", {{"stops", bad}}), 422, "stops[4]");
    check(post("/v1/route", {{"from", {{"lat", 0}, {"lon", 0}}}}), 400, "to");
    CHECK(http_exchange(running.port(), "GET", "/v1/status").status == 200);
}

TEST_CASE("far stops may be skipped: the rest is answered and the skipped ones listed") {
    RunningService running;
    json stops = demo_stops_json(6);
    stops[2]["lat"] = 0.0;
    stops[2]["lon"] = 0.0;
    const HttpAnswer answer = http_exchange(running.port(), "POST", "/v1/tour", json{{"stops", stops}, {"far_stops", "skip"}}.dump());
    INFO(answer.body);
    REQUIRE(answer.status == 200);
    const json skipped = answer.json().at("skipped_stops");
    REQUIRE(skipped.size() == 1);
    CHECK(skipped[0].at("id") == stops[2]["id"]);
    CHECK(skipped[0].at("meters_to_road").get<double>() > 1000.0);
}

TEST_CASE("limits in force: stops and matrix cells per request are 413") {
    ringroad::service::ServiceOptions options = test_service_options();
    options.limits.max_stops = 4;
    RunningService running(options);
    const HttpAnswer answer = http_exchange(running.port(), "POST", "/v1/matrix", json{{"stops", demo_stops_json(6)}}.dump());
    INFO(answer.body);
    CHECK(answer.status == 413);
    CHECK(answer.json().at("error").at("code") == "too_large");
    CHECK(http_exchange(running.port(), "GET", "/v1/status").json().at("limits").at("max_stops") == 4);
}

TEST_CASE("--server: the one-shot commands print the same output, computed by the running service") {
    RunningService running;
    const std::string url = "http://127.0.0.1:" + std::to_string(running.port());
    const std::string region = demo_region_path();
    const std::string stops_csv = fixture_path("demo/stops.csv");
    for (const std::string format : {"csv", "gpx"}) {
        const CommandResult local = run_ringroad({"tour", region, "--stops", stops_csv, "--format", format});
        const CommandResult remote = run_ringroad({"tour", "--server", url, "--stops", stops_csv, "--format", format});
        INFO(remote.err);
        REQUIRE(remote.exit_code == 0);
        CHECK(remote.out == local.out);
    }
    const CommandResult local = run_ringroad({"matrix", region, "--stops", stops_csv, "--format", "csv"});
    const CommandResult remote = run_ringroad({"matrix", "--server", url, "--stops", stops_csv, "--format", "csv"});
    REQUIRE(remote.exit_code == 0);
    CHECK(remote.out == local.out);
    CHECK(without_timing(json::parse(run_ringroad({"network", "--server", url, "--stops", stops_csv}).out)) ==
          without_timing(json::parse(run_ringroad({"network", region, "--stops", stops_csv}).out)));
    CHECK(without_timing(json::parse(run_ringroad({"route", "--server", url, "--from", "-47.349892,-125.398009", "--to",
                                                   "-47.343597,-125.386063"}).out)) ==
          without_timing(json::parse(run_ringroad({"route", region, "--from", "-47.349892,-125.398009", "--to",
                                                   "-47.343597,-125.386063"}).out)));
}

TEST_CASE("--server: a refusal reads as the local one; an unreachable service is named (exit 1)") {
    RunningService running;
    const std::string url = "http://127.0.0.1:" + std::to_string(running.port());
    const std::string folder = make_scratch_dir("service-server-option");
    write_file(folder + "/stops.csv", "id,lat,lon\na,-47.349892,-125.398009\nb,-47.346744,-125.394027\n");
    // The service refuses the unknown start (404 unknown_stop); the command words it as locally.
    const CommandResult remote = run_ringroad({"tour", "--server", url, "--stops", folder + "/stops.csv", "--start", "zz"});
    const CommandResult local = run_ringroad({"tour", demo_region_path(), "--stops", folder + "/stops.csv", "--start", "zz"});
    CHECK(remote.exit_code == 1);
    CHECK(remote.err == local.err);
    CHECK(remote.err.find("zz") != std::string::npos);
    const CommandResult closed = run_ringroad({"tour", "--server", "unix:" + folder + "/nobody.sock", "--stops",
                                               folder + "/stops.csv"});
    CHECK(closed.exit_code == 1);
    CHECK(closed.err.find("nobody.sock") != std::string::npos);
    const CommandResult both = run_ringroad({"tour", demo_region_path(), "--server", url, "--stops", folder + "/stops.csv"});
    CHECK(both.exit_code == 2);
}
