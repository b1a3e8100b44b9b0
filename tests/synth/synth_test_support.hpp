#pragma once
// Helpers for the generator's tests: plan and write a region into a scratch folder, and read a
// PBF file back with libosmium's own reader (the outside reference for what the file holds).

#include "synth/pbf_region_writer.hpp"
#include "synth/region_calibration.hpp"
#include "tests/support/run_command.hpp"

#include <osmium/handler.hpp>
#include <osmium/io/pbf_input.hpp>
#include <osmium/io/reader.hpp>
#include <osmium/visitor.hpp>

#include <cstdint>
#include <string>
#include <vector>

namespace ringroad::test {

struct WrittenRegion {
    synth::RegionPlan plan;
    std::string path;
};

inline WrittenRegion write_region(std::uint64_t junctions, std::uint64_t seed, const std::string& label) {
    WrittenRegion region{synth::plan_region(junctions, seed, nullptr), make_scratch_dir(label) + "/region.osm.pbf"};
    synth::write_region_pbf(region.plan, region.path, nullptr);
    return region;
}

struct ReadWay {
    std::int64_t id;
    std::vector<std::int64_t> nodes;
    std::vector<std::pair<std::string, std::string>> tags;
    std::string tag(const char* key) const {
        for (const auto& [k, v] : tags) if (k == key) return v;
        return {};
    }
};

struct ReadRelation {
    std::int64_t id;
    std::vector<std::pair<std::string, std::int64_t>> members;   // role, ref
    std::string restriction;
};

// Everything in the file, in file order, as libosmium's reader sees it.
struct ReadBack : osmium::handler::Handler {
    std::string generator;
    std::vector<char> order;                       // 'n', 'w', 'r' per object
    std::vector<std::int64_t> node_ids;
    std::vector<osmium::Location> locations;
    std::vector<std::pair<std::int64_t, std::string>> barriers;
    std::vector<ReadWay> ways;
    std::vector<ReadRelation> relations;
    bool has_metadata = false;

    void node(const osmium::Node& node) {
        order.push_back('n');
        node_ids.push_back(node.id());
        locations.push_back(node.location());
        if (const char* barrier = node.tags().get_value_by_key("barrier")) barriers.emplace_back(node.id(), barrier);
        has_metadata |= node.version() != 0 || node.timestamp().valid();
    }
    void way(const osmium::Way& way) {
        order.push_back('w');
        ReadWay read{way.id(), {}, {}};
        for (const auto& ref : way.nodes()) read.nodes.push_back(ref.ref());
        for (const auto& tag : way.tags()) read.tags.emplace_back(tag.key(), tag.value());
        ways.push_back(std::move(read));
    }
    void relation(const osmium::Relation& relation) {
        order.push_back('r');
        ReadRelation read{relation.id(), {}, relation.tags().get_value_by_key("restriction", "")};
        for (const auto& member : relation.members()) read.members.emplace_back(member.role(), member.ref());
        relations.push_back(std::move(read));
    }
};

inline ReadBack read_back(const std::string& path) {
    ReadBack content;
    osmium::io::Reader reader{path};
    content.generator = reader.header().get("generator");
    osmium::apply(reader, content);
    reader.close();
    return content;
}

} // namespace ringroad::test
