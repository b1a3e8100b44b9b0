// The PBF file the generator writes, read back with libosmium's own reader (osmium::io::Reader):
// it must hold exactly what the plan says, in the PBF order (nodes by id, then ways, then
// relations), with the tags our extractor reads (extract/PROFILES.md), in open ocean.

#include "synth/street_names.hpp"
#include "tests/synth/synth_test_support.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>
#include <set>

using namespace ringroad;
using namespace ringroad::test;

TEST_CASE("the file holds the planned nodes, ways and restrictions in PBF order") {
    const WrittenRegion region = write_region(6000, 7, "synth-file");
    const ReadBack content = read_back(region.path);
    const synth::RegionPlan& plan = region.plan;

    CHECK(content.generator == synth::kGeneratorName);
    CHECK_FALSE(content.has_metadata);   // no versions or timestamps: the bytes depend on the plan only
    REQUIRE(content.node_ids.size() == plan.nodes.size());
    REQUIRE(content.ways.size() == plan.ways.size());
    REQUIRE(content.relations.size() == plan.restrictions.size());
    CHECK(plan.restrictions.size() > 0);
    // Nodes, then ways, then relations; each kind by ascending id (the PBF convention libosmium's
    // "Sort.Type_then_ID" feature names).
    CHECK(std::is_sorted(content.order.begin(), content.order.end(),
                         [](char a, char b) { return std::string_view{"nwr"}.find(a) < std::string_view{"nwr"}.find(b); }));
    CHECK(std::is_sorted(content.node_ids.begin(), content.node_ids.end()));
    CHECK(std::adjacent_find(content.node_ids.begin(), content.node_ids.end()) == content.node_ids.end());
    CHECK(std::is_sorted(content.ways.begin(), content.ways.end(), [](const auto& a, const auto& b) { return a.id < b.id; }));

    // Every way as planned: node references and tags.
    std::size_t mismatches = 0;
    for (std::size_t index = 0; index < plan.ways.size(); ++index) {
        const synth::PlannedWay& planned = plan.ways[index];
        const ReadWay& read = content.ways[index];
        std::vector<std::int64_t> expected;
        for (std::uint32_t i = 0; i < planned.node_count; ++i) expected.push_back(plan.way_nodes[planned.first_ref + i] + 1);
        std::vector<std::pair<std::string, std::string>> expected_tags;
        for (const auto& tag : synth::way_tags(planned, plan.seed)) expected_tags.emplace_back(tag.key, tag.value);
        mismatches += read.nodes != expected || read.tags != expected_tags;
    }
    CHECK(mismatches == 0);
    // Every referenced node exists in the file.
    std::size_t dangling = 0;
    for (const ReadWay& way : content.ways) {
        for (std::int64_t ref : way.nodes) dangling += !std::binary_search(content.node_ids.begin(), content.node_ids.end(), ref);
    }
    CHECK(dangling == 0);
    CHECK(content.barriers.size() == plan.barriers.size());

    // Turn restrictions: from way, via node, to way; the via node lies on both ways.
    for (const ReadRelation& relation : content.relations) {
        REQUIRE(relation.members.size() == 3);
        CHECK(relation.members[0].first == "from");
        CHECK(relation.members[1].first == "via");
        CHECK(relation.members[2].first == "to");
        const std::int64_t via = relation.members[1].second;
        for (int member : {0, 2}) {
            const ReadWay& way = content.ways[static_cast<std::size_t>(relation.members[member].second - 1)];
            CHECK((way.nodes.front() == via || way.nodes.back() == via));
        }
    }
    std::filesystem::remove_all(std::filesystem::path(region.path).parent_path());
}

TEST_CASE("the region lies in open ocean near 47 S 128 W and grows with the request") {
    const WrittenRegion small = write_region(2000, 1, "synth-small");
    const WrittenRegion large = write_region(30000, 1, "synth-large");
    for (const WrittenRegion* region : {&small, &large}) {
        const ReadBack content = read_back(region->path);
        // A box of 4 x 6 degrees around the centre is open South Pacific (from memory: the
        // nearest land, the Pitcairn Islands, lies near 25 S 130 W; the demo town's fixture is
        // elsewhere, see fixtures/demo).
        for (const osmium::Location& location : content.locations) {
            REQUIRE(location.valid());
            REQUIRE(location.lat() > -49.0);
            REQUIRE(location.lat() < -45.0);
            REQUIRE(location.lon() > -131.0);
            REQUIRE(location.lon() < -125.0);
        }
    }
    // 15 times the junctions: about sqrt(15) ~ 3.9 times the width.
    const double ratio = large.plan.figures.width_m / small.plan.figures.width_m;
    CHECK(ratio > 3.0);
    CHECK(ratio < 5.0);
    std::filesystem::remove_all(std::filesystem::path(small.path).parent_path());
    std::filesystem::remove_all(std::filesystem::path(large.path).parent_path());
}

