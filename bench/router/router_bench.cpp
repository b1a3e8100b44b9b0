// Router benchmark: on the largest real extract at hand (Andorra, © OpenStreetMap contributors,
// ODbL 1.0), N = 100 and 1000 random stops: the Boost Graph Library's dijkstra_shortest_paths
// (N = 100 only) against our Dijkstra on the same routing graph, and our Dijkstra matrix against
// the contraction hierarchy's many-to-many; milliseconds, ratios, peak memory, hierarchy build
// time and size; then the same on larger random street grids. Usage: see main().
#include "bench/peak_memory.hpp"
#include "bench/router/hierarchy/hierarchy_search_space.hpp"
#include "extract/road_extractor.hpp"
#include "router/dijkstra.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/hierarchy/hierarchy_query.hpp"
#include "router/road_router.hpp"
#include "synth/pbf_region_writer.hpp"
#include "synth/region_calibration.hpp"
#include "tests/router/test_graphs.hpp"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/compressed_sparse_row_graph.hpp>
#include <boost/graph/dijkstra_shortest_paths.hpp>
#include <boost/graph/two_bit_color_map.hpp>

#include <chrono>
#include <ctime>
#include <cstdio>
#include <filesystem>
#include <random>
#include <string>
#include <thread>

#include <unistd.h>

using namespace ringroad;
using namespace ringroad::router;
using namespace ringroad::router::hierarchy;

namespace {

double milliseconds_since(std::chrono::steady_clock::time_point start) {
    return std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count();
}

// CPU time of the whole process (all threads): on a machine shared with other work, wall time
// measures the neighbours too; the ratios below use CPU time.
double process_cpu_milliseconds() {
    timespec now{};
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &now);
    return now.tv_sec * 1e3 + now.tv_nsec / 1e6;
}

using BglListGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::directedS, boost::no_property,
                                           boost::property<boost::edge_weight_t, std::uint64_t>>;
struct BglArc {
    std::uint64_t weight;
};
using BglCsrGraph = boost::compressed_sparse_row_graph<boost::directedS, boost::no_property, BglArc>;

// One-to-all timings per source, single thread, on exactly the routing graph and packed weights
// our Dijkstra searches. Both sides compute distances AND the shortest-path tree (predecessors).
//  * BGL: dijkstra_shortest_paths with its default 4-ary indirect heap; the distance,
//    predecessor and colour maps are allocated once and reused (BGL re-initialises all n entries
//    per call, as its interface requires, and allocates its heap-position array internally per
//    call: BGL offers no way to pass it). Timed: the call only. Two graph types: the general
//    adjacency_list, and compressed_sparse_row_graph, BGL's static CSR graph, the like-for-like
//    reference for our CSR arrays; the ratio is taken against the faster of the two.
//  * ours: run_dijkstra with a reused workspace (no per-call allocation, no O(n) clearing).
//    Timed: the call only.
// The three run in turns for several rounds and each keeps its best round, so a burst of other
// work on the shared machine does not land on one side only.
struct PerSourceTimes {
    double bgl_list_ms = 1e300;
    double bgl_csr_ms = 1e300;
    double ours_ms = 1e300;
    bool same_distances = true;
};

