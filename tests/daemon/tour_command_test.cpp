// `ringroad tour` run as a program. Outside references: the published optimal tour lengths of
// TSPLIB 95 (fixtures/tsplib/*/optimal.txt: burma14 = 3323, ulysses16 = 6859, gr17 = 2085,
// br17 = 39, eil51 = 426), brute force over all orders for small open trips, and the real
// OpenStreetMap extract fixtures/osm/monaco.osm.pbf (© OpenStreetMap contributors, ODbL 1.0).
#include "planners/matrices/matrix_csv.hpp"
#include "tests/support/run_command.hpp"
#include "tests/support/tsplib_reader.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <numeric>
#include <set>

using nlohmann::json;
using ringroad::test::fixture_path;
using ringroad::test::run_ringroad;

namespace {

// A TSPLIB instance as MATRIX.csv with ids c1..cN (TSPLIB city numbers), diagonal 0.
std::string tsplib_matrix_csv(const std::string& folder, const std::string& relative, const std::string& name) {
    const auto instance = ringroad::test::read_tsplib_file(fixture_path("tsplib/" + relative));
    ringroad::planners::matrices::LabelledMatrix matrix{{}, instance.costs};
    for (std::size_t i = 0; i < instance.costs.size(); ++i) {
        std::string id = "c";   // built by appending: GCC 12 warns falsely on "c" + std::string
        id += std::to_string(i + 1);
        matrix.ids.push_back(id);
        matrix.costs(i, i) = 0.0;
    }
    const std::string path = folder + "/" + name + ".csv";
    ringroad::planners::matrices::write_matrix_csv(matrix, path);
    return path;
}

long published_optimum(const std::string& folder, const std::string& name) {
    return ringroad::test::read_tsplib_optima(fixture_path("tsplib/" + folder + "/optimal.txt")).at(name);
}

// The order is a permutation of the stops and the hops chain along it.
void check_consistent(const json& tour, std::size_t stops, bool closed) {
    const auto order = tour.at("order").get<std::vector<std::string>>();
    REQUIRE(order.size() == stops);
    CHECK(std::set<std::string>(order.begin(), order.end()).size() == stops);
    const auto& hops = tour.at("hops");
    REQUIRE(hops.size() == (closed ? stops : stops - 1));
    double sum = 0.0;
    for (std::size_t i = 0; i < hops.size(); ++i) {
        CHECK(hops[i].at("from") == order[i]);
        CHECK(hops[i].at("to") == order[(i + 1) % stops]);
        sum += hops[i].contains("cost") ? hops[i].at("cost").get<double>() : hops[i].at("seconds").get<double>();
    }
    const double total = tour.contains("cost") ? tour.at("cost").get<double>() : tour.at("total_seconds").get<double>();
    CHECK(sum == Approx(total).margin(0.05 * static_cast<double>(stops)));
    CHECK(tour.at("caution").get<std::string>().find("road signs") != std::string::npos);
}

bool one_line(const std::string& text) {
    return !text.empty() && text.find('\n') == text.size() - 1;
}

} // namespace

TEST_CASE("tour --matrix reaches the published TSPLIB optima, proven") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-tsplib");
    struct Instance { const char* folder; const char* file; const char* name; };
    for (const Instance& instance : {Instance{"symmetric", "symmetric/burma14.tsp", "burma14"},
                                     Instance{"symmetric", "symmetric/ulysses16.tsp", "ulysses16"},
                                     Instance{"symmetric", "symmetric/gr17.tsp", "gr17"},
                                     Instance{"asymmetric", "asymmetric/br17.atsp", "br17"}}) {
        INFO(instance.name);
        const std::string matrix = tsplib_matrix_csv(folder, instance.file, instance.name);
        const auto result = run_ringroad({"tour", "--matrix", matrix, "--exact-limit", "17"});
        REQUIRE(result.exit_code == 0);
        const json tour = json::parse(result.out);
        // TSPLIB 95 published optimum (fixtures/tsplib/*/optimal.txt).
        CHECK(tour.at("cost").get<double>() == static_cast<double>(published_optimum(instance.folder, instance.name)));
        CHECK(tour.at("proven_optimal") == true);
        CHECK(tour.at("lower_bound").get<double>() <= tour.at("cost").get<double>());
        CHECK(tour.at("order")[0] == "c1");
        check_consistent(tour, tour.at("stops").get<std::size_t>(), true);
        CHECK(tour.at("diagnostics").at("symmetric") == (std::string(instance.folder) == "symmetric"));
    }
}

