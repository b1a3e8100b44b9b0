// Turn restrictions (fixtures/extract/restrictions.osm), read as the OSM wiki's Relation:restriction
// page defines them: type=restriction, restriction=no_*|only_*, members from (way), via (node),
// to (way); restriction:motorcar=* for cars only; except=* exempts the vehicles it names.

#include "tests/extract/extract_test_support.hpp"

#include <catch2/catch.hpp>

#include <tuple>

using namespace ringroad;
using namespace ringroad::test;

namespace {

// (relation id, kind, from way, via node, to way) of every stored restriction, sorted.
using RestrictionRow = std::tuple<std::int64_t, int, std::int64_t, std::int64_t, std::int64_t>;

std::vector<RestrictionRow> stored_restrictions(const graph::RoadGraph& graph) {
    std::vector<RestrictionRow> rows;
    for (const auto& restriction : graph.turn_restrictions()) {
        const auto& from = graph.segments()[restriction.from_segment];
        const auto& to = graph.segments()[restriction.to_segment];
        // The from and to segments must touch the via vertex.
        CHECK((from.first_vertex == restriction.via_vertex || from.last_vertex == restriction.via_vertex));
        CHECK((to.first_vertex == restriction.via_vertex || to.last_vertex == restriction.via_vertex));
        rows.emplace_back(restriction.relation_id, restriction.kind, from.way_id,
                          graph.vertex_osm_ids()[restriction.via_vertex], to.way_id);
    }
    std::sort(rows.begin(), rows.end());
    return rows;
}

constexpr int kNo = static_cast<int>(graph::RestrictionKind::no_turn);
constexpr int kOnly = static_cast<int>(graph::RestrictionKind::only_turn);

} // namespace

TEST_CASE("car: no_* and only_* restrictions with a via node are stored by segment") {
    const auto graph = build_fixture("extract/restrictions.osm", "car");
    const std::vector<RestrictionRow> expected{
        {1, kNo, 1, 100, 3},     // no_left_turn
        {2, kOnly, 3, 100, 4},   // only_straight_on
        {3, kNo, 2, 100, 3},     // restriction:motorcar=no_right_turn
        {9, kNo, 4, 100, 4},     // no_u_turn, from and to the same way
        {12, kNo, 1, 100, 2},    // no_entry with two from ways: one stored restriction each
        {12, kNo, 3, 100, 2},
    };
    CHECK(stored_restrictions(graph) == expected);
}

TEST_CASE("car: restrictions that cannot be matched are counted, not fatal") {
    const auto graph = build_fixture("extract/restrictions.osm", "car");
    // Read: 1, 2, 3, 6, 7, 8, 9, 10, 12. Not read: 4 (hgv only), 5 (except=motorcar).
    CHECK(metadata(graph, "restrictions_read") == "9");
    // Unmatched: 6 (via way), 7 (from way not in the extract), 8 (from way passes through the
    // via node: arrival direction ambiguous), 10 (unknown restriction value).
    CHECK(metadata(graph, "restrictions_unmatched") == "4");
}

TEST_CASE("bicycle and foot do not read turn restrictions") {
    for (const char* profile : {"bicycle", "foot"}) {
        const auto graph = build_fixture("extract/restrictions.osm", profile);
        CHECK(graph.turn_restrictions().empty());
        CHECK(metadata(graph, "restrictions_read") == "0");
    }
}
