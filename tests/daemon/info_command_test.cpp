// `ringroad info` from the outside: counts and provenance of a graph built from the real Monaco
// extract (fixtures/osm/monaco.osm.pbf, © OpenStreetMap contributors, ODbL 1.0), and damaged
// region files refused with one line naming the file and exit code 1.

#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <filesystem>
#include <random>

using namespace ringroad::test;

namespace {

std::size_t line_count(const std::string& text) {
    return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n'));
}

struct BuiltRegion {
    std::string folder;
    std::string path;
};

const BuiltRegion& monaco() {
    static const BuiltRegion region = [] {
        BuiltRegion built{make_scratch_dir("info"), ""};
        built.path = built.folder + "/monaco.rrg";
        const auto result = run_ringroad({"build", fixture_path("osm/monaco.osm.pbf"), "-o", built.path, "--quiet"});
        REQUIRE(result.exit_code == 0);
        return built;
    }();
    return region;
}

} // namespace

TEST_CASE("info --json reports provenance and counts of a real extract") {
    const auto result = run_ringroad({"info", monaco().path, "--json"});
    REQUIRE(result.exit_code == 0);
    const auto info = nlohmann::json::parse(result.out);
    for (const char* key : {"junctions", "edges", "road_km", "components", "profile", "source", "source_timestamp"}) {
        CHECK(info.contains(key));
    }
    CHECK(info["profile"] == "car");
    CHECK(info["source"] == "monaco.osm.pbf");
    // The snapshot time published with the extract (shared data README, PBF header).
    CHECK(info["source_timestamp"] == "2019-09-30T20:18:02Z");
    CHECK(info["junctions"].get<long>() > 100);
    CHECK(info["edges"].get<long>() > info["junctions"].get<long>());
    CHECK(info["hierarchy"] == true);
    CHECK(info["hierarchy_metrics"] == nlohmann::json({"time", "distance"}));
    CHECK(info["hierarchy_unusable"].empty());
    // Monaco's road network is a few hundred km at most (the country is about 2 km²; from memory).
    CHECK(info["road_km"].get<double>() > 20.0);
    CHECK(info["road_km"].get<double>() < 500.0);
}

TEST_CASE("info prints text by default") {
    const auto result = run_ringroad({"info", monaco().path});
    REQUIRE(result.exit_code == 0);
    for (const char* word : {"junctions", "road length", "profile", "hierarchy        time, distance\n"}) {
        CHECK(result.out.find(word) != std::string::npos);
    }
}

TEST_CASE("damaged region files are refused: one line, exit code 1") {
    const std::string bytes = read_file(monaco().path);
    const std::string folder = make_scratch_dir("info-bad");
    const std::string bad = folder + "/bad.rrg";
    auto check_refused = [&](const std::string& content, const std::string& why) {
        INFO(why);
        write_file(bad, content);
        const auto result = run_ringroad({"info", bad});
        CHECK(result.exit_code == 1);
        CHECK(line_count(result.err) == 1);
        CHECK(result.err.find(bad) != std::string::npos);
        CHECK(result.out.empty());
    };
    for (const std::size_t keep : {std::size_t{0}, std::size_t{63}, std::size_t{5000}, bytes.size() / 2, bytes.size() - 8}) {
        check_refused(bytes.substr(0, keep), "truncated to " + std::to_string(keep) + " bytes");
    }
    // Flipped bytes inside the data sections (past the header and table): caught by the CRCs.
    std::mt19937 random(17);
    for (int trial = 0; trial < 8; ++trial) {
        std::string damaged = bytes;
        const std::size_t at = bytes.size() / 4 + random() % (bytes.size() / 2);
        damaged[at] = static_cast<char>(damaged[at] ^ 0x5A);
        if (damaged == bytes) continue;
        // A flip in the zero padding between sections is harmless; every other byte is checked.
        write_file(bad, damaged);
        const auto result = run_ringroad({"info", bad});
        if (result.exit_code == 0) continue;
        CHECK(result.exit_code == 1);
        CHECK(line_count(result.err) == 1);
        CHECK(result.err.find("checksum mismatch") != std::string::npos);
    }
    check_refused("this is not a region graph, just text\n", "text file");
    const auto missing = run_ringroad({"info", folder + "/missing.rrg"});
    CHECK(missing.exit_code == 1);
    CHECK(missing.err.find("missing.rrg") != std::string::npos);
    std::filesystem::remove_all(folder);
}

TEST_CASE("usage errors exit with code 2") {
    CHECK(run_ringroad({"info"}).exit_code == 2);
    CHECK(run_ringroad({"no-such-command"}).exit_code == 2);
    CHECK(run_ringroad({"--help"}).exit_code == 0);
}
