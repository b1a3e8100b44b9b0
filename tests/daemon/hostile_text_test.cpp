// Hostile text in inputs, run as a program: bytes that are not UTF-8 in stops are input errors
// naming file, line and column (not "internal error"); control characters, NUL and markup in ids
// still give GPX that an XML parser (expat, the reference outside the project) accepts; and no
// error message echoes raw control characters to the terminal. Map data: the invented demo town
// fixtures/demo/port-ambrell.osm.
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>
#include <expat.h>
#include <nlohmann/json.hpp>

#include <string>
#include <vector>

using ringroad::test::fixture_path;
using ringroad::test::make_scratch_dir;
using ringroad::test::run_ringroad;
using ringroad::test::write_file;

namespace {

const std::string& region() {
    static const std::string path = [] {
        const std::string made = make_scratch_dir("hostile-text") + "/town.rrg";
        REQUIRE(run_ringroad({"build", fixture_path("demo/port-ambrell.osm"), "-o", made, "--quiet", "--no-hierarchy"})
                    .exit_code == 0);
        return made;
    }();
    return path;
}

// Demo-town stops (fixtures/demo/stops.csv) with the given ids.
std::string stops_file(const std::vector<std::string>& ids, const std::string& name_of_first = "Harbour depot") {
    static const char* positions[] = {"-47.349892,-125.398009", "-47.346744,-125.394027", "-47.345324,-125.390682",
                                      "-47.343597,-125.386063"};
    std::string text = "id,lat,lon,name\n";
    for (std::size_t i = 0; i < ids.size(); ++i) {
        std::string id = ids[i];
        std::string quoted = "\"";
        for (const char c : id) quoted += c == '"' ? std::string("\"\"") : std::string(1, c);
        quoted += "\"";
        text += quoted + "," + positions[i] + "," + (i == 0 ? name_of_first : std::string("stop")) + "\n";
    }
    const std::string path = make_scratch_dir("hostile-stops") + "/stops.csv";
    write_file(path, text);
    return path;
}

bool has_control_characters(const std::string& text) {
    for (std::size_t i = 0; i < text.size(); ++i) {
        const auto c = static_cast<unsigned char>(text[i]);
        if ((c < 0x20 && !(c == '\n' && i + 1 == text.size())) || c == 0x7F) return true;
    }
    return false;
}

bool well_formed_xml(const std::string& text, std::string& problem) {
    XML_Parser parser = XML_ParserCreate(nullptr);
    const bool ok = XML_Parse(parser, text.data(), static_cast<int>(text.size()), 1) == XML_STATUS_OK;
    if (!ok) {
        problem = std::string(XML_ErrorString(XML_GetErrorCode(parser))) + " at line " +
                  std::to_string(XML_GetCurrentLineNumber(parser));
    }
    XML_ParserFree(parser);
    return ok;
}

} // namespace

TEST_CASE("Stops that are not UTF-8 are input errors naming file, line and column", "[text]") {
    SECTION("in an id") {
        const std::string stops = stops_file({"depot", "s\xC3(1", "s2"});
        const auto result = run_ringroad({"matrix", region(), "--stops", stops, "--format", "json"});
        CHECK(result.exit_code == 1);
        CHECK_THAT(result.err, Catch::Contains(stops + ":3: column 'id': not valid UTF-8"));
        CHECK_FALSE(has_control_characters(result.err));
    }
    SECTION("in a further column") {
        const std::string stops = stops_file({"depot", "s1"}, "Harbour \xFF depot");
        const auto result = run_ringroad({"tour", region(), "--stops", stops});
        CHECK(result.exit_code == 1);
        CHECK_THAT(result.err, Catch::Contains(stops + ":2: column 'name': not valid UTF-8"));
    }
}

TEST_CASE("GPX stays well-formed XML with control characters, NUL and markup in ids", "[text]") {
    const std::vector<std::string> ids{"depot <&\"'>", std::string("s\x01\x1b[2J", 6), std::string("nul\0here", 8),
                                       "tab\tand\rline"};
    const std::string stops = stops_file(ids);
    const auto result = run_ringroad({"tour", region(), "--stops", stops, "--format", "gpx"});
    REQUIRE(result.exit_code == 0);
    std::string problem;
    CHECK(well_formed_xml(result.out, problem));
    CAPTURE(problem);
    CHECK_THAT(result.out, Catch::Contains("depot &lt;&amp;&quot;&apos;&gt;"));
    CHECK(result.out.find('\0') == std::string::npos);
    CHECK(result.out.find('\x1b') == std::string::npos);
}

TEST_CASE("Error messages escape what is not printable", "[text]") {
    // A duplicate id that clears the screen when echoed raw.
    const std::string clear_screen = "\x1b[2J\x1b[H";
    const std::string stops = stops_file({clear_screen, clear_screen});
    const auto result = run_ringroad({"matrix", region(), "--stops", stops});
    CHECK(result.exit_code == 1);
    CHECK_THAT(result.err, Catch::Contains("duplicate id"));
    CHECK_THAT(result.err, Catch::Contains("\\x1b[2J"));
    CHECK_FALSE(has_control_characters(result.err));
    // A usage error quoting the argument.
    const auto usage = run_ringroad({"tour", "--matrix", stops, "--time-limit", "\x1b[31m"});
    CHECK(usage.exit_code == 2);
    CHECK_FALSE(has_control_characters(usage.err));
}
