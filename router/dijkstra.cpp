#include "router/dijkstra.hpp"

#include <algorithm>
#include <bit>

namespace ringroad::router {

namespace {
constexpr std::uint32_t kSettled = 1;
constexpr std::uint32_t kTarget = 2;
constexpr std::uint32_t kLastQuery = 0x3fffffffu;   // stamps keep the query in 30 bits
constexpr std::uint32_t kNoItem = 0xffffffffu;
constexpr unsigned kSlotBits = 12;                      // 4096 slots per block
constexpr std::uint32_t kSlotCount = 1u << kSlotBits;
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
    if (slot_heads_.size() != kSlotCount) slot_heads_.assign(kSlotCount, kNoItem);
    std::fill(std::begin(filled_slots_), std::end(filled_slots_), 0);
    for (std::vector<QueuedNode>& bucket : buckets_) bucket.clear();
    settled_count_ = 0;
}

namespace {
using QueuedNode = DijkstraWorkspace::QueuedNode;
using SlotItem = DijkstraWorkspace::SlotItem;
} // namespace

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

    // The queue (see dijkstra.hpp): keys in the current block live in its slots, later ones in
    // the bucket numbered by the highest block-number bit in which they differ from the current
    // block (bucket i holds blocks greater than the current one, and all of bucket i's blocks
    // are smaller than those of bucket i + 1).
    const unsigned block_shift = graph.search_block_shift(metric);
    std::vector<QueuedNode>* const buckets = w.buckets_;
    std::uint64_t filled_buckets = 0;   // bit i: bucket i is not empty
    PackedWeight current_block = kUnreachableWeight;
    for (const WeightedNode& start : starts) current_block = std::min(current_block, start.weight >> block_shift);

    // The current block: 4096 slots of consecutive key ranges, each an unsorted list (through
    // the pool of slot items) from which a pop takes the smallest key; a bitmap finds the next
    // filled slot. Lists are short (a slot is 1/256 of a median node weight), so popping is a
    // short scan instead of a walk down a heap.
    const unsigned slot_shift = block_shift - kSlotBits;
    // Dial's argument: when every arc weighs at least a slot's width, keys in one slot cannot
    // improve one another and the slot's first item may be taken; otherwise (sub-second roads)
    // the list is searched for its smallest key. (Distances are the same either way; on exact
    // ties the tree may take another, equally short, parent.) On the 1000 x 1000 grid lists hold
    // ~20 items of equal time, and searching them cost 20% of the time.
    const bool order_inside_slots = graph.smallest_node_weight(metric) < (PackedWeight{1} << slot_shift);
    std::uint32_t* const slot_heads = w.slot_heads_.data();
    std::uint64_t* const filled_slots = w.filled_slots_;
    SlotItem* pool = w.slot_items_.data();
    std::uint32_t pool_capacity = static_cast<std::uint32_t>(w.slot_items_.size());
    std::uint32_t pool_used = 0;
    std::uint32_t free_item = kNoItem;
    std::size_t queued = 0;          // items in the current block's slots
    std::uint32_t cursor = 0;        // no filled slot below it
    const auto ensure_slot_room = [&](std::size_t more) {
        if (pool_used + more > pool_capacity) {
            w.slot_items_.resize(std::max<std::size_t>({1024, 2 * w.slot_items_.size(), pool_used + more}));
            pool = w.slot_items_.data();
            pool_capacity = static_cast<std::uint32_t>(w.slot_items_.size());
        }
    };
    const auto enqueue = [&](PackedWeight key, NodeId node, std::uint32_t successors) {
        const PackedWeight block = key >> block_shift;
        if (block == current_block) {
            const std::uint32_t slot = static_cast<std::uint32_t>(key >> slot_shift) & (kSlotCount - 1);
            std::uint32_t item;
            if (free_item != kNoItem) {
                item = free_item;
                free_item = pool[item].next;
            } else {
                item = pool_used++;
            }
            std::uint64_t& word = filled_slots[slot >> 6];
            const std::uint64_t bit = std::uint64_t{1} << (slot & 63);
            pool[item] = {key, node, successors, (word & bit) ? slot_heads[slot] : kNoItem};
            slot_heads[slot] = item;
            word |= bit;
            ++queued;
        } else {
            const int bucket = std::bit_width(block ^ current_block);
            buckets[bucket].push_back({key, node, successors});
            filled_buckets |= std::uint64_t{1} << bucket;
        }
    };
    const auto pop_smallest = [&]() -> QueuedNode {
        std::uint32_t word_index = cursor >> 6;
        std::uint64_t word = filled_slots[word_index] & (~std::uint64_t{0} << (cursor & 63));
        while (word == 0) word = filled_slots[++word_index];
        const std::uint32_t slot = word_index * 64 + static_cast<std::uint32_t>(std::countr_zero(word));
        cursor = slot;
        std::uint32_t best = slot_heads[slot];
        std::uint32_t before_best = kNoItem;
        if (order_inside_slots) {
            for (std::uint32_t before = best, item = pool[best].next; item != kNoItem; before = item, item = pool[item].next) {
                if (pool[item].key < pool[best].key) {
                    best = item;
                    before_best = before;
                }
            }
        }
        const SlotItem taken = pool[best];
        if (before_best == kNoItem) {
            slot_heads[slot] = taken.next;
            if (taken.next == kNoItem) filled_slots[word_index] &= ~(std::uint64_t{1} << (slot & 63));
        } else {
            pool[before_best].next = taken.next;
        }
        pool[best].next = free_item;
        free_item = best;
        --queued;
        return {taken.key, taken.node, taken.successors};
    };

    for (const WeightedNode& start : starts) {
        Label& label = labels[start.node];
        if ((label.stamp & ~3u) != fresh) label = {kUnreachableWeight, kNoNode, fresh};
        if (start.weight < label.distance) {
            label.distance = start.weight;
            label.parent = kNoNode;
            ensure_slot_room(1);
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
            if (queued == 0) {
                // The current block is done: the first non-empty bucket holds the next block;
                // its smallest key's block becomes current and its items move down.
                if (filled_buckets == 0) break;
                const int bucket = std::countr_zero(filled_buckets);
                filled_buckets &= filled_buckets - 1;
                std::vector<QueuedNode>& moving = buckets[bucket];
                PackedWeight smallest = kUnreachableWeight;
                for (const QueuedNode& item : moving) smallest = std::min(smallest, item.key);
                current_block = smallest >> block_shift;
                cursor = 0;
                ensure_slot_room(moving.size());
                for (const QueuedNode& item : moving) enqueue(item.key, item.node, item.successors);
                moving.clear();
                continue;
            }
            const QueuedNode item = pop_smallest();
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
            ensure_slot_room(range_length);
            std::uint32_t first = successors >> 9;
            if (first == RoutingGraph::kFirstSuccessorElsewhere) first = search_nodes[node].first_successor;
            // Without a branch on the skipped position: successor i is range entry i, or i + 1
            // from the skipped entry on.
            const std::uint32_t skipped = (successors >> 5) & 15u;
            const std::uint32_t successor_count = range_length - (skipped != RoutingGraph::kNoSkippedSuccessor);
            for (std::uint32_t i = 0; i < successor_count; ++i) relax(first + i + (i >= skipped));
        } else {
            const std::uint32_t begin = first_arc[node], end = first_arc[node + 1];
            ensure_slot_room(end - begin);
            for (std::uint32_t arc = begin; arc < end; ++arc) relax(arc_heads[arc]);
        }
    }
    // Leftovers of an early stop are forgotten by clearing the bitmap at the next start.
    w.settled_count_ = settled_count;
}

} // namespace ringroad::router
