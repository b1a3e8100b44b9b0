#include "router/road_network.hpp"

#include "common/input_error.hpp"

#include <algorithm>
#include <functional>
#include <limits>
#include <numeric>
#include <queue>
#include <span>
#include <tuple>
#include <unordered_map>
#include <utility>

namespace ringroad::router {

namespace {

using graph::SegmentId;
using graph::VertexId;

constexpr std::uint64_t kUnreached = std::numeric_limits<std::uint64_t>::max();
constexpr std::size_t kNoSite = std::numeric_limits<std::size_t>::max();
constexpr SegmentId kNoSegment = std::numeric_limits<SegmentId>::max();

// A segment usable in at least one direction, seen as an undirected piece of road.
bool usable(const graph::Segment& segment) {
    return segment.forward_edge != graph::kNoEdge || segment.backward_edge != graph::kNoEdge;
}

// Undirected adjacency over segments: for each vertex, the segments touching it.
class UndirectedRoads {
public:
    explicit UndirectedRoads(const graph::RoadGraph& graph) : first_(graph.vertex_count() + 1, 0) {
        const auto segments = graph.segments();
        for (const graph::Segment& segment : segments) {
            if (!usable(segment)) continue;
            ++first_[segment.first_vertex + 1];
            if (segment.last_vertex != segment.first_vertex) ++first_[segment.last_vertex + 1];
        }
        std::partial_sum(first_.begin(), first_.end(), first_.begin());
        touching_.resize(first_.back());
        std::vector<std::uint32_t> fill(first_.begin(), first_.end() - 1);
        for (SegmentId s = 0; s < segments.size(); ++s) {
            if (!usable(segments[s])) continue;
            touching_[fill[segments[s].first_vertex]++] = s;
            if (segments[s].last_vertex != segments[s].first_vertex) touching_[fill[segments[s].last_vertex]++] = s;
        }
    }
    std::span<const SegmentId> touching(VertexId v) const {
        return std::span<const SegmentId>(touching_).subspan(first_[v], first_[v + 1] - first_[v]);
    }

private:
    std::vector<std::uint32_t> first_;
    std::vector<SegmentId> touching_;
};

VertexId other_end(const graph::Segment& segment, VertexId v) {
    return segment.first_vertex == v ? segment.last_vertex : segment.first_vertex;
}

// The region of each vertex: its nearest site, the distance to it and the segment leading back.
struct SiteRegions {
    std::vector<std::uint64_t> distance;
    std::vector<std::size_t> site;
    std::vector<SegmentId> back_segment;
};

SiteRegions grow_regions(const graph::RoadGraph& graph, const UndirectedRoads& roads,
                         const std::vector<NetworkSite>& sites) {
    const std::size_t vertex_count = graph.vertex_count();
    SiteRegions regions{std::vector<std::uint64_t>(vertex_count, kUnreached),
                        std::vector<std::size_t>(vertex_count, kNoSite),
                        std::vector<SegmentId>(vertex_count, kNoSegment)};
    using Entry = std::pair<std::uint64_t, VertexId>;
    std::priority_queue<Entry, std::vector<Entry>, std::greater<>> queue;
    for (std::size_t i = 0; i < sites.size(); ++i) {
        const VertexId v = sites[i].vertex;
        if (regions.distance[v] == 0) continue;   // two sites on one vertex: the first owns it
        regions.distance[v] = 0;
        regions.site[v] = i;
        queue.push({0, v});
    }
    const auto segments = graph.segments();
    while (!queue.empty()) {
        const auto [distance, v] = queue.top();
        queue.pop();
        if (distance != regions.distance[v]) continue;
        for (const SegmentId s : roads.touching(v)) {
            const VertexId w = other_end(segments[s], v);
            const std::uint64_t through = distance + segments[s].length_dm;
            if (through >= regions.distance[w]) continue;
            regions.distance[w] = through;
            regions.site[w] = regions.site[v];
            regions.back_segment[w] = s;
            queue.push({through, w});
        }
    }
    return regions;
}

class DisjointSets {
public:
    explicit DisjointSets(std::size_t count) : parent_(count) {
        std::iota(parent_.begin(), parent_.end(), std::size_t{0});
    }
    std::size_t find(std::size_t item) {
        while (parent_[item] != item) item = parent_[item] = parent_[parent_[item]];
        return item;
    }
    bool unite(std::size_t a, std::size_t b) {
        a = find(a);
        b = find(b);
        if (a == b) return false;
        parent_[std::max(a, b)] = std::min(a, b);
        return true;
    }

private:
    std::vector<std::size_t> parent_;
};

// A link proposed by a road segment joining two regions: its length and the bridging segment.
struct Bridge {
    std::size_t from_site;
    std::size_t to_site;
    std::uint64_t length_dm;
    SegmentId segment;
};

std::vector<Bridge> cheapest_bridges(const graph::RoadGraph& graph, const SiteRegions& regions) {
    std::unordered_map<std::uint64_t, Bridge> best;
    const auto segments = graph.segments();
    for (SegmentId s = 0; s < segments.size(); ++s) {
        const graph::Segment& segment = segments[s];
        if (!usable(segment)) continue;
        const std::size_t a = regions.site[segment.first_vertex];
        const std::size_t b = regions.site[segment.last_vertex];
        if (a == kNoSite || b == kNoSite || a == b) continue;
        const std::uint64_t length = regions.distance[segment.first_vertex] + segment.length_dm +
                                     regions.distance[segment.last_vertex];
        const std::uint64_t key = (static_cast<std::uint64_t>(std::min(a, b)) << 32) | std::max(a, b);
        const auto found = best.find(key);
        if (found == best.end() || length < found->second.length_dm) best[key] = {a, b, length, s};
    }
    std::vector<Bridge> bridges;
    bridges.reserve(best.size());
    for (const auto& entry : best) bridges.push_back(entry.second);
    std::sort(bridges.begin(), bridges.end(), [](const Bridge& x, const Bridge& y) {
        return std::tie(x.length_dm, x.segment) < std::tie(y.length_dm, y.segment);
    });
    return bridges;
}

void add_path_to_site(const graph::RoadGraph& graph, const SiteRegions& regions, VertexId v,
                      std::vector<SegmentId>& used) {
    while (regions.back_segment[v] != kNoSegment) {
        const SegmentId s = regions.back_segment[v];
        used.push_back(s);
        v = other_end(graph.segments()[s], v);
    }
}

// Spanning tree of the merged paths (Kruskal by length), then prune branches that end at no site.
std::vector<SegmentId> span_and_prune(const graph::RoadGraph& graph, std::vector<SegmentId> used,
                                      const std::vector<NetworkSite>& sites) {
    const auto segments = graph.segments();
    std::sort(used.begin(), used.end(), [&](SegmentId x, SegmentId y) {
        return std::pair(segments[x].length_dm, x) < std::pair(segments[y].length_dm, y);
    });
    used.erase(std::unique(used.begin(), used.end()), used.end());

    std::unordered_map<VertexId, std::size_t> local;
    const auto local_index = [&](VertexId v) { return local.emplace(v, local.size()).first->second; };
    for (const SegmentId s : used) {
        local_index(segments[s].first_vertex);
        local_index(segments[s].last_vertex);
    }
    DisjointSets sets(local.size());
    std::vector<SegmentId> tree;
    for (const SegmentId s : used) {
        if (sets.unite(local.at(segments[s].first_vertex), local.at(segments[s].last_vertex))) tree.push_back(s);
    }

    std::vector<bool> is_site(local.size(), false);
    for (const NetworkSite& site : sites) {
        if (const auto found = local.find(site.vertex); found != local.end()) is_site[found->second] = true;
    }
    std::vector<std::vector<SegmentId>> touching(local.size());
    std::vector<std::size_t> degree(local.size(), 0);
    for (const SegmentId s : tree) {
        for (const VertexId end : {segments[s].first_vertex, segments[s].last_vertex}) {
            touching[local.at(end)].push_back(s);
            ++degree[local.at(end)];
        }
    }
    std::vector<bool> removed(segments.size(), false);
    std::vector<std::size_t> leaves;
    for (std::size_t v = 0; v < local.size(); ++v) {
        if (degree[v] == 1 && !is_site[v]) leaves.push_back(v);
    }
    std::vector<VertexId> vertex_of(local.size());
    for (const auto& [vertex, index] : local) vertex_of[index] = vertex;
    while (!leaves.empty()) {
        const std::size_t leaf = leaves.back();
        leaves.pop_back();
        for (const SegmentId s : touching[leaf]) {
            if (removed[s]) continue;
            removed[s] = true;
            const std::size_t next = local.at(other_end(segments[s], vertex_of[leaf]));
            if (--degree[next] == 1 && !is_site[next]) leaves.push_back(next);
        }
        degree[leaf] = 0;
    }
    std::vector<SegmentId> kept;
    for (const SegmentId s : tree) {
        if (!removed[s]) kept.push_back(s);
    }
    std::sort(kept.begin(), kept.end());
    return kept;
}

void check_sites(const graph::RoadGraph& graph, const std::vector<NetworkSite>& sites) {
    for (const NetworkSite& site : sites) {
        if (site.vertex >= graph.vertex_count()) {
            throw InputError("site '" + site.id + "' is not on the road graph (vertex " +
                             std::to_string(site.vertex) + " out of range)");
        }
    }
}

} // namespace

RoadNetwork plan_road_network(const graph::RoadGraph& graph, const std::vector<NetworkSite>& sites) {
    check_sites(graph, sites);
    RoadNetwork network;
    if (sites.size() < 2) return network;
    const UndirectedRoads roads(graph);
    const SiteRegions regions = grow_regions(graph, roads, sites);

    // Two sites on one vertex are joined by a link of length 0.
    DisjointSets joined(sites.size());
    for (std::size_t i = 0; i < sites.size(); ++i) {
        const std::size_t owner = regions.site[sites[i].vertex];
        if (owner != i && joined.unite(owner, i)) network.links.push_back({owner, i, 0});
    }
    std::vector<SegmentId> used;
    for (const Bridge& bridge : cheapest_bridges(graph, regions)) {
        if (!joined.unite(bridge.from_site, bridge.to_site)) continue;
        network.links.push_back({bridge.from_site, bridge.to_site, bridge.length_dm});
        network.link_length_sum_dm += bridge.length_dm;
        const graph::Segment& segment = graph.segments()[bridge.segment];
        used.push_back(bridge.segment);
        add_path_to_site(graph, regions, segment.first_vertex, used);
        add_path_to_site(graph, regions, segment.last_vertex, used);
    }
    for (std::size_t i = 1; i < sites.size(); ++i) {
        if (joined.find(i) != joined.find(0)) {
            throw InputError("site '" + sites[i].id + "' cannot be joined to site '" + sites[0].id +
                             "': no road connects them");
        }
    }
    network.segments = span_and_prune(graph, std::move(used), sites);
    for (const SegmentId s : network.segments) network.road_length_dm += graph.segments()[s].length_dm;
    return network;
}

} // namespace ringroad::router
