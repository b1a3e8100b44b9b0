// `ringroad matrix` end to end on a small invented town written as a .rrg file: CSV and JSON
// shapes, engines agreeing, unreachable pairs, outputs written whole or not at all, and bad input.
#include "common/safety_notice.hpp"
#include "graph/graph_file.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "tests/router/test_graphs.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <cstring>
#include <sstream>

using namespace ringroad;
using ringroad::test::run_ringroad;

namespace {

struct Town {
    std::string folder;
    std::string region;        // no hierarchy stored
    std::string region_with_hierarchy;
    std::string stops;
};

const Town& town() {
    static const Town prepared = [] {
        Town result;
        result.folder = test::make_scratch_dir("matrix-cli");
        const graph::RoadGraph graph = test::small_test_town(/*trap_spur=*/true);
        result.region = result.folder + "/town.rrg";
        result.region_with_hierarchy = result.folder + "/town-ch.rrg";
        graph::write_road_graph(graph, result.region);
        graph::write_road_graph(graph::attach_sections(graph, router::hierarchy::build_hierarchy_sections(graph)),
                                result.region_with_hierarchy);
        result.stops = result.folder + "/stops.csv";
        // a: south-west corner; b: mid Row Street 1; c: north-east corner; spur: on Spur Lane.
        test::write_file(result.stops, "id,lat,lon,name\n"
                                       "a,18.05,-141.0,Depot\n"
                                       "b,18.0509,-140.9995,Bakery\n"
                                       "c,18.0518,-140.9981,Clinic\n"
                                       "spur,18.0509,-140.9975,Farm gate\n");
        return result;
    }();
    return prepared;
}

std::vector<std::vector<std::string>> csv_cells(const std::string& text) {
    std::vector<std::vector<std::string>> rows;
    std::istringstream in(text);
    std::string line;
    while (std::getline(in, line)) {
        if (!line.empty() && line.back() == '\r') line.pop_back();
        std::vector<std::string> cells;
        std::string cell;
        std::istringstream fields(line);
        while (std::getline(fields, cell, ',')) cells.push_back(cell);
        if (!line.empty() && line.back() == ',') cells.emplace_back();
        rows.push_back(cells);
    }
    return rows;
}

} // namespace

TEST_CASE("matrix CSV: header, seconds with one decimal, empty cells and a summary for unreachable pairs", "[cli][matrix]") {
    const auto result = run_ringroad({"matrix", town().region, "--stops", town().stops});
    REQUIRE(result.exit_code == 0);
    const auto rows = csv_cells(result.out);
    REQUIRE(rows.size() == 5);
    REQUIRE(rows[0] == std::vector<std::string>{"id", "a", "b", "c", "spur"});
    REQUIRE(rows[1][0] == "a");
    REQUIRE(rows[1][1] == "0.0");
    REQUIRE(rows[1][2].find('.') == rows[1][2].size() - 2);   // one decimal
    REQUIRE(std::stod(rows[1][3]) > 0);
    // The spur can be left but not reached: its column is empty except its own diagonal.
    REQUIRE(rows[1][4].empty());
    REQUIRE(rows[4][4] == "0.0");
    REQUIRE_FALSE(rows[4][1].empty());
    REQUIRE_THAT(result.err, Catch::Contains("3 unreachable pairs (no route): a -> spur, b -> spur, c -> spur"));
    REQUIRE_THAT(result.err, Catch::Contains(kSafetyNotice));
}

TEST_CASE("matrix JSON: ids, seconds, meters, snapped, unreachable, caution; engines agree", "[cli][matrix]") {
    const auto dijkstra = run_ringroad({"matrix", town().region, "--stops", town().stops, "--format", "json", "--engine", "dijkstra"});
    const auto hierarchy = run_ringroad({"matrix", town().region_with_hierarchy, "--stops", town().stops, "--format", "json"});
    REQUIRE(dijkstra.exit_code == 0);
    REQUIRE(hierarchy.exit_code == 0);
    const auto a = nlohmann::json::parse(dijkstra.out);
    const auto b = nlohmann::json::parse(hierarchy.out);
    REQUIRE(a["engine"] == "dijkstra");
    REQUIRE(b["engine"] == "hierarchy");
    REQUIRE(a["ids"] == nlohmann::json({"a", "b", "c", "spur"}));
    REQUIRE(a["seconds"] == b["seconds"]);
    REQUIRE(a["meters"] == b["meters"]);
    REQUIRE(a["seconds"][0][3].is_null());
    REQUIRE(a["meters"][0][3].is_null());
    REQUIRE(a["seconds"][3][0].is_number());
    REQUIRE(a["unreachable"].size() == 3);
    REQUIRE(a["unreachable"][0] == nlohmann::json({{"from", "a"}, {"to", "spur"}}));
    REQUIRE(a["caution"] == kSafetyNotice);
    REQUIRE(a["snapped"][1]["columns"]["name"] == "Bakery");
    REQUIRE(a["snapped"][1]["road"] == "Row Street 1");
    REQUIRE(a["snapped"][0]["snap_meters"].get<double>() < 0.1);
    // a -> c: the corners of the grid, about 200 m + 190 m apart along the streets.
    REQUIRE(a["meters"][0][2].get<double>() == Approx(200.1 + 190.5).margin(15.0));
}

