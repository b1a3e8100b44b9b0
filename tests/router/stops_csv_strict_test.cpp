// Stop lists are read strictly: what could be misread is refused, naming the real problem, with
// one line naming file, line and column. References: RFC 4180 (CSV), RFC 3629 (UTF-8).
#include "common/input_error.hpp"
#include "router/stops.hpp"

#include <catch2/catch.hpp>

#include <filesystem>

using namespace ringroad;
using namespace ringroad::router;

namespace {

std::string error_of(const std::string& text) {
    try {
        parse_stops_csv(text, "stops.csv");
    } catch (const InputError& error) {
        const std::string message = error.what();
        REQUIRE(message.find('\n') == std::string::npos);
        return message;
    }
    return "(no error)";
}

} // namespace

TEST_CASE("A doubled sign is not a number", "[stops]") {
    REQUIRE_THAT(error_of("id,lat,lon\na,+-47.3,2\n"), Catch::Contains("stops.csv:2: column 'lat': '+-47.3' is not a number"));
}

TEST_CASE("A column named twice in the header is refused", "[stops]") {
    REQUIRE_THAT(error_of("id,lat,lon,lat\na,1,2,3\n"),
                 Catch::Contains("stops.csv:1: column 4: column name 'lat' repeats column 2"));
    REQUIRE_THAT(error_of("id,lat,lon,name,name\na,1,2,x,y\n"), Catch::Contains("column name 'name' repeats column 4"));
}

TEST_CASE("Text after a closing quote is refused, not glued on", "[stops]") {
    REQUIRE_THAT(error_of("id,lat,lon\n\"ab\"cd,1,2\n"), Catch::Contains("stops.csv:2: column 1: text after the closing quote"));
}

TEST_CASE("CR-only line endings are read as lines, not as one header", "[stops]") {
    const StopList list = parse_stops_csv("id,lat,lon\rdepot,1,2\rs1,3,4\r", "stops.csv");
    REQUIRE(list.stops.size() == 2);
    CHECK(list.stops[1].id == "s1");
    CHECK(list.stops[1].line == 3);
}

TEST_CASE("Bytes that are not UTF-8 are refused naming the cell", "[stops]") {
    REQUIRE_THAT(error_of("id,lat,lon\ndepot,1,2\ns\xE9,1,2\n"),
                 Catch::Contains("stops.csv:3: column 'id': not valid UTF-8 (byte 2 of the value)"));
    REQUIRE_THAT(error_of("id,lat,lon,name\ndepot,1,2,Caf\xE9\n"), Catch::Contains("stops.csv:2: column 'name': not valid UTF-8"));
    REQUIRE_THAT(error_of("id,lat,lon,n\xE4me\ndepot,1,2,x\n"), Catch::Contains("stops.csv:1: column 4: not valid UTF-8"));
}

TEST_CASE("A folder given as the stops file is named as a folder", "[stops]") {
    const std::string folder = std::filesystem::temp_directory_path().string();
    REQUIRE_THROWS_WITH(read_stops_csv(folder), Catch::Contains("is a folder"));
}
