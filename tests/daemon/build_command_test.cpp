// `ringroad build` from the outside: the real binary on good and bad inputs. Every bad input must
// give exit code 1, a single line on stderr naming the file, and leave no output file and no
// temporary file behind. Inputs: the hand-written fixtures and fixtures/osm/monaco.osm.pbf
// (© OpenStreetMap contributors, ODbL 1.0), truncated and damaged here.

#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <filesystem>
#include <string>
#include <vector>

using namespace ringroad::test;

namespace {

std::size_t line_count(const std::string& text) {
    return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n'));
}

bool folder_is_empty(const std::string& folder) {
    return std::filesystem::is_empty(folder);
}

// Runs a build expected to fail on the input; checks the error contract.
void check_rejected(const std::string& input, const std::string& must_mention, const std::string& output_folder) {
    INFO("input " << input);
    const std::string output = output_folder + "/region.rrg";
    const auto result = run_ringroad({"build", input, "-o", output, "--quiet"});
    CHECK(result.exit_code == 1);
    CHECK(line_count(result.err) == 1);
    CHECK(result.err.find(must_mention) != std::string::npos);
    CHECK(result.out.empty());
    CHECK_FALSE(file_exists(output));
    CHECK(folder_is_empty(output_folder));   // no temporary file left either
}

std::string pbf_bytes() { return read_file(fixture_path("osm/monaco.osm.pbf")); }

} // namespace

TEST_CASE("build writes a region graph and a one-paragraph summary") {
    const std::string folder = make_scratch_dir("build-ok");
    const std::string output = folder + "/monaco.rrg";
    const auto result = run_ringroad({"build", fixture_path("osm/monaco.osm.pbf"), "-o", output});
    REQUIRE(result.exit_code == 0);
    CHECK(file_exists(output));
    CHECK(line_count(result.err) == 1);                 // the summary, no progress in a pipe
    CHECK(result.err.find('\r') == std::string::npos);
    for (const char* word : {"junctions", "edges", "km of road", "components", "turn restrictions", "skipped"}) {
        CHECK(result.err.find(word) != std::string::npos);
    }
    std::vector<std::string> names;
    for (const auto& entry : std::filesystem::directory_iterator(folder)) names.push_back(entry.path().filename());
    CHECK(names == std::vector<std::string>{"monaco.rrg"});   // no temporary or probe file left

    const auto info = run_ringroad({"info", output, "--json"});
    REQUIRE(info.exit_code == 0);
    const auto json = nlohmann::json::parse(info.out);
    CHECK(json.at("profile") == "car");
    CHECK(json.at("source") == "monaco.osm.pbf");
    // Published replication timestamp of the extract (shared data README).
    CHECK(json.at("source_timestamp") == "2019-09-30T20:18:02Z");
    std::filesystem::remove_all(folder);
}

TEST_CASE("build --quiet prints nothing; --profile selects the profile; XML input works") {
    const std::string folder = make_scratch_dir("build-quiet");
    const std::string output = folder + "/town.rrg";
    const auto result = run_ringroad({"build", fixture_path("extract/junctions.osm"), "-o", output, "--profile", "foot", "--quiet"});
    REQUIRE(result.exit_code == 0);
    CHECK(result.err.empty());
    CHECK(result.out.empty());
    const auto info = run_ringroad({"info", output, "--json"});
    REQUIRE(info.exit_code == 0);
    CHECK(nlohmann::json::parse(info.out).at("profile") == "foot");
    std::filesystem::remove_all(folder);
}

TEST_CASE("build: an unknown profile is a usage error") {
    const auto result = run_ringroad({"build", fixture_path("extract/junctions.osm"), "-o", "/tmp/never.rrg", "--profile", "horse"});
    CHECK(result.exit_code == 2);
}

TEST_CASE("build: a missing input file") {
    const std::string folder = make_scratch_dir("build-missing");
    check_rejected(folder + "-nowhere/none.osm.pbf", "none.osm.pbf: no such file", folder);
    std::filesystem::remove_all(folder);
}

