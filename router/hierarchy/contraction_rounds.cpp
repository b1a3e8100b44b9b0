#include "router/hierarchy/contraction_rounds.hpp"

#include "common/progress.hpp"
#include "router/hierarchy/contraction_graph.hpp"
#include "router/hierarchy/contraction_witness_search.hpp"

#include <algorithm>
#include <atomic>
#include <memory>
#include <thread>

namespace ringroad::router::hierarchy {

namespace {

// Witness searches when contracting, and the cheaper ones that estimate a priority.
// Measured with bench/router/hierarchy/hierarchy_build_bench.cpp --synth (invented regions, seed 1). When
// contracting, 1000 settled nodes: a search stops as soon as every target has its answer, so a
// high limit costs little, and the witnesses it finds keep the core sparse; at 100,000 junctions
// (distance metric) 1000 gave 4% fewer shortcuts than 100 and took 22% less CPU time (the
// denser core made every later search dearer); 4000 gave no further gain. When estimating a
// priority, 40 settled nodes, 3 arcs deep: against 20 nodes, 3% fewer shortcuts and an 8%
// smaller upward search space for 4% more CPU time (same region and metric). At 200,000
// junctions 60 nodes 4 arcs deep gave 2% fewer shortcuts, a 9% smaller search space in the
// distance metric (none in the time metric) for 12-27% more CPU time; 100 nodes 5 arcs deep an
// 11% smaller one in the distance metric but a 5% larger one in the time metric, for 40-50% more.
// (On the 300 x 300 grid, with 100 settled nodes when contracting, 30 nodes when estimating
// gave an average upward search space of 104 for 24.8 s of CPU, 20 nodes 107 for 21.8 s, 10
// nodes 114 for 18 s; 2 arcs deep gave 10% more shortcuts on the 150 x 150 grid.)
constexpr WitnessLimits kContractLimits{1000, 64};
constexpr WitnessLimits kEstimateLimits{40, 3};
// Re-estimating a priority after a neighbour's contraction simulates the node's contraction
// again only when it is cheap (at most this many in x out pairs) or when the node's arc count
// moved by more than 1/kDegreeChangeFraction since its last simulation; otherwise the last
// simulation's shortcut count is reused with the fresh arc count, contracted neighbours and depth.
// In the dense core of a large region a round contracts only a handful of nodes while hundreds
// of neighbours of degree 100 or more would be simulated again at a cost of in x out searches:
// at 100,000 junctions (distance metric) the last 1000 of 226,713 nodes took 25 of the 32 s of
// re-estimation.
constexpr std::uint64_t kAlwaysSimulatePairs = 256;
constexpr std::uint32_t kDegreeChangeFraction = 16;
// Priority = weights . (edge difference, contracted neighbours, depth) (Geisberger et al. 2008).
// Measured with hierarchy_build_bench --synth (seed 1), against the former weights 2, 1, 1:
// 3, 1, 1 gave 2-5% fewer shortcuts, a 2-3% smaller upward search space at 100,000 and 200,000
// junctions (the same at 20,000) and a slightly faster build. Without the contracted neighbours
// (3, 0, 1 or 2, 0, 1) there were 2-4% fewer shortcuts still, but the time metric's search space
// grew by 4-8% at 20,000 or 100,000 junctions; 2 x depth gave more shortcuts.
constexpr std::int64_t kEdgeDifferenceWeight = 3;
constexpr std::int64_t kContractedNeighbourWeight = 1;
constexpr std::int64_t kDepthWeight = 1;
// Work items per chunk of a parallel phase: a function of the item count only, so results never
// depend on the thread count. Up to 64 items; fewer when there are few, since a round in the
// dense core contracts a handful of nodes whose witness searches are the dearest of the build
// (one chunk of 64 left one core idle: at 1,000,000 junctions the distance build took 410 s of
// CPU for 327 s of wall time on 2 cores).
constexpr std::size_t kMaxChunkSize = 64;
std::size_t chunk_size(std::size_t count) { return std::clamp<std::size_t>(count / 64, 1, kMaxChunkSize); }

// Runs body(worker, chunk, begin, end) over [0, count) in chunks of chunk_size(count) on
// `threads` threads; `worker` < threads names the caller's private workspace.
template <typename Body>
void for_each_chunk(std::size_t count, unsigned threads, Body body) {
    static_assert(std::is_invocable_v<Body&, unsigned, std::size_t, std::size_t, std::size_t>);
    const std::size_t size = chunk_size(count);
    const std::size_t chunks = (count + size - 1) / size;
    const unsigned workers = static_cast<unsigned>(std::min<std::size_t>(threads, chunks));
    std::atomic<std::size_t> next{0};
    const auto work = [&](unsigned worker) {
        for (std::size_t chunk = next++; chunk < chunks; chunk = next++) {
            body(worker, chunk, chunk * size, std::min(count, (chunk + 1) * size));
        }
    };
    if (workers <= 1) {
        work(0);
        return;
    }
    std::vector<std::thread> pool;
    for (unsigned worker = 1; worker < workers; ++worker) pool.emplace_back(work, worker);
    work(0);
    for (std::thread& thread : pool) thread.join();
}

// A fixed scramble of node ids breaks priority ties without favouring one corner of the map.
std::uint32_t tie_breaker(NodeId node) {
    std::uint32_t x = node * 0x9E3779B1u;
    x ^= x >> 15;
    x *= 0x85EBCA77u;
    x ^= x >> 13;
    return x;
}

struct Shortcut {
    NodeId from;
    NodeId to;
    PackedWeight weight;
    NodeId middle;
};

// What one chunk of a round produced, applied in chunk order.
struct ChunkResult {
    std::vector<Shortcut> shortcuts;
    std::vector<HierarchyArc> upward_arcs;   // of the chunk's nodes, in order
    std::vector<std::uint32_t> upward_counts;
};

class RoundContractor {
public:
    RoundContractor(const RoutingGraph& routing_graph, Metric metric, unsigned threads)
        : graph_(routing_graph, metric), node_count_(routing_graph.node_count()), threads_(threads) {
        priority_.assign(node_count_, 0);
        contracted_neighbours_.assign(node_count_, 0);
        depth_.assign(node_count_, 0);
        round_position_.assign(node_count_, AvoidRoundFrom::kNotInRound);
        touched_.assign(node_count_, 0);
        neighbour_mark_.assign(node_count_, 0);
        rank_.assign(node_count_, 0);
        upward_begin_.assign(node_count_, 0);
        upward_count_.assign(node_count_, 0);
        simulated_shortcuts_.assign(node_count_, 0);
        simulated_degree_.assign(node_count_, kNeverSimulated);
        for (unsigned worker = 0; worker < threads_; ++worker) searches_.push_back(std::make_unique<WitnessSearch>(node_count_));
        sorted_out_.resize(threads_);
    }

