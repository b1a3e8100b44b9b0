#pragma once
// WitnessSearch: the bounded Dijkstra a contraction runs from each in-neighbour u of a node v to
// learn whether a path u -> w avoiding v is at most as cheap as u -> v -> w (a "witness", which
// makes the shortcut unnecessary). It stops as soon as every target w has its answer (reached at
// most as cheaply as u -> v -> w, or settled dearer), when no label within the dearest such path
// is left, after a number of settled nodes, and it does not continue from nodes that are a
// number of arcs from u (hop limit). Stopping at a limit can only miss a witness, which adds a
// needless shortcut, never a wrong distance.
// Nodes the search must not pass through are told by a rule (AvoidNode, AvoidRoundFrom). A
// workspace is reused between searches (stamped labels) and belongs to one thread.

#include "router/hierarchy/contraction_graph.hpp"

#include <algorithm>
#include <cstdint>
#include <span>
#include <type_traits>
#include <vector>

namespace ringroad::router::hierarchy {

struct WitnessLimits {
    std::uint32_t settled_nodes;
    std::uint32_t hops;
};

// A witness must avoid the node whose contraction is simulated.
struct AvoidNode {
    NodeId node;
    bool excludes(NodeId other) const { return other == node; }
};

// When a round contracts an independent set at once, a witness for the node at `position` in
// the round must also avoid the nodes of the round at or after that position
// (round_position[x] >= kNotInRound for nodes outside the round). A witness through an earlier
// node of the round stays valid: that node's own contraction keeps its paths (by a shortcut or a
// witness that, in turn, avoids every node from its position on, so never relies on this one).
struct AvoidRoundFrom {
    static constexpr std::uint32_t kNotInRound = 0xFFFFFFF0u;
    std::uint32_t position;
    const std::uint32_t* round_position;   // per node
    bool excludes(NodeId other) const {
        const std::uint32_t at = round_position[other];
        return at >= position && at < kNotInRound;
    }
};

class WitnessSearch {
public:
    explicit WitnessSearch(std::uint32_t node_count) : labels_(node_count, Label{kUnreachableWeight, 0, 0, 0}) {}

    // Searches from `source`, an in-neighbour reaching the avoided node at `source_weight`, until
    // every target (an out-neighbour w of the avoided node, other than the source) is decided:
    // reached at most as cheaply as source_weight + the target's weight (a witness), or settled
    // dearer; or until a limit is reached. distance(w) then is at most the path through the
    // avoided node exactly when a witness was found.
    template <typename Avoid>
    void run(const ContractionGraph& graph, NodeId source, PackedWeight source_weight,
             std::span<const ContractionArc> targets, const Avoid& avoid, const WitnessLimits& limits);
    PackedWeight distance(NodeId node) const { return labels_[node].stamp == query_ ? labels_[node].distance : kUnreachableWeight; }

private:
    // One record per node, read in one access: its label, the query it belongs to, whether it is
    // a still undecided target of the current query and that target's bound. (A 16-byte record
    // with the bounds kept apart measured no faster at 200,000 junctions.)
    struct Label {
        PackedWeight distance;
        std::uint32_t stamp;
        std::uint32_t target_stamp;
        PackedWeight target_bound;   // for a target: the weight of the path through the avoided node
    };
    struct HeapEntry {
        PackedWeight weight;
        NodeId node;
        std::uint32_t hops;
    };
    struct Later {
        bool operator()(const HeapEntry& a, const HeapEntry& b) const { return a.weight > b.weight; }
    };
    // Marks the targets and returns the weight beyond which no label can help.
    PackedWeight start(NodeId source, PackedWeight source_weight, std::span<const ContractionArc> targets,
                       std::uint32_t& targets_left);

    std::vector<Label> labels_;
    std::uint32_t query_ = 0;
    std::vector<HeapEntry> heap_;
};

template <typename Avoid>
void WitnessSearch::run(const ContractionGraph& graph, NodeId source, PackedWeight source_weight,
                        std::span<const ContractionArc> targets, const Avoid& avoid, const WitnessLimits& limits) {
    static_assert(std::is_invocable_r_v<bool, decltype(&Avoid::excludes), const Avoid&, NodeId>);
    std::uint32_t targets_left = 0;
    const PackedWeight bound = start(source, source_weight, targets, targets_left);
    std::uint32_t settled = 0;
    while (!heap_.empty() && targets_left > 0 && settled < limits.settled_nodes) {
        std::pop_heap(heap_.begin(), heap_.end(), Later{});
        const HeapEntry entry = heap_.back();
        heap_.pop_back();
        Label& label = labels_[entry.node];
        if (entry.weight != label.distance) continue;   // superseded copy
        ++settled;
        if (label.target_stamp == query_) {   // settled dearer than the path through the avoided node
            label.target_stamp = 0;
            --targets_left;
        }
        if (entry.hops >= limits.hops) continue;
        for (const ContractionArc& arc : graph.out(entry.node)) {
            const PackedWeight candidate = entry.weight + arc.weight;
            if (candidate > bound || candidate < entry.weight) continue;   // beyond the bound, or wrapped past 2^64
            Label& next = labels_[arc.other];
            if (next.stamp == query_ && next.distance <= candidate) continue;
            if (avoid.excludes(arc.other)) continue;
            next.stamp = query_;
            next.distance = candidate;
            // A target reached at most as cheaply as through the avoided node has its witness:
            // later improvements cannot change that answer.
            if (next.target_stamp == query_ && candidate <= next.target_bound) {
                next.target_stamp = 0;
                if (--targets_left == 0) return;
            }
            heap_.push_back({candidate, arc.other, entry.hops + 1});
            std::push_heap(heap_.begin(), heap_.end(), Later{});
        }
    }
}

} // namespace ringroad::router::hierarchy
