#include "router/road_network.hpp"

#include "planners/networks/disjoint_sets.hpp"

#include "common/input_error.hpp"

#include <algorithm>
#include <cmath>
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

using planners::networks::DisjointSets;
using graph::SegmentId;
using graph::VertexId;
using PointId = std::uint32_t;   // a graph vertex, or vertex_count + site index
using PieceId = std::uint32_t;

constexpr std::uint64_t kUnreached = std::numeric_limits<std::uint64_t>::max();
constexpr std::size_t kNoSite = std::numeric_limits<std::size_t>::max();
constexpr PieceId kNoPiece = std::numeric_limits<PieceId>::max();

bool usable(const graph::Segment& segment) {
    return segment.forward_edge != graph::kNoEdge || segment.backward_edge != graph::kNoEdge;
}

std::int64_t position_dm(const graph::Segment& segment, double fraction) {
    return std::llround(fraction * segment.length_dm);
}

struct Piece {
    PointId first;      // at from_fraction
    PointId last;       // at to_fraction
    NetworkPiece road;
};

// The road as undirected pieces: whole segments, and segments split at the sites they hold.
class PieceGraph {
public:
    PieceGraph(const graph::RoadGraph& graph, const std::vector<NetworkSite>& sites)
        : vertex_count_(graph.vertex_count()), site_count_(sites.size()) {
        std::unordered_map<SegmentId, std::vector<std::size_t>> sites_on;
        for (std::size_t i = 0; i < sites.size(); ++i) sites_on[sites[i].segment].push_back(i);
        const auto segments = graph.segments();
        for (SegmentId s = 0; s < segments.size(); ++s) {
            if (!usable(segments[s])) continue;
            const auto found = sites_on.find(s);
            if (found == sites_on.end()) {
                add(segments[s].first_vertex, segments[s].last_vertex, {s, 0.0, 1.0, segments[s].length_dm});
            } else {
                split(segments[s], s, found->second, sites);
            }
        }
        index_touching();
    }

    std::size_t point_count() const { return first_touching_.size() - 1; }
    PointId site_point(std::size_t site) const { return vertex_count_ + static_cast<PointId>(site); }
    bool is_site(PointId point) const { return point >= vertex_count_; }
    const Piece& piece(PieceId id) const { return pieces_[id]; }
    std::size_t piece_count() const { return pieces_.size(); }
    std::span<const PieceId> touching(PointId point) const {
        return std::span<const PieceId>(touching_).subspan(first_touching_[point],
                                                            first_touching_[point + 1] - first_touching_[point]);
    }
    PointId other_end(PieceId id, PointId point) const {
        return pieces_[id].first == point ? pieces_[id].last : pieces_[id].first;
    }

private:
    void add(PointId first, PointId last, NetworkPiece road) { pieces_.push_back({first, last, road}); }

    void split(const graph::Segment& segment, SegmentId s, std::vector<std::size_t> on_segment,
               const std::vector<NetworkSite>& sites) {
        std::sort(on_segment.begin(), on_segment.end(), [&](std::size_t a, std::size_t b) {
            return std::pair(sites[a].fraction, a) < std::pair(sites[b].fraction, b);
        });
        PointId previous = segment.first_vertex;
        double previous_fraction = 0.0;
        for (const std::size_t site : on_segment) {
            const double fraction = sites[site].fraction;
            add(previous, site_point(site), {s, previous_fraction, fraction, length(segment, previous_fraction, fraction)});
            previous = site_point(site);
            previous_fraction = fraction;
        }
        add(previous, segment.last_vertex, {s, previous_fraction, 1.0, length(segment, previous_fraction, 1.0)});
    }

    static std::uint32_t length(const graph::Segment& segment, double from, double to) {
        return static_cast<std::uint32_t>(position_dm(segment, to) - position_dm(segment, from));
    }

    void index_touching() {
        const std::size_t points = vertex_count_ + site_count_;
        first_touching_.assign(points + 1, 0);
        for (const Piece& p : pieces_) {
            ++first_touching_[p.first + 1];
            if (p.last != p.first) ++first_touching_[p.last + 1];
        }
        std::partial_sum(first_touching_.begin(), first_touching_.end(), first_touching_.begin());
        touching_.resize(first_touching_.back());
        std::vector<std::uint32_t> fill(first_touching_.begin(), first_touching_.end() - 1);
        for (PieceId id = 0; id < pieces_.size(); ++id) {
            touching_[fill[pieces_[id].first]++] = id;
            if (pieces_[id].last != pieces_[id].first) touching_[fill[pieces_[id].last]++] = id;
        }
    }

