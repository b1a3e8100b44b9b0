// The road network joining sites (Mehlhorn's Kou–Markowsky–Berman variant) on a real extract:
// fixtures/osm/monaco.osm.pbf (© OpenStreetMap contributors, ODbL 1.0).
// Outside references: the Boost Graph Library (dijkstra_shortest_paths for site-to-site road
// distances, kruskal_minimum_spanning_tree over them and over the returned subgraph,
// connected_components), and the published guarantees of the method (Kou, Markowsky and Berman
// 1981; Mehlhorn 1988; citations and bound from memory): network <= MST of the site distances,
// MST <= 2(1 - 1/k) x optimum.
#include "router/road_network.hpp"

#include "common/input_error.hpp"
#include "extract/profile.hpp"
#include "extract/road_extractor.hpp"
#include "tests/support/run_command.hpp"

#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/connected_components.hpp>
#include <boost/graph/dijkstra_shortest_paths.hpp>
#include <boost/graph/kruskal_min_spanning_tree.hpp>
#pragma GCC diagnostic pop

#include <catch2/catch.hpp>

#include <algorithm>
#include <map>
#include <set>

using ringroad::graph::RoadGraph;
using ringroad::graph::SegmentId;
using ringroad::graph::VertexId;
using ringroad::router::NetworkSite;
using ringroad::router::plan_road_network;

namespace {

using BoostGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::undirectedS, boost::no_property,
                                         boost::property<boost::edge_weight_t, std::uint64_t>>;

const RoadGraph& monaco() {
    static const RoadGraph graph = [] {
        ringroad::extract::ExtractOptions options;
        options.input_path = ringroad::test::fixture_path("osm/monaco.osm.pbf");
        options.profile = *ringroad::extract::profile_from_name("car");
        return ringroad::extract::extract_and_build_road_graph(options, nullptr);
    }();
    return graph;
}

bool usable(const ringroad::graph::Segment& segment) {
    return segment.forward_edge != ringroad::graph::kNoEdge || segment.backward_edge != ringroad::graph::kNoEdge;
}

// The road graph as an undirected Boost graph, one edge per usable segment, weighted by length.
BoostGraph undirected_roads(const RoadGraph& graph) {
    BoostGraph roads(graph.vertex_count());
    for (const auto& segment : graph.segments()) {
        if (usable(segment)) boost::add_edge(segment.first_vertex, segment.last_vertex, segment.length_dm, roads);
    }
    return roads;
}

// Sites at junctions of the main component, spread over the vertex numbering: a site at a
// vertex is the start (fraction 0) or end (fraction 1) of a usable segment touching it.
std::vector<NetworkSite> junction_sites(const RoadGraph& graph, std::size_t count, std::size_t offset) {
    std::map<VertexId, NetworkSite> by_vertex;
    const auto segments = graph.segments();
    const std::size_t step = segments.size() / count;
    for (std::size_t i = 0; by_vertex.size() < count && i < segments.size(); ++i) {
        const SegmentId s = static_cast<SegmentId>((offset + i * step + i / count) % segments.size());
        if (!usable(segments[s]) || !graph.in_main_component(segments[s].first_vertex)) continue;
        by_vertex.emplace(segments[s].first_vertex,
                          NetworkSite{"site" + std::to_string(by_vertex.size()), s, 0.0});
    }
    std::vector<NetworkSite> sites;
    for (auto& entry : by_vertex) sites.push_back(entry.second);
    return sites;
}

VertexId vertex_of(const RoadGraph& graph, const NetworkSite& site) {
    const auto& segment = graph.segments()[site.segment];
    return site.fraction == 0.0 ? segment.first_vertex : segment.last_vertex;
}

// Weight of the minimum spanning tree of the sites' road-distance closure, by Boost alone.
std::uint64_t boost_site_closure_mst(const RoadGraph& graph, const std::vector<NetworkSite>& sites) {
    const BoostGraph roads = undirected_roads(graph);
    const std::size_t k = sites.size();
    BoostGraph closure(k);
    for (std::size_t a = 0; a < k; ++a) {
        std::vector<std::uint64_t> distance(graph.vertex_count());
        boost::dijkstra_shortest_paths(roads, vertex_of(graph, sites[a]),
                                       boost::distance_map(boost::make_iterator_property_map(
                                           distance.begin(), boost::get(boost::vertex_index, roads))));
        for (std::size_t b = a + 1; b < k; ++b) boost::add_edge(a, b, distance[vertex_of(graph, sites[b])], closure);
    }
    std::vector<boost::graph_traits<BoostGraph>::edge_descriptor> tree;
    boost::kruskal_minimum_spanning_tree(closure, std::back_inserter(tree));
    std::uint64_t total = 0;
    for (const auto& edge : tree) total += boost::get(boost::edge_weight, closure, edge);
    return total;
}

} // namespace

