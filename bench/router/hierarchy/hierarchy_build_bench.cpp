// Contraction-hierarchy build benchmark: for the largest real extract at hand (Andorra,
// © OpenStreetMap contributors, ODbL 1.0), invented regions of the given sizes (`ringroad synth`,
// seed 1, written as PBF and read by the extractor, as router_bench does) and random street grids
// of the given sizes (tests/router/test_graphs.hpp with router_bench's options), builds the hierarchy of each metric
// and prints its build time (process CPU and wall), upward arcs, shortcuts, bytes, the average
// upward search space, a 1000 x 1000 many-to-many time, and an exactness spot check against our
// Dijkstra (router/dijkstra.hpp, itself checked against the Boost Graph Library in
// tests/router/dijkstra_test.cpp) on random pairs; then the peak memory.
// The reference measured in the same run is one Dijkstra one-to-all search: the build is printed
// as a multiple of it, which stays comparable across machines and loads.
//
// Usage: hierarchy_build_bench [--synth JUNCTIONS]... [--grid ROWS]... [--no-extract] [--threads N]
//                              [--metric time|distance]
//   (default: Andorra, then a 300 x 300 grid; with --synth, no grid unless --grid is given;
//   --grid 0 skips the grids)
#include "bench/peak_memory.hpp"
#include "bench/router/hierarchy/hierarchy_search_space.hpp"
#include "extract/road_extractor.hpp"
#include "router/dijkstra.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/hierarchy/hierarchy_query.hpp"
#include "synth/pbf_region_writer.hpp"
#include "synth/region_calibration.hpp"
#include "tests/router/test_graphs.hpp"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <ctime>
#include <filesystem>
#include <random>
#include <string>
#include <thread>

#include <unistd.h>

using namespace ringroad;
using namespace ringroad::router;
using namespace ringroad::router::hierarchy;

namespace {

// Process CPU time (all threads): on a shared machine wall time measures the neighbours too.
double process_cpu_seconds() {
    timespec now{};
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &now);
    return static_cast<double>(now.tv_sec) + static_cast<double>(now.tv_nsec) * 1e-9;
}

struct Stopwatch {
    std::chrono::steady_clock::time_point wall = std::chrono::steady_clock::now();
    double cpu = process_cpu_seconds();
    double wall_seconds() const { return std::chrono::duration<double>(std::chrono::steady_clock::now() - wall).count(); }
    double cpu_seconds() const { return process_cpu_seconds() - cpu; }
};

// Pairs where the hierarchy differs from Dijkstra (0 expected).
int spot_check(const RoutingGraph& routing_graph, const ContractionHierarchy& hierarchy, Metric metric, int pairs) {
    HierarchySearch search(hierarchy);
    DijkstraWorkspace workspace(routing_graph.node_count());
    std::mt19937_64 random(17);
    int differences = 0;
    for (int pair = 0; pair < pairs; ++pair) {
        const WeightedNode start{static_cast<NodeId>(random() % routing_graph.node_count()), 0};
        const WeightedNode end{static_cast<NodeId>(random() % routing_graph.node_count()), 0};
        run_dijkstra(routing_graph, metric, {&start, 1}, {&end.node, 1}, workspace);
        const PackedWeight ours = search.shortest({&start, 1}, {&end, 1});
        differences += ours != workspace.distance(end.node);
    }
    return differences;
}

// The same measure as bench::average_search_space over ten times as many start nodes: build
// settings that change the search space by a few percent need the steadier figure to be told
// apart.
double average_search_space_of_2000(const ContractionHierarchy& hierarchy) {
    HierarchySearch search(hierarchy);
    std::vector<WeightedNode> settled;
    std::mt19937_64 random(5);
    for (int k = 0; k < 2000; ++k) {
        const WeightedNode from{static_cast<NodeId>(random() % hierarchy.node_count()), 0};
        search.upward_search({&from, 1}, k % 2 == 0, settled);
    }
    return static_cast<double>(settled.size()) / 2000.0;
}

