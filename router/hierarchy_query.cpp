#include "router/hierarchy_query.hpp"

#include <algorithm>
#include <cstdlib>
#include <functional>
#include <new>

namespace ringroad::router {

namespace {
using HeapEntry = std::pair<PackedWeight, NodeId>;
constexpr auto kHeapOrder = std::greater<HeapEntry>();
}

void HierarchySearch::FreeLabels::operator()(Label* labels) const noexcept { std::free(labels); }

HierarchySearch::HierarchySearch(const ContractionHierarchy& hierarchy) : hierarchy_(&hierarchy) {
    backward_.forward = false;
}

void HierarchySearch::start(Side& side, std::span<const WeightedNode> starts) {
    const std::size_t node_count = hierarchy_->node_count();
    // Allocated on first use: a many-to-many worker searches in one direction only.
    if (!side.labels) {
        side.labels.reset(static_cast<Label*>(std::calloc(std::max<std::size_t>(node_count, 1), sizeof(Label))));
        if (!side.labels) throw std::bad_alloc();
        side.query = 0;
    }
    if (++side.query == 0) {   // the stamps wrapped around: forget every label
        std::fill(side.labels.get(), side.labels.get() + node_count, Label{});
        side.query = 1;
    }
    side.heap.clear();
    for (const WeightedNode& start : starts) {
        if (start.weight < side.label(start.node)) {
            side.labels[start.node] = {start.weight, side.query, kNoNode};
            side.heap.push_back({start.weight, start.node});
            std::push_heap(side.heap.begin(), side.heap.end(), kHeapOrder);
        }
    }
}

bool HierarchySearch::pop(Side& side, NodeId& node, PackedWeight& weight) {
    while (!side.heap.empty()) {
        std::pop_heap(side.heap.begin(), side.heap.end(), kHeapOrder);
        const HeapEntry entry = side.heap.back();
        side.heap.pop_back();
        if (entry.first != side.label(entry.second)) continue;   // superseded
        weight = entry.first;
        node = entry.second;
        return true;
    }
    return false;
}

// Stall-on-demand: a higher node reached more cheaply proves this label is not a shortest
// distance, so the search need not continue from it.
bool HierarchySearch::stalled(const Side& side, NodeId node, PackedWeight weight) const {
    const std::uint32_t inbound = side.forward ? kArcBackward : kArcForward;
    for (const HierarchyArc& arc : hierarchy_->upward_arcs(node)) {
        if (!(arc.directions & inbound)) continue;
        const PackedWeight higher = side.label(arc.higher_node);
        if (higher != kUnreachableWeight && higher + arc.weight < weight) return true;
    }
    return false;
}

void HierarchySearch::relax(Side& side, NodeId node, PackedWeight weight) {
    const std::uint32_t outbound = side.forward ? kArcForward : kArcBackward;
    for (const HierarchyArc& arc : hierarchy_->upward_arcs(node)) {
        if (!(arc.directions & outbound)) continue;
        const PackedWeight candidate = weight + arc.weight;
        if (candidate < side.label(arc.higher_node)) {
            side.labels[arc.higher_node] = {candidate, side.query, node};
            side.heap.push_back({candidate, arc.higher_node});
            std::push_heap(side.heap.begin(), side.heap.end(), kHeapOrder);
        }
    }
}

PackedWeight HierarchySearch::shortest(std::span<const WeightedNode> starts, std::span<const WeightedNode> ends,
                                       std::vector<NodeId>* path) {
    start(forward_, starts);
    start(backward_, ends);
    PackedWeight best = kUnreachableWeight;
    NodeId meeting = kNoNode;
    for (;;) {
        const PackedWeight forward_min = forward_.heap.empty() ? kUnreachableWeight : forward_.heap.front().first;
        const PackedWeight backward_min = backward_.heap.empty() ? kUnreachableWeight : backward_.heap.front().first;
        const bool forward_open = forward_min < best;
        const bool backward_open = backward_min < best;
        if (!forward_open && !backward_open) break;
        Side& side = forward_open && (!backward_open || forward_min <= backward_min) ? forward_ : backward_;
        const Side& other = &side == &forward_ ? backward_ : forward_;
        NodeId node = kNoNode;
        PackedWeight weight = 0;
        if (!pop(side, node, weight)) continue;
        const PackedWeight other_label = other.label(node);
        if (other_label != kUnreachableWeight && weight + other_label < best) {
            best = weight + other_label;
            meeting = node;
        }
        if (stalled(side, node, weight)) continue;
        relax(side, node, weight);
    }
    if (path && meeting != kNoNode) {
        path->clear();
        std::vector<NodeId> climb{meeting};
        for (NodeId node = meeting; forward_.labels[node].parent != kNoNode; node = forward_.labels[node].parent) {
            climb.push_back(forward_.labels[node].parent);
        }
        std::reverse(climb.begin(), climb.end());
        path->push_back(climb.front());
        for (std::size_t i = 1; i < climb.size(); ++i) {
            hierarchy_->unpack_arc(climb[i - 1], climb[i],
                                   forward_.labels[climb[i]].distance - forward_.labels[climb[i - 1]].distance, *path);
        }
        for (NodeId node = meeting; backward_.labels[node].parent != kNoNode; node = backward_.labels[node].parent) {
            const NodeId next = backward_.labels[node].parent;
            hierarchy_->unpack_arc(node, next, backward_.labels[node].distance - backward_.labels[next].distance, *path);
        }
    }
    return best;
}

void HierarchySearch::upward_search(std::span<const WeightedNode> starts, bool forward,
                                    std::vector<WeightedNode>& settled) {
    // Both directions use the forward side's labels, so a many-to-many worker that searches
    // backwards and then forwards touches one label array, not two.
    Side& side = forward_;
    side.forward = forward;
    struct RestoreDirection {
        Side& side;
        ~RestoreDirection() { side.forward = true; }   // shortest() expects a forward side
    } restore{side};
    start(side, starts);
    NodeId node = kNoNode;
    PackedWeight weight = 0;
    while (pop(side, node, weight)) {
        if (stalled(side, node, weight)) continue;
        settled.push_back({node, weight});
        relax(side, node, weight);
    }
}

} // namespace ringroad::router