TEST_CASE("Monaco: the network is a pruned tree no longer than the sites' spanning tree") {
    const RoadGraph& graph = monaco();
    REQUIRE(graph.segment_count() > 1000);
    for (const std::size_t count : {2u, 5u, 12u, 30u}) {
        const std::vector<NetworkSite> sites = junction_sites(graph, count, count * 7);
        REQUIRE(sites.size() == count);
        INFO(count << " sites");
        const auto network = plan_road_network(graph, sites);
        REQUIRE(network.links.size() == count - 1);

        // Mehlhorn 1988 (from memory): the links form a minimum spanning tree of the site-distance closure;
        // checked against Boost's dijkstra_shortest_paths + kruskal_minimum_spanning_tree.
        const std::uint64_t closure_mst = boost_site_closure_mst(graph, sites);
        CHECK(network.link_length_sum_dm == closure_mst);

        // Kou–Markowsky–Berman: network <= MST of the closure <= 2(1 - 1/k) x optimal Steiner tree,
        // and optimum <= network, so network >= MST / (2(1 - 1/k)).
        CHECK(network.road_length_dm <= closure_mst);
        CHECK(static_cast<double>(network.road_length_dm) * 2.0 * (1.0 - 1.0 / static_cast<double>(count)) >=
              static_cast<double>(closure_mst) - 1e-9);
        CHECK(network.saving_dm() == closure_mst - network.road_length_dm);

        // Sites at junctions: every piece is a whole segment, each at most once.
        std::set<SegmentId> seen;
        std::uint64_t total = 0;
        BoostGraph subgraph(graph.vertex_count());
        for (const auto& piece : network.pieces) {
            CHECK(piece.from_fraction == 0.0);
            CHECK(piece.to_fraction == 1.0);
            CHECK(seen.insert(piece.segment).second);
            const auto& segment = graph.segments()[piece.segment];
            CHECK(piece.length_dm == segment.length_dm);
            total += piece.length_dm;
            boost::add_edge(segment.first_vertex, segment.last_vertex, segment.length_dm, subgraph);
        }
        CHECK(total == network.road_length_dm);
        CHECK(network.segments().size() == network.pieces.size());

        // Every site joined (Boost connected_components on the returned subgraph).
        std::vector<int> component(graph.vertex_count());
        boost::connected_components(subgraph, component.data());
        for (const auto& site : sites) CHECK(component[vertex_of(graph, site)] == component[vertex_of(graph, sites[0])]);

        // A tree (Boost's MST of the subgraph keeps every piece) whose leaves are all sites.
        std::vector<boost::graph_traits<BoostGraph>::edge_descriptor> tree;
        boost::kruskal_minimum_spanning_tree(subgraph, std::back_inserter(tree));
        CHECK(tree.size() == network.pieces.size());
        std::set<VertexId> site_vertices;
        for (const auto& site : sites) site_vertices.insert(vertex_of(graph, site));
        for (VertexId v = 0; v < graph.vertex_count(); ++v) {
            if (boost::out_degree(v, subgraph) == 1) CHECK(site_vertices.count(v) == 1);
        }
    }
}

TEST_CASE("Monaco: sites in the middle of segments split them exactly") {
    const RoadGraph& graph = monaco();
    std::vector<NetworkSite> sites = junction_sites(graph, 8, 3);
    for (std::size_t i = 0; i < sites.size(); ++i) sites[i].fraction = 0.25 + 0.05 * static_cast<double>(i);
    // Two sites on one segment: the piece between them is part of that segment.
    sites.push_back({"twin", sites[0].segment, 0.9});
    const auto network = plan_road_network(graph, sites);
    CHECK(network.links.size() == sites.size() - 1);
    CHECK(network.road_length_dm <= network.link_length_sum_dm);
    std::map<SegmentId, std::vector<std::pair<double, double>>> stretches;
    std::uint64_t total = 0;
    for (const auto& piece : network.pieces) {
        CHECK(piece.from_fraction < piece.to_fraction);
        stretches[piece.segment].push_back({piece.from_fraction, piece.to_fraction});
        total += piece.length_dm;
    }
    CHECK(total == network.road_length_dm);
    for (auto& [segment, list] : stretches) {   // pieces of one segment never overlap
        std::sort(list.begin(), list.end());
        for (std::size_t i = 1; i < list.size(); ++i) CHECK(list[i - 1].second <= list[i].first);
    }
    // Two sites alone on one segment: the network is the road between them, no longer than the
    // stretch of that segment between their positions.
    const auto& shared = graph.segments()[sites[0].segment];
    const auto between = std::llround(0.9 * shared.length_dm) - std::llround(0.25 * shared.length_dm);
    const auto pair = plan_road_network(graph, {sites[0], sites.back()});
    REQUIRE(pair.links.size() == 1);
    CHECK(pair.links[0].length_dm <= static_cast<std::uint64_t>(between));
    CHECK(pair.road_length_dm == pair.links[0].length_dm);
    if (pair.road_length_dm == static_cast<std::uint64_t>(between)) {
        REQUIRE(pair.pieces.size() == 1);
        CHECK(pair.pieces[0].segment == sites[0].segment);
        CHECK(pair.pieces[0].from_fraction == 0.25);
        CHECK(pair.pieces[0].to_fraction == 0.9);
    }
}

TEST_CASE("Monaco: two sites at the same place are joined by an empty link") {
    const RoadGraph& graph = monaco();
    std::vector<NetworkSite> sites = junction_sites(graph, 4, 11);
    sites[1].fraction = 0.5;
    sites.push_back({"copy", sites[1].segment, 0.5});
    const auto network = plan_road_network(graph, sites);
    REQUIRE(network.links.size() == 4);
    bool empty_link = false;
    for (const auto& link : network.links) {
        if ((link.from_site == 1 && link.to_site == 4) || (link.from_site == 4 && link.to_site == 1)) {
            empty_link = link.length_dm == 0;
        }
    }
    CHECK(empty_link);
    // The copy adds nothing: the same network as without it.
    sites.pop_back();
    const auto without = plan_road_network(graph, sites);
    CHECK(without.road_length_dm == network.road_length_dm);
    CHECK(without.link_length_sum_dm == network.link_length_sum_dm);
}

TEST_CASE("bad sites are named") {
    const RoadGraph& graph = monaco();
    std::vector<NetworkSite> sites = junction_sites(graph, 3, 0);
    sites[1].segment = graph.segment_count() + 5;
    sites[1].id = "harbour";
    CHECK_THROWS_WITH(plan_road_network(graph, sites), Catch::Contains("'harbour'"));
    CHECK(plan_road_network(graph, {sites[0]}).pieces.empty());
}