    ContractedGraph run(Progress* progress) {
        if (progress) progress->phase("hierarchy: ordering");
        remaining_.resize(node_count_);
        for (NodeId node = 0; node < node_count_; ++node) remaining_[node] = node;
        estimate_priorities(remaining_);
        if (progress) progress->phase("hierarchy: contracting");
        std::uint32_t next_rank = 0;
        while (!remaining_.empty()) {
            const std::vector<NodeId> round = select_round();
            next_rank = contract_round(round, next_rank);
            std::erase_if(remaining_, [&](NodeId node) { return round_position_[node] == kContracted; });
            if (progress) progress->update(static_cast<double>(next_rank) / node_count_);
        }
        if (progress) progress->finish();
        // The stored arrays are assembled next; at 3 million nodes the dynamic graph and the
        // search workspaces would add about a gigabyte to that peak.
        graph_.release_memory();
        searches_.clear();
        return assemble();
    }

private:
    static constexpr std::uint32_t kContracted = AvoidRoundFrom::kNotInRound + 1;
    static constexpr std::uint32_t kNeverSimulated = 0xFFFFFFFFu;

    bool precedes(NodeId a, NodeId b) const {
        if (priority_[a] != priority_[b]) return priority_[a] < priority_[b];
        const std::uint32_t tie_a = tie_breaker(a), tie_b = tie_breaker(b);
        return tie_a != tie_b ? tie_a < tie_b : a < b;
    }