TEST_CASE("tour --start keeps the optimum of a closed tour and starts there; --end fixes the last stop") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-start");
    const std::string matrix = tsplib_matrix_csv(folder, "symmetric/burma14.tsp", "burma14");
    const auto started = run_ringroad({"tour", "--matrix", matrix, "--start", "c7"});
    REQUIRE(started.exit_code == 0);
    const json tour = json::parse(started.out);
    CHECK(tour.at("order")[0] == "c7");
    CHECK(tour.at("cost").get<double>() == 3323.0);   // TSPLIB 95 published optimum of burma14

    const auto ended = run_ringroad({"tour", "--matrix", matrix, "--start", "c7", "--end", "c3"});
    REQUIRE(ended.exit_code == 0);
    const json trip = json::parse(ended.out);
    CHECK(trip.at("order")[0] == "c7");
    CHECK(trip.at("order").back() == "c3");
    CHECK(trip.at("trip") == "open, fixed end");
    check_consistent(trip, 14, false);
    // An open trip drops the closing hop back to c7 and the tour can be re-ordered, so it is
    // never dearer than the closed optimum.
    CHECK(trip.at("cost").get<double>() <= 3323.0);
}

TEST_CASE("tour --open: free end equals brute force over all orders") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-open");
    // Seven stops on a line with one-way penalties: asymmetric, small enough to enumerate.
    ringroad::planners::matrices::LabelledMatrix matrix{{"a", "b", "c", "d", "e", "f", "g"}, ringroad::planners::matrices::CostMatrix(7)};
    for (std::size_t i = 0; i < 7; ++i)
        for (std::size_t j = 0; j < 7; ++j)
            if (i != j) matrix.costs(i, j) = std::abs(static_cast<double>(i * i) - static_cast<double>(j * j)) + (i < j ? 3.0 : 1.0) + static_cast<double>((i * 5 + j * 3) % 7);
    const std::string path = folder + "/line.csv";
    ringroad::planners::matrices::write_matrix_csv(matrix, path);
    std::vector<std::size_t> rest{1, 2, 3, 4, 5, 6};
    double best = 1e300;
    do {
        double cost = matrix.costs(0, rest[0]);
        for (std::size_t i = 0; i + 1 < rest.size(); ++i) cost += matrix.costs(rest[i], rest[i + 1]);
        best = std::min(best, cost);
    } while (std::next_permutation(rest.begin(), rest.end()));
    const auto result = run_ringroad({"tour", "--matrix", path, "--open"});
    REQUIRE(result.exit_code == 0);
    const json trip = json::parse(result.out);
    CHECK(trip.at("cost").get<double>() == best);   // brute force over all 720 orders
    CHECK(trip.at("trip") == "open, free end");
    check_consistent(trip, 7, false);
}

TEST_CASE("tour on 51 stops: within 5 % of the published optimum, bound below it") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-eil51");
    const std::string matrix = tsplib_matrix_csv(folder, "symmetric/eil51.tsp", "eil51");
    const auto result = run_ringroad({"tour", "--matrix", matrix, "--time-limit", "0.3", "--seed", "4"});
    REQUIRE(result.exit_code == 0);
    const json tour = json::parse(result.out);
    const double optimum = static_cast<double>(published_optimum("symmetric", "eil51"));   // TSPLIB 95: 426
    CHECK(tour.at("cost").get<double>() >= optimum);
    CHECK(tour.at("cost").get<double>() <= optimum * 1.05);
    CHECK(tour.at("lower_bound").get<double>() <= optimum);
    check_consistent(tour, 51, true);
    // Same seed, same tour.
    const auto again = run_ringroad({"tour", "--matrix", matrix, "--time-limit", "0.3", "--seed", "4"});
    CHECK(json::parse(again.out).at("order") == tour.at("order"));
}

