// OSM input with impossible values is an input error naming the file and the real problem (not
// an internal error, not "nodes missing"): an id beyond what libosmium reads, a coordinate that is
// "nan" or text, a latitude of 95 (outside WGS84's [-90, 90]). Road names that are not UTF-8
// (possible in PBF, whose strings are unchecked bytes) are repaired with U+FFFD and counted.
// Files are hand-written here at an invented spot in the open Pacific; the PBF is written with
// libosmium's own writer.
#include "common/input_error.hpp"
#include "common/utf8.hpp"
#include "extract/road_extractor.hpp"
#include "tests/support/run_command.hpp"

#include <osmium/builder/attr.hpp>
#include <osmium/io/pbf_output.hpp>
#include <osmium/io/writer.hpp>
#include <osmium/memory/buffer.hpp>

#include <catch2/catch.hpp>

#include <string>

using namespace ringroad;

namespace {

std::string osm_with(const std::string& first_node_attributes) {
    return "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<osm version=\"0.6\" generator=\"hand-written\">\n"
           "  <node " + first_node_attributes + " version=\"1\"/>\n"
           "  <node id=\"2\" lat=\"18.0000\" lon=\"-139.9990\" version=\"1\"/>\n"
           "  <way id=\"1\" version=\"1\"><nd ref=\"1\"/><nd ref=\"2\"/><tag k=\"highway\" v=\"residential\"/></way>\n"
           "</osm>\n";
}

std::string error_of(const std::string& attributes) {
    const std::string path = test::make_scratch_dir("bad-osm") + "/bad.osm";
    test::write_file(path, osm_with(attributes));
    try {
        extract::extract_road_graph({path, *extract::profile_from_name("car")}, nullptr);
    } catch (const InputError& error) {
        const std::string message = error.what();
        CHECK(message.find('\n') == std::string::npos);
        CHECK(message.rfind(path + ": ", 0) == 0);   // names the file first
        return message;
    }
    return "(accepted)";
}

} // namespace

TEST_CASE("Impossible ids and coordinates are input errors naming the file") {
    CHECK_THAT(error_of("id=\"1\" lat=\"95\" lon=\"-140.0\""),
               Catch::Contains("node 1 has coordinates outside the valid range (lat 95, lon -140"));
    CHECK_THAT(error_of("id=\"1\" lat=\"18.0\" lon=\"-200\""), Catch::Contains("outside the valid range"));
    CHECK_THAT(error_of("id=\"1\" lat=\"nan\" lon=\"-140.0\""), Catch::Contains("not valid OSM"));
    CHECK_THAT(error_of("id=\"1\" lat=\"north\" lon=\"-140.0\""), Catch::Contains("not valid OSM"));
    CHECK_THAT(error_of("id=\"99999999999999999999\" lat=\"18.0\" lon=\"-140.0\""), Catch::Contains("not valid OSM"));
}

TEST_CASE("The largest 64-bit id, which libosmium does not read, is an input error") {
    CHECK_THAT(error_of("id=\"9223372036854775807\" lat=\"18.0\" lon=\"-140.0\""),
               Catch::Contains("not valid OSM data (illegal id: '9223372036854775807')"));
}

TEST_CASE("Road names that are not UTF-8 are repaired and counted") {
    using namespace osmium::builder::attr;
    const std::string path = test::make_scratch_dir("bad-name") + "/names.osm.pbf";
    {
        osmium::memory::Buffer buffer{1024, osmium::memory::Buffer::auto_grow::yes};
        osmium::builder::add_node(buffer, _id(1), _version(1), _location(-140.0, 18.0));
        osmium::builder::add_node(buffer, _id(2), _version(1), _location(-139.999, 18.0));
        osmium::builder::add_node(buffer, _id(3), _version(1), _location(-139.998, 18.0));
        osmium::builder::add_way(buffer, _id(1), _version(1), _nodes({1, 2}), _tag("highway", "residential"),
                                 _tag("name", "Caf\xE9 Street"));
        osmium::builder::add_way(buffer, _id(2), _version(1), _nodes({2, 3}), _tag("highway", "residential"),
                                 _tag("name", "Harbour Road"));
        osmium::io::Writer writer{path, osmium::io::overwrite::allow};
        writer(std::move(buffer));
        writer.close();
    }
    const auto data = extract::extract_road_graph({path, *extract::profile_from_name("car")}, nullptr);
    CHECK_FALSE(first_invalid_utf8(data.names).has_value());
    CHECK(data.names.find("Caf\xEF\xBF\xBD Street") != std::string::npos);
    CHECK(data.names.find("Harbour Road") != std::string::npos);
    std::string repaired;
    for (const auto& [key, value] : data.metadata)
        if (key == "names_repaired") repaired = value;
    CHECK(repaired == "1");
}
