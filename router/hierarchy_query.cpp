#include "router/hierarchy_query.hpp"

#include "router/weight_buffer.hpp"

#include <algorithm>
#include <atomic>
#include <cstdlib>
#include <new>
#include <functional>
#include <thread>

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
    Side& side = forward ? forward_ : backward_;
    start(side, starts);
    NodeId node = kNoNode;
    PackedWeight weight = 0;
    while (pop(side, node, weight)) {
        if (stalled(side, node, weight)) continue;
        settled.push_back({node, weight});
        relax(side, node, weight);
    }
}

namespace {

// Runs body(search, scratch, index) for index in [0, count) on `threads` threads, each with its
// own search and scratch list.
template <typename Body>
void parallel_for(const ContractionHierarchy& hierarchy, std::size_t count, unsigned threads, Body body) {
    static_assert(std::is_invocable_v<Body&, HierarchySearch&, std::vector<WeightedNode>&, std::size_t>);
    if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
    threads = static_cast<unsigned>(std::min<std::size_t>(threads, std::max<std::size_t>(count, 1)));
    std::atomic<std::size_t> next{0};
    const auto worker = [&] {
        HierarchySearch search(hierarchy);
        std::vector<WeightedNode> scratch;
        for (std::size_t index = next++; index < count; index = next++) body(search, scratch, index);
    };
    std::vector<std::thread> pool;
    for (unsigned t = 1; t < threads; ++t) pool.emplace_back(worker);
    worker();
    for (std::thread& thread : pool) thread.join();
}

struct BucketEntry {
    std::uint32_t target;
    PackedWeight weight;
};

} // namespace

std::vector<PackedWeight> hierarchy_many_to_many(const ContractionHierarchy& hierarchy,
                                                 const std::vector<std::vector<WeightedNode>>& starts,
                                                 const std::vector<std::vector<WeightedNode>>& ends,
                                                 unsigned threads) {
    // Backward searches from every target fill the buckets.
    std::vector<std::vector<WeightedNode>> reached(ends.size());
    parallel_for(hierarchy, ends.size(), threads, [&](HierarchySearch& search, std::vector<WeightedNode>&, std::size_t target) {
        search.upward_search(ends[target], /*forward=*/false, reached[target]);
    });
    const std::uint32_t node_count = hierarchy.node_count();
    std::vector<std::uint32_t> first_entry(std::size_t{node_count} + 1, 0);
    for (const auto& list : reached) {
        for (const WeightedNode& entry : list) ++first_entry[entry.node + 1];
    }
    for (std::uint32_t node = 0; node < node_count; ++node) first_entry[node + 1] += first_entry[node];
    std::vector<BucketEntry> buckets(first_entry.back());
    {
        std::vector<std::uint32_t> fill(first_entry.begin(), first_entry.end() - 1);
        for (std::uint32_t target = 0; target < reached.size(); ++target) {
            for (const WeightedNode& entry : reached[target]) buckets[fill[entry.node]++] = {target, entry.weight};
        }
    }
    reached = {};

    // Forward searches from every source scan them.
    std::vector<PackedWeight> result = make_weight_buffer(starts.size() * ends.size(), kUnreachableWeight);
    parallel_for(hierarchy, starts.size(), threads, [&](HierarchySearch& search, std::vector<WeightedNode>& settled,
                                                        std::size_t source) {
        settled.clear();
        search.upward_search(starts[source], /*forward=*/true, settled);
        PackedWeight* const row = result.data() + source * ends.size();
        const BucketEntry* const entries = buckets.data();
        for (const WeightedNode& entry : settled) {
            // Most cells improve only a few times: an unconditional store of the minimum
            // avoids a mispredicted branch per entry.
            for (std::uint32_t i = first_entry[entry.node], end = first_entry[entry.node + 1]; i < end; ++i) {
                PackedWeight& cell = row[entries[i].target];
                cell = std::min(cell, entry.weight + entries[i].weight);
            }
        }
    });
    return result;
}

} // namespace ringroad::router
