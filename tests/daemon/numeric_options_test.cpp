// Every numeric option refuses NaN, infinities, signs on counts and out-of-range values with one
// line and exit 2 (usage), before any work. Run as a program on a small bare matrix and the
// invented demo town fixtures/demo/port-ambrell.osm.
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <string>
#include <vector>

using ringroad::test::fixture_path;
using ringroad::test::make_scratch_dir;
using ringroad::test::run_ringroad;
using ringroad::test::write_file;

namespace {

bool one_line(const std::string& text) { return !text.empty() && text.find('\n') == text.size() - 1; }

struct Inputs {
    std::string matrix;
    std::string region;
    std::string stops;
};

const Inputs& inputs() {
    static const Inputs made = [] {
        Inputs result;
        const std::string folder = make_scratch_dir("numeric-options");
        result.matrix = folder + "/matrix.csv";
        write_file(result.matrix, "id,a,b,c\na,0,1,2\nb,1,0,1\nc,2,1,0\n");
        result.region = folder + "/town.rrg";
        REQUIRE(run_ringroad({"build", fixture_path("demo/port-ambrell.osm"), "-o", result.region, "--quiet",
                              "--no-hierarchy"})
                    .exit_code == 0);
        result.stops = fixture_path("demo/stops.csv");
        return result;
    }();
    return made;
}

void check_usage_error(std::vector<std::string> arguments, const std::string& option) {
    CAPTURE(arguments);
    const auto result = run_ringroad(arguments);
    CHECK(result.exit_code == 2);
    CHECK(one_line(result.err));
    CHECK_THAT(result.err, Catch::Contains(option));
    CHECK(result.err.size() < 200);   // no 309-digit limits
    CHECK(result.out.empty());
}

} // namespace

TEST_CASE("Numeric options refuse NaN, infinities and out-of-range values with one line, exit 2", "[options]") {
    const Inputs& in = inputs();
    for (const std::string value : {"nan", "NaN", "inf", "-inf", "infinity", "1e20", "-1", "1e400", "0x10", "abc", ""}) {
        check_usage_error({"tour", "--matrix", in.matrix, "--time-limit", value}, "--time-limit");
    }
    for (const std::string value : {"nan", "inf", "0", "-5", "1e9", "abc"}) {
        for (const std::string command : {"matrix", "tour", "network"}) {
            check_usage_error({command, in.region, "--stops", in.stops, "--snap-radius", value}, "--snap-radius");
        }
        check_usage_error({"route", in.region, "--from", "-47.349892,-125.398009", "--to", "-47.345324,-125.390682",
                           "--snap-radius", value},
                          "--snap-radius");
    }
    for (const std::string value : {"-1", "18446744073709551616", "1.5", "1e3", "+3", "nan"}) {
        check_usage_error({"tour", "--matrix", in.matrix, "--seed", value}, "--seed");
        check_usage_error({"synth", "--junctions", "500", "--seed", value, "-o", "/tmp/unused.osm.pbf"}, "--seed");
    }
    for (const std::string value : {"21", "-1", "nan"}) {
        check_usage_error({"tour", "--matrix", in.matrix, "--exact-limit", value}, "--exact-limit");
    }
    for (const std::string value : {"-1", "100000", "nan"}) {
        check_usage_error({"matrix", in.region, "--stops", in.stops, "--threads", value}, "--threads");
    }
}

TEST_CASE("Numeric options accept ordinary values at the ends of their ranges", "[options]") {
    const Inputs& in = inputs();
    CHECK(run_ringroad({"tour", "--matrix", in.matrix, "--time-limit", "0", "--seed", "18446744073709551615"}).exit_code == 0);
    CHECK(run_ringroad({"tour", "--matrix", in.matrix, "--time-limit", "0.5", "--exact-limit", "0"}).exit_code == 0);
    CHECK(run_ringroad({"matrix", in.region, "--stops", in.stops, "--snap-radius", "100000", "--threads", "1"}).exit_code == 0);
}
