// The two real extracts in fixtures/osm (© OpenStreetMap contributors, ODbL 1.0): monaco.osm.pbf
// and andorra.osm.pbf, built for all three profiles.
//
//  * Total road length: the graph's segment lengths add up to the haversine lengths of the
//    selected ways computed here independently with libosmium (its NodeLocationsForWays index and
//    osmium::geom::haversine::distance). libosmium uses an Earth radius of 6 372 797.560856 m,
//    0.028 % more than the WGS84 mean radius 6 371 008.8 m the project uses, so the raw totals
//    agree within 0.1 %, and rescaled to the same radius they differ by no more than the
//    rounding of each segment to whole decimetres.
//  * Every edge's time is its integer length over its speed, round(length_dm * 3.6 / km/h),
//    plus the barrier delay on edges arriving at a gate; ferries with a duration are left out
//    (their time is the tagged duration, checked in flags_test).
//  * The replication timestamps match those published with the data (shared data README).
//
// Which ways are roads and at what speed comes from the extractor's own tag rules
// (extract::evaluate_way / evaluate_barrier), which the per-rule fixture tests pin down; the
// geometry, the splitting into segments and the arithmetic are checked against libosmium here.

#include "tests/extract/extract_test_support.hpp"

#include "extract/barrier_rules.hpp"
#include "extract/way_rules.hpp"
#include "graph/haversine.hpp"

#include <osmium/handler.hpp>
#include <osmium/handler/node_locations_for_ways.hpp>
#include <osmium/index/map/flex_mem.hpp>
#include <osmium/io/pbf_input.hpp>
#include <osmium/visitor.hpp>

#include <catch2/catch.hpp>

#include <map>
#include <unordered_map>

using namespace ringroad;
using namespace ringroad::test;

namespace {

const char* const kProfiles[] = {"car", "bicycle", "foot"};

// What libosmium sees in one file, for every profile at once.
struct Reference {
    std::map<std::string, double> road_metres;   // per profile, libosmium's own radius
    std::map<std::string, std::unordered_map<std::int64_t, extract::WayRule>> way_rules;
    std::map<std::string, std::unordered_map<std::int64_t, extract::BarrierRule>> barriers;
};

class ReferenceHandler : public osmium::handler::Handler {
public:
    explicit ReferenceHandler(Reference& reference) : reference_(reference) {}

    void node(const osmium::Node& node) {
        if (!node.tags().has_key("barrier")) return;
        for (const char* name : kProfiles) {
            reference_.barriers[name][node.id()] = extract::evaluate_barrier(node.tags(), *extract::profile_from_name(name));
        }
    }

