#include "router/hierarchy/hierarchy_query.hpp"

#include <algorithm>
#include <cstdlib>
#include <functional>
#include <new>
#include <tuple>

namespace ringroad::router::hierarchy {

void HierarchySearch::FreeMemory::operator()(void* memory) const noexcept { std::free(memory); }

HierarchySearch::HierarchySearch(const ContractionHierarchy& hierarchy) : hierarchy_(&hierarchy) {
    backward_.forward = false;
}

namespace {

template <typename T, typename Deleter>
void allocate_zeroed(std::unique_ptr<T[], Deleter>& array, std::size_t count) {
    array.reset(static_cast<T*>(std::calloc(std::max<std::size_t>(count, 1), sizeof(T))));
    if (!array) throw std::bad_alloc();
}

} // namespace

void HierarchySearch::start(Side& side, std::span<const WeightedNode> starts) {
    // Allocated on first use: a many-to-many worker uses one side only.
    if (!side.inverted_distance) {
        allocate_zeroed(side.inverted_distance, hierarchy_->node_count());
        allocate_zeroed(side.links, hierarchy_->node_count());
    }
    for (const std::uint32_t rank : side.reached) side.inverted_distance[rank] = 0;
    side.reached.clear();
    side.heap.clear();
    for (const WeightedNode& start : starts) reach(side, hierarchy_->rank(start.node), start.weight, kNoNode);
}

void HierarchySearch::reach(Side& side, std::uint32_t rank, PackedWeight weight, std::uint32_t parent) {
    PackedWeight& inverted = side.inverted_distance[rank];
    if (inverted == 0) {
        side.reached.push_back(rank);
        side.links[rank].heap_slot = RankHeap::kNotQueued;
    } else if (weight >= ~inverted) {
        return;
    }
    inverted = ~weight;
    side.links[rank].parent = parent;
    side.heap.push_or_decrease(rank, weight, side.slots());
}

bool HierarchySearch::pop(Side& side, std::uint32_t& rank, PackedWeight& weight) {
    if (side.heap.empty()) return false;
    std::tie(weight, rank) = side.heap.pop(side.slots());
    return true;
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
        reach(side, arc.other, weight + arc.weight, rank);
    }
}

PackedWeight HierarchySearch::shortest(std::span<const WeightedNode> starts, std::span<const WeightedNode> ends,
                                       std::vector<NodeId>* path) {
    start(forward_, starts);
    start(backward_, ends);
    PackedWeight best = kUnreachableWeight;
    std::uint32_t meeting = kNoNode;
    for (;;) {
        const PackedWeight forward_min = forward_.heap.empty() ? kUnreachableWeight : forward_.heap.min_weight();
        const PackedWeight backward_min = backward_.heap.empty() ? kUnreachableWeight : backward_.heap.min_weight();
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
    for (std::uint32_t rank = meeting; forward_.links[rank].parent != kNoNode; rank = forward_.links[rank].parent) {
        climb.push_back(forward_.links[rank].parent);
    }
    std::reverse(climb.begin(), climb.end());
    path.push_back(hierarchy_->node_at(climb.front()));
    for (std::size_t i = 1; i < climb.size(); ++i) {
        hierarchy_->unpack_arc(climb[i - 1], climb[i],
                               forward_.label(climb[i]) - forward_.label(climb[i - 1]), path);
    }
    for (std::uint32_t rank = meeting; backward_.links[rank].parent != kNoNode; rank = backward_.links[rank].parent) {
        const std::uint32_t next = backward_.links[rank].parent;
        hierarchy_->unpack_arc(rank, next, backward_.label(rank) - backward_.label(next), path);
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

} // namespace ringroad::router::hierarchy