PerSourceTimes time_one_to_all(const RoutingGraph& routing_graph, const std::vector<NodeId>& sources, int rounds = 3) {
    const std::uint32_t n = routing_graph.node_count();
    BglListGraph list_graph(n);
    std::vector<std::pair<std::uint32_t, std::uint32_t>> arcs;
    std::vector<BglArc> arc_weights;
    for (NodeId tail = 0; tail < n; ++tail) {
        for (NodeId head : routing_graph.successors(tail)) {
            const std::uint64_t weight = routing_graph.node_weight(Metric::time, head);
            boost::add_edge(tail, head, weight, list_graph);
            arcs.emplace_back(tail, head);
            arc_weights.push_back({weight});
        }
    }
    const BglCsrGraph csr_graph(boost::edges_are_sorted, arcs.begin(), arcs.end(), arc_weights.begin(), n);
    std::vector<std::uint64_t> distance(n);
    std::vector<std::size_t> predecessor_csr(n);
    std::vector<std::size_t> predecessor_list(n);
    const boost::two_bit_color_map<boost::typed_identity_property_map<std::size_t>> colour(n);
    const auto csr_index = boost::get(boost::vertex_index, csr_graph);
    const auto list_index = boost::get(boost::vertex_index, list_graph);
    DijkstraWorkspace workspace(n);
    std::vector<std::uint64_t> reference(n);

    PerSourceTimes best;
    for (int round = 0; round < rounds; ++round) {
        double cpu_start = process_cpu_milliseconds();
        for (NodeId source : sources) {
            boost::dijkstra_shortest_paths(
                list_graph, source,
                boost::distance_map(boost::make_iterator_property_map(distance.begin(), list_index))
                    .predecessor_map(boost::make_iterator_property_map(predecessor_list.begin(), list_index))
                    .color_map(colour));
        }
        best.bgl_list_ms = std::min(best.bgl_list_ms, (process_cpu_milliseconds() - cpu_start) / sources.size());

        cpu_start = process_cpu_milliseconds();
        for (NodeId source : sources) {
            boost::dijkstra_shortest_paths(
                csr_graph, source,
                boost::weight_map(boost::get(&BglArc::weight, csr_graph))
                    .distance_map(boost::make_iterator_property_map(distance.begin(), csr_index))
                    .predecessor_map(boost::make_iterator_property_map(predecessor_csr.begin(), csr_index))
                    .color_map(colour));
        }
        best.bgl_csr_ms = std::min(best.bgl_csr_ms, (process_cpu_milliseconds() - cpu_start) / sources.size());
        reference = distance;   // from the last source

        cpu_start = process_cpu_milliseconds();
        for (NodeId source : sources) {
            const WeightedNode from{source, 0};
            run_dijkstra(routing_graph, Metric::time, {&from, 1}, {}, workspace);
        }
        best.ours_ms = std::min(best.ours_ms, (process_cpu_milliseconds() - cpu_start) / sources.size());
    }
    for (NodeId node = 0; node < n; ++node) {
        const std::uint64_t theirs = reference[node] == std::numeric_limits<std::uint64_t>::max() ? kUnreachableWeight
                                                                                                 : reference[node];
        best.same_distances = best.same_distances && workspace.distance(node) == theirs;
    }
    return best;
}

std::vector<SnappedStop> random_stops(const RoadRouter& router, std::size_t count, std::uint64_t seed) {
    const graph::RoadGraph& graph = router.road_graph();
    std::mt19937_64 random(seed);
    std::vector<SnappedStop> stops;
    while (stops.size() < count) {
        const auto vertex = static_cast<graph::VertexId>(random() % graph.vertex_count());
        if (!graph.in_main_component(vertex)) continue;
        const graph::Coordinate at = graph.coordinate(vertex);
        const double lat = at.lat() + (static_cast<double>(random() % 1000) - 500.0) * 1e-6;
        const double lon = at.lon() + (static_cast<double>(random() % 1000) - 500.0) * 1e-6;
        stops.push_back(router.snap(std::string("s").append(std::to_string(stops.size())), lat, lon));
    }
    return stops;
}

std::vector<NodeId> departure_nodes_of(const RoadRouter& router, const std::vector<SnappedStop>& stops) {
    std::vector<NodeId> nodes;
    for (const SnappedStop& stop : stops) {
        const graph::Segment& segment = router.road_graph().segments()[stop.segment];
        nodes.push_back(segment.forward_edge != graph::kNoEdge ? segment.forward_edge : segment.backward_edge);
    }
    return nodes;
}

