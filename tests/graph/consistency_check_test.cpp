// Region files whose checksums are right but whose contents are inconsistent: each case changes
// one field of a written file, re-seals it (tests/graph/region_file_editor.hpp, from the layout
// in graph/FORMAT.md and libxxhash's XXH3) and expects the loader's one-line refusal naming the
// file, the section and the record. Without the check a case targets, the file loads (and a
// command would read out of bounds) or another check names a different field: the case fails.

#include "common/input_error.hpp"
#include "graph/consistency_check.hpp"
#include "graph/graph_file.hpp"
#include "tests/graph/random_road_graph.hpp"
#include "tests/graph/region_file_bytes.hpp"
#include "tests/graph/region_file_editor.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <functional>

using namespace ringroad;
using namespace ringroad::graph;
using ringroad::test::load_error;
using ringroad::test::read_bytes;
using ringroad::test::write_bytes;
using test::RegionFileEditor;

namespace {

// Record sizes and field offsets from graph/FORMAT.md.
constexpr std::size_t kEdge = 20, kSegment = 40, kRestriction = 24, kCoordinate = 8, kU32 = 4;
namespace edge_field { constexpr std::size_t head = 0, segment = 4, time = 8, length = 12, reversed = 19; }
namespace segment_field {
constexpr std::size_t first_vertex = 0, last_vertex = 4, shape_begin = 8, shape_end = 12, name = 20, forward_edge = 24,
                      backward_edge = 28;
}
namespace restriction_field { constexpr std::size_t from_segment = 0, via_vertex = 4, to_segment = 8, kind = 12; }

// "\nkey\tvalue\n" with the value's last digit changed, so the text keeps its length.
std::pair<std::string, std::string> changed_count(const RoadGraph& graph, const std::string& key) {
    const std::string value = graph.metadata_value(key);
    std::string changed = value;
    changed.back() = changed.back() == '9' ? '8' : static_cast<char>(changed.back() + 1);
    return {"\n" + key + "\t" + value + "\n", "\n" + key + "\t" + changed + "\n"};
}

struct Damage {
    std::string what;
    std::function<void(RegionFileEditor&)> change;
    std::string message;   // after "PATH: "
};

} // namespace

