// Input formats: OSM XML plain, gzip- and bzip2-compressed, and PBF give the same graph. The
// compressed and PBF copies of fixtures/extract/restrictions.osm are written here by libosmium's
// own writers, so the reference is libosmium's reading of the same data.

#include "tests/extract/extract_test_support.hpp"

#include <osmium/io/bzip2_compression.hpp>
#include <osmium/io/gzip_compression.hpp>
#include <osmium/io/pbf_output.hpp>
#include <osmium/io/xml_input.hpp>
#include <osmium/io/xml_output.hpp>

#include <catch2/catch.hpp>

#include <filesystem>

using namespace ringroad;
using namespace ringroad::test;

namespace {

void convert(const std::string& from, const std::string& to) {
    osmium::io::Reader reader{from};
    osmium::io::Writer writer{to, reader.header(), osmium::io::overwrite::allow};
    while (osmium::memory::Buffer buffer = reader.read()) writer(std::move(buffer));
    writer.close();
    reader.close();
}

void check_same_graph(const graph::RoadGraph& expected, const graph::RoadGraph& actual) {
    REQUIRE(actual.segment_count() == expected.segment_count());
    REQUIRE(actual.edge_count() == expected.edge_count());
    CHECK(actual.vertex_count() == expected.vertex_count());
    CHECK(actual.turn_restrictions().size() == expected.turn_restrictions().size());
    for (std::uint32_t e = 0; e < expected.edge_count(); ++e) {
        CHECK(actual.edges()[e].time_ds == expected.edges()[e].time_ds);
        CHECK(actual.edges()[e].length_dm == expected.edges()[e].length_dm);
        CHECK(actual.edges()[e].head == expected.edges()[e].head);
    }
}

} // namespace

TEST_CASE(".osm, .osm.gz, .osm.bz2 and .osm.pbf inputs give the same graph") {
    const std::string source = fixture_path("extract/restrictions.osm");
    const std::string folder = make_scratch_dir("formats");
    const auto expected = build_fixture("extract/restrictions.osm", "car");
    for (const char* name : {"town.osm.gz", "town.osm.bz2", "town.osm.pbf"}) {
        INFO(name);
        const std::string path = folder + "/" + name;
        convert(source, path);
        const auto actual = extract::extract_and_build_road_graph({path, *extract::profile_from_name("car")}, nullptr);
        check_same_graph(expected, actual);
        CHECK(actual.metadata_value("source") == name);
    }
    std::filesystem::remove_all(folder);
}