TEST_CASE("tour --method tree-doubling over the metric closure stays within twice the optimum") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-doubling");
    const std::string matrix = tsplib_matrix_csv(folder, "symmetric/burma14.tsp", "burma14");
    const auto result = run_ringroad({"tour", "--matrix", matrix, "--method", "tree-doubling", "--metric-closure"});
    REQUIRE(result.exit_code == 0);
    const json tour = json::parse(result.out);
    // 2-approximation of tree doubling under the triangle inequality (the closure guarantees it);
    // TSPLIB 95 published optimum 3323.
    CHECK(tour.at("cost").get<double>() <= 2.0 * 3323.0);
    CHECK(tour.at("cost").get<double>() >= 3323.0);
    CHECK(tour.at("metric_closure").at("used") == true);
    CHECK(tour.at("method").get<std::string>().find("tree") != std::string::npos);
}

TEST_CASE("tour --metric-closure states the entries it changed") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-closure");
    ringroad::test::write_file(folder + "/m.csv", "id,a,b,c\na,0,1,9\nb,1,0,1\nc,9,1,0\n");
    const json plain = json::parse(run_ringroad({"tour", "--matrix", folder + "/m.csv"}).out);
    CHECK(plain.at("diagnostics").at("triangle_violations") == 2);   // a->c and c->a via b
    CHECK(plain.at("diagnostics").at("triangle_examples")[0].at("via") == "b");
    CHECK(plain.at("metric_closure").at("used") == false);
    const json closed = json::parse(run_ringroad({"tour", "--matrix", folder + "/m.csv", "--metric-closure"}).out);
    CHECK(closed.at("metric_closure").at("entries_shortened") == 2);
    CHECK(closed.at("cost").get<double>() == 4.0);   // a->b->c->(b)->a with c->a closed to 2
    CHECK(plain.at("cost").get<double>() == 11.0);
}

TEST_CASE("tour --format csv: one row per visit, back to the start, caution on stderr") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-csv");
    const std::string matrix = tsplib_matrix_csv(folder, "symmetric/burma14.tsp", "burma14");
    const auto result = run_ringroad({"tour", "--matrix", matrix, "--format", "csv"});
    REQUIRE(result.exit_code == 0);
    std::vector<std::string> lines;
    std::size_t begin = 0;
    for (std::size_t end; (end = result.out.find("\r\n", begin)) != std::string::npos; begin = end + 2) {
        lines.push_back(result.out.substr(begin, end - begin));
    }
    REQUIRE(lines.size() == 16);   // header, start, 13 visits, back at the start (RFC 4180 CRLF)
    CHECK(lines[0] == "visit,stop,cost_from_previous,total_cost");
    CHECK(lines[1] == "0,c1,0,0");
    CHECK(lines.back().rfind("14,c1,", 0) == 0);
    CHECK(lines.back().substr(lines.back().rfind(',') + 1) == "3323");   // TSPLIB 95 optimum
    CHECK(result.err.find("road signs") != std::string::npos);
}