    PointId vertex_count_;
    std::size_t site_count_;
    std::vector<Piece> pieces_;
    std::vector<std::uint32_t> first_touching_;
    std::vector<PieceId> touching_;
};

// The region of each point: its nearest site, the distance to it and the piece leading back.
struct SiteRegions {
    std::vector<std::uint64_t> distance;
    std::vector<std::size_t> site;
    std::vector<PieceId> back_piece;
};

SiteRegions grow_regions(const PieceGraph& roads, std::size_t site_count) {
    const std::size_t points = roads.point_count();
    SiteRegions regions{std::vector<std::uint64_t>(points, kUnreached), std::vector<std::size_t>(points, kNoSite),
                        std::vector<PieceId>(points, kNoPiece)};
    using Entry = std::pair<std::uint64_t, PointId>;
    std::priority_queue<Entry, std::vector<Entry>, std::greater<>> queue;
    for (std::size_t i = 0; i < site_count; ++i) {
        const PointId point = roads.site_point(i);
        regions.distance[point] = 0;
        regions.site[point] = i;
        queue.push({0, point});
    }
    while (!queue.empty()) {
        const auto [distance, point] = queue.top();
        queue.pop();
        if (distance != regions.distance[point]) continue;
        for (const PieceId id : roads.touching(point)) {
            const PointId next = roads.other_end(id, point);
            const std::uint64_t through = distance + roads.piece(id).road.length_dm;
            if (through >= regions.distance[next]) continue;
            regions.distance[next] = through;
            regions.site[next] = regions.site[point];
            regions.back_piece[next] = id;
            queue.push({through, next});
        }
    }
    return regions;
}


// A link proposed by a piece joining two regions: its length and the bridging piece.
struct Bridge {
    std::size_t from_site;
    std::size_t to_site;
    std::uint64_t length_dm;
    PieceId piece;
};

std::vector<Bridge> cheapest_bridges(const PieceGraph& roads, const SiteRegions& regions) {
    std::unordered_map<std::uint64_t, Bridge> best;
    for (PieceId id = 0; id < roads.piece_count(); ++id) {
        const Piece& piece = roads.piece(id);
        const std::size_t a = regions.site[piece.first];
        const std::size_t b = regions.site[piece.last];
        if (a == kNoSite || b == kNoSite || a == b) continue;
        const std::uint64_t length = regions.distance[piece.first] + piece.road.length_dm + regions.distance[piece.last];
        const std::uint64_t key = (static_cast<std::uint64_t>(std::min(a, b)) << 32) | std::max(a, b);
        const auto found = best.find(key);
        if (found == best.end() || std::pair(length, id) < std::pair(found->second.length_dm, found->second.piece)) {
            best[key] = {a, b, length, id};
        }
    }
    std::vector<Bridge> bridges;
    bridges.reserve(best.size());
    for (const auto& entry : best) bridges.push_back(entry.second);
    std::sort(bridges.begin(), bridges.end(), [](const Bridge& x, const Bridge& y) {
        return std::tie(x.length_dm, x.piece) < std::tie(y.length_dm, y.piece);
    });
    return bridges;
}

void add_path_to_site(const PieceGraph& roads, const SiteRegions& regions, PointId point, std::vector<PieceId>& used) {
    while (regions.back_piece[point] != kNoPiece) {
        const PieceId id = regions.back_piece[point];
        used.push_back(id);
        point = roads.other_end(id, point);
    }
}

