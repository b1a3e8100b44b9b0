// The .rrg file: a round trip keeps every section bit for bit, and damaged files (truncated,
// flipped bytes, wrong magic), files of format version 1 and paths that are not regular files (a
// named pipe, a directory) are refused at once with a one-line message naming the file.

#include "common/input_error.hpp"
#include "graph/graph_file.hpp"
#include "tests/graph/random_road_graph.hpp"
#include "tests/graph/region_file_bytes.hpp"
#include "tests/graph/region_file_editor.hpp"
#include "tests/support/run_command.hpp"

#include <catch2/catch.hpp>

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>
#include <zlib.h>

#include <algorithm>
#include <chrono>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <future>
#include <random>

using namespace ringroad;
using namespace ringroad::graph;
using ringroad::test::load_error;
using ringroad::test::read_bytes;
using ringroad::test::write_bytes;

namespace {

template <typename T>
bool same(std::span<const T> a, std::span<const T> b) {
    return a.size() == b.size() && std::memcmp(a.data(), b.data(), a.size_bytes()) == 0;
}

} // namespace

TEST_CASE("a written graph loads back identical") {
    const RoadGraph graph = test::random_road_graph(300, 900, 7);
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
    const RoadGraph graph = test::random_road_graph(50, 120, 3);
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
    write_road_graph(test::random_road_graph(200, 600, 11), good);
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
        // Where the sections lie, read from the table as graph/FORMAT.md lays it out.
        const test::RegionFileEditor layout(bytes);
        std::vector<std::pair<std::uint64_t, std::uint64_t>> sections;   // [begin, end)
        for (std::uint32_t i = 0; i < layout.section_count(); ++i) {
            const std::size_t entry = test::RegionFileEditor::kHeaderSize + i * test::RegionFileEditor::kEntrySize;
            const auto offset = layout.get<std::uint64_t>(entry + test::RegionFileEditor::kEntryOffsetAt);
            sections.emplace_back(offset, offset + layout.get<std::uint64_t>(entry + test::RegionFileEditor::kEntrySizeAt));
        }
        const std::uint64_t table_end =
            test::RegionFileEditor::kHeaderSize + layout.section_count() * test::RegionFileEditor::kEntrySize;
        std::mt19937 random(5);
        int in_sections = 0;
        for (int trial = 0; trial < 300; ++trial) {
            auto damaged = bytes;
            const std::size_t at = random() % damaged.size();
            damaged[at] = static_cast<char>(damaged[at] ^ (1 + random() % 255));
            write_bytes(bad, damaged);
            const std::string message = load_error(bad);
            INFO("flipped byte " << at << ": " << message);
            const bool in_section = std::any_of(sections.begin(), sections.end(),
                                                [&](const auto& range) { return at >= range.first && at < range.second; });
            if (at < table_end) {
                CHECK(message.rfind(bad + ": ", 0) == 0);
            } else if (in_section) {
                // Only the section's checksum can see every such change (a changed travel time, say).
                ++in_sections;
                CHECK(message.rfind(bad + ": checksum mismatch in section '", 0) == 0);
            } else {
                // Zero padding between sections carries no data and no checksum.
                CHECK(message.empty());
            }
        }
        CHECK(in_sections > 200);
    }
    SECTION("not a graph at all") {
        write_bytes(bad, std::vector<char>(4096, 'x'));
        CHECK(load_error(bad) == bad + ": not a ringroad region graph (bad magic)");
        CHECK(load_error(folder + "/missing.rrg").find("cannot open") != std::string::npos);
    }
    std::filesystem::remove_all(folder);
}

TEST_CASE("a file of format version 1 is refused with one line saying to rebuild it") {
    const std::string folder = test::make_scratch_dir("graph-version");
    const std::string old = folder + "/old.rrg";
    // A version-1 file with no sections, as version 1 of graph/FORMAT.md laid it out: 64-byte
    // header, CRC32 (zlib) of the empty table at offset 32 and of bytes 0..59 at offset 60.
    std::vector<char> v1(64, 0);
    const unsigned char magic[8] = {0x89, 'R', 'R', 'G', '\r', '\n', 0x1A, '\n'};
    std::memcpy(v1.data(), magic, 8);
    const std::uint32_t version = 1, sections = 0;
    const std::uint64_t size = 64, table_offset = 64;
    std::memcpy(v1.data() + 8, &version, 4);
    std::memcpy(v1.data() + 12, &sections, 4);
    std::memcpy(v1.data() + 16, &size, 8);
    std::memcpy(v1.data() + 24, &table_offset, 8);
    const auto table_crc = static_cast<std::uint32_t>(crc32(0L, Z_NULL, 0));
    std::memcpy(v1.data() + 32, &table_crc, 4);
    const auto header_crc = static_cast<std::uint32_t>(crc32(0L, reinterpret_cast<const Bytef*>(v1.data()), 60));
    std::memcpy(v1.data() + 60, &header_crc, 4);
    write_bytes(old, v1);
    CHECK(load_error(old) == old + ": region graph format version 1, which this ringroad does not read (it reads "
                                   "version 2); rebuild the file from its extract with `ringroad build`");

    // A later version, sealed as version 2 seals a header, gets the same advice.
    write_road_graph(test::random_road_graph(20, 40, 2), folder + "/good.rrg");
    test::RegionFileEditor later(read_bytes(folder + "/good.rrg"));
    later.set<std::uint32_t>(8, 3);
    later.reseal();
    write_bytes(folder + "/later.rrg", later.bytes());
    CHECK(load_error(folder + "/later.rrg").find("format version 3, which this ringroad does not read") !=
          std::string::npos);
    // An unknown version in a header that fails its checksum is damage, not an old file.
    test::RegionFileEditor damaged(later.bytes());
    damaged.set<std::uint32_t>(8, 7);
    write_bytes(folder + "/damaged.rrg", damaged.bytes());
    CHECK(load_error(folder + "/damaged.rrg") == folder + "/damaged.rrg: corrupt header (checksum mismatch)");
    std::filesystem::remove_all(folder);
}

TEST_CASE("a named pipe or a directory given as the region file is refused at once") {
    const std::string folder = test::make_scratch_dir("graph-special");
    const std::string pipe = folder + "/region.rrg";
    REQUIRE(::mkfifo(pipe.c_str(), 0600) == 0);
    // Opening a pipe for reading waits for a writer: the loader must answer without one. If it
    // has not answered after a while, a writer appears so that the test ends either way.
    auto answer = std::async(std::launch::async, [&] { return load_error(pipe); });
    const bool answered_alone = answer.wait_for(std::chrono::seconds(20)) == std::future_status::ready;
    if (!answered_alone) {
        const int writer = ::open(pipe.c_str(), O_WRONLY | O_CLOEXEC);
        if (writer >= 0) ::close(writer);
    }
    CHECK(answered_alone);
    CHECK(answer.get() == pipe + ": is a named pipe (FIFO), not a region graph file");
    CHECK(load_error(folder) == folder + ": is a directory, not a region graph file");
    std::filesystem::remove_all(folder);
}

TEST_CASE("a failed write leaves no file behind") {
    const std::string folder = test::make_scratch_dir("graph-nowrite");
    CHECK_THROWS_AS(write_road_graph(test::random_road_graph(10, 20, 1), folder + "/no/such/folder/x.rrg"), InputError);
    CHECK(std::filesystem::is_empty(folder));
    std::filesystem::remove_all(folder);
}