TEST_CASE("tour: bad input exits 1 with one line and -o leaves no file") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-bad");
    ringroad::test::write_file(folder + "/ragged.csv", "id,a,b\na,0,1\nb,2\n");
    ringroad::test::write_file(folder + "/word.csv", "id,a,b\na,0,far\nb,2,0\n");
    ringroad::test::write_file(folder + "/negative.csv", "id,a,b\na,0,-1\nb,2,0\n");
    ringroad::test::write_file(folder + "/twice.csv", "id,a,a\na,0,1\na,2,0\n");
    ringroad::test::write_file(folder + "/short.csv", "id,a,b,c\na,0,1,1\nb,1,0,1\n");
    ringroad::test::write_file(folder + "/island.csv", "id,a,b,c\na,0,1,\nb,1,0,\nc,,,0\n");
    ringroad::test::write_file(folder + "/good.csv", "id,a,b,c\na,0,1,2\nb,1,0,1\nc,2,1,0\n");
    // Every stop has ways in and out, yet no closed tour exists (d is only left towards b).
    ringroad::test::write_file(folder + "/no-tour.csv", "id,a,b,c,d\na,0,1,,\nb,1,0,1,\nc,,,0,1\nd,,1,,0\n");
    struct Case { std::vector<std::string> arguments; std::string expected; };
    const std::vector<Case> cases = {
        {{"--matrix", folder + "/ragged.csv"}, "ragged.csv:3:"},
        {{"--matrix", folder + "/word.csv"}, "word.csv:2: column 3"},
        {{"--matrix", folder + "/negative.csv"}, "negative.csv:2: column 3"},
        {{"--matrix", folder + "/twice.csv"}, "duplicate stop id 'a'"},
        {{"--matrix", folder + "/short.csv"}, "no row for stop 'c'"},
        {{"--matrix", folder + "/island.csv"}, "stop 'c'"},
        {{"--matrix", folder + "/no-tour.csv"}, "no tour exists"},
        {{"--matrix", folder + "/absent.csv"}, "absent.csv"},
        {{"--matrix", folder + "/good.csv", "--start", "zz"}, "--start: unknown stop 'zz'"},
        {{"--matrix", folder + "/good.csv", "--end", "yy"}, "--end: unknown stop 'yy'"},
        {{"--matrix", folder + "/good.csv", "--format", "gpx"}, "needs REGION.rrg --stops"},
    };
    for (const Case& c : cases) {
        std::vector<std::string> arguments{"tour"};
        arguments.insert(arguments.end(), c.arguments.begin(), c.arguments.end());
        const std::string output = folder + "/out.json";
        arguments.insert(arguments.end(), {"-o", output});
        INFO(c.expected);
        const auto result = run_ringroad(arguments);
        CHECK(result.exit_code == 1);
        CHECK(one_line(result.err));
        CHECK(result.err.find(c.expected) != std::string::npos);
        CHECK_FALSE(ringroad::test::file_exists(output));
    }
    // Usage mistakes exit 2.
    CHECK(run_ringroad({"tour", "--stops", folder + "/good.csv"}).exit_code == 2);
    CHECK(run_ringroad({"tour", "--matrix", folder + "/good.csv", "--end", "a", "--open"}).exit_code == 2);
    CHECK(run_ringroad({"tour"}).exit_code == 2);
    // And -o writes the whole answer when all is well.
    REQUIRE(run_ringroad({"tour", "--matrix", folder + "/good.csv", "-o", folder + "/ok.json"}).exit_code == 0);
    CHECK(json::parse(ringroad::test::read_file(folder + "/ok.json")).at("cost").get<double>() == 4.0);
}