// dijkstra_sample_rows > 0: the 1000 x 1000 Dijkstra matrix is timed on its first that many rows
// (all 1000 columns) and scaled to 1000 rows, so large graphs fit in the benchmark's time.
void run_suite(const graph::RoadGraph& road_graph, std::size_t dijkstra_sample_rows) {
    const unsigned cores = std::max(1u, std::thread::hardware_concurrency());
    std::printf("%u junctions, %u edges, %zu turn restrictions, %u cores\n", road_graph.vertex_count(),
                road_graph.edge_count(), road_graph.turn_restrictions().size(), cores);
    // The hierarchy is built once, on a routing graph made as the router makes it, and attached to the
    // graph the measured router gets, as `ringroad build` stores it in the file.
    graph::RoadGraph graph_with_hierarchy;
    double build_ms = 0, build_cpu_ms = 0;
    ContractionHierarchy hierarchy;
    {
        const RoutingGraph build_graph(road_graph, RouterOptions{}.restrictions);
        const double cpu_start = process_cpu_milliseconds();
        const auto start = std::chrono::steady_clock::now();
        hierarchy = ContractionHierarchy::build(build_graph, Metric::time);
        build_ms = milliseconds_since(start);
        build_cpu_ms = process_cpu_milliseconds() - cpu_start;
        graph_with_hierarchy = graph::attach_sections(road_graph, hierarchy.to_sections());
    }
    auto start = std::chrono::steady_clock::now();
    RoadRouter router(graph_with_hierarchy);
    const RoutingGraph& routing_graph = router.routing_graph();
    std::printf("routing graph + snap index: %.0f ms, %u nodes, %u turn arcs\n", milliseconds_since(start),
                routing_graph.node_count(), routing_graph.arc_count());
    std::printf("hierarchy build (time metric, %u cores): %.0f ms wall, %.0f ms CPU, %u upward arcs of which %u "
                "shortcuts, %.1f MiB\n",
                cores, build_ms, build_cpu_ms, hierarchy.arc_count(), hierarchy.shortcut_count(),
                hierarchy.byte_size() / 1048576.0);
    std::printf("hierarchy search space: %.0f nodes settled per upward search (average)\n",
                bench::average_search_space(hierarchy));
    // Warm the router (maps the attached hierarchy) so matrix timings exclude the set-up.
    (void)router.matrix(random_stops(router, 2, 1), Metric::time, Engine::hierarchy);

    // Per-source one-to-all Dijkstra, single thread: BGL against ours, same graph and weights.
    const std::vector<SnappedStop> stops100 = random_stops(router, 100, 100);
    // On large graphs 20 sources per round keep the benchmark short.
    std::vector<NodeId> sources = departure_nodes_of(router, stops100);
    if (routing_graph.node_count() > 100000) sources.resize(20);
    const PerSourceTimes per_source = time_one_to_all(routing_graph, sources);
    const double bgl_ms = std::min(per_source.bgl_list_ms, per_source.bgl_csr_ms);
    const double ours_ms = per_source.ours_ms;

    std::printf("\n| measure | CPU ms | wall ms | ratio (CPU) |\n|---|---:|---:|---:|\n");
    std::printf("| (per-source figures: best of 3 interleaved rounds over %zu sources) | | | |\n", sources.size());
    std::printf("| BGL dijkstra_shortest_paths on adjacency_list, one source to all, 1 thread | %.3f | | %.2f |\n",
                per_source.bgl_list_ms, per_source.bgl_list_ms / bgl_ms);
    std::printf("| BGL dijkstra_shortest_paths on compressed_sparse_row_graph, one source to all, 1 thread | %.3f | | %.2f |\n",
                per_source.bgl_csr_ms, per_source.bgl_csr_ms / bgl_ms);
    std::printf("| our Dijkstra, one source to all, 1 thread | %.3f | | %.2fx faster than the faster BGL |\n", ours_ms,
                bgl_ms / ours_ms);
    if (!per_source.same_distances) std::printf("| MISMATCH: our distances differ from BGL's | | | |\n");
    double cpu_start = 0;

    for (std::size_t n : {std::size_t{100}, std::size_t{1000}}) {
        const std::vector<SnappedStop> stops = n == 100 ? stops100 : random_stops(router, n, 1000);
        const std::size_t rows = n == 1000 && dijkstra_sample_rows > 0 ? std::min(n, dijkstra_sample_rows) : n;
        const std::vector<SnappedStop> row_stops(stops.begin(), stops.begin() + static_cast<std::ptrdiff_t>(rows));
        const double scale = static_cast<double>(n) / static_cast<double>(rows);
        start = std::chrono::steady_clock::now();
        cpu_start = process_cpu_milliseconds();
        const std::vector<PackedWeight> by_dijkstra = router.matrix(row_stops, stops, Metric::time, Engine::dijkstra);
        const double dijkstra_ms = milliseconds_since(start) * scale;
        const double dijkstra_cpu = (process_cpu_milliseconds() - cpu_start) * scale;
        start = std::chrono::steady_clock::now();
        cpu_start = process_cpu_milliseconds();
        const TravelMatrix by_hierarchy = router.matrix(stops, Metric::time, Engine::hierarchy);
        const double hierarchy_ms = milliseconds_since(start);
        const double hierarchy_cpu = process_cpu_milliseconds() - cpu_start;
        // The bucket many-to-many alone (no snapping glue, no mid-edge stops), on 1 thread and on
        // all cores: the CPU time ratio above is independent of the thread count only if the
        // work splits well.
        std::vector<std::vector<WeightedNode>> starts(n), ends(n);
        const std::vector<NodeId> nodes = departure_nodes_of(router, stops);
        for (std::size_t i = 0; i < n; ++i) {
            starts[i] = {{nodes[i], 0}};
            ends[i] = {{nodes[i], 0}};
        }
        double core_cpu[2], core_wall[2];
        for (unsigned threads : {1u, 0u}) {
            const double core_start = process_cpu_milliseconds();
            const auto core_wall_start = std::chrono::steady_clock::now();
            (void)hierarchy_many_to_many(hierarchy, starts, ends, threads);
            core_cpu[threads == 0] = process_cpu_milliseconds() - core_start;
            core_wall[threads == 0] = milliseconds_since(core_wall_start);
        }
        std::size_t differences = 0;
        for (std::size_t i = 0; i < rows; ++i) {
            for (std::size_t j = 0; j < n; ++j) {
                const PackedWeight expected = i == j ? 0 : by_dijkstra[i * n + j];
                differences += expected != by_hierarchy.weight(i, j);
            }
        }
        if (n == 100) {
            std::printf("| BGL Dijkstra %zux%zu matrix (%zu sources x one-to-all) | %.1f | | %.2f |\n", n, n, n,
                        bgl_ms * n, bgl_ms * n / dijkstra_cpu);
        }
        if (rows < n) {
            std::printf("| our Dijkstra %zux%zu matrix (early stop, %u threads; %zu rows timed, x%.0f) | %.1f | %.1f | 1.00 |\n",
                        n, n, cores, rows, scale, dijkstra_cpu, dijkstra_ms);
        } else {
            std::printf("| our Dijkstra %zux%zu matrix (early stop, %u threads) | %.1f | %.1f | 1.00 |\n", n, n, cores,
                        dijkstra_cpu, dijkstra_ms);
        }
        std::printf("| hierarchy many-to-many %zux%zu (%u threads) | %.1f | %.1f | %.1fx faster |\n", n, n, cores,
                    hierarchy_cpu, hierarchy_ms, dijkstra_cpu / hierarchy_cpu);
        std::printf("| (bucket many-to-many core alone, %zux%zu, 1 thread) | %.1f | %.1f | |\n", n, n, core_cpu[0], core_wall[0]);
        std::printf("| (bucket many-to-many core alone, %zux%zu, %u threads) | %.1f | %.1f | |\n", n, n, cores, core_cpu[1],
                    core_wall[1]);
        if (differences != 0) std::printf("| MISMATCH between engines | %zu cells | | |\n", differences);
    }
    std::printf("\npeak memory so far: %.0f MiB\n\n", bench::peak_memory_mib());
}

} // namespace

