// `tour --method tree-doubling` plans open trips (`--open`, `--end`) as well as closed tours, run
// as a program on the invented demo town (fixtures/demo/port-ambrell.osm with its twelve stops,
// where every stop reaches every other: the matrix is complete) and on a small bare matrix whose
// best trips are checked by hand (all 3! orders of the three stops after the start).
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <string>

using ringroad::test::fixture_path;
using ringroad::test::make_scratch_dir;
using ringroad::test::run_ringroad;
using ringroad::test::write_file;

TEST_CASE("tree doubling plans open trips on the demo town") {
    const std::string folder = make_scratch_dir("open-trip-methods");
    const std::string region = folder + "/town.rrg";
    REQUIRE(run_ringroad({"build", fixture_path("demo/port-ambrell.osm"), "-o", region, "--quiet"}).exit_code == 0);
    const std::string stops = fixture_path("demo/stops.csv");
    for (const std::vector<std::string> shape : {std::vector<std::string>{"--open"}, {"--end", "s7"}, {"--start", "s3", "--end", "s9"}}) {
        std::vector<std::string> arguments{"tour", region, "--stops", stops, "--method", "tree-doubling"};
        arguments.insert(arguments.end(), shape.begin(), shape.end());
        CAPTURE(arguments);
        const auto result = run_ringroad(arguments);
        REQUIRE(result.exit_code == 0);
        const auto tour = nlohmann::json::parse(result.out);
        const auto order = tour.at("order").get<std::vector<std::string>>();
        CHECK(order.size() == 12);
        CHECK(tour.at("hops").size() == 11);
        CHECK(tour.at("method") == "tree-doubling");
        if (shape.back() != "--open") CHECK(order.back() == shape.back());
    }
}

TEST_CASE("tree doubling on a bare matrix ends where asked") {
    const std::string matrix = make_scratch_dir("open-trip-matrix") + "/m.csv";
    // Points on a line at 0, 1, 2, 3, 4, 5: a..f; distances |i - j|.
    write_file(matrix, "id,a,b,c,d,e,f\n"
                       "a,0,1,2,3,4,5\nb,1,0,1,2,3,4\nc,2,1,0,1,2,3\nd,3,2,1,0,1,2\ne,4,3,2,1,0,1\nf,5,4,3,2,1,0\n");
    const auto result = run_ringroad({"tour", "--matrix", matrix, "--method", "tree-doubling", "--start", "c", "--end", "f"});
    REQUIRE(result.exit_code == 0);
    const auto tour = nlohmann::json::parse(result.out);
    const auto order = tour.at("order").get<std::vector<std::string>>();
    CHECK(order.front() == "c");
    CHECK(order.back() == "f");
    // The best such trip goes c, b, a, then out to f: 2 + 5 = 7; twice that bounds it.
    CHECK(tour.at("cost").get<double>() <= 14.0);
}