TEST_CASE("matrix writes -o and --second-table files; distance metric", "[cli][matrix]") {
    const std::string out = town().folder + "/m.csv";
    const std::string second = town().folder + "/m-seconds.csv";
    const auto result = run_ringroad(
        {"matrix", town().region, "--stops", town().stops, "--metric", "distance", "-o", out, "--second-table", second});
    REQUIRE(result.exit_code == 0);
    REQUIRE(result.out.empty());
    const auto meters = csv_cells(test::read_file(out));
    const auto seconds = csv_cells(test::read_file(second));
    REQUIRE(meters[0] == seconds[0]);
    // Metres exceed seconds on streets driven at 30-50 km/h (8-14 m/s).
    REQUIRE(std::stod(meters[1][3]) > 5 * std::stod(seconds[1][3]));
}

TEST_CASE("matrix refuses bad input with one line, exit 1, and no output file", "[cli][matrix]") {
    const std::string folder = test::make_scratch_dir("matrix-bad");
    const std::string out = folder + "/out.csv";
    const auto run_with = [&](const std::string& stops_text) {
        test::write_file(folder + "/stops.csv", stops_text);
        return run_ringroad({"matrix", town().region, "--stops", folder + "/stops.csv", "-o", out});
    };
    auto result = run_with("id,lat\na,18.05\n");
    REQUIRE(result.exit_code == 1);
    REQUIRE_THAT(result.err, Catch::Contains("stops.csv:1: missing column 'lon'"));
    result = run_with("id,lat,lon\na,18.05,-141.0\nb,x,-141.0\n");
    REQUIRE(result.exit_code == 1);
    REQUIRE_THAT(result.err, Catch::Contains("stops.csv:3: column 'lat': 'x' is not a number"));
    result = run_with("id,lat,lon\na,18.05,-141.0\na,18.05,-141.0\n");
    REQUIRE_THAT(result.err, Catch::Contains("stops.csv:3: column 'id': duplicate id 'a'"));
    result = run_with("id,lat,lon\na,18.05,-141.0\nfar,18.0575,-141.0\n");
    REQUIRE(result.exit_code == 1);
    REQUIRE_THAT(result.err, Catch::Contains("stops.csv:3: stop 'far' is"));
    REQUIRE_THAT(result.err, Catch::Contains("m from the nearest road (snap radius 500 m)"));
    REQUIRE(std::count(result.err.begin(), result.err.end(), '\n') == 1);
    result = run_with("id,lat,lon\na,95,-141.0\n");
    REQUIRE_THAT(result.err, Catch::Contains("latitude 95 is outside"));
    REQUIRE_FALSE(test::file_exists(out));

    result = run_ringroad({"matrix", folder + "/missing.rrg", "--stops", town().stops});
    REQUIRE(result.exit_code == 1);
    REQUIRE_THAT(result.err, Catch::Contains("missing.rrg"));
    result = run_ringroad({"matrix", town().region, "--stops", town().stops, "--metric", "fuel"});
    REQUIRE(result.exit_code == 2);
    // A larger radius accepts the far stop.
    test::write_file(folder + "/stops.csv", "id,lat,lon\na,18.05,-141.0\nfar,18.0575,-141.0\n");
    result = run_ringroad({"matrix", town().region, "--stops", folder + "/stops.csv", "--snap-radius", "1000"});
    REQUIRE(result.exit_code == 0);
}