    // Calls on_shortcut(from, to, weight) for every pair u -> node -> w with no witness.
    template <typename Avoid, typename OnShortcut>
    void find_shortcuts(NodeId node, const Avoid& avoid, WitnessSearch& search, const WitnessLimits& limits,
                        OnShortcut on_shortcut) const {
        const std::span<const ContractionArc> incoming = graph_.in(node);
        const std::span<const ContractionArc> outgoing = graph_.out(node);
        if (incoming.empty() || outgoing.empty()) return;
        for (const ContractionArc& in_arc : incoming) {
            // A lone target that is the source itself needs no search.
            if (outgoing.size() == 1 && outgoing[0].other == in_arc.other) continue;
            search.run(graph_, in_arc.other, in_arc.weight, outgoing, avoid, limits);
            for (const ContractionArc& out_arc : outgoing) {
                if (out_arc.other == in_arc.other) continue;
                const PackedWeight through = in_arc.weight + out_arc.weight;
                // A sum past 2^64 breaks the packed-weight contract (router/metric.hpp); such a
                // path is never a shortest one, and a wrapped weight would undercut real ones.
                if (through < in_arc.weight) continue;
                if (search.distance(out_arc.other) <= through) continue;
                on_shortcut(in_arc.other, out_arc.other, through);
            }
        }
    }

    // Whether the node's shortcuts must be counted again (see kAlwaysSimulatePairs).
    bool needs_simulation(NodeId node) const {
        const std::uint32_t degree = static_cast<std::uint32_t>(graph_.in(node).size() + graph_.out(node).size());
        const std::uint32_t before = simulated_degree_[node];
        if (before == kNeverSimulated) return true;
        if (std::uint64_t{graph_.in(node).size()} * graph_.out(node).size() <= kAlwaysSimulatePairs) return true;
        const std::uint32_t change = before > degree ? before - degree : degree - before;
        return std::uint64_t{change} * kDegreeChangeFraction > before;
    }

    // Writes only the node's own entries: nodes are estimated in parallel.
    std::int64_t estimate_priority(NodeId node, WitnessSearch& search) {
        const auto removed = static_cast<std::int64_t>(graph_.in(node).size() + graph_.out(node).size());
        if (needs_simulation(node)) {
            std::uint32_t found = 0;
            const AvoidNode avoid{node};
            find_shortcuts(node, avoid, search, kEstimateLimits, [&](NodeId, NodeId, PackedWeight) { ++found; });
            simulated_shortcuts_[node] = found;
            simulated_degree_[node] = static_cast<std::uint32_t>(removed);
        }
        const std::int64_t shortcuts = simulated_shortcuts_[node];
        return kEdgeDifferenceWeight * (shortcuts - removed) + kContractedNeighbourWeight * contracted_neighbours_[node] +
               kDepthWeight * depth_[node];
    }

    void estimate_priorities(const std::vector<NodeId>& nodes) {
        for_each_chunk(nodes.size(), threads_, [&](unsigned worker, std::size_t, std::size_t begin, std::size_t end) {
            for (std::size_t i = begin; i < end; ++i) priority_[nodes[i]] = estimate_priority(nodes[i], *searches_[worker]);
        });
    }

    // Whether `node` precedes all its remaining neighbours.
    bool is_local_minimum(NodeId node) const {
        for (const ContractionArc& arc : graph_.out(node)) {
            if (!precedes(node, arc.other)) return false;
        }
        for (const ContractionArc& arc : graph_.in(node)) {
            if (!precedes(node, arc.other)) return false;
        }
        return true;
    }

