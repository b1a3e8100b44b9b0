// The PBF layout guess that lets the extractor decompress each block once
// (extract/pbf_layout.hpp), checked against libosmium reading the pieces it designates, and
// against the object counts published with the extracts (shared data README: andorra.osm.pbf has
// 370,798 nodes, 18,909 ways and 496 relations; monaco.osm.pbf 46,444 / 3,717 / 210).
// A file whose blocks are not nodes-first must still be read correctly (the plain way).

#include "tests/extract/extract_test_support.hpp"

#include "extract/pbf_layout.hpp"

#include <osmium/builder/attr.hpp>
#include <osmium/handler.hpp>
#include <osmium/io/pbf_input.hpp>
#include <osmium/io/pbf_output.hpp>
#include <osmium/io/xml_input.hpp>
#include <osmium/memory/buffer.hpp>
#include <osmium/visitor.hpp>

#include <catch2/catch.hpp>

#include <filesystem>

using namespace ringroad;
using namespace ringroad::test;

namespace {

struct Counter : osmium::handler::Handler {
    std::size_t nodes = 0, ways = 0, relations = 0;
    void node(const osmium::Node&) { ++nodes; }
    void way(const osmium::Way&) { ++ways; }
    void relation(const osmium::Relation&) { ++relations; }
};

Counter count_objects(const std::string& bytes) {
    Counter counter;
    osmium::io::Reader reader{osmium::io::File{bytes.data(), bytes.size(), "pbf"}};
    osmium::apply(reader, counter);
    reader.close();
    return counter;
}

void check_layout(const std::string& file, std::size_t nodes, std::size_t ways, std::size_t relations) {
    const std::string bytes = read_file(fixture_path("osm/" + file));
    const auto layout = extract::find_pbf_layout(bytes.data(), bytes.size());
    REQUIRE(layout);
    CHECK(layout->node_blobs > 0);
    CHECK(layout->other_blobs > 0);
    const std::string header = bytes.substr(0, layout->header_end);
    const Counter node_part = count_objects(bytes.substr(0, layout->first_non_node));
    const Counter other_part = count_objects(header + bytes.substr(layout->first_non_node));
    CHECK(node_part.nodes == nodes);
    CHECK(node_part.ways + node_part.relations == 0);
    CHECK(other_part.nodes == 0);
    CHECK(other_part.ways == ways);
    CHECK(other_part.relations == relations);
}

} // namespace

TEST_CASE("the layout splits the real extracts exactly between node blocks and the rest") {
    check_layout("andorra.osm.pbf", 370798, 18909, 496);
    check_layout("monaco.osm.pbf", 46444, 3717, 210);
}

TEST_CASE("no layout for truncated or foreign bytes") {
    const std::string bytes = read_file(fixture_path("osm/monaco.osm.pbf"));
    for (std::size_t cut : {std::size_t{3}, std::size_t{50}, bytes.size() / 2, bytes.size() - 1}) {
        CHECK_FALSE(extract::find_pbf_layout(bytes.data(), cut));
    }
    const std::string text = "<?xml version='1.0'?><osm></osm>";
    CHECK_FALSE(extract::find_pbf_layout(text.data(), text.size()));
}

TEST_CASE("a PBF with ways before nodes is read correctly (the guess is detected as wrong)") {
    // Rewrite fixtures/extract/junctions.osm as a PBF with its ways and nodes in reverse type
    // order; the graph must equal the one built from the XML file.
    osmium::memory::Buffer nodes{1024 * 1024, osmium::memory::Buffer::auto_grow::yes};
    osmium::memory::Buffer others{1024 * 1024, osmium::memory::Buffer::auto_grow::yes};
    {
        osmium::io::Reader reader{fixture_path("extract/junctions.osm")};
        while (osmium::memory::Buffer buffer = reader.read()) {
            for (const auto& object : buffer.select<osmium::OSMObject>()) {
                (object.type() == osmium::item_type::node ? nodes : others).add_item(object);
                (object.type() == osmium::item_type::node ? nodes : others).commit();
            }
        }
        reader.close();
    }
    const std::string folder = make_scratch_dir("unsorted-pbf");
    const std::string path = folder + "/unsorted.osm.pbf";
    {
        osmium::io::Header header;
        osmium::io::Writer writer{path, header, osmium::io::overwrite::allow};
        writer(std::move(others));   // ways first ...
        writer.flush();
        writer(std::move(nodes));    // ... then the nodes, in a later block
        writer.close();
    }
    const auto from_xml = build_fixture("extract/junctions.osm", "car");
    const auto from_pbf = extract::extract_and_build_road_graph({path, *extract::profile_from_name("car")}, nullptr);
    REQUIRE(from_pbf.segment_count() == from_xml.segment_count());
    CHECK(from_pbf.vertex_count() == from_xml.vertex_count());
    CHECK(from_pbf.edge_count() == from_xml.edge_count());
    for (std::uint32_t s = 0; s < from_xml.segment_count(); ++s) {
        CHECK(from_pbf.segments()[s].length_dm == from_xml.segments()[s].length_dm);
        CHECK(from_pbf.segments()[s].way_id == from_xml.segments()[s].way_id);
    }
    std::filesystem::remove_all(folder);
}
