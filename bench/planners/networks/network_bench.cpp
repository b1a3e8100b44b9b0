// Matrix tools and road networks, timed side by side with the Boost Graph Library in one run.
//  1. Random Euclidean matrices (n = 250, 500, 1000): metric closure (ours vs BGL
//     floyd_warshall_all_pairs_shortest_paths), spanning tree (ours vs BGL
//     kruskal_minimum_spanning_tree), diagnostics; MATRIX.csv write + read at n = 2000 and the
//     sampled diagnostics there.
//  2. Road networks on fixtures/osm/andorra.osm.pbf (© OpenStreetMap contributors, ODbL 1.0):
//     ours (Mehlhorn's one-search variant) vs the classical Kou–Markowsky–Berman first stage with
//     BGL (one dijkstra_shortest_paths per site + kruskal_minimum_spanning_tree over the closure);
//     the spanning weights must agree (Mehlhorn 1988), and the network's length is printed
//     against the sum of its links.
// CPU seconds are reported (the machine may be shared). Usage: network_bench

#include "bench/peak_memory.hpp"
#include "extract/road_extractor.hpp"
#include "planners/matrices/matrix_csv.hpp"
#include "planners/matrices/matrix_diagnostics.hpp"
#include "planners/matrices/metric_closure.hpp"
#include "planners/networks/spanning_tree.hpp"
#include "router/road_network.hpp"

#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/dijkstra_shortest_paths.hpp>
#include <boost/graph/floyd_warshall_shortest.hpp>
#include <boost/graph/kruskal_min_spanning_tree.hpp>
#pragma GCC diagnostic pop

#include <cmath>
#include <cstdio>
#include <ctime>
#include <filesystem>
#include <functional>
#include <iterator>
#include <limits>
#include <random>
#include <vector>

namespace {

using ringroad::planners::matrices::CostMatrix;

// "s17"; built by appending, since GCC 12 warns falsely on "s" + std::string.
std::string label(std::size_t index) {
    std::string text = "s";
    text += std::to_string(index);
    return text;
}

double cpu_seconds() {
    timespec now{};
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &now);
    return static_cast<double>(now.tv_sec) + 1e-9 * static_cast<double>(now.tv_nsec);
}

double timed(const std::function<void()>& work) {
    const double start = cpu_seconds();
    work();
    return cpu_seconds() - start;
}

CostMatrix euclidean(std::size_t size, std::uint64_t seed) {
    std::mt19937_64 random(seed);
    std::uniform_real_distribution<double> coordinate(0.0, 10000.0);
    std::vector<std::pair<double, double>> points(size);
    for (auto& point : points) point = {coordinate(random), coordinate(random)};
    CostMatrix costs(size);
    for (std::size_t a = 0; a < size; ++a)
        for (std::size_t b = 0; b < size; ++b)
            costs(a, b) = std::round(std::hypot(points[a].first - points[b].first, points[a].second - points[b].second)) +
                          (a > b ? 7.0 : 0.0);   // a little asymmetry, like one-ways
    return costs;
}

using DirectedGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::directedS, boost::no_property,
                                            boost::property<boost::edge_weight_t, double>>;
using UndirectedGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::undirectedS, boost::no_property,
                                              boost::property<boost::edge_weight_t, double>>;

void matrix_tools(std::size_t size) {
    const CostMatrix costs = euclidean(size, size);
    double ours_closure = 0, boost_closure = 0, ours_tree = 0, boost_tree = 0, diagnostics = 0;
    double ours_weight = 0, boost_weight = 0;
    ours_closure = timed([&] { (void)ringroad::planners::matrices::metric_closure(costs); });
    {
        DirectedGraph graph(size);
        for (std::size_t a = 0; a < size; ++a)
            for (std::size_t b = 0; b < size; ++b)
                if (a != b) boost::add_edge(a, b, costs(a, b), graph);
        std::vector<std::vector<double>> distances(size, std::vector<double>(size));
        boost_closure = timed([&] {
            boost::floyd_warshall_all_pairs_shortest_paths(
                graph, distances, boost::distance_inf(std::numeric_limits<double>::infinity()));
        });
    }
    ours_tree = timed([&] { ours_weight = ringroad::planners::networks::minimum_spanning_forest(costs).cost; });
    {
        UndirectedGraph graph(size);
        for (std::size_t a = 0; a < size; ++a)
            for (std::size_t b = a + 1; b < size; ++b) boost::add_edge(a, b, std::min(costs(a, b), costs(b, a)), graph);
        std::vector<boost::graph_traits<UndirectedGraph>::edge_descriptor> tree;
        boost_tree = timed([&] { boost::kruskal_minimum_spanning_tree(graph, std::back_inserter(tree)); });
        for (const auto& edge : tree) boost_weight += boost::get(boost::edge_weight, graph, edge);
    }
    diagnostics = timed([&] { (void)ringroad::planners::matrices::diagnose_matrix(costs); });
    std::printf("%6zu  %9.3f %9.3f %6.2f   %9.4f %9.4f %6.2f  %s   %9.3f\n", size, ours_closure, boost_closure,
                ours_closure / boost_closure, ours_tree, boost_tree, ours_tree / boost_tree,
                ours_weight == boost_weight ? "equal" : "DIFFER", diagnostics);
}