    // The remaining nodes that precede all their neighbours, in the order of remaining_.
    // (Re-estimating only the nodes that look like minima, with the neighbours of a round left
    // stale, took 15% less time on the 150 x 150 grid but 34% more upward search space.)
    std::vector<NodeId> select_round() {
        std::vector<std::uint8_t> chosen(remaining_.size(), 0);
        for_each_chunk(remaining_.size(), threads_, [&](unsigned, std::size_t, std::size_t begin, std::size_t end) {
            for (std::size_t i = begin; i < end; ++i) chosen[i] = is_local_minimum(remaining_[i]);
        });
        std::vector<NodeId> round;
        for (std::size_t i = 0; i < remaining_.size(); ++i) {
            if (chosen[i]) round.push_back(remaining_[i]);
        }
        return round;
    }

    // The node's arcs, all towards higher nodes now, as stored upward arcs: an out-arc and an
    // in-arc with the same other end, weight and middle become one arc usable both ways.
    void record_upward_arcs(NodeId node, std::vector<std::pair<NodeId, std::uint32_t>>& sorted_out,
                            ChunkResult& result) const {
        const std::size_t first = result.upward_arcs.size();
        sorted_out.clear();
        for (const ContractionArc& arc : graph_.out(node)) {
            sorted_out.push_back({arc.other, static_cast<std::uint32_t>(result.upward_arcs.size())});
            result.upward_arcs.push_back({arc.other, arc.middle, arc.weight, kArcForward});
        }
        std::sort(sorted_out.begin(), sorted_out.end());
        for (const ContractionArc& arc : graph_.in(node)) {
            const auto found = std::lower_bound(sorted_out.begin(), sorted_out.end(), std::pair<NodeId, std::uint32_t>{arc.other, 0});
            if (found != sorted_out.end() && found->first == arc.other) {
                HierarchyArc& forward = result.upward_arcs[found->second];
                if (forward.weight == arc.weight && forward.middle_node == arc.middle) {
                    forward.directions |= kArcBackward;
                    continue;
                }
            }
            result.upward_arcs.push_back({arc.other, arc.middle, arc.weight, kArcBackward});
        }
        result.upward_counts.push_back(static_cast<std::uint32_t>(result.upward_arcs.size() - first));
    }