TEST_CASE("a region file with right checksums but inconsistent contents is refused, naming section and record") {
    const RoadGraph graph = test::random_road_graph(200, 600, 11);
    const std::uint32_t n = graph.vertex_count(), m = graph.edge_count(), s = graph.segment_count();
    const std::string ns = std::to_string(n), ms = std::to_string(m), ss = std::to_string(s);
    REQUIRE(find_inconsistency(graph).empty());

    // A two-way segment between different vertices, a one-way one, a named one (not the first name).
    SegmentId two_way = kNoEdge, one_way = kNoEdge, named = kNoEdge;
    for (SegmentId id = 0; id < s; ++id) {
        const Segment& segment = graph.segments()[id];
        if (segment.first_vertex == segment.last_vertex) continue;
        if (two_way == kNoEdge && segment.backward_edge != kNoEdge && segment.forward_edge != kNoEdge) two_way = id;
        if (one_way == kNoEdge && segment.backward_edge == kNoEdge) one_way = id;
        if (named == kNoEdge && segment.name != kNoName && segment.name > 0) named = id;
    }
    REQUIRE((two_way != kNoEdge && one_way != kNoEdge && named != kNoEdge));
    const Segment& road = graph.segments()[two_way];
    const EdgeId forward = road.forward_edge, backward = road.backward_edge;
    const EdgeId one_way_edge = graph.segments()[one_way].forward_edge;
    const VertexId other_vertex = (road.last_vertex + 1) % n == road.first_vertex ? (road.last_vertex + 2) % n
                                                                                  : (road.last_vertex + 1) % n;
    // A vertex whose adjacency offset can go below the one before it.
    VertexId busy = 1;
    while (graph.first_out()[busy - 1] == 0) ++busy;
    std::uint32_t main_vertex = 0;
    while (graph.components()[main_vertex] != 0) ++main_vertex;
    REQUIRE(graph.component_count() >= 2);
    const std::string names_tag = "names", count = std::to_string(graph.component_count());
    const auto s_str = [](std::uint64_t value) { return std::to_string(value); };

    using E = RegionFileEditor;
    const std::vector<Damage> damages = {
        // edges
        {"edge head out of range", [&](E& e) { e.set_field<std::uint32_t>("edges", kEdge, forward, edge_field::head, 99999999); },
         "section 'edges' record " + s_str(forward) + ": head 99999999 is out of range (n = " + ns + ")"},
        {"edge segment out of range", [&](E& e) { e.set_field<std::uint32_t>("edges", kEdge, forward, edge_field::segment, s); },
         "section 'edges' record " + s_str(forward) + ": segment " + ss + " is out of range (s = " + ss + ")"},
        {"edge direction not 0 or 1", [&](E& e) { e.set_field<std::uint8_t>("edges", kEdge, forward, edge_field::reversed, 2); },
         "section 'edges' record " + s_str(forward) + ": reversed is 2, not 0 or 1"},
        {"edge moved to another segment", [&](E& e) { e.set_field<std::uint32_t>("edges", kEdge, forward, edge_field::segment, one_way); },
         "section 'edges' record " + s_str(forward) + ": its segment " + s_str(one_way) + " does not list it as its forward edge"},
        {"edge direction flipped", [&](E& e) { e.set_field<std::uint8_t>("edges", kEdge, forward, edge_field::reversed, 1); },
         "section 'edges' record " + s_str(forward) + ": its segment " + s_str(two_way) + " does not list it as its backward edge"},
        {"edge head in range but not its segment's end",
         [&](E& e) { e.set_field<std::uint32_t>("edges", kEdge, forward, edge_field::head, other_vertex); },
         "section 'edges' record " + s_str(forward) + ": runs from vertex " + s_str(road.first_vertex) + " to " +
             s_str(other_vertex) + " but its segment " + s_str(two_way) + " runs from " + s_str(road.first_vertex) +
             " to " + s_str(road.last_vertex)},
        // A length or time that would overflow a search's packed 32-bit halves (a fuzzing finding:
        // an edge 2^32 dm long overran the distance search's queue).
        {"edge length not its segment's",
         [&](E& e) { e.set_field<std::uint32_t>("edges", kEdge, forward, edge_field::length, 4294964296u); },
         "section 'edges' record " + s_str(forward) + ": length 4294964296 dm differs from its segment's " +
             s_str(road.length_dm) + " dm"},
        {"edge time too large",
         [&](E& e) { e.set_field<std::uint32_t>("edges", kEdge, forward, edge_field::time, 4000000000u); },
         "section 'edges' record " + s_str(forward) + ": time 4000000000 is out of range (the largest = 100000000)"},
        // segments
        {"segment length too large",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, 16, 4000000000u); },
         "section 'segments' record " + s_str(two_way) + ": length 4000000000 is out of range (the largest = 100000000)"},
        {"segment first vertex out of range",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, segment_field::first_vertex, n); },
         "section 'segments' record " + s_str(two_way) + ": first vertex " + ns + " is out of range (n = " + ns + ")"},
        {"segment last vertex out of range",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, segment_field::last_vertex, 4000000000u); },
         "section 'segments' record " + s_str(two_way) + ": last vertex 4000000000 is out of range (n = " + ns + ")"},
        {"segment first vertex in range but not its edge's tail",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, one_way, segment_field::first_vertex, other_vertex == graph.segments()[one_way].first_vertex ? (other_vertex + 1) % n : other_vertex); },
         ""},  // message filled in below: it depends on the vertex chosen
        {"segment shape range reversed",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, segment_field::shape_begin, road.shape_end + 1); },
         "section 'segments' record " + s_str(two_way) + ": shape range [" + s_str(road.shape_end + 1) + ", " +
             s_str(road.shape_end) + ") is not within the " + s_str(graph.shape_points().size()) + " shape points"},
        {"segment shape range past the shape points",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, segment_field::shape_end, 700000); },
         "section 'segments' record " + s_str(two_way) + ": shape range [" + s_str(road.shape_begin) +
             ", 700000) is not within the " + s_str(graph.shape_points().size()) + " shape points"},
        {"segment name past the names",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, named, segment_field::name, 1u << 30); },
         "section 'segments' record " + s_str(named) + ": name offset 1073741824 is out of range (bytes of names = " +
             s_str(graph.names_blob().size()) + ")"},
        {"segment name inside another name",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, named, segment_field::name, graph.segments()[named].name + 1); },
         "section 'segments' record " + s_str(named) + ": name offset " + s_str(graph.segments()[named].name + 1) +
             " points inside a name"},
        {"segment forward edge out of range",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, segment_field::forward_edge, m); },
         "section 'segments' record " + s_str(two_way) + ": forward edge " + ms + " is out of range (m = " + ms + ")"},
        {"segment backward edge out of range",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, segment_field::backward_edge, m + 7); },
         "section 'segments' record " + s_str(two_way) + ": backward edge " + s_str(m + 7) + " is out of range (m = " + ms + ")"},
        {"segment forward edge naming its backward edge",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, segment_field::forward_edge, backward); },
         "section 'edges' record " + s_str(forward) + ": its segment " + s_str(two_way) + " does not list it as its forward edge"},
        {"segment direction closed while its edge remains",
         [&](E& e) { e.set_field<std::uint32_t>("segments", kSegment, two_way, segment_field::backward_edge, kNoEdge); },
         "section 'segments' has " + s_str(m - 1) + " open directions but section 'edges' holds " + ms + " records"},
        // first_out
        {"adjacency not starting at 0", [&](E& e) { e.set_field<std::uint32_t>("first_out", kU32, 0, 0, 1); },
         "section 'first_out' record 0: offset 1 should be 0"},
        {"adjacency offsets descending",
         [&](E& e) { e.set_field<std::uint32_t>("first_out", kU32, busy, 0, graph.first_out()[busy - 1] - 1); },
         "section 'first_out' record " + s_str(busy) + ": offset " + s_str(graph.first_out()[busy - 1] - 1) +
             " is below the offset before it (" + s_str(graph.first_out()[busy - 1]) + ")"},
        {"adjacency not ending at m", [&](E& e) { e.set_field<std::uint32_t>("first_out", kU32, n, 0, 0xFFFFFF00u); },
         "section 'first_out' record " + ns + ": offset 4294967040 should be the edge count (m = " + ms + ")"},
        // restrictions
        {"restriction from segment out of range",
         [&](E& e) { e.set_field<std::uint32_t>("restrictions", kRestriction, 0, restriction_field::from_segment, s); },
         "section 'restrictions' record 0: from segment " + ss + " is out of range (s = " + ss + ")"},
        {"restriction via vertex out of range",
         [&](E& e) { e.set_field<std::uint32_t>("restrictions", kRestriction, 0, restriction_field::via_vertex, 123456789); },
         "section 'restrictions' record 0: via vertex 123456789 is out of range (n = " + ns + ")"},
        {"restriction to segment out of range",
         [&](E& e) { e.set_field<std::uint32_t>("restrictions", kRestriction, 0, restriction_field::to_segment, s + 1); },
         "section 'restrictions' record 0: to segment " + s_str(s + 1) + " is out of range (s = " + ss + ")"},
        {"restriction kind unknown",
         [&](E& e) { e.set_field<std::uint8_t>("restrictions", kRestriction, 0, restriction_field::kind, 9); },
         "section 'restrictions' record 0: kind 9 is not 0 (no turn) or 1 (only turn)"},
        // components
        {"component id out of range",
         [&](E& e) { e.set_field<std::uint32_t>("components", kU32, 5, 0, graph.component_count()); },
         "section 'components' record 5: component " + count + " is out of range (components = " + count + ")"},
        {"main component size disagreeing with the metadata",
         [&](E& e) { e.set_field<std::uint32_t>("components", kU32, main_vertex, 0, 1); },
         "section 'meta': 'main_component_junctions' is '" + graph.metadata_value("main_component_junctions") +
             "' but section 'components' puts " +
             s_str(std::stoul(graph.metadata_value("main_component_junctions")) - 1) + " vertices in component 0"},
        // names
        {"last name not NUL-terminated",
         [&](E& e) { e.set_field<char>("names", 1, graph.names_blob().size() - 1, 0, 'x'); },
         "section 'names': the last name is not NUL-terminated"},
        // positions
        {"vertex latitude beyond the pole",
         [&](E& e) { e.set_field<std::int32_t>("coordinates", kCoordinate, 3, 0, 950000000); },
         "section 'coordinates' record 3: position 95.000000," + std::to_string(graph.coordinates()[3].lon_e7 * 1e-7) +
             " is not a latitude,longitude"},
        {"shape point longitude past 180",
         [&](E& e) { e.set_field<std::int32_t>("shape_points", kCoordinate, 2, 4, -1900000000); },
         "section 'shape_points' record 2: position " + std::to_string(graph.shape_points()[2].lat_e7 * 1e-7) +
             ",-190.000000 is not a latitude,longitude"},
        // counts in the metadata
        {"junction count", [&](E& e) { const auto [a, b] = changed_count(graph, "junctions"); e.replace_text("meta", a, b); },
         "section 'meta': 'junctions' is " + changed_count(graph, "junctions").second.substr(11, ns.size()) +
             " but section 'coordinates' holds " + ns + " records"},
        {"edge count", [&](E& e) { const auto [a, b] = changed_count(graph, "edges"); e.replace_text("meta", a, b); },
         "section 'meta': 'edges' is " + changed_count(graph, "edges").second.substr(7, ms.size()) +
             " but section 'edges' holds " + ms + " records"},
        {"segment count", [&](E& e) { const auto [a, b] = changed_count(graph, "segments"); e.replace_text("meta", a, b); },
         "section 'meta': 'segments' is " + changed_count(graph, "segments").second.substr(10, ss.size()) +
             " but section 'segments' holds " + ss + " records"},
        {"restriction count",
         [&](E& e) { const auto [a, b] = changed_count(graph, "turn_restrictions"); e.replace_text("meta", a, b); },
         "section 'meta': 'turn_restrictions' is 2 but section 'restrictions' holds 1 record"},
        {"component count", [&](E& e) { const auto [a, b] = changed_count(graph, "components"); e.replace_text("meta", a, b); },
         "section 'meta': 'components' is " + changed_count(graph, "components").second.substr(12, count.size()) +
             " but section 'components' numbers them from 0 to " + s_str(graph.component_count() - 1)},
        {"junction count missing", [&](E& e) { e.replace_text("meta", "\njunctions\t", "\njunctionz\t"); },
         "section 'meta': 'junctions' is missing or not a count"},
        {"component count not a number",
         [&](E& e) { const auto [a, b] = changed_count(graph, "components"); e.replace_text("meta", a, "\ncomponents\t" + std::string(count.size(), 'x') + "\n"); },
         "section 'meta': 'components' is missing or not a count"},
        // section sizes (the table entry's size field)
        {"one vertex OSM id short",
         [&](E& e) { e.set<std::uint64_t>(e.entry_at("vertex_osm_ids") + E::kEntrySizeAt, e.section_size("vertex_osm_ids") - 8); },
         "section 'vertex_osm_ids' holds " + s_str(n - 1) + " records, expected one per vertex (n = " + ns + ")"},
        {"one component id short",
         [&](E& e) { e.set<std::uint64_t>(e.entry_at("components") + E::kEntrySizeAt, e.section_size("components") - 4); },
         "section 'components' holds " + s_str(n - 1) + " records, expected one per vertex (n = " + ns + ")"},
        {"one adjacency offset short",
         [&](E& e) { e.set<std::uint64_t>(e.entry_at("first_out") + E::kEntrySizeAt, e.section_size("first_out") - 4); },
         "section 'first_out' holds " + ns + " records, expected n + 1 = " + s_str(n + 1)},
        // the section table
        {"edge records of the wrong size",
         [&](E& e) { e.set<std::uint32_t>(e.entry_at("edges") + E::kEntryElementSizeAt, 10); },
         "section 'edges' has records of 10 bytes, not 20"},
        {"a tag twice", [&](E& e) { std::memcpy(e.bytes_for_edit() + e.entry_at("names"), "meta\0", 5); },
         "section 'meta' appears twice"},
        {"a tag without its NUL", [&](E& e) { std::memcpy(e.bytes_for_edit() + e.entry_at("names"), "0123456789abcdef", 16); },
         "section table entry 7 has no tag of 1 to 15 bytes"},
        {"a section over the header",
         [&](E& e) { e.set<std::uint64_t>(e.entry_at("names") + E::kEntryOffsetAt, 0); },
         "section 'names' does not lie between the section table and the end of the file"},
    };

    const std::string folder = test::make_scratch_dir("graph-inconsistent");
    const std::string good = folder + "/good.rrg", bad = folder + "/bad.rrg";
    write_road_graph(graph, good);
    const std::vector<char> bytes = read_bytes(good);
    {
        RegionFileEditor editor(bytes);
        editor.reseal();
        REQUIRE(editor.bytes() == bytes);   // the editor's sealing is the writer's
    }
    for (const Damage& damage : damages) {
        RegionFileEditor editor(bytes);
        damage.change(editor);
        editor.reseal();
        write_bytes(bad, editor.bytes());
        std::string expected = damage.message;
        if (expected.empty()) {
            // The one-way segment's only edge now leaves a vertex its segment does not start at.
            const Segment& segment = graph.segments()[one_way];
            const VertexId moved = other_vertex == segment.first_vertex ? (other_vertex + 1) % n : other_vertex;
            expected = "section 'edges' record " + std::to_string(one_way_edge) + ": runs from vertex " +
                       std::to_string(segment.first_vertex) + " to " + std::to_string(segment.last_vertex) +
                       " but its segment " + std::to_string(one_way) + " runs from " + std::to_string(moved) + " to " +
                       std::to_string(segment.last_vertex);
        }
        INFO(damage.what);
        CHECK(load_error(bad) == bad + ": " + expected);
    }
    std::filesystem::remove_all(folder);
}
