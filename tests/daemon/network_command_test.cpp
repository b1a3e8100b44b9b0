// `ringroad network` run as a program. Outside references: the Boost Graph Library's
// kruskal_minimum_spanning_tree on the same matrices (TSPLIB 95 instances burma14, gr17 and the
// asymmetric br17, ftv33), and the real extract fixtures/osm/monaco.osm.pbf (© OpenStreetMap
// contributors, ODbL 1.0) with the Kou–Markowsky–Berman guarantee (network <= sum of links).
#include "planners/matrices/matrix_csv.hpp"
#include "tests/support/run_command.hpp"
#include "tests/support/tsplib_reader.hpp"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/kruskal_min_spanning_tree.hpp>

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <iterator>
#include <set>

using nlohmann::json;
using ringroad::planners::matrices::CostMatrix;
using ringroad::test::fixture_path;
using ringroad::test::run_ringroad;

namespace {

ringroad::planners::matrices::LabelledMatrix tsplib_matrix(const std::string& relative) {
    const auto instance = ringroad::test::read_tsplib_file(fixture_path("tsplib/" + relative));
    ringroad::planners::matrices::LabelledMatrix matrix{{}, instance.costs};
    for (std::size_t i = 0; i < instance.costs.size(); ++i) {
        std::string id = "c";   // appended: GCC 12 warns falsely on "c" + std::string
        id += std::to_string(i + 1);
        matrix.ids.push_back(id);
        matrix.costs(i, i) = 0.0;
    }
    return matrix;
}

// Boost Graph Library kruskal_minimum_spanning_tree with each link priced min or max of its two
// directions.
double boost_mst(const CostMatrix& costs, bool dearer) {
    using Graph = boost::adjacency_list<boost::vecS, boost::vecS, boost::undirectedS, boost::no_property,
                                        boost::property<boost::edge_weight_t, double>>;
    Graph graph(costs.size());
    for (std::size_t a = 0; a < costs.size(); ++a) {
        for (std::size_t b = a + 1; b < costs.size(); ++b) {
            const double cost = dearer ? std::max(costs(a, b), costs(b, a)) : std::min(costs(a, b), costs(b, a));
            if (std::isfinite(cost)) boost::add_edge(a, b, cost, graph);
        }
    }
    std::vector<boost::graph_traits<Graph>::edge_descriptor> tree;
    boost::kruskal_minimum_spanning_tree(graph, std::back_inserter(tree));
    double total = 0.0;
    for (const auto& edge : tree) total += boost::get(boost::edge_weight, graph, edge);
    return total;
}

bool one_line(const std::string& text) { return !text.empty() && text.find('\n') == text.size() - 1; }

} // namespace

TEST_CASE("network --matrix: the spanning tree weighs what Boost's Kruskal says, on TSPLIB matrices") {
    const std::string folder = ringroad::test::make_scratch_dir("network-tsplib");
    for (const char* relative : {"symmetric/burma14.tsp", "symmetric/gr17.tsp", "asymmetric/br17.atsp",
                                 "asymmetric/ftv33.atsp"}) {
        INFO(relative);
        const auto matrix = tsplib_matrix(relative);
        const std::string path = folder + "/m.csv";
        ringroad::planners::matrices::write_matrix_csv(matrix, path);
        for (const bool dearer : {false, true}) {
            const auto result = run_ringroad({"network", "--matrix", path, "--link-cost", dearer ? "dearer" : "cheaper"});
            REQUIRE(result.exit_code == 0);
            const json network = json::parse(result.out);
            // Boost Graph Library kruskal_minimum_spanning_tree on the same matrix.
            CHECK(network.at("cost").get<double>() == Approx(boost_mst(matrix.costs, dearer)));
            REQUIRE(network.at("links").size() == matrix.ids.size() - 1);
            std::set<std::string> joined;
            double sum = 0.0;
            for (const auto& link : network.at("links")) {
                joined.insert(link.at("from").get<std::string>());
                joined.insert(link.at("to").get<std::string>());
                sum += link.at("cost").get<double>();
            }
            CHECK(joined.size() == matrix.ids.size());
            CHECK(sum == Approx(network.at("cost").get<double>()));
            CHECK(network.at("link_cost_rule").get<std::string>().find(dearer ? "max" : "min") == 0);
        }
    }
}

TEST_CASE("network --matrix --metric-closure and missing entries") {
    const std::string folder = ringroad::test::make_scratch_dir("network-closure");
    // a-c only through b; the closure fills a->c with 2 but the tree is unchanged (a tree over a
    // closure weighs the same as over the matrix it closes when the entries are symmetric).
    ringroad::test::write_file(folder + "/m.csv", "id,a,b,c\na,0,1,\nb,1,0,1\nc,,1,0\n");
    const json plain = json::parse(run_ringroad({"network", "--matrix", folder + "/m.csv"}).out);
    const json closed = json::parse(run_ringroad({"network", "--matrix", folder + "/m.csv", "--metric-closure"}).out);
    CHECK(plain.at("cost") == 2.0);
    CHECK(closed.at("cost") == 2.0);
    CHECK(plain.at("missing_entries") == 2);
    CHECK(closed.at("metric_closure").at("entries_filled") == 2);
}

