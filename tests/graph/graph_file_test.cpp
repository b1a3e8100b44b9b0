// The .rrg file: a round trip keeps every section bit for bit, and damaged files (truncated,
// flipped bytes, wrong magic) are refused with a one-line message naming the file.

#include "common/input_error.hpp"
#include "graph/graph_file.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <cstring>
#include <filesystem>
#include <fstream>
#include <random>

using namespace ringroad;
using namespace ringroad::graph;

namespace {

// A small random road graph: a grid-like set of vertices with random two-way and one-way roads.
RoadGraph random_graph(std::uint32_t vertices, std::uint32_t roads, unsigned seed) {
    std::mt19937 random(seed);
    RoadGraphData data;
    for (std::uint32_t v = 0; v < vertices; ++v) {
        data.coordinates.push_back(Coordinate::from_degrees(43.5 + 0.001 * (v % 17), 7.4 + 0.001 * (v / 17)));
        data.vertex_osm_ids.push_back(1000 + v);
    }
    std::uniform_int_distribution<std::uint32_t> pick(0, vertices - 1);
    for (std::uint32_t r = 0; r < roads; ++r) {
        const VertexId a = pick(random), b = pick(random);
        Segment segment{a, b, static_cast<std::uint32_t>(data.shape_points.size()), 0, 0, kNoName, kNoEdge, kNoEdge, r};
        data.shape_points.push_back(Coordinate::from_degrees(43.6, 7.45));
        segment.shape_end = static_cast<std::uint32_t>(data.shape_points.size());
        segment.length_dm = 10 + random() % 1000;
        if (r % 3 == 0) segment.name = data.add_name("Road " + std::to_string(r));
        const auto s = static_cast<SegmentId>(data.segments.size());
        data.segments.push_back(segment);
        const auto time = static_cast<std::uint32_t>(1 + random() % 500);
        data.edges.push_back({a, Edge{b, s, time, segment.length_dm, 0, 11, 0}});
        if (r % 4 != 0) data.edges.push_back({b, Edge{a, s, time, segment.length_dm, 0, 11, 1}});
    }
    data.turn_restrictions.push_back({0, data.segments[0].last_vertex, 1, 0, {}, 77});
    data.metadata.emplace_back("source", "random");
    return build_road_graph(std::move(data));
}

template <typename T>
bool same(std::span<const T> a, std::span<const T> b) {
    return a.size() == b.size() && std::memcmp(a.data(), b.data(), a.size_bytes()) == 0;
}

std::vector<char> read_bytes(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

void write_bytes(const std::string& path, const std::vector<char>& bytes) {
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
}

std::string load_error(const std::string& path) {
    try {
        load_road_graph(path);
    } catch (const InputError& error) {
        return error.what();
    }
    return "";
}

} // namespace

TEST_CASE("a written graph loads back identical") {
    const RoadGraph graph = random_graph(300, 900, 7);
    const std::string folder = test::make_scratch_dir("graph-file");
    const std::string path = folder + "/region.rrg";
    const std::vector<std::byte> extra = {std::byte{1}, std::byte{2}, std::byte{3}};
    write_road_graph(attach_sections(graph, {{"ch.test", extra}}), path);

    const RoadGraph loaded = load_road_graph(path);
    CHECK(same(graph.coordinates(), loaded.coordinates()));
    CHECK(same(graph.vertex_osm_ids(), loaded.vertex_osm_ids()));
    CHECK(same(graph.first_out(), loaded.first_out()));
    CHECK(same(graph.edges(), loaded.edges()));
    CHECK(same(graph.segments(), loaded.segments()));
    CHECK(same(graph.shape_points(), loaded.shape_points()));
    CHECK(same(graph.turn_restrictions(), loaded.turn_restrictions()));
    CHECK(same(graph.components(), loaded.components()));
    CHECK(graph.names_blob() == loaded.names_blob());
    CHECK(graph.metadata() == loaded.metadata());
    CHECK(loaded.component_count() == graph.component_count());
    REQUIRE(loaded.section("ch.test").size() == 3);
    CHECK(loaded.section("ch.test")[2] == std::byte{3});
    CHECK(loaded.name(loaded.segments()[0].name) == "Road 0");
    std::filesystem::remove_all(folder);
}

TEST_CASE("segments know their directed edges and edges their tails") {
    const RoadGraph graph = random_graph(50, 120, 3);
    for (EdgeId e = 0; e < graph.edge_count(); ++e) {
        const Edge& edge = graph.edges()[e];
        const Segment& segment = graph.segments()[edge.segment];
        CHECK((edge.reversed ? segment.backward_edge : segment.forward_edge) == e);
        const VertexId tail = graph.edge_tail(e);
        CHECK(tail == (edge.reversed ? segment.last_vertex : segment.first_vertex));
        CHECK(edge.head == (edge.reversed ? segment.first_vertex : segment.last_vertex));
    }
}

TEST_CASE("damaged graph files are refused with a message naming the file") {
    const std::string folder = test::make_scratch_dir("graph-corrupt");
    const std::string good = folder + "/good.rrg";
    write_road_graph(random_graph(200, 600, 11), good);
    const std::vector<char> bytes = read_bytes(good);
    const std::string bad = folder + "/bad.rrg";

    SECTION("truncated at several offsets") {
        for (const std::size_t keep : {std::size_t{0}, std::size_t{10}, std::size_t{64}, std::size_t{200},
                                       bytes.size() / 2, bytes.size() - 1}) {
            write_bytes(bad, std::vector<char>(bytes.begin(), bytes.begin() + static_cast<long>(keep)));
            const std::string message = load_error(bad);
            INFO("kept " << keep << " bytes: " << message);
            CHECK(message.rfind(bad + ": ", 0) == 0);
            CHECK(message.find('\n') == std::string::npos);
        }
    }
    SECTION("one flipped byte anywhere is detected") {
        std::mt19937 random(5);
        for (int trial = 0; trial < 200; ++trial) {
            auto damaged = bytes;
            const std::size_t at = random() % damaged.size();
            damaged[at] = static_cast<char>(damaged[at] ^ (1 + random() % 255));
            write_bytes(bad, damaged);
            const std::string message = load_error(bad);
            // Padding bytes between sections carry no data and no checksum; every other byte does.
            if (message.empty()) {
                CHECK_NOTHROW(load_road_graph(bad));
                continue;
            }
            INFO("flipped byte " << at << ": " << message);
            CHECK(message.rfind(bad + ": ", 0) == 0);
        }
    }
    SECTION("not a graph at all") {
        write_bytes(bad, std::vector<char>(4096, 'x'));
        CHECK(load_error(bad) == bad + ": not a ringroad region graph (bad magic)");
        CHECK(load_error(folder + "/missing.rrg").find("cannot open") != std::string::npos);
    }
    std::filesystem::remove_all(folder);
}

TEST_CASE("a failed write leaves no file behind") {
    const std::string folder = test::make_scratch_dir("graph-nowrite");
    CHECK_THROWS_AS(write_road_graph(random_graph(10, 20, 1), folder + "/no/such/folder/x.rrg"), InputError);
    CHECK(std::filesystem::is_empty(folder));
    std::filesystem::remove_all(folder);
}
