// hierarchy_many_to_many (declared in router/hierarchy_query.hpp): the bucket method of Knopp et
// al. 2007 on a contraction hierarchy. Backward upward searches from every target leave
// (target, distance) in a bucket at each node they settle; forward upward searches from every
// source scan the buckets of the nodes they settle.
//
// The stored hierarchy keeps each node's upward arcs in one list, both directions mixed, in
// 24-byte records that also carry the shortcut's middle node (for unpacking). A matrix runs
// thousands of searches, and every settled node is scanned twice (stall test, then relaxation):
// on a region of a million junctions the profile was half in reading those lists. So the
// matrix first copies the arcs into two lean lists per node, one per direction, holding only
// the higher node and the weight: each scan reads just the arcs it can use, in a third of the
// bytes. The copy is one sequential pass (about 0.1 s for 12 million arcs), worth it from a few
// hundred searches on; the answers are the same arcs, so the same exact weights.
#include "router/hierarchy_query.hpp"

#include "router/weight_buffer.hpp"

#include <algorithm>
#include <atomic>
#include <cstdlib>
#include <functional>
#include <memory>
#include <new>
#include <thread>

namespace ringroad::router {

namespace {

// One direction's upward arcs: for node v, heads[first[v] .. first[v + 1]) with their weights.
struct DirectedArcs {
    std::vector<std::uint32_t> first;
    // Filled right after allocation: default-initialised, not zeroed (a 150 MB memset at a
    // million junctions).
    std::unique_ptr<NodeId[]> heads;
    std::unique_ptr<PackedWeight[]> weights;

    std::uint32_t begin(NodeId node) const { return first[node]; }
    std::uint32_t end(NodeId node) const { return first[node + 1]; }
};

// The arcs usable going up along them (forward) and against them (backward).
struct SplitHierarchy {
    DirectedArcs forward;
    DirectedArcs backward;
};

void add_direction(const ContractionHierarchy& hierarchy, std::uint32_t direction, DirectedArcs& out) {
    const std::uint32_t node_count = hierarchy.node_count();
    out.first.resize(std::size_t{node_count} + 1);
    std::uint32_t count = 0;
    for (NodeId node = 0; node < node_count; ++node) {
        out.first[node] = count;
        for (const HierarchyArc& arc : hierarchy.upward_arcs(node)) count += (arc.directions & direction) != 0;
    }
    out.first[node_count] = count;
    out.heads.reset(new NodeId[count]);
    out.weights.reset(new PackedWeight[count]);
    std::uint32_t at = 0;
    for (NodeId node = 0; node < node_count; ++node) {
        for (const HierarchyArc& arc : hierarchy.upward_arcs(node)) {
            if (!(arc.directions & direction)) continue;
            out.heads[at] = arc.higher_node;
            out.weights[at] = arc.weight;
            ++at;
        }
    }
}

SplitHierarchy split_by_direction(const ContractionHierarchy& hierarchy) {
    SplitHierarchy split;
    std::thread backward([&] { add_direction(hierarchy, kArcBackward, split.backward); });
    add_direction(hierarchy, kArcForward, split.forward);
    backward.join();
    return split;
}

// An upward search with stall-on-demand over one direction's lists; a reusable workspace
// (stamped labels, calloc'ed so that only the pages a search touches are ever zeroed).
class UpwardSearch {
public:
    explicit UpwardSearch(std::uint32_t node_count)
        : node_count_(node_count),
          labels_(static_cast<Label*>(std::calloc(std::max<std::size_t>(node_count, 1), sizeof(Label)))) {
        if (!labels_) throw std::bad_alloc();
    }
    ~UpwardSearch() { std::free(labels_); }
    UpwardSearch(const UpwardSearch&) = delete;
    UpwardSearch& operator=(const UpwardSearch&) = delete;

