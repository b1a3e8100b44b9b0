// --snap-radius means the same on every command that places stops on roads. Stops are points in
// the real Monaco extract (fixtures/osm/monaco.osm.pbf, © OpenStreetMap contributors, ODbL 1.0):
// with a radius of a few centimetres they cannot all sit exactly on a road, and the error names
// the stop and its distance; with the default radius they snap.

#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>

using namespace ringroad::test;

namespace {

struct Region {
    std::string folder, graph, stops;
};

const Region& monaco() {
    static const Region region = [] {
        Region built{make_scratch_dir("snap-radius"), "", ""};
        built.graph = built.folder + "/monaco.rrg";
        built.stops = built.folder + "/stops.csv";
        write_file(built.stops, "id,lat,lon\nport,43.7350,7.4230\ncasino,43.7396,7.4276\npalace,43.7314,7.4199\n");
        REQUIRE(run_ringroad({"build", fixture_path("osm/monaco.osm.pbf"), "-o", built.graph, "--quiet"}).exit_code == 0);
        return built;
    }();
    return region;
}

std::vector<std::vector<std::string>> commands_with(const std::vector<std::string>& extra) {
    const Region& region = monaco();
    std::vector<std::vector<std::string>> commands = {
        {"matrix", region.graph, "--stops", region.stops},
        {"tour", region.graph, "--stops", region.stops},
        {"network", region.graph, "--stops", region.stops},
        {"route", region.graph, "--from", "43.7350,7.4230", "--to", "43.7396,7.4276"},
    };
    for (auto& command : commands) command.insert(command.end(), extra.begin(), extra.end());
    return commands;
}

} // namespace

TEST_CASE("every stop-placing command accepts --snap-radius and applies it") {
    for (const auto& command : commands_with({})) {
        INFO(command[0] << " with the default radius");
        CHECK(run_ringroad(command).exit_code == 0);
    }
    for (const auto& command : commands_with({"--snap-radius", "0.01"})) {
        INFO(command[0] << " with a 1 cm radius");
        const auto result = run_ringroad(command);
        CHECK(result.exit_code == 1);
        CHECK(std::count(result.err.begin(), result.err.end(), '\n') == 1);
        CHECK(result.err.find("from the nearest road") != std::string::npos);
        CHECK(result.out.empty());
    }
    for (const auto& command : commands_with({"--snap-radius", "-5"})) {
        INFO(command[0] << " with a negative radius");
        CHECK(run_ringroad(command).exit_code == 2);
    }
}