void large_matrix_io() {
    const std::size_t size = 2000;
    ringroad::planners::matrices::LabelledMatrix matrix{{}, euclidean(size, 2000)};
    for (std::size_t i = 0; i < size; ++i) matrix.ids.push_back(label(i));
    const std::string path = (std::filesystem::temp_directory_path() / "ringroad-network-bench.csv").string();
    const double write = timed([&] { ringroad::planners::matrices::write_matrix_csv(matrix, path); });
    ringroad::planners::matrices::LabelledMatrix back;
    const double read = timed([&] { back = ringroad::planners::matrices::read_matrix_csv(path); });
    ringroad::planners::matrices::MatrixDiagnostics report;
    const double diagnose = timed([&] { report = ringroad::planners::matrices::diagnose_matrix(back.costs); });
    std::printf("\nn = 2000: MATRIX.csv %.1f MB written in %.2f s, read in %.2f s; diagnostics %.2f s "
                "(triangle check sampled over %zu middle stops)\n",
                static_cast<double>(std::filesystem::file_size(path)) / 1e6, write, read, diagnose,
                report.via_stops_checked);
    std::filesystem::remove(path);
}

bool usable(const ringroad::graph::Segment& segment) {
    return segment.forward_edge != ringroad::graph::kNoEdge || segment.backward_edge != ringroad::graph::kNoEdge;
}

void road_networks() {
    ringroad::extract::ExtractOptions options;
    options.input_path = std::string(RINGROAD_FIXTURES_DIR) + "/osm/andorra.osm.pbf";
    options.profile = *ringroad::extract::profile_from_name("car");
    const auto graph = ringroad::extract::extract_and_build_road_graph(options, nullptr);
    std::printf("\nandorra.osm.pbf car graph: %u junctions, %u segments\n", graph.vertex_count(), graph.segment_count());
    std::printf("%6s  %10s %10s %6s  %12s %12s %8s  %s\n", "sites", "ours s", "BGL KMB s", "ratio", "links m",
                "network m", "saving", "spanning weights");
    UndirectedGraph roads(graph.vertex_count());
    for (const auto& segment : graph.segments()) {
        if (usable(segment)) boost::add_edge(segment.first_vertex, segment.last_vertex, segment.length_dm, roads);
    }
    for (const std::size_t count : {10u, 50u, 200u}) {
        std::vector<ringroad::router::NetworkSite> sites;
        std::mt19937_64 random(count);
        std::uniform_int_distribution<std::uint32_t> pick(0, graph.segment_count() - 1);
        while (sites.size() < count) {
            const auto s = pick(random);
            const auto& segment = graph.segments()[s];
            if (!usable(segment) || !graph.in_main_component(segment.first_vertex)) continue;
            sites.push_back({label(sites.size()), s, 0.0});
        }
        ringroad::router::RoadNetwork network;
        const double ours = timed([&] { network = ringroad::router::plan_road_network(graph, sites); });
        double closure_weight = 0.0;
        const double reference = timed([&] {
            UndirectedGraph closure(count);
            std::vector<double> distance(graph.vertex_count());
            for (std::size_t a = 0; a < count; ++a) {
                boost::dijkstra_shortest_paths(roads, graph.segments()[sites[a].segment].first_vertex,
                                               boost::distance_map(distance.data()));
                for (std::size_t b = a + 1; b < count; ++b) {
                    boost::add_edge(a, b, distance[graph.segments()[sites[b].segment].first_vertex], closure);
                }
            }
            std::vector<boost::graph_traits<UndirectedGraph>::edge_descriptor> tree;
            boost::kruskal_minimum_spanning_tree(closure, std::back_inserter(tree));
            for (const auto& edge : tree) closure_weight += boost::get(boost::edge_weight, closure, edge);
        });
        std::printf("%6zu  %10.4f %10.4f %6.2f  %12.1f %12.1f %7.1f%%  %s\n", count, ours, reference, ours / reference,
                    static_cast<double>(network.link_length_sum_dm) / 10.0,
                    static_cast<double>(network.road_length_dm) / 10.0,
                    100.0 * static_cast<double>(network.saving_dm()) / static_cast<double>(network.link_length_sum_dm),
                    static_cast<double>(network.link_length_sum_dm) == closure_weight ? "equal" : "DIFFER");
    }
}

} // namespace

int main() {
    std::printf("Matrix tools, CPU seconds (ours vs Boost Graph Library, same matrix)\n");
    std::printf("%6s  %9s %9s %6s   %9s %9s %6s  %5s   %9s\n", "n", "closure", "BGL FW", "ratio", "kruskal",
                "BGL", "ratio", "MST", "diagnose");
    for (const std::size_t size : {250u, 500u, 1000u}) matrix_tools(size);
    large_matrix_io();
    road_networks();
    std::printf("\npeak memory %.1f MiB\n", ringroad::bench::peak_memory_mib());
    return 0;
}