    // Settles upwards from `starts` along `up` arcs; a node is stalled (not reported, not
    // continued from) when a higher node reached already proves its label too long through a
    // `down` arc. Appends (node, weight) for every node settled and not stalled.
    void run(std::span<const WeightedNode> starts, const DirectedArcs& up, const DirectedArcs& down,
             std::vector<WeightedNode>& settled) {
        begin_query();
        for (const WeightedNode& start : starts) improve(start.node, start.weight);
        while (!heap_.empty()) {
            std::pop_heap(heap_.begin(), heap_.end(), std::greater<>());
            const auto [weight, node] = heap_.back();
            heap_.pop_back();
            if (weight != label(node)) continue;   // superseded copy
            if (stalled(node, weight, down)) continue;
            settled.push_back({node, weight});
            for (std::uint32_t arc = up.begin(node), end = up.end(node); arc < end; ++arc) {
                improve(up.heads[arc], weight + up.weights[arc]);
            }
        }
    }

private:
    struct Label {
        PackedWeight distance;
        std::uint32_t stamp;   // valid when equal to query_
        std::uint32_t unused;
    };

    PackedWeight label(NodeId node) const {
        return labels_[node].stamp == query_ ? labels_[node].distance : kUnreachableWeight;
    }
    void begin_query() {
        if (++query_ == 0) {   // the stamps wrapped around: forget every label
            std::fill(labels_, labels_ + node_count_, Label{});
            query_ = 1;
        }
        heap_.clear();
    }
    void improve(NodeId node, PackedWeight weight) {
        if (weight >= label(node)) return;
        labels_[node] = {weight, query_, 0};
        heap_.push_back({weight, node});
        std::push_heap(heap_.begin(), heap_.end(), std::greater<>());
    }
    bool stalled(NodeId node, PackedWeight weight, const DirectedArcs& down) const {
        for (std::uint32_t arc = down.begin(node), end = down.end(node); arc < end; ++arc) {
            const PackedWeight higher = label(down.heads[arc]);
            if (higher != kUnreachableWeight && higher + down.weights[arc] < weight) return true;
        }
        return false;
    }

    std::uint32_t node_count_;
    Label* labels_;
    std::uint32_t query_ = 0;
    std::vector<std::pair<PackedWeight, NodeId>> heap_;
};

// One search workspace per thread, kept for both phases (its label pages are faulted in once).
struct Worker {
    explicit Worker(std::uint32_t node_count) : search(node_count) {}
    UpwardSearch search;
    std::vector<WeightedNode> scratch;
};

// Runs body(search, scratch, index) for index in [0, count) on the workers' threads.
template <typename Body>
void parallel_for(std::vector<std::unique_ptr<Worker>>& workers, std::size_t count, Body body) {
    static_assert(std::is_invocable_v<Body&, UpwardSearch&, std::vector<WeightedNode>&, std::size_t>);
    const std::size_t threads = std::min(workers.size(), std::max<std::size_t>(count, 1));
    std::atomic<std::size_t> next{0};
    const auto work = [&](Worker& worker) {
        for (std::size_t index = next++; index < count; index = next++) body(worker.search, worker.scratch, index);
    };
    std::vector<std::thread> pool;
    for (std::size_t t = 1; t < threads; ++t) pool.emplace_back(work, std::ref(*workers[t]));
    work(*workers[0]);
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
    const std::uint32_t node_count = hierarchy.node_count();
    const SplitHierarchy arcs = split_by_direction(hierarchy);
    if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
    threads = static_cast<unsigned>(std::min<std::size_t>(threads, std::max<std::size_t>(std::max(starts.size(), ends.size()), 1)));
    std::vector<std::unique_ptr<Worker>> workers;
    for (unsigned t = 0; t < threads; ++t) workers.push_back(std::make_unique<Worker>(node_count));

    // Backward searches from every target fill the buckets.
    std::vector<std::vector<WeightedNode>> reached(ends.size());
    parallel_for(workers, ends.size(), [&](UpwardSearch& search, std::vector<WeightedNode>&, std::size_t target) {
        search.run(ends[target], arcs.backward, arcs.forward, reached[target]);
    });
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
    parallel_for(workers, starts.size(), [&](UpwardSearch& search, std::vector<WeightedNode>& settled,
                                                         std::size_t source) {
        settled.clear();
        search.run(starts[source], arcs.forward, arcs.backward, settled);
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
