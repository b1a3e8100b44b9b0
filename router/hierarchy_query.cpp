#include "router/hierarchy_query.hpp"

#include <algorithm>
#include <cstdlib>
#include <functional>
#include <new>

namespace ringroad::router {

namespace {
using HeapEntry = std::pair<PackedWeight, std::uint32_t>;   // (weight, rank)
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
        const std::uint32_t rank = hierarchy_->rank(start.node);
        if (start.weight < side.label(rank)) {
            side.labels[rank] = {start.weight, side.query, kNoNode};
            side.heap.push_back({start.weight, rank});
            std::push_heap(side.heap.begin(), side.heap.end(), kHeapOrder);
        }
    }
}

bool HierarchySearch::pop(Side& side, std::uint32_t& rank, PackedWeight& weight) {
    while (!side.heap.empty()) {
        std::pop_heap(side.heap.begin(), side.heap.end(), kHeapOrder);
        const HeapEntry entry = side.heap.back();
        side.heap.pop_back();
        if (entry.first != side.label(entry.second)) continue;   // superseded
        weight = entry.first;
        rank = entry.second;
        return true;
    }
    return false;
}

// Stall-on-demand: a higher node reached more cheaply proves this label is not a shortest
// distance, so the search need not continue from it.
bool HierarchySearch::stalled(const Side& side, std::uint32_t rank, PackedWeight weight) const {
    // Arcs from higher nodes into this one: for a backward search, the ones it climbs.
    for (const RankedArc& arc : side.forward ? hierarchy_->descending_arcs(rank) : hierarchy_->climbing_arcs(rank)) {
        const PackedWeight higher = side.label(arc.other);
        if (higher != kUnreachableWeight && higher + arc.weight < weight) return true;
    }
    return false;
}

void HierarchySearch::relax(Side& side, std::uint32_t rank, PackedWeight weight) {
    for (const RankedArc& arc : side.forward ? hierarchy_->climbing_arcs(rank) : hierarchy_->descending_arcs(rank)) {
        const PackedWeight candidate = weight + arc.weight;
        if (candidate < side.label(arc.other)) {
            side.labels[arc.other] = {candidate, side.query, rank};
            side.heap.push_back({candidate, arc.other});
            std::push_heap(side.heap.begin(), side.heap.end(), kHeapOrder);
        }
    }
}

PackedWeight HierarchySearch::shortest(std::span<const WeightedNode> starts, std::span<const WeightedNode> ends,
                                       std::vector<NodeId>* path) {
    start(forward_, starts);
    start(backward_, ends);
    PackedWeight best = kUnreachableWeight;
    std::uint32_t meeting = kNoNode;
    for (;;) {
        const PackedWeight forward_min = forward_.heap.empty() ? kUnreachableWeight : forward_.heap.front().first;
        const PackedWeight backward_min = backward_.heap.empty() ? kUnreachableWeight : backward_.heap.front().first;
        const bool forward_open = forward_min < best;
        const bool backward_open = backward_min < best;
        if (!forward_open && !backward_open) break;
        Side& side = forward_open && (!backward_open || forward_min <= backward_min) ? forward_ : backward_;
        const Side& other = &side == &forward_ ? backward_ : forward_;
        std::uint32_t rank = kNoNode;
        PackedWeight weight = 0;
        if (!pop(side, rank, weight)) continue;
        const PackedWeight other_label = other.label(rank);
        if (other_label != kUnreachableWeight && weight + other_label < best) {
            best = weight + other_label;
            meeting = rank;
        }
        if (stalled(side, rank, weight)) continue;
        relax(side, rank, weight);
    }
    if (path && meeting != kNoNode) unpack_path(meeting, *path);
    return best;
}

void HierarchySearch::unpack_path(std::uint32_t meeting, std::vector<NodeId>& path) const {
    path.clear();
    std::vector<std::uint32_t> climb{meeting};
    for (std::uint32_t rank = meeting; forward_.labels[rank].parent != kNoNode; rank = forward_.labels[rank].parent) {
        climb.push_back(forward_.labels[rank].parent);
    }
    std::reverse(climb.begin(), climb.end());
    path.push_back(hierarchy_->node_at(climb.front()));
    for (std::size_t i = 1; i < climb.size(); ++i) {
        hierarchy_->unpack_arc(climb[i - 1], climb[i],
                               forward_.labels[climb[i]].distance - forward_.labels[climb[i - 1]].distance, path);
    }
    for (std::uint32_t rank = meeting; backward_.labels[rank].parent != kNoNode; rank = backward_.labels[rank].parent) {
        const std::uint32_t next = backward_.labels[rank].parent;
        hierarchy_->unpack_arc(rank, next, backward_.labels[rank].distance - backward_.labels[next].distance, path);
    }
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
    std::uint32_t rank = kNoNode;
    PackedWeight weight = 0;
    while (pop(side, rank, weight)) {
        if (stalled(side, rank, weight)) continue;
        settled.push_back({rank, weight});
        relax(side, rank, weight);
    }
}

} // namespace ringroad::router
