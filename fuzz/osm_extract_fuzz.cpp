#include "fuzz/osm_extract_fuzz.hpp"

#include "common/input_error.hpp"
#include "extract/road_extractor.hpp"
#include "fuzz/scratch_file.hpp"
#include "graph/graph_file.hpp"

#include <cstdio>
#include <cstdlib>
#include <string>

namespace ringroad::fuzz {

void fuzz_osm_extract(const std::uint8_t* data, std::size_t size, const char* suffix) {
    static ScratchFile input(suffix);
    static ScratchFile region(".rrg");
    extract::ExtractOptions options;
    options.input_path = input.write(data, size);
    graph::RoadGraph road_graph;
    try {
        road_graph = extract::extract_and_build_road_graph(options, nullptr);
    } catch (const InputError&) {
        return;
    }
    try {
        graph::write_road_graph(road_graph, region.path());
        const graph::RoadGraph loaded = graph::load_road_graph(region.path());
        if (loaded.vertex_count() != road_graph.vertex_count() || loaded.edge_count() != road_graph.edge_count()) {
            std::fprintf(stderr, "osm fuzz: the region file read back differs from the graph written\n");
            std::abort();
        }
    } catch (const InputError& error) {
        std::fprintf(stderr, "osm fuzz: an extracted graph does not load back: %s\n", error.what());
        std::abort();
    }
}

} // namespace ringroad::fuzz