// --only one-to-all: the per-source comparison alone (BGL list, BGL CSR, ours), `rounds`
// interleaved rounds over `source_count` sources (fewer on large graphs unless given), so the
// Dijkstra can be measured quickly at every scale.
void run_one_to_all_only(const graph::RoadGraph& road_graph, std::size_t source_count, int rounds) {
    auto start = std::chrono::steady_clock::now();
    RoadRouter router(road_graph);
    const RoutingGraph& routing_graph = router.routing_graph();
    std::printf("%u junctions, %u routing nodes, %u turn arcs (routing graph + snap index: %.0f ms)\n",
                road_graph.vertex_count(), routing_graph.node_count(), routing_graph.arc_count(), milliseconds_since(start));
    std::vector<NodeId> sources = departure_nodes_of(router, random_stops(router, 100, 100));
    sources.resize(std::min(sources.size(), source_count));
    const PerSourceTimes times = time_one_to_all(routing_graph, sources, rounds);
    const double bgl_ms = std::min(times.bgl_list_ms, times.bgl_csr_ms);
    std::printf("| one source to all, 1 thread, best of %d interleaved rounds over %zu sources | CPU ms | ours faster by |\n"
                "|---|---:|---:|\n", rounds, sources.size());
    std::printf("| BGL dijkstra_shortest_paths, adjacency_list | %.3f | %.2fx |\n", times.bgl_list_ms, times.bgl_list_ms / times.ours_ms);
    std::printf("| BGL dijkstra_shortest_paths, compressed_sparse_row_graph | %.3f | %.2fx |\n", times.bgl_csr_ms,
                times.bgl_csr_ms / times.ours_ms);
    std::printf("| our Dijkstra | %.3f | (%.2fx the faster BGL) |\n", times.ours_ms, bgl_ms / times.ours_ms);
    if (!times.same_distances) std::printf("| MISMATCH: our distances differ from BGL's | | |\n");
    std::printf("peak memory so far: %.0f MiB\n\n", bench::peak_memory_mib());
}

