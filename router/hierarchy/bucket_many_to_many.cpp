// hierarchy_many_to_many (declared in router/hierarchy/hierarchy_query.hpp): the bucket method of Knopp et
// al. 2007 on a contraction hierarchy. Backward upward searches from every target leave
// (target, distance) in a bucket at each node they settle; forward upward searches from every
// source scan the buckets of the nodes they settle.
//
// Each thread keeps one search workspace for both phases, so the label pages a search touches
// are faulted in once (on a million-junction region every workspace is tens of megabytes of
// lazily zeroed memory). Buckets are indexed by rank, like the searches.
#include "router/hierarchy/hierarchy_query.hpp"

#include "router/weight_buffer.hpp"

#include <algorithm>
#include <atomic>
#include <functional>
#include <memory>
#include <thread>

namespace ringroad::router::hierarchy {

namespace {

// One search workspace per thread, kept for both phases (its label pages are faulted in once).
struct Worker {
    explicit Worker(const ContractionHierarchy& hierarchy) : search(hierarchy) {}
    HierarchySearch search;
    std::vector<WeightedNode> scratch;
};

// Runs body(search, scratch, index) for index in [0, count) on the workers' threads.
template <typename Body>
void parallel_for(std::vector<std::unique_ptr<Worker>>& workers, std::size_t count, Body body) {
    static_assert(std::is_invocable_v<Body&, HierarchySearch&, std::vector<WeightedNode>&, std::size_t>);
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
    if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
    threads = static_cast<unsigned>(std::min<std::size_t>(threads, std::max<std::size_t>(std::max(starts.size(), ends.size()), 1)));
    std::vector<std::unique_ptr<Worker>> workers;
    for (unsigned t = 0; t < threads; ++t) workers.push_back(std::make_unique<Worker>(hierarchy));

    // Backward searches from every target fill the buckets.
    std::vector<std::vector<WeightedNode>> reached(ends.size());
    parallel_for(workers, ends.size(), [&](HierarchySearch& search, std::vector<WeightedNode>&, std::size_t target) {
        search.upward_search(ends[target], /*forward=*/false, reached[target]);
    });
    std::vector<std::uint32_t> first_entry(std::size_t{node_count} + 1, 0);
    for (const auto& list : reached) {
        for (const WeightedNode& entry : list) ++first_entry[entry.node + 1];   // entry.node: a rank
    }
    for (std::uint32_t rank = 0; rank < node_count; ++rank) first_entry[rank + 1] += first_entry[rank];
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
    parallel_for(workers, starts.size(), [&](HierarchySearch& search, std::vector<WeightedNode>& settled,
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

} // namespace ringroad::router::hierarchy
