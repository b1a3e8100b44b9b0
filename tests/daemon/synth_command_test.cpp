// `ringroad synth` from the outside: the real binary writes a PBF file that `ringroad build`
// accepts, with a one-paragraph summary; bad arguments and unusable output paths give one line on
// stderr, the documented exit code, and leave no file and no temporary file behind.

#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <filesystem>
#include <string>
#include <vector>

using namespace ringroad::test;

namespace {

std::size_t line_count(const std::string& text) { return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n')); }

std::vector<std::string> folder_entries(const std::string& folder) {
    std::vector<std::string> names;
    for (const auto& entry : std::filesystem::directory_iterator(folder)) names.push_back(entry.path().filename());
    std::sort(names.begin(), names.end());
    return names;
}

void check_refused(const std::vector<std::string>& arguments, int exit_code, const std::string& must_mention,
                   const std::string& folder) {
    INFO("arguments ending " << arguments.back());
    const auto result = run_ringroad(arguments);
    CHECK(result.exit_code == exit_code);
    CHECK(line_count(result.err) == 1);
    CHECK(result.err.find(must_mention) != std::string::npos);
    CHECK(result.out.empty());
    CHECK(folder_entries(folder).empty());
}

} // namespace

TEST_CASE("synth writes a region that build accepts, with a one-paragraph summary") {
    const std::string folder = make_scratch_dir("synth-cli");
    const std::string output = folder + "/invented.osm.pbf";
    const auto result = run_ringroad({"synth", "--junctions", "3000", "--seed", "5", "-o", output});
    REQUIRE(result.exit_code == 0);
    CHECK(result.out.empty());
    CHECK(line_count(result.err) == 1);               // the summary; no progress in a pipe
    CHECK(result.err.find('\r') == std::string::npos);
    for (const char* word : {"junctions", "nodes", "ways", "turn restrictions", "MiB", "km", "lat", "lon"}) {
        CHECK(result.err.find(word) != std::string::npos);
    }
    CHECK(folder_entries(folder) == std::vector<std::string>{"invented.osm.pbf"});

    const std::string graph = folder + "/invented.rrg";
    REQUIRE(run_ringroad({"build", output, "-o", graph, "--no-hierarchy", "--quiet"}).exit_code == 0);
    const auto info = run_ringroad({"info", graph, "--json"});
    REQUIRE(info.exit_code == 0);
    const auto json = nlohmann::json::parse(info.out);
    INFO(info.out);
    const double junctions = json.at("junctions").get<double>();
    CHECK(std::abs(junctions - 3000) <= 150);   // the requested count within 5 %

    // --quiet: nothing on stderr; the same request gives the same bytes.
    const std::string again = folder + "/again.osm.pbf";
    const auto quiet = run_ringroad({"synth", "--junctions", "3000", "--seed", "5", "-o", again, "--quiet"});
    REQUIRE(quiet.exit_code == 0);
    CHECK(quiet.err.empty());
    CHECK(read_file(again) == read_file(output));
    std::filesystem::remove_all(folder);
}

TEST_CASE("synth: junctions out of range or not a number") {
    const std::string folder = make_scratch_dir("synth-cli-bad");
    const std::string output = folder + "/region.osm.pbf";
    check_refused({"synth", "--junctions", "99", "-o", output}, 1, "--junctions: 99 is outside the allowed range 100 .. 20000000", folder);
    check_refused({"synth", "--junctions", "20000001", "-o", output}, 1, "allowed range 100 .. 20000000", folder);
    check_refused({"synth", "--junctions", "0", "-o", output}, 1, "--junctions", folder);
    check_refused({"synth", "--junctions", "99999999999999999999999", "-o", output}, 1, "allowed range", folder);
    check_refused({"synth", "--junctions", "lots", "-o", output}, 1, "--junctions: 'lots' is not a whole number", folder);
    check_refused({"synth", "--junctions", "-5", "-o", output}, 1, "--junctions", folder);
    check_refused({"synth", "--junctions", "1e6", "-o", output}, 1, "--junctions", folder);
    // Missing required options and a non-numeric seed are usage errors of the parser (exit 2).
    const auto missing = run_ringroad({"synth", "-o", output});
    CHECK(missing.exit_code == 2);
    CHECK(missing.err.find("--junctions") != std::string::npos);
    const auto seed = run_ringroad({"synth", "--junctions", "500", "--seed", "abc", "-o", output});
    CHECK(seed.exit_code == 2);
    CHECK(seed.err.find("--seed") != std::string::npos);
    CHECK(folder_entries(folder).empty());
    std::filesystem::remove_all(folder);
}

TEST_CASE("synth: an output folder that does not exist or cannot be written") {
    const std::string folder = make_scratch_dir("synth-cli-outdir");
    const std::string missing = folder + "/no-such-folder/region.osm.pbf";
    check_refused({"synth", "--junctions", "500", "-o", missing}, 1, missing + ": output folder", folder);
    check_refused({"synth", "--junctions", "500", "-o", folder}, 1, "is a folder", folder);

    // /proc accepts no new files, even from root (who ignores permission bits).
    const auto result = run_ringroad({"synth", "--junctions", "500", "-o", "/proc/ringroad-region.osm.pbf"});
    CHECK(result.exit_code == 1);
    CHECK(line_count(result.err) == 1);
    CHECK(result.err.find("/proc/ringroad-region.osm.pbf") != std::string::npos);
    CHECK_FALSE(file_exists("/proc/ringroad-region.osm.pbf"));
    std::filesystem::remove_all(folder);
}