TEST_CASE("matrix notes a stored hierarchy it cannot use, and answers exactly without it", "[cli][matrix]") {
    // The town's file with its time hierarchy marked as layout version 1 (router/hierarchy/HIERARCHY.md),
    // as a file written by an older ringroad would be.
    const graph::RoadGraph graph = graph::load_road_graph(town().region_with_hierarchy);
    const auto header = graph.section("ch.t.header");
    REQUIRE(header.size() >= 4);
    graph::ExtraSection old_header{"ch.t.header", std::vector<std::byte>(header.begin(), header.end())};
    const std::uint32_t old_version = 1;
    std::memcpy(old_header.bytes.data(), &old_version, sizeof old_version);
    const std::string old_region = town().folder + "/town-old-ch.rrg";
    graph::write_road_graph(graph::attach_sections(graph, {old_header}), old_region);

    const auto old_run = run_ringroad({"matrix", old_region, "--stops", town().stops, "--format", "json"});
    REQUIRE(old_run.exit_code == 0);
    REQUIRE(old_run.err.find("note: " + old_region + ": its stored time hierarchy") != std::string::npos);
    REQUIRE(old_run.err.find("ringroad build") != std::string::npos);
    const auto current = run_ringroad({"matrix", town().region_with_hierarchy, "--stops", town().stops, "--format", "json"});
    REQUIRE(current.err.find("note:") == std::string::npos);
    const auto a = nlohmann::json::parse(old_run.out);
    const auto b = nlohmann::json::parse(current.out);
    REQUIRE(a["engine"] == "dijkstra");
    REQUIRE(a["seconds"] == b["seconds"]);
    REQUIRE(a["meters"] == b["meters"]);
    // `info` tells the same.
    const auto info = run_ringroad({"info", old_region});
    REQUIRE(info.out.find("hierarchy        distance  (time stored by another version") != std::string::npos);
    // The distance hierarchy is intact: no note when asking for it.
    const auto distance = run_ringroad({"matrix", old_region, "--stops", town().stops, "--metric", "distance"});
    REQUIRE(distance.exit_code == 0);
    REQUIRE(distance.err.find("note:") == std::string::npos);
}

TEST_CASE("matrix --far-stops skip: the far stop is left out, listed with its distance, the rest answered") {
    const std::string folder = test::make_scratch_dir("matrix-far");
    // "far" is 0.0075 degrees of latitude (about 830 m) north of the corner stop a: beyond the
    // 500 m radius, as the bad-input test above shows.
    test::write_file(folder + "/stops.csv", "id,lat,lon\na,18.05,-141.0\nfar,18.0575,-141.0\nc,18.0518,-140.9981\n");
    const auto refused = run_ringroad({"matrix", town().region, "--stops", folder + "/stops.csv"});
    CHECK(refused.exit_code == 1);
    const auto skipped = run_ringroad(
        {"matrix", town().region, "--stops", folder + "/stops.csv", "--far-stops", "skip", "--format", "json"});
    REQUIRE(skipped.exit_code == 0);
    const auto answer = nlohmann::json::parse(skipped.out);
    CHECK(answer.at("ids") == nlohmann::json::array({"a", "c"}));
    REQUIRE(answer.at("skipped_stops").size() == 1);
    CHECK(answer.at("skipped_stops")[0].at("id") == "far");
    CHECK(answer.at("skipped_stops")[0].at("meters_to_road").get<double>() > 500.0);
    REQUIRE_THAT(skipped.err, Catch::Contains("skipped stop 'far'"));
    CHECK(run_ringroad({"matrix", town().region, "--stops", folder + "/stops.csv", "--far-stops", "drop"}).exit_code == 2);
}

TEST_CASE("matrix: a request too large for memory is refused before anything is allocated (issue 13 A.17)") {
    const std::string folder = test::make_scratch_dir("matrix-huge");
    std::string text = "id,lat,lon\n";
    for (int i = 0; i < 100000; ++i) text += "s" + std::to_string(i) + ",18.05,-141.0\n";
    test::write_file(folder + "/stops.csv", text);
    const auto result = run_ringroad({"matrix", town().region, "--stops", folder + "/stops.csv", "-o", folder + "/out.csv"});
    CHECK(result.exit_code == 1);
    REQUIRE_THAT(result.err, Catch::Contains("100000 stops need a 100000 x 100000 table"));
    REQUIRE_THAT(result.err, Catch::Contains("the limit is"));
    CHECK(std::count(result.err.begin(), result.err.end(), '\n') == 1);
    CHECK_FALSE(test::file_exists(folder + "/out.csv"));
}
