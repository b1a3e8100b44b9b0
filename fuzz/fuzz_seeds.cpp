// fuzz_seeds OUTPUT_FOLDER OSM_FILE...: makes the seed corpora that must be built rather than
// copied, from OSM XML fixtures: OUTPUT_FOLDER/osm_pbf/ gets each file as PBF (zlib blobs and
// plain blobs, so mutations also reach the PBF parser behind zlib), OUTPUT_FOLDER/region_file/
// gets its car-profile region file with and without the contraction hierarchy. scripts/fuzz.sh
// runs it once per build; the hand-written seeds live in fuzz/seeds/.

#include "common/input_error.hpp"
#include "extract/profile.hpp"
#include "extract/road_extractor.hpp"
#include "graph/graph_file.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"

#include <osmium/io/any_input.hpp>
#include <osmium/io/any_output.hpp>

#include <cstdio>
#include <exception>
#include <filesystem>
#include <string>

namespace {

using namespace ringroad;

void write_pbf(const std::string& input, const std::string& output, bool compressed) {
    osmium::io::File out_file(output, "pbf");
    if (!compressed) out_file.set("pbf_compression", "none");
    osmium::io::Reader reader(input);
    osmium::io::Writer writer(out_file, reader.header(), osmium::io::overwrite::allow);
    while (osmium::memory::Buffer buffer = reader.read()) writer(std::move(buffer));
    writer.close();
    reader.close();
}

void write_region_files(const std::string& input, const std::string& stem) {
    extract::ExtractOptions options;
    options.input_path = input;
    graph::RoadGraph road_graph = extract::extract_and_build_road_graph(options, nullptr);
    graph::write_road_graph(road_graph, stem + ".plain");
    road_graph = graph::attach_sections(road_graph, router::hierarchy::build_hierarchy_sections(road_graph));
    graph::write_road_graph(road_graph, stem + ".hierarchy");
}

} // namespace

int main(int argc, char** argv) {
    if (argc < 3) {
        std::fprintf(stderr, "usage: fuzz_seeds OUTPUT_FOLDER OSM_FILE...\n");
        return 2;
    }
    const std::filesystem::path output = argv[1];
    std::filesystem::create_directories(output / "osm_pbf");
    std::filesystem::create_directories(output / "region_file");
    int made = 0;
    for (int i = 2; i < argc; ++i) {
        const std::string input = argv[i];
        const std::string name = std::filesystem::path(input).stem().string();
        try {
            write_pbf(input, (output / "osm_pbf" / (name + ".zlib.osm.pbf")).string(), true);
            write_pbf(input, (output / "osm_pbf" / (name + ".plain.osm.pbf")).string(), false);
            made += 2;
            write_region_files(input, (output / "region_file" / name).string());
            made += 2;
        } catch (const InputError& error) {
            // Fixtures without roads for a car (no_roads.osm) seed only the PBF corpus.
            std::fprintf(stderr, "fuzz_seeds: %s\n", error.what());
        } catch (const std::exception& error) {
            std::fprintf(stderr, "fuzz_seeds: %s: %s\n", input.c_str(), error.what());
            return 1;
        }
    }
    std::fprintf(stderr, "fuzz_seeds: %d seed files in %s\n", made, output.c_str());
    return 0;
}