// Usage: router_bench [EXTRACT.osm.pbf] [--synth JUNCTIONS]... [--grid ROWS]...
//   Default: Andorra, then an invented region of 20,000 junctions (`ringroad synth`, seed 1).
//   --synth N: an invented region of N junctions, written as PBF to a scratch folder and read by
//   the extractor like any map; --synth 0 skips the default one. --grid ROWS: a random street grid
//   of ROWS x ROWS junctions (tests/router/test_graphs.hpp; no road hierarchy, a hard case).
//   Graphs above 100,000 routing nodes time the 1000 x 1000 Dijkstra matrix on 100 rows and scale it.
// [--only one-to-all] runs only the per-source BGL comparison on each graph; [--sources N] and
// [--rounds R] set its sources per round and interleaved rounds.
int main(int argc, char** argv) {
    std::string path = std::string(RINGROAD_FIXTURES_DIR) + "/osm/andorra.osm.pbf";
    std::vector<std::uint32_t> grid_sizes;
    std::vector<std::uint64_t> synth_sizes;
    bool synth_given = false;
    bool one_to_all_only = false;
    std::size_t source_count = 0;   // 0: 100 sources, 20 on graphs above 100 000 nodes, 5 above 1 000 000
    int rounds = 3;
    for (int i = 1; i < argc; ++i) {
        const std::string argument = argv[i];
        if (argument == "--only" && i + 1 < argc) {
            const std::string what = argv[++i];
            if (what != "one-to-all") {
                std::fprintf(stderr, "router_bench: --only takes one-to-all, not '%s'\n", what.c_str());
                return 2;
            }
            one_to_all_only = true;
        } else if (argument == "--sources" && i + 1 < argc) {
            source_count = std::stoul(argv[++i]);
        } else if (argument == "--rounds" && i + 1 < argc) {
            rounds = std::max(1, std::stoi(argv[++i]));
        } else if (argument == "--grid" && i + 1 < argc) {
            const auto rows = static_cast<std::uint32_t>(std::stoul(argv[++i]));
            if (rows > 0) grid_sizes.push_back(rows);
        } else if (argument == "--synth" && i + 1 < argc) {
            synth_given = true;
            const auto junctions = std::stoull(argv[++i]);
            if (junctions > 0) synth_sizes.push_back(junctions);
        } else {
            path = argument;
        }
    }
    if (!synth_given) synth_sizes = {20000};
    auto start = std::chrono::steady_clock::now();
    extract::ExtractOptions options;
    options.input_path = path;
    const graph::RoadGraph extract_graph = extract::extract_and_build_road_graph(options, nullptr);
    std::printf("## %s (extracted in %.0f ms)\n", path.c_str(), milliseconds_since(start));
    const auto sources_for = [&](std::uint64_t nodes) -> std::size_t {
        if (source_count > 0) return source_count;
        return nodes > 1000000 ? 5 : nodes > 100000 ? 20 : 100;
    };
    const auto run_on = [&](const graph::RoadGraph& road_graph) {
        if (one_to_all_only) {
            run_one_to_all_only(road_graph, sources_for(road_graph.edge_count()), rounds);
        } else {
            run_suite(road_graph, road_graph.edge_count() > 100000 ? 100 : 0);
        }
    };
    run_on(extract_graph);

    for (std::uint64_t junctions : synth_sizes) {
        // The whole pipeline, as a user would run it: ringroad synth, then the extractor.
        const std::filesystem::path scratch =
            std::filesystem::temp_directory_path() / ("ringroad-router-bench-" + std::to_string(::getpid()));
        std::filesystem::create_directories(scratch);
        const std::string region_path = (scratch / "region.osm.pbf").string();
        start = std::chrono::steady_clock::now();
        const std::uint64_t bytes = synth::write_region_pbf(synth::plan_region(junctions, 1, nullptr), region_path, nullptr);
        const double synth_ms = milliseconds_since(start);
        start = std::chrono::steady_clock::now();
        extract::ExtractOptions synth_options;
        synth_options.input_path = region_path;
        const graph::RoadGraph synth_graph = extract::extract_and_build_road_graph(synth_options, nullptr);
        std::filesystem::remove_all(scratch);
        std::printf("## invented region of %llu junctions (ringroad synth, seed 1: %.1f MiB written in %.0f ms, "
                    "extracted in %.0f ms)\n",
                    static_cast<unsigned long long>(junctions), bytes / 1048576.0, synth_ms, milliseconds_since(start));
        run_on(synth_graph);
    }
    for (std::uint32_t grid_rows : grid_sizes) {
        start = std::chrono::steady_clock::now();
        const graph::RoadGraph grid_graph = test::random_grid_graph(test::benchmark_grid_options(grid_rows));
        std::printf("## random street grid %u x %u (generated in %.0f ms)\n", grid_rows, grid_rows, milliseconds_since(start));
        run_on(grid_graph);
    }
    return 0;
}