TEST_CASE("network: bad input exits 1 with one line and -o leaves no file") {
    const std::string folder = ringroad::test::make_scratch_dir("network-bad");
    ringroad::test::write_file(folder + "/island.csv", "id,a,b,c\na,0,1,\nb,1,0,\nc,,,0\n");
    ringroad::test::write_file(folder + "/word.csv", "id,a,b\na,0,x\nb,1,0\n");
    ringroad::test::write_file(folder + "/good.csv", "id,a,b\na,0,1\nb,1,0\n");
    struct Case { std::vector<std::string> arguments; std::string expected; };
    const std::vector<Case> cases = {
        {{"--matrix", folder + "/island.csv"}, "stop 'c' cannot be joined"},
        {{"--matrix", folder + "/word.csv"}, "word.csv:2: column 3"},
        {{"--matrix", folder + "/none.csv"}, "none.csv"},
        {{"--matrix", folder + "/good.csv", "--format", "geojson"}, "needs REGION.rrg --stops"},
    };
    for (const Case& c : cases) {
        std::vector<std::string> arguments{"network"};
        arguments.insert(arguments.end(), c.arguments.begin(), c.arguments.end());
        arguments.insert(arguments.end(), {"-o", folder + "/out.json"});
        INFO(c.expected);
        const auto result = run_ringroad(arguments);
        CHECK(result.exit_code == 1);
        CHECK(one_line(result.err));
        CHECK(result.err.find(c.expected) != std::string::npos);
        CHECK_FALSE(ringroad::test::file_exists(folder + "/out.json"));
    }
    CHECK(run_ringroad({"network", "--stops", folder + "/good.csv"}).exit_code == 2);
    CHECK(run_ringroad({"network", "--matrix", folder + "/good.csv", "--link-cost", "average"}).exit_code == 2);
}

TEST_CASE("network on the Monaco road graph: shared road counted once, unique pieces, GeoJSON") {
    const std::string folder = ringroad::test::make_scratch_dir("network-roads");
    const std::string region = folder + "/monaco.rrg";
    REQUIRE(run_ringroad({"build", fixture_path("osm/monaco.osm.pbf"), "-o", region}).exit_code == 0);
    ringroad::test::write_file(folder + "/sites.csv",
                               "id,lat,lon\nport,43.7350,7.4230\ncasino,43.7396,7.4276\npalace,43.7314,7.4199\n"
                               "station,43.7387,7.4194\ngarden,43.7275,7.4155\neast,43.7450,7.4330\n");
    const auto result = run_ringroad({"network", region, "--stops", folder + "/sites.csv", "-o", folder + "/n.json"});
    REQUIRE(result.exit_code == 0);
    const json network = json::parse(ringroad::test::read_file(folder + "/n.json"));
    CHECK(network.at("links").size() == 5);
    const double road = network.at("road_meters").get<double>();
    const double links = network.at("link_meters_sum").get<double>();
    // Kou–Markowsky–Berman: the network is no longer than the spanning tree of its links.
    CHECK(road <= links);
    CHECK(network.at("saving_meters").get<double>() == Approx(links - road).margin(0.05));
    CHECK(network.at("cost").get<double>() == road);
    double sum = 0.0;
    std::set<std::pair<std::uint64_t, double>> pieces;
    for (const auto& segment : network.at("segments")) {
        sum += segment.at("meters").get<double>();
        const double from = segment.contains("from_fraction") ? segment.at("from_fraction").get<double>() : 0.0;
        CHECK(pieces.insert({segment.at("segment").get<std::uint64_t>(), from}).second);   // unique
    }
    CHECK(sum == Approx(road).margin(0.05 * static_cast<double>(pieces.size())));
    // Monaco is about 3 km across (from memory): six sites need a few km of road.
    CHECK(road > 2000.0);
    CHECK(road < 15000.0);

    const json geojson = json::parse(run_ringroad({"network", region, "--stops", folder + "/sites.csv", "--format", "geojson"}).out);
    CHECK(geojson.at("type") == "FeatureCollection");
    const auto& lines = geojson.at("features")[0].at("geometry");
    CHECK(lines.at("type") == "MultiLineString");
    CHECK(lines.at("coordinates").size() == pieces.size());
    CHECK(lines.at("coordinates")[0][0][0].get<double>() == Approx(7.42).margin(0.03));   // longitude first
    CHECK(geojson.at("network").at("road_meters").get<double>() == road);

    CHECK(run_ringroad({"network", region, "--stops", folder + "/sites.csv", "--metric-closure"}).exit_code == 1);

    // A site far from every road is named, with its line; nothing is written.
    ringroad::test::write_file(folder + "/far.csv", "id,lat,lon\nport,43.7350,7.4230\nnice,43.7102,7.2620\n");
    const auto far = run_ringroad({"network", region, "--stops", folder + "/far.csv", "-o", folder + "/far.json"});
    CHECK(far.exit_code == 1);
    CHECK(one_line(far.err));
    CHECK(far.err.find("far.csv:3:") != std::string::npos);
    CHECK(far.err.find("nice") != std::string::npos);
    CHECK_FALSE(ringroad::test::file_exists(folder + "/far.json"));
}