    void way(const osmium::Way& way) {
        for (const char* name : kProfiles) {
            const auto rule = extract::evaluate_way(way.tags(), *extract::profile_from_name(name));
            if (!rule.is_road) continue;
            bool complete = true;
            for (const auto& node_ref : way.nodes()) complete = complete && node_ref.location().valid();
            if (!complete) continue;
            reference_.road_metres[name] += osmium::geom::haversine::distance(way.nodes());
            reference_.way_rules[name][way.id()] = rule;
        }
    }

private:
    Reference& reference_;
};

Reference read_reference(const std::string& path) {
    Reference reference;
    using Index = osmium::index::map::FlexMem<osmium::unsigned_object_id_type, osmium::Location>;
    Index index;
    osmium::handler::NodeLocationsForWays<Index> locations{index};
    locations.ignore_errors();   // ways at the extract border keep invalid locations: skipped above
    ReferenceHandler handler{reference};
    osmium::io::Reader reader{path};
    osmium::apply(reader, locations, handler);
    reader.close();
    return reference;
}

double graph_road_metres(const graph::RoadGraph& graph) {
    std::uint64_t decimetres = 0;
    for (const auto& segment : graph.segments()) decimetres += segment.length_dm;
    return static_cast<double>(decimetres) / 10.0;
}

void check_extract(const std::string& file, const std::string& replication_timestamp) {
    const std::string path = fixture_path("osm/" + file);
    const Reference reference = read_reference(path);
    for (const char* name : kProfiles) {
        INFO(file << ", " << name << " profile");
        const auto graph = build_fixture("osm/" + file, name);
        REQUIRE(graph.vertex_count() > 100);
        CHECK(metadata(graph, "source") == file);
        CHECK(metadata(graph, "profile") == name);
        CHECK(metadata(graph, "source_timestamp") == replication_timestamp);

        const double ours = graph_road_metres(graph);
        const double libosmium = reference.road_metres.at(name);
        const double rescaled = libosmium * (graph::kEarthMeanRadiusMeters / osmium::geom::haversine::EARTH_RADIUS_IN_METERS);
        CHECK(ours == Approx(libosmium).epsilon(0.001));
        // Rescaled to the same radius, the only difference left is each segment's rounding to
        // whole decimetres: at most 0.05 m per segment.
        CHECK(ours == Approx(rescaled).epsilon(0).margin(0.05 * graph.segment_count() + 0.01));
        CHECK(ours == Approx(rescaled).epsilon(0.0001));

        const auto& rules = reference.way_rules.at(name);
        static const std::unordered_map<std::int64_t, extract::BarrierRule> kNoBarriers;
        const auto barriers_found = reference.barriers.find(name);
        const auto& barriers = barriers_found == reference.barriers.end() ? kNoBarriers : barriers_found->second;
        std::size_t checked = 0;
        for (const auto& directed : all_edges(graph)) {
            const auto& edge = directed.edge;
            const auto& rule = rules.at(graph.segments()[edge.segment].way_id);
            CHECK(edge.length_dm == graph.segments()[edge.segment].length_dm);
            CHECK((edge.reversed ? rule.backward : rule.forward));
            if (rule.ferry_duration_seconds) continue;
            std::uint32_t delay_ds = 0;
            const auto barrier = barriers.find(graph.vertex_osm_ids()[edge.head]);
            if (barrier != barriers.end() && barrier->second.effect == extract::BarrierEffect::delays) {
                delay_ds = static_cast<std::uint32_t>(std::lround(barrier->second.delay_seconds * 10));
            }
            CHECK(((edge.flags & graph::edge_flag::barrier_delay) != 0) == (delay_ds > 0));
            const double speed = edge.reversed ? rule.backward_speed_kmh : rule.forward_speed_kmh;
            if (edge.time_ds != expected_time_ds(edge.length_dm, speed) + delay_ds) {
                FAIL_CHECK("edge on way " << graph.segments()[edge.segment].way_id << ": " << edge.time_ds
                           << " ds for " << edge.length_dm << " dm at " << speed << " km/h");
            }
            ++checked;
        }
        CHECK(checked > graph.edge_count() * 9 / 10);
        // Every segment has the edges its way's directions call for.
        for (std::uint32_t s = 0; s < graph.segment_count(); ++s) {
            const auto& segment = graph.segments()[s];
            const auto& rule = rules.at(segment.way_id);
            CHECK((segment.forward_edge != graph::kNoEdge) == rule.forward);
            CHECK((segment.backward_edge != graph::kNoEdge) == rule.backward);
        }
    }
}

} // namespace

TEST_CASE("monaco.osm.pbf: lengths match libosmium, times match lengths and speeds") {
    // Snapshot time as published with the extract (shared data README).
    check_extract("monaco.osm.pbf", "2019-09-30T20:18:02Z");
}

TEST_CASE("andorra.osm.pbf: lengths match libosmium, times match lengths and speeds") {
    check_extract("andorra.osm.pbf", "2023-05-02T20:16:04Z");
}

TEST_CASE("andorra.osm.pbf, car: turn restrictions are read and nearly all matched") {
    const auto graph = build_fixture("osm/andorra.osm.pbf", "car");
    const int read = std::stoi(metadata(graph, "restrictions_read"));
    const int unmatched = std::stoi(metadata(graph, "restrictions_unmatched"));
    CHECK(read > 0);
    CHECK(unmatched * 5 < read);                  // a few via-way restrictions at most
    CHECK(graph.turn_restrictions().size() >= static_cast<std::size_t>(read - unmatched));
    CHECK(metadata(graph, "ways_missing_nodes") == "0");   // the extract keeps complete ways
}