TEST_CASE("build: files that are not OSM data") {
    const std::string inputs = make_scratch_dir("build-notosm-in");
    const std::string folder = make_scratch_dir("build-notosm-out");
    write_file(inputs + "/notes.txt", "hello\n");
    check_rejected(inputs + "/notes.txt", "notes.txt: not an OSM file", folder);
    for (const char* name : {"text.osm", "text.osm.pbf", "text.osm.gz", "text.osm.bz2", "empty.osm"}) {
        write_file(inputs + "/" + name, std::string(name) == "empty.osm" ? "" : "hello world\n");
        check_rejected(inputs + "/" + name, name, folder);
    }
    std::filesystem::remove_all(inputs);
    std::filesystem::remove_all(folder);
}

TEST_CASE("build: a PBF truncated at several offsets") {
    const std::string inputs = make_scratch_dir("build-cut-in");
    const std::string folder = make_scratch_dir("build-cut-out");
    const std::string bytes = pbf_bytes();
    // Inside the first blob header, inside the header block, early data, a third, past half, and
    // one byte short of the end: none of these is a blob boundary.
    for (std::size_t offset : {std::size_t{5}, std::size_t{100}, std::size_t{1000}, bytes.size() / 3,
                               bytes.size() / 2 + 7, bytes.size() - 1}) {
        const std::string path = inputs + "/cut-" + std::to_string(offset) + ".osm.pbf";
        write_file(path, bytes.substr(0, offset));
        check_rejected(path, "cut-" + std::to_string(offset) + ".osm.pbf: truncated or corrupt", folder);
    }
    std::filesystem::remove_all(inputs);
    std::filesystem::remove_all(folder);
}

TEST_CASE("build: a PBF with damaged bytes") {
    const std::string inputs = make_scratch_dir("build-flip-in");
    const std::string folder = make_scratch_dir("build-flip-out");
    const std::string bytes = pbf_bytes();
    for (std::size_t offset : {std::size_t{200}, bytes.size() / 2, bytes.size() - 100}) {
        std::string damaged = bytes;
        for (std::size_t i = 0; i < 8; ++i) damaged[offset + i] = static_cast<char>(~damaged[offset + i]);
        const std::string path = inputs + "/flip-" + std::to_string(offset) + ".osm.pbf";
        write_file(path, damaged);
        check_rejected(path, "flip-" + std::to_string(offset) + ".osm.pbf: ", folder);
        check_rejected(path, "corrupt", folder);
    }
    std::filesystem::remove_all(inputs);
    std::filesystem::remove_all(folder);
}

TEST_CASE("build: an extract without roads") {
    const std::string folder = make_scratch_dir("build-noroads");
    check_rejected(fixture_path("extract/no_roads.osm"), "no_roads.osm: no roads for the car profile", folder);
    std::filesystem::remove_all(folder);
}

TEST_CASE("build: an output folder that does not exist or cannot be written") {
    const std::string input = fixture_path("extract/junctions.osm");
    const std::string folder = make_scratch_dir("build-outdir");

    const std::string missing = folder + "/no-such-folder/region.rrg";
    auto result = run_ringroad({"build", input, "-o", missing, "--quiet"});
    CHECK(result.exit_code == 1);
    CHECK(line_count(result.err) == 1);
    CHECK(result.err.find(missing) != std::string::npos);
    CHECK(result.err.find("does not exist") != std::string::npos);
    CHECK(folder_is_empty(folder));

    // /proc accepts no new files, even from root (who ignores permission bits).
    result = run_ringroad({"build", input, "-o", "/proc/ringroad-region.rrg", "--quiet"});
    CHECK(result.exit_code == 1);
    CHECK(line_count(result.err) == 1);
    CHECK(result.err.find("/proc/ringroad-region.rrg") != std::string::npos);
    CHECK_FALSE(file_exists("/proc/ringroad-region.rrg"));

    if (::geteuid() != 0) {   // permission bits only bind other users
        const std::string locked = folder + "/locked";
        std::filesystem::create_directory(locked);
        ::chmod(locked.c_str(), 0555);
        result = run_ringroad({"build", input, "-o", locked + "/region.rrg", "--quiet"});
        CHECK(result.exit_code == 1);
        CHECK(result.err.find("not writable") != std::string::npos);
        CHECK(folder_is_empty(locked));
        ::chmod(locked.c_str(), 0755);
    }
    std::filesystem::remove_all(folder);
}