    std::uint32_t contract_round(const std::vector<NodeId>& round, std::uint32_t next_rank) {
        for (std::size_t i = 0; i < round.size(); ++i) round_position_[round[i]] = static_cast<std::uint32_t>(i);
        const std::size_t size = chunk_size(round.size());
        std::vector<ChunkResult> results((round.size() + size - 1) / size);
        for_each_chunk(round.size(), threads_, [&](unsigned worker, std::size_t chunk, std::size_t begin, std::size_t end) {
            ChunkResult& result = results[chunk];
            for (std::size_t i = begin; i < end; ++i) {
                const NodeId node = round[i];
                const AvoidRoundFrom avoid{static_cast<std::uint32_t>(i), round_position_.data()};
                find_shortcuts(node, avoid, *searches_[worker], kContractLimits, [&](NodeId from, NodeId to, PackedWeight weight) {
                    result.shortcuts.push_back({from, to, weight, node});
                });
                record_upward_arcs(node, sorted_out_[worker], result);
            }
        });
        // Apply in chunk order: ranks and upward arcs, then neighbour terms, removal, shortcuts.
        std::vector<NodeId> neighbours;
        for (std::size_t chunk = 0; chunk < results.size(); ++chunk) {
            const ChunkResult& result = results[chunk];
            std::size_t arc = 0;
            for (std::size_t k = 0; k < result.upward_counts.size(); ++k) {
                const NodeId node = round[chunk * size + k];
                rank_[node] = next_rank++;
                upward_begin_[node] = upward_arcs_.size();
                upward_count_[node] = result.upward_counts[k];
                upward_arcs_.insert(upward_arcs_.end(), result.upward_arcs.begin() + static_cast<std::ptrdiff_t>(arc),
                                    result.upward_arcs.begin() + static_cast<std::ptrdiff_t>(arc + result.upward_counts[k]));
                arc += result.upward_counts[k];
            }
        }
        ++touch_stamp_;
        for (NodeId node : round) {
            const auto visit = [&](NodeId neighbour) {
                ++contracted_neighbours_[neighbour];
                depth_[neighbour] = std::max(depth_[neighbour], depth_[node] + 1);
                if (touched_[neighbour] != touch_stamp_) {
                    touched_[neighbour] = touch_stamp_;
                    neighbours.push_back(neighbour);
                }
            };
            // A node both before and after this one counts once.
            ++neighbour_stamp_;
            for (const ContractionArc& arc : graph_.out(node)) {
                neighbour_mark_[arc.other] = neighbour_stamp_;
                visit(arc.other);
            }
            for (const ContractionArc& arc : graph_.in(node)) {
                if (neighbour_mark_[arc.other] != neighbour_stamp_) visit(arc.other);
            }
        }
        for (NodeId node : round) {
            graph_.remove_node(node);
            round_position_[node] = kContracted;
        }
        for (const ChunkResult& result : results) {
            for (const Shortcut& shortcut : result.shortcuts) graph_.add_or_improve(shortcut.from, shortcut.to, shortcut.weight, shortcut.middle);
        }
        results.clear();
        estimate_priorities(neighbours);
        return next_rank;
    }

    ContractedGraph assemble() {
        ContractedGraph result;
        result.rank = std::move(rank_);
        result.first_arc.assign(std::size_t{node_count_} + 1, 0);
        for (NodeId node = 0; node < node_count_; ++node) result.first_arc[node + 1] = result.first_arc[node] + upward_count_[node];
        result.arcs.resize(result.first_arc.back());
        for (NodeId node = 0; node < node_count_; ++node) {
            std::copy_n(upward_arcs_.begin() + static_cast<std::ptrdiff_t>(upward_begin_[node]), upward_count_[node],
                        result.arcs.begin() + result.first_arc[node]);
        }
        std::vector<HierarchyArc>().swap(upward_arcs_);
        return result;
    }

    ContractionGraph graph_;
    std::uint32_t node_count_;
    unsigned threads_;
    std::vector<std::int64_t> priority_;
    std::vector<std::uint32_t> contracted_neighbours_;
    std::vector<std::uint32_t> depth_;
    // Shortcuts found by the node's last simulated contraction, and its arc count then.
    std::vector<std::uint32_t> simulated_shortcuts_;
    std::vector<std::uint32_t> simulated_degree_;
    // Position in the current round, AvoidRoundFrom::kNotInRound, or kContracted.
    std::vector<std::uint32_t> round_position_;
    std::vector<std::uint32_t> touched_;
    std::uint32_t touch_stamp_ = 0;
    std::vector<std::uint32_t> neighbour_mark_;
    std::uint32_t neighbour_stamp_ = 0;
    std::vector<NodeId> remaining_;
    std::vector<std::uint32_t> rank_;
    std::vector<std::uint64_t> upward_begin_;
    std::vector<std::uint32_t> upward_count_;
    std::vector<HierarchyArc> upward_arcs_;   // in contraction order
    std::vector<std::unique_ptr<WitnessSearch>> searches_;
    std::vector<std::vector<std::pair<NodeId, std::uint32_t>>> sorted_out_;
};

} // namespace

ContractedGraph contract_in_rounds(const RoutingGraph& routing_graph, Metric metric, unsigned threads, Progress* progress) {
    if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
    RoundContractor contractor(routing_graph, metric, threads);
    return contractor.run(progress);
}

} // namespace ringroad::router::hierarchy