TEST_CASE("the tags are those the extractor reads, for every road class") {
    const WrittenRegion region = write_region(20000, 3, "synth-tags");
    const ReadBack content = read_back(region.path);
    std::set<std::string> highways, restrictions, barriers;
    std::size_t oneway_yes = 0, oneway_reverse = 0, roundabouts = 0, private_roads = 0, speed_limits = 0, named = 0;
    for (const ReadWay& way : content.ways) {
        highways.insert(way.tag("highway"));
        oneway_yes += way.tag("oneway") == "yes";
        oneway_reverse += way.tag("oneway") == "-1";
        roundabouts += way.tag("junction") == "roundabout";
        private_roads += way.tag("access") == "private";
        speed_limits += !way.tag("maxspeed").empty();
        named += !way.tag("name").empty();
    }
    for (const ReadRelation& relation : content.relations) restrictions.insert(relation.restriction);
    for (const auto& barrier : content.barriers) barriers.insert(barrier.second);
    // highway=* values of the car table in extract/PROFILES.md.
    CHECK(highways == std::set<std::string>{"motorway", "motorway_link", "primary", "secondary", "tertiary", "residential", "service"});
    CHECK(restrictions == std::set<std::string>{"no_left_turn", "no_right_turn", "no_u_turn", "only_straight_on"});
    CHECK(barriers == std::set<std::string>{"bollard", "gate"});
    CHECK(oneway_yes > 0);
    CHECK(oneway_reverse > 0);
    CHECK(roundabouts > 0);
    CHECK(private_roads > 0);
    CHECK(speed_limits > content.ways.size() / 10);
    CHECK(named > content.ways.size() / 2);
    std::filesystem::remove_all(std::filesystem::path(region.path).parent_path());
}

TEST_CASE("motorways meet other roads only at interchanges, through their ramps") {
    const WrittenRegion region = write_region(30000, 2, "synth-motorway");
    const ReadBack content = read_back(region.path);
    std::set<std::int64_t> motorway_nodes, link_nodes, street_nodes;
    for (const ReadWay& way : content.ways) {
        const std::string highway = way.tag("highway");
        auto& target = highway == "motorway" ? motorway_nodes : highway == "motorway_link" ? link_nodes : street_nodes;
        target.insert(way.nodes.begin(), way.nodes.end());
        if (highway == "motorway") CHECK(way.tag("bridge") == "yes");
    }
    REQUIRE_FALSE(motorway_nodes.empty());
    std::size_t shared_with_streets = 0, ramps_to_streets = 0;
    for (std::int64_t node : motorway_nodes) shared_with_streets += street_nodes.count(node);
    for (std::int64_t node : link_nodes) ramps_to_streets += street_nodes.count(node);
    CHECK(shared_with_streets == 0);
    // A diamond interchange: two ramp terminals on the arterial, each shared by two ramps.
    CHECK(ramps_to_streets == 2 * region.plan.figures.interchanges);
    std::filesystem::remove_all(std::filesystem::path(region.path).parent_path());
}

TEST_CASE("invented names are stable words with fitting suffixes") {
    CHECK(synth::invented_word(42) == synth::invented_word(42));
    CHECK(synth::invented_road_name(synth::RoadKind::cul_de_sac, 5, 1).find_first_of(' ') != std::string::npos);
    CHECK(synth::invented_road_name(synth::RoadKind::roundabout, 5, 1).empty());
    const std::string motorway = synth::invented_road_name(synth::RoadKind::motorway, 2, 1);
    CHECK(motorway.size() > std::string{" Motorway"}.size());
    CHECK(motorway.substr(motorway.size() - 8) == "Motorway");
}
