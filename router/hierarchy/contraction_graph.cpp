#include "router/hierarchy/contraction_graph.hpp"

#include <algorithm>

namespace ringroad::router::hierarchy {

namespace {
// Room for two shortcuts before a list first moves: most nodes gain a few while their
// neighbours are contracted.
constexpr std::uint32_t kInitialSlack = 2;
}

void ArcPool::reset(std::span<const std::uint32_t> counts) {
    lists_.assign(counts.size(), List{0, 0, 0});
    std::uint64_t total = 0;
    for (std::size_t node = 0; node < counts.size(); ++node) {
        lists_[node] = {total, 0, counts[node] + kInitialSlack};
        total += lists_[node].capacity;
    }
    pool_.assign(total, ContractionArc{kNoNode, kNoNode, 0});
    abandoned_ = 0;
}

void ArcPool::append(NodeId node, const ContractionArc& arc) {
    List& list = lists_[node];
    if (list.size == list.capacity) {
        const std::uint32_t room = std::max<std::uint32_t>(4, 2 * list.capacity);
        const std::uint64_t moved_to = pool_.size();
        pool_.resize(pool_.size() + room);
        std::copy_n(pool_.begin() + static_cast<std::ptrdiff_t>(list.begin), list.size,
                    pool_.begin() + static_cast<std::ptrdiff_t>(moved_to));
        abandoned_ += list.capacity;
        list.begin = moved_to;
        list.capacity = room;
    }
    pool_[list.begin + list.size++] = arc;
    if (abandoned_ > pool_.size() / 2) compact();
}

void ArcPool::erase(NodeId node, NodeId other) {
    std::span<ContractionArc> list = arcs(node);
    const auto found = std::find_if(list.begin(), list.end(), [other](const ContractionArc& arc) { return arc.other == other; });
    if (found == list.end()) return;
    std::copy(found + 1, list.end(), found);
    --lists_[node].size;
}

void ArcPool::release(NodeId node) {
    abandoned_ += lists_[node].capacity;
    lists_[node].size = 0;
    lists_[node].capacity = 0;
}

void ArcPool::release_memory() {
    std::vector<List>().swap(lists_);
    std::vector<ContractionArc>().swap(pool_);
    abandoned_ = 0;
}

// Moves every list to the front in node order, keeping a quarter of its size as room.
void ArcPool::compact() {
    std::uint64_t total = 0;
    for (const List& list : lists_) total += list.size + list.size / 4;
    std::vector<ContractionArc> fresh(total);
    std::uint64_t next = 0;
    for (List& list : lists_) {
        std::copy_n(pool_.begin() + static_cast<std::ptrdiff_t>(list.begin), list.size,
                    fresh.begin() + static_cast<std::ptrdiff_t>(next));
        list.begin = next;
        list.capacity = list.size + list.size / 4;
        next += list.capacity;
    }
    pool_.swap(fresh);
    abandoned_ = 0;
}

ContractionGraph::ContractionGraph(const RoutingGraph& routing_graph, Metric metric)
    : node_count_(routing_graph.node_count()) {
    std::vector<std::uint32_t> out_counts(node_count_, 0), in_counts(node_count_, 0);
    for (NodeId tail = 0; tail < node_count_; ++tail) {
        for (NodeId head : routing_graph.successors(tail)) {
            if (head == tail) continue;
            ++out_counts[tail];
            ++in_counts[head];
        }
    }
    out_.reset(out_counts);
    in_.reset(in_counts);
    for (NodeId tail = 0; tail < node_count_; ++tail) {
        for (NodeId head : routing_graph.successors(tail)) {
            if (head == tail) continue;
            const PackedWeight weight = routing_graph.node_weight(metric, head);
            out_.append(tail, {head, kNoNode, weight});
            in_.append(head, {tail, kNoNode, weight});
        }
    }
}

void ContractionGraph::add_or_improve(NodeId from, NodeId to, PackedWeight weight, NodeId middle) {
    for (ContractionArc& arc : out_.arcs(from)) {
        if (arc.other != to) continue;
        if (arc.weight <= weight) return;
        arc.weight = weight;
        arc.middle = middle;
        for (ContractionArc& reverse : in_.arcs(to)) {
            if (reverse.other == from) {
                reverse.weight = weight;
                reverse.middle = middle;
                break;
            }
        }
        return;
    }
    out_.append(from, {to, middle, weight});
    in_.append(to, {from, middle, weight});
}

void ContractionGraph::remove_node(NodeId node) {
    for (const ContractionArc& arc : out_.arcs(node)) in_.erase(arc.other, node);
    for (const ContractionArc& arc : in_.arcs(node)) out_.erase(arc.other, node);
    out_.release(node);
    in_.release(node);
}

void ContractionGraph::release_memory() {
    out_.release_memory();
    in_.release_memory();
}

} // namespace ringroad::router::hierarchy
