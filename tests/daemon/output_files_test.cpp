// Where outputs go, run as a program: an output that is also an input is refused (by device and
// inode, through links and other relative paths); `-o ""` is refused before any work; `-o -` is
// standard output for every command; special files are written into, symbolic links keep
// pointing at their (replaced) target; a failed write to standard output fails the command.
// Map data: the invented demo town fixtures/demo/port-ambrell.osm (see fixtures/demo/README.md).
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <fcntl.h>
#include <sys/stat.h>
#include <sys/sysmacros.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <string>

using ringroad::test::file_exists;
using ringroad::test::fixture_path;
using ringroad::test::make_scratch_dir;
using ringroad::test::read_file;
using ringroad::test::run_ringroad;
using ringroad::test::write_file;

namespace {

struct Town {
    std::string folder;
    std::string region;
    std::string stops;
};

const Town& town() {
    static const Town result = [] {
        Town made;
        made.folder = make_scratch_dir("output-files");
        made.region = made.folder + "/town.rrg";
        made.stops = made.folder + "/stops.csv";
        const auto built = run_ringroad({"build", fixture_path("demo/port-ambrell.osm"), "-o", made.region, "--quiet",
                                         "--no-hierarchy"});
        REQUIRE(built.exit_code == 0);
        write_file(made.stops, read_file(fixture_path("demo/stops.csv")));
        return made;
    }();
    return result;
}

bool one_line(const std::string& text) { return !text.empty() && text.find('\n') == text.size() - 1; }

// A small bare matrix for tour and network.
std::string matrix_file(const std::string& folder) {
    const std::string path = folder + "/matrix.csv";
    write_file(path, "id,a,b,c\na,0,1,2\nb,1,0,1\nc,2,1,0\n");
    return path;
}

void check_refused_usage(const ringroad::test::CommandResult& result, const std::string& mention) {
    CHECK(result.exit_code == 2);
    CHECK(one_line(result.err));
    CHECK_THAT(result.err, Catch::Contains(mention));
}

// Runs `ringroad` through /bin/sh so that stdout can be redirected or closed.
int run_with_shell(const std::string& command) {
    const int status = std::system(command.c_str());
    return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

} // namespace

TEST_CASE("An output that is the same file as an input is refused and the input kept", "[output]") {
    const std::string folder = make_scratch_dir("same-file");
    const std::string extract = folder + "/town.osm";
    write_file(extract, read_file(fixture_path("demo/port-ambrell.osm")));
    const std::string original = read_file(extract);

    SECTION("build INPUT -o INPUT, also through another relative path and a symbolic link") {
        check_refused_usage(run_ringroad({"build", extract, "-o", extract}), "same file");
        check_refused_usage(run_ringroad({"build", extract, "-o", folder + "/./../" +
                                                              std::filesystem::path(folder).filename().string() +
                                                              "/town.osm"}),
                            "same file");
        std::filesystem::create_symlink(extract, folder + "/link.osm");
        check_refused_usage(run_ringroad({"build", extract, "-o", folder + "/link.osm"}), "same file");
        CHECK(read_file(extract) == original);
    }
    SECTION("matrix REGION -o REGION, and --second-table over the stops") {
        const std::string region = folder + "/region.rrg";
        std::filesystem::copy_file(town().region, region);
        const std::string region_bytes = read_file(region);
        check_refused_usage(run_ringroad({"matrix", region, "--stops", town().stops, "-o", region}), "same file");
        const std::string stops = folder + "/stops.csv";
        std::filesystem::copy_file(town().stops, stops);
        check_refused_usage(run_ringroad({"matrix", region, "--stops", stops, "--second-table", stops}), "same file");
        CHECK(read_file(region) == region_bytes);
        CHECK(read_file(stops) == read_file(town().stops));
    }
    SECTION("tour --matrix M -o M") {
        const std::string matrix = matrix_file(folder);
        const std::string before = read_file(matrix);
        check_refused_usage(run_ringroad({"tour", "--matrix", matrix, "-o", matrix}), "same file");
        CHECK(read_file(matrix) == before);
    }
}

TEST_CASE("An empty output name is refused at once and so are two outputs naming one file", "[output]") {
    const std::string folder = make_scratch_dir("empty-name");
    // The extract does not exist: an empty name must be refused before the build even looks.
    check_refused_usage(run_ringroad({"build", folder + "/absent.osm", "-o", ""}), "empty file name");
    check_refused_usage(run_ringroad({"tour", "--matrix", matrix_file(folder), "-o", ""}), "empty file name");
    check_refused_usage(run_ringroad({"matrix", town().region, "--stops", town().stops, "--second-table", ""}),
                        "empty file name");
    const std::string table = folder + "/table.csv";
    check_refused_usage(run_ringroad({"matrix", town().region, "--stops", town().stops, "-o", table, "--second-table",
                                      folder + "/../" + std::filesystem::path(folder).filename().string() + "/table.csv"}),
                        "give each output its own file");
    check_refused_usage(run_ringroad({"matrix", town().region, "--stops", town().stops, "-o", "-", "--second-table", "-"}),
                        "give each output its own file");
    CHECK_FALSE(file_exists(table));
}

TEST_CASE("A dash is standard output for build and synth and --second-table", "[output]") {
    const std::string folder = make_scratch_dir("dash");
    const auto built = run_ringroad({"build", fixture_path("demo/port-ambrell.osm"), "-o", "-", "--quiet", "--no-hierarchy"});
    REQUIRE(built.exit_code == 0);
    CHECK(built.out.size() == std::filesystem::file_size(town().region));
    CHECK_FALSE(file_exists(folder + "/-"));
    CHECK_FALSE(file_exists("-"));

    const auto synth = run_ringroad({"synth", "--junctions", "500", "-o", "-", "--quiet"});
    REQUIRE(synth.exit_code == 0);
    const std::string synth_file = folder + "/s.osm.pbf";
    REQUIRE(run_ringroad({"synth", "--junctions", "500", "-o", synth_file, "--quiet"}).exit_code == 0);
    CHECK(synth.out == read_file(synth_file));

    const std::string primary = folder + "/seconds.csv";
    const auto matrix = run_ringroad({"matrix", town().region, "--stops", town().stops, "-o", primary, "--second-table", "-"});
    REQUIRE(matrix.exit_code == 0);
    CHECK(matrix.out.rfind("id,depot,", 0) == 0);
    CHECK(file_exists(primary));
    CHECK(matrix.out != read_file(primary));   // metres on stdout, seconds in the file
}

TEST_CASE("synth refuses a name build would read as another format", "[output]") {
    const std::string folder = make_scratch_dir("synth-name");
    const auto result = run_ringroad({"synth", "--junctions", "500", "-o", folder + "/s.osm"});
    check_refused_usage(result, ".pbf");
    CHECK_FALSE(file_exists(folder + "/s.osm"));
}

TEST_CASE("Special files are written into and symbolic links keep pointing at the replaced target", "[output]") {
    const std::string folder = make_scratch_dir("special");
    const std::string matrix = matrix_file(folder);
    SECTION("a null device stays a device") {
        // A copy of the null device (Linux: 1,3) in the scratch folder, never the system's own:
        // a regression would replace the node with a file, under root too.
        const std::string device = folder + "/null";
        const int made = ::mknod(device.c_str(), S_IFCHR | 0666, makedev(1, 3));
        const int descriptor = made == 0 ? ::open(device.c_str(), O_WRONLY) : -1;
        if (descriptor >= 0) ::close(descriptor);
        if (descriptor < 0) {
            WARN("cannot make a device node here (not root, or a nodev file system): skipped");
            return;
        }
        const auto result = run_ringroad({"tour", "--matrix", matrix, "-o", device});
        CHECK(result.exit_code == 0);
        struct stat status {};
        REQUIRE(::stat(device.c_str(), &status) == 0);
        CHECK(S_ISCHR(status.st_mode));
    }
    SECTION("a FIFO receives the output and stays a FIFO") {
        const std::string fifo = folder + "/pipe";
        REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
        const std::string copy = folder + "/copy.json";
        // A reader in the background: cat holds the FIFO open until the writer closes it. Bounded:
        // should the FIFO be replaced by a file, nobody would ever open it for writing.
        const int reader = run_with_shell("(timeout 20 cat '" + fifo + "' > '" + copy + "') & " + RINGROAD_BINARY +
                                          " tour --matrix '" + matrix + "' -o '" + fifo + "'; wait");
        CHECK(reader == 0);
        struct stat status {};
        REQUIRE(::lstat(fifo.c_str(), &status) == 0);
        CHECK(S_ISFIFO(status.st_mode));
        CHECK_THAT(read_file(copy), Catch::Contains("\"order\""));
    }
    SECTION("a symbolic link") {
        const std::string target = folder + "/target.json";
        write_file(target, "old");
        const std::string link = folder + "/link.json";
        std::filesystem::create_symlink("target.json", link);
        REQUIRE(run_ringroad({"tour", "--matrix", matrix, "-o", link}).exit_code == 0);
        CHECK(std::filesystem::is_symlink(link));
        CHECK_THAT(read_file(target), Catch::Contains("\"order\""));
    }
    SECTION("modes: a new file gets what the umask allows, a replaced file keeps its mode") {
        const std::string fresh = folder + "/fresh.json";
        const std::string kept = folder + "/kept.json";
        write_file(kept, "old");
        ::chmod(kept.c_str(), 0640);
        const mode_t previous = ::umask(022);
        REQUIRE(run_ringroad({"tour", "--matrix", matrix, "-o", fresh}).exit_code == 0);
        REQUIRE(run_ringroad({"tour", "--matrix", matrix, "-o", kept}).exit_code == 0);
        ::umask(previous);
        struct stat status {};
        REQUIRE(::stat(fresh.c_str(), &status) == 0);
        CHECK((status.st_mode & 0777) == 0644);
        REQUIRE(::stat(kept.c_str(), &status) == 0);
        CHECK((status.st_mode & 0777) == 0640);
    }
}

TEST_CASE("A failed write to standard output fails the command with one line", "[output]") {
    const std::string folder = make_scratch_dir("stdout");
    const std::string binary = RINGROAD_BINARY;
    const std::string err = folder + "/err";
    const std::string matrix = matrix_file(folder);
    for (const std::string& arguments :
         {"info '" + town().region + "'", "matrix '" + town().region + "' --stops '" + town().stops + "'",
          "tour --matrix '" + matrix + "'",
          "route '" + town().region + "' --from -47.349892,-125.398009 --to -47.345324,-125.390682"}) {
        CAPTURE(arguments);
        for (const std::string& redirect : {std::string("> /dev/full"), std::string(">&-")}) {
            CAPTURE(redirect);
            CHECK(run_with_shell(binary + " " + arguments + " " + redirect + " 2> '" + err + "'") == 1);
            const std::string message = read_file(err);
            CHECK_THAT(message, Catch::Contains("cannot write to standard output"));
            CHECK(message.find("cannot write") == message.rfind("cannot write"));
        }
    }
}
