#include "router/dijkstra.hpp"

#include <algorithm>
#include <bit>

namespace ringroad::router {

namespace {
constexpr std::uint32_t kSettled = 1;
constexpr std::uint32_t kTarget = 2;
constexpr std::uint32_t kLastQuery = 0x3fffffffu;   // stamps keep the query in 30 bits
constexpr PackedWeight kSentinelKey = kUnreachableWeight;
}

DijkstraWorkspace::DijkstraWorkspace(std::uint32_t node_count) { labels_.assign(node_count, Label{kUnreachableWeight, kNoNode, 0}); }

void DijkstraWorkspace::start_query(std::uint32_t node_count) {
    if (labels_.size() != node_count) {
        labels_.assign(node_count, Label{kUnreachableWeight, kNoNode, 0});
        query_ = 0;
    }
    if (++query_ > kLastQuery) {   // the stamp wrapped: old labels could look current, so clear once
        for (Label& label : labels_) label.stamp = 0;
        query_ = 1;
    }
    std::fill(heap_.begin(), heap_.begin() + static_cast<std::ptrdiff_t>(std::min(heap_.size(), heap_size_)),
              HeapItem{kSentinelKey, kNoNode, 0});
    heap_size_ = 0;
    for (std::vector<HeapItem>& bucket : buckets_) bucket.clear();
    settled_count_ = 0;
}

namespace {

using HeapItem = DijkstraWorkspace::HeapItem;

// 4-ary heap on a raw array (see dijkstra.hpp); the search keeps array and size in locals so
// that label stores, which the compiler must assume may alias workspace members, do not force
// them to be reloaded.
inline void heap_push(HeapItem* items, std::size_t& size, PackedWeight key, NodeId node, std::uint32_t successors) {
    std::size_t hole = size++;
    while (hole > 0) {
        const std::size_t parent = (hole - 1) / 4;
        if (items[parent].key <= key) break;
        items[hole] = items[parent];
        hole = parent;
    }
    items[hole] = {key, node, successors};
}

inline HeapItem heap_pop(HeapItem* items, std::size_t& size) {
    const HeapItem top = items[0];
    const std::size_t last_index = --size;
    const HeapItem last = items[last_index];
    items[last_index] = {kSentinelKey, kNoNode, 0};
    if (last_index == 0) return top;
    // Walk the hole down to a leaf along the smallest children (sentinels never win)...
    std::size_t hole = 0;
    for (std::size_t first = 1; first < last_index; first = 4 * hole + 1) {
        const std::size_t left = first + (items[first + 1].key < items[first].key);
        const std::size_t right = first + 2 + (items[first + 3].key < items[first + 2].key);
        const std::size_t smallest = items[right].key < items[left].key ? right : left;
        items[hole] = items[smallest];
        hole = smallest;
    }
    // ...then lift the former last item from there.
    while (hole > 0) {
        const std::size_t parent = (hole - 1) / 4;
        if (items[parent].key <= last.key) break;
        items[hole] = items[parent];
        hole = parent;
    }
    items[hole] = last;
    return top;
}

} // namespace

void DijkstraWorkspace::reserve_heap(std::size_t items) {
    // Four sentinel slots beyond the last item, always.
    if (items + 5 > heap_.size()) heap_.resize(std::max<std::size_t>({64, 2 * heap_.size(), items + 5}), {kSentinelKey, kNoNode, 0});
}

std::vector<NodeId> DijkstraWorkspace::tree_path(NodeId node) const {
    std::vector<NodeId> path;
    for (NodeId current = node; current != kNoNode; current = labels_[current].parent) path.push_back(current);
    std::reverse(path.begin(), path.end());
    return path;
}

void run_dijkstra(const RoutingGraph& graph, Metric metric, std::span<const WeightedNode> starts,
                  std::span<const NodeId> stop_when_settled, DijkstraWorkspace& workspace) {
    using Label = DijkstraWorkspace::Label;
    DijkstraWorkspace& w = workspace;
    w.start_query(graph.node_count());
    const std::uint32_t fresh = w.query_ << 2;   // stamp of a label first reached in this query
    Label* const labels = w.labels_.data();

    std::size_t targets_left = 0;
    for (NodeId target : stop_when_settled) {
        Label& label = labels[target];
        if ((label.stamp & ~3u) != fresh) label = {kUnreachableWeight, kNoNode, fresh};
        if (!(label.stamp & kTarget)) {
            label.stamp |= kTarget;
            ++targets_left;
        }
    }
    const bool stop_early = !stop_when_settled.empty();

    // The queue (see dijkstra.hpp): keys in the current block live in the heap, later ones in
    // the bucket numbered by the highest block-number bit in which they differ from the current
    // block (bucket i holds blocks greater than the current one, and all of bucket i's blocks
    // are smaller than those of bucket i + 1).
    const unsigned block_shift = graph.search_block_shift(metric);
    std::vector<HeapItem>* const buckets = w.buckets_;
    std::uint64_t filled_buckets = 0;   // bit i: bucket i is not empty
    PackedWeight current_block = kUnreachableWeight;
    for (const WeightedNode& start : starts) current_block = std::min(current_block, start.weight >> block_shift);

    HeapItem* items = w.heap_.data();
    std::size_t heap_size = w.heap_size_;
    std::size_t heap_capacity = w.heap_.size();   // including the four sentinel slots
    const auto ensure_heap_room = [&](std::size_t more) {
        if (heap_size + more + 5 > heap_capacity) {
            w.heap_size_ = heap_size;
            w.reserve_heap(heap_size + more);
            items = w.heap_.data();
            heap_capacity = w.heap_.size();
        }
    };
    const auto enqueue = [&](PackedWeight key, NodeId node, std::uint32_t successors) {
        const PackedWeight block = key >> block_shift;
        if (block == current_block) {
            heap_push(items, heap_size, key, node, successors);
        } else {
            const int bucket = std::bit_width(block ^ current_block);
            buckets[bucket].push_back({key, node, successors});
            filled_buckets |= std::uint64_t{1} << bucket;
        }
    };

    for (const WeightedNode& start : starts) {
        Label& label = labels[start.node];
        if ((label.stamp & ~3u) != fresh) label = {kUnreachableWeight, kNoNode, fresh};
        if (start.weight < label.distance) {
            label.distance = start.weight;
            label.parent = kNoNode;
            ensure_heap_room(1);
            enqueue(start.weight, start.node, graph.search_nodes(metric)[start.node].successors);
        }
    }

    const std::uint32_t* const first_arc = graph.first_arc().data();
    const NodeId* const arc_heads = graph.arc_heads().data();
    const RoutingGraph::SearchNode* const search_nodes = graph.search_nodes(metric).data();
    // Each node enters the stack of final labels at most once per query (its only incoming arc
    // is relaxed once), so the stack needs no bounds checks.
    if (w.final_labels_.size() < graph.node_count()) w.final_labels_.resize(graph.node_count());
    DijkstraWorkspace::PendingNode* const final_labels = w.final_labels_.data();
    std::size_t final_count = 0;
    std::uint32_t settled_count = 0;
    NodeId node = kNoNode;
    PackedWeight base = 0;
    const auto relax = [&](NodeId head) {
        const RoutingGraph::SearchNode& reached = search_nodes[head];
        const PackedWeight candidate = base + reached.weight;
        Label& next = labels[head];
        if ((next.stamp & ~3u) != fresh) {
            next = {candidate, node, fresh};
        } else if (candidate < next.distance) {
            next.distance = candidate;
            next.parent = node;
        } else {
            return;
        }
        const std::uint32_t successors = reached.successors;
        // The head will be scanned later: start fetching its successors' records and labels
        // now (a list or a range held elsewhere prefetches a wrong line, harmlessly).
        __builtin_prefetch(search_nodes + (successors >> 9));
        __builtin_prefetch(labels + (successors >> 9));
        // Through the head's only incoming arc, from a final label, the head's label is
        // final too: it skips the queue.
        if (successors & 1u) {
            final_labels[final_count++] = {head, successors};
        } else {
            enqueue(candidate, head, successors);
        }
    };
    for (;;) {
        std::uint32_t successors;
        if (final_count > 0) {
            --final_count;
            node = final_labels[final_count].node;
            successors = final_labels[final_count].successors;
            base = labels[node].distance;
        } else {
            if (heap_size == 0) {
                // The current block is done: the first non-empty bucket holds the next block;
                // its smallest key's block becomes current and its items move down.
                if (filled_buckets == 0) break;
                const int bucket = std::countr_zero(filled_buckets);
                filled_buckets &= filled_buckets - 1;
                std::vector<HeapItem>& moving = buckets[bucket];
                PackedWeight smallest = kUnreachableWeight;
                for (const HeapItem& item : moving) smallest = std::min(smallest, item.key);
                current_block = smallest >> block_shift;
                ensure_heap_room(moving.size());
                for (const HeapItem& item : moving) enqueue(item.key, item.node, item.successors);
                moving.clear();
                continue;
            }
            const HeapItem item = heap_pop(items, heap_size);
            node = item.node;
            successors = item.successors;
            base = item.key;
            // A stale copy: the node's better copy came first (or it was scanned from the stack).
            if (labels[node].stamp & kSettled) continue;
        }
        Label& label = labels[node];
        label.stamp |= kSettled;
        ++settled_count;
        if ((label.stamp & kTarget) && --targets_left == 0 && stop_early) break;
        const std::uint32_t range_length = (successors >> 1) & 15u;
        if (range_length != RoutingGraph::kSuccessorList) {
            ensure_heap_room(range_length);
            std::uint32_t first = successors >> 9;
            if (first == RoutingGraph::kFirstSuccessorElsewhere) first = search_nodes[node].first_successor;
            // Without a branch on the skipped position: successor i is range entry i, or i + 1
            // from the skipped entry on.
            const std::uint32_t skipped = (successors >> 5) & 15u;
            const std::uint32_t successor_count = range_length - (skipped != RoutingGraph::kNoSkippedSuccessor);
            for (std::uint32_t i = 0; i < successor_count; ++i) relax(first + i + (i >= skipped));
        } else {
            const std::uint32_t begin = first_arc[node], end = first_arc[node + 1];
            ensure_heap_room(end - begin);
            for (std::uint32_t arc = begin; arc < end; ++arc) relax(arc_heads[arc]);
        }
    }
    w.heap_size_ = heap_size;
    w.settled_count_ = settled_count;
}

} // namespace ringroad::router