TEST_CASE("tour on the Monaco road graph: seconds and metres, GeoJSON and GPX geometry") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-roads");
    const std::string region = folder + "/monaco.rrg";
    REQUIRE(run_ringroad({"build", fixture_path("osm/monaco.osm.pbf"), "-o", region}).exit_code == 0);
    ringroad::test::write_file(folder + "/stops.csv",
                               "id,lat,lon\nport,43.7350,7.4230\ncasino,43.7396,7.4276\npalace,43.7314,7.4199\n"
                               "station,43.7387,7.4194\ngarden,43.7275,7.4155\n");
    const auto result = run_ringroad({"tour", region, "--stops", folder + "/stops.csv"});
    REQUIRE(result.exit_code == 0);
    const json tour = json::parse(result.out);
    check_consistent(tour, 5, true);
    CHECK(tour.at("metric") == "time");
    CHECK(tour.at("proven_optimal") == true);
    double meters = 0.0;
    for (const auto& hop : tour.at("hops")) {
        CHECK(hop.at("meters").get<double>() > 0.0);
        meters += hop.at("meters").get<double>();
    }
    CHECK(tour.at("total_meters").get<double>() == Approx(meters).margin(0.5));
    // Monaco is about 3 km across (from memory): a five-stop tour is a few km, not tens.
    CHECK(meters > 2000.0);
    CHECK(meters < 20000.0);

    const json geojson = json::parse(run_ringroad({"tour", region, "--stops", folder + "/stops.csv", "--format", "geojson"}).out);
    CHECK(geojson.at("type") == "FeatureCollection");
    std::size_t lines = 0;
    for (const auto& feature : geojson.at("features")) {
        if (feature.at("geometry").at("type") != "LineString") continue;
        ++lines;
        const auto& first = feature.at("geometry").at("coordinates")[0];
        CHECK(first[0].get<double>() == Approx(7.42).margin(0.03));    // RFC 7946: longitude first
        CHECK(first[1].get<double>() == Approx(43.735).margin(0.02));
    }
    CHECK(lines == 5);
    const auto gpx = run_ringroad({"tour", region, "--stops", folder + "/stops.csv", "--format", "gpx", "--open"});
    REQUIRE(gpx.exit_code == 0);
    CHECK(gpx.out.find("<gpx version=\"1.1\"") != std::string::npos);
    CHECK(gpx.out.find("<name>port</name>") != std::string::npos);
    CHECK(gpx.out.find("<trkpt lat=\"43.7") != std::string::npos);

    // Further columns of STOPS.csv are echoed on every CSV row (GUIDE section 3).
    ringroad::test::write_file(folder + "/named.csv", "id,lat,lon,name\nport,43.7350,7.4230,\"Quay, north\"\n"
                                                      "casino,43.7396,7.4276,Square\n");
    const auto named = run_ringroad({"tour", region, "--stops", folder + "/named.csv", "--format", "csv"});
    REQUIRE(named.exit_code == 0);
    CHECK(named.out.rfind("visit,stop,lat,lon,seconds_from_previous,meters_from_previous,total_seconds,total_meters,name\r\n", 0) == 0);
    CHECK(named.out.find("0,port,43.735,7.423,0,0,0,0,\"Quay, north\"\r\n") != std::string::npos);
    CHECK(named.out.find(",Square\r\n") != std::string::npos);

    ringroad::test::write_file(folder + "/far.csv", "id,lat,lon\nport,43.7350,7.4230\nparis,48.8566,2.3522\n");
    const auto far = run_ringroad({"tour", region, "--stops", folder + "/far.csv", "-o", folder + "/far.json"});
    CHECK(far.exit_code == 1);
    CHECK(far.err.find("paris") != std::string::npos);
    CHECK(one_line(far.err));
    CHECK_FALSE(ringroad::test::file_exists(folder + "/far.json"));
}

TEST_CASE("tour: an open trip needs no way into its start (issue 13 A.10)") {
    const std::string folder = ringroad::test::make_scratch_dir("tour-chain");
    // A one-way chain: only a -> b and b -> c. Brute force: the only open trip from a is a, b, c (cost 2).
    ringroad::test::write_file(folder + "/chain.csv", "id,a,b,c\na,0,1,\nb,,0,1\nc,,,0\n");
    for (const std::vector<std::string>& shape :
         {std::vector<std::string>{"--open"}, std::vector<std::string>{"--start", "a", "--end", "c"}}) {
        std::vector<std::string> arguments{"tour", "--matrix", folder + "/chain.csv"};
        arguments.insert(arguments.end(), shape.begin(), shape.end());
        const auto result = run_ringroad(arguments);
        INFO(result.err);
        REQUIRE(result.exit_code == 0);
        const json trip = json::parse(result.out);
        CHECK(trip.at("order") == json::array({"a", "b", "c"}));
        CHECK(trip.at("cost") == 2.0);
    }
    // A closed tour on the chain is still refused.
    CHECK(run_ringroad({"tour", "--matrix", folder + "/chain.csv"}).exit_code == 1);
}