void run_suite(const std::string& name, const graph::RoadGraph& road_graph, unsigned threads,
               const std::vector<Metric>& metrics) {
    const RoutingGraph routing_graph(road_graph, RestrictionPolicy::automatic);
    std::printf("## %s: %u junctions, %u routing nodes, %u turn arcs\n\n", name.c_str(), road_graph.vertex_count(),
                routing_graph.node_count(), routing_graph.arc_count());
    // Reference: one Dijkstra from a node in the middle of the numbering to all (time metric),
    // 1 thread.
    DijkstraWorkspace workspace(routing_graph.node_count());
    const WeightedNode origin{routing_graph.node_count() / 2, 0};
    run_dijkstra(routing_graph, Metric::time, {&origin, 1}, {}, workspace);   // warm-up
    Stopwatch reference_clock;
    run_dijkstra(routing_graph, Metric::time, {&origin, 1}, {}, workspace);
    const double reference_cpu = reference_clock.cpu_seconds();

    std::printf("| metric | build CPU s | build wall s | CPU / one-to-all Dijkstra | upward arcs | shortcuts | MiB | "
                "search space | of 2000 starts | m2m 1000x1000 CPU ms | m2m wall ms | pairs differing from Dijkstra |\n");
    std::printf("|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|\n");
    for (Metric metric : metrics) {
        Stopwatch build_clock;
        const ContractionHierarchy hierarchy = ContractionHierarchy::build(routing_graph, metric, nullptr, threads);
        const double build_cpu = build_clock.cpu_seconds();
        const double build_wall = build_clock.wall_seconds();

        std::mt19937_64 random(1000);
        std::vector<std::vector<WeightedNode>> ends(1000);
        for (auto& end : ends) end = {{static_cast<NodeId>(random() % routing_graph.node_count()), 0}};
        Stopwatch matrix_clock;
        (void)hierarchy_many_to_many(hierarchy, ends, ends, threads);
        const double matrix_cpu = matrix_clock.cpu_seconds();
        const double matrix_wall = matrix_clock.wall_seconds();

        const int pairs = routing_graph.node_count() > 1000000 ? 20 : 200;
        const int differences = spot_check(routing_graph, hierarchy, metric, pairs);
        std::printf("| %s | %.2f | %.2f | %.0f | %u | %u | %.1f | %.1f | %.1f | %.0f | %.0f | %d of %d |\n",
                    std::string(metric_name(metric)).c_str(), build_cpu, build_wall, build_cpu / reference_cpu,
                    hierarchy.arc_count(), hierarchy.shortcut_count(), hierarchy.byte_size() / 1048576.0,
                    bench::average_search_space(hierarchy), average_search_space_of_2000(hierarchy), matrix_cpu * 1e3, matrix_wall * 1e3, differences, pairs);
    }
    std::printf("\none-to-all Dijkstra (reference): %.1f ms CPU; peak memory so far: %.0f MiB\n\n", reference_cpu * 1e3,
                bench::peak_memory_mib());
    std::fflush(stdout);
}

// An invented region as a user would get it: `ringroad synth` (seed 1), then the extractor.
graph::RoadGraph invented_region(std::uint64_t junctions) {
    const std::filesystem::path scratch =
        std::filesystem::temp_directory_path() / ("ringroad-hierarchy-build-bench-" + std::to_string(::getpid()));
    std::filesystem::create_directories(scratch);
    const std::string region_path = (scratch / "region.osm.pbf").string();
    synth::write_region_pbf(synth::plan_region(junctions, 1, nullptr), region_path, nullptr);
    extract::ExtractOptions options;
    options.input_path = region_path;
    graph::RoadGraph road_graph = extract::extract_and_build_road_graph(options, nullptr);
    std::filesystem::remove_all(scratch);
    return road_graph;
}

} // namespace

int main(int argc, char** argv) {
    std::vector<std::uint32_t> grid_sizes;
    std::vector<std::uint64_t> synth_sizes;
    bool grids_given = false;
    bool with_extract = true;
    unsigned threads = 0;
    std::vector<Metric> metrics{Metric::time, Metric::distance};
    for (int i = 1; i < argc; ++i) {
        const std::string argument = argv[i];
        if (argument == "--grid" && i + 1 < argc) {
            grids_given = true;
            const auto rows = static_cast<std::uint32_t>(std::stoul(argv[++i]));
            if (rows > 0) grid_sizes.push_back(rows);
        } else if (argument == "--synth" && i + 1 < argc) {
            const auto junctions = static_cast<std::uint64_t>(std::stoull(argv[++i]));
            if (junctions > 0) synth_sizes.push_back(junctions);
        } else if (argument == "--threads" && i + 1 < argc) {
            threads = static_cast<unsigned>(std::stoul(argv[++i]));
        } else if (argument == "--metric" && i + 1 < argc) {
            const auto metric = metric_from_name(argv[++i]);
            if (!metric) {
                std::fprintf(stderr, "unknown metric %s\n", argv[i]);
                return 2;
            }
            metrics = {*metric};
        } else if (argument == "--no-extract") {
            with_extract = false;
        } else {
            std::fprintf(stderr, "usage: hierarchy_build_bench [--synth JUNCTIONS]... [--grid ROWS]... [--no-extract] [--threads N] [--metric time|distance]\n");
            return 2;
        }
    }
    if (!grids_given && synth_sizes.empty()) grid_sizes = {300};
    std::printf("%u cores, %u build threads (0 = all)\n\n", std::max(1u, std::thread::hardware_concurrency()), threads);
    if (with_extract) {
        extract::ExtractOptions options;
        options.input_path = std::string(RINGROAD_FIXTURES_DIR) + "/osm/andorra.osm.pbf";
        run_suite("Andorra", extract::extract_and_build_road_graph(options, nullptr), threads, metrics);
    }
    for (std::uint64_t junctions : synth_sizes) {
        run_suite("invented region of " + std::to_string(junctions) + " junctions (ringroad synth, seed 1)",
                  invented_region(junctions), threads, metrics);
    }
    for (std::uint32_t rows : grid_sizes) {
        run_suite("random street grid " + std::to_string(rows) + " x " + std::to_string(rows),
                  test::random_grid_graph(test::benchmark_grid_options(rows)), threads, metrics);
    }
    return 0;
}