// Spanning tree of the merged paths (Kruskal by length), then prune branches that end at no site.
std::vector<PieceId> span_and_prune(const PieceGraph& roads, std::vector<PieceId> used) {
    const auto by_length = [&](PieceId x, PieceId y) {
        return std::pair(roads.piece(x).road.length_dm, x) < std::pair(roads.piece(y).road.length_dm, y);
    };
    std::sort(used.begin(), used.end(), by_length);
    used.erase(std::unique(used.begin(), used.end()), used.end());

    std::unordered_map<PointId, std::size_t> local;
    const auto local_index = [&](PointId p) { return local.emplace(p, local.size()).first->second; };
    for (const PieceId id : used) {
        local_index(roads.piece(id).first);
        local_index(roads.piece(id).last);
    }
    DisjointSets sets(local.size());
    std::vector<std::vector<PieceId>> touching(local.size());
    std::vector<std::size_t> degree(local.size(), 0);
    std::vector<PieceId> tree;
    for (const PieceId id : used) {
        const std::size_t a = local.at(roads.piece(id).first);
        const std::size_t b = local.at(roads.piece(id).last);
        if (!sets.unite(a, b)) continue;
        tree.push_back(id);
        for (const std::size_t end : {a, b}) {
            touching[end].push_back(id);
            ++degree[end];
        }
    }
    std::vector<PointId> point_of(local.size());
    for (const auto& [point, index] : local) point_of[index] = point;
    std::vector<bool> removed(roads.piece_count(), false);
    std::vector<std::size_t> leaves;
    for (std::size_t v = 0; v < local.size(); ++v) {
        if (degree[v] == 1 && !roads.is_site(point_of[v])) leaves.push_back(v);
    }
    while (!leaves.empty()) {
        const std::size_t leaf = leaves.back();
        leaves.pop_back();
        for (const PieceId id : touching[leaf]) {
            if (removed[id]) continue;
            removed[id] = true;
            const std::size_t next = local.at(roads.other_end(id, point_of[leaf]));
            if (--degree[next] == 1 && !roads.is_site(point_of[next])) leaves.push_back(next);
        }
    }
    std::vector<PieceId> kept;
    for (const PieceId id : tree) {
        if (!removed[id]) kept.push_back(id);
    }
    return kept;
}

void check_sites(const graph::RoadGraph& graph, const std::vector<NetworkSite>& sites) {
    for (const NetworkSite& site : sites) {
        if (site.segment >= graph.segment_count() || !usable(graph.segments()[site.segment])) {
            throw InputError("site '" + site.id + "' is not on a usable road segment (segment " +
                             std::to_string(site.segment) + ")");
        }
        if (!(site.fraction >= 0.0 && site.fraction <= 1.0)) {
            throw InputError("site '" + site.id + "': position along its segment must be within [0, 1]");
        }
    }
}

// A site splits its segment for the search; where the network runs on through the site, the two
// stretches become one piece again (lengths add exactly: both use rounded positions).
void merge_touching_pieces(std::vector<NetworkPiece>& pieces) {
    std::vector<NetworkPiece> merged;
    for (const NetworkPiece& piece : pieces) {
        if (!merged.empty() && merged.back().segment == piece.segment && merged.back().to_fraction == piece.from_fraction) {
            merged.back().to_fraction = piece.to_fraction;
            merged.back().length_dm += piece.length_dm;
        } else {
            merged.push_back(piece);
        }
    }
    pieces = std::move(merged);
}

} // namespace

std::vector<graph::SegmentId> RoadNetwork::segments() const {
    std::vector<graph::SegmentId> ids;
    for (const NetworkPiece& piece : pieces) ids.push_back(piece.segment);
    std::sort(ids.begin(), ids.end());
    ids.erase(std::unique(ids.begin(), ids.end()), ids.end());
    return ids;
}

RoadNetwork plan_road_network(const graph::RoadGraph& graph, const std::vector<NetworkSite>& sites) {
    check_sites(graph, sites);
    RoadNetwork network;
    if (sites.size() < 2) return network;
    const PieceGraph roads(graph, sites);
    const SiteRegions regions = grow_regions(roads, sites.size());

    DisjointSets joined(sites.size());
    std::vector<PieceId> used;
    for (const Bridge& bridge : cheapest_bridges(roads, regions)) {
        if (!joined.unite(bridge.from_site, bridge.to_site)) continue;
        network.links.push_back({bridge.from_site, bridge.to_site, bridge.length_dm});
        network.link_length_sum_dm += bridge.length_dm;
        used.push_back(bridge.piece);
        add_path_to_site(roads, regions, roads.piece(bridge.piece).first, used);
        add_path_to_site(roads, regions, roads.piece(bridge.piece).last, used);
    }
    for (std::size_t i = 1; i < sites.size(); ++i) {
        if (joined.find(i) != joined.find(0)) {
            throw InputError("site '" + sites[i].id + "' cannot be joined to site '" + sites[0].id +
                             "': no road connects them");
        }
    }
    for (const PieceId id : span_and_prune(roads, std::move(used))) {
        // A site exactly at a junction is joined to it by an empty piece: nothing to lay.
        if (roads.piece(id).road.from_fraction == roads.piece(id).road.to_fraction) continue;
        network.pieces.push_back(roads.piece(id).road);
        network.road_length_dm += roads.piece(id).road.length_dm;
    }
    std::sort(network.pieces.begin(), network.pieces.end(), [](const NetworkPiece& x, const NetworkPiece& y) {
        return std::pair(x.segment, x.from_fraction) < std::pair(y.segment, y.from_fraction);
    });
    merge_touching_pieces(network.pieces);
    return network;
}

} // namespace ringroad::router
