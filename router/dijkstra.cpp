#include "router/dijkstra.hpp"

#include <algorithm>
#include <bit>

namespace ringroad::router {

namespace {
constexpr std::uint32_t kSettled = 1;
constexpr std::uint32_t kTarget = 2;
constexpr std::uint32_t kLastQuery = 0x3fffffffu;   // stamps keep the query in 30 bits
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
    for (auto& bucket : buckets_) bucket.clear();
    heap_size_ = 0;
    last_popped_ = 0;
    settled_count_ = 0;
}

void DijkstraWorkspace::push(PackedWeight key, NodeId node) {
    const int bucket = key == last_popped_ ? 0 : 64 - std::countl_zero(key ^ last_popped_);
    buckets_[bucket].push_back({key, node});
    ++heap_size_;
}

bool DijkstraWorkspace::pop(HeapItem& item) {
    if (heap_size_ == 0) return false;
    if (buckets_[0].empty()) {
        int bucket = 1;
        while (buckets_[bucket].empty()) ++bucket;
        std::vector<HeapItem>& source = buckets_[bucket];
        PackedWeight smallest = source.front().key;
        for (const HeapItem& candidate : source) smallest = std::min(smallest, candidate.key);
        last_popped_ = smallest;
        for (const HeapItem& moved : source) {
            const int target = moved.key == last_popped_ ? 0 : 64 - std::countl_zero(moved.key ^ last_popped_);
            buckets_[target].push_back(moved);
        }
        source.clear();
    }
    item = buckets_[0].back();
    buckets_[0].pop_back();
    --heap_size_;
    return true;
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
    for (const WeightedNode& start : starts) {
        Label& label = labels[start.node];
        if ((label.stamp & ~3u) != fresh) label = {kUnreachableWeight, kNoNode, fresh};
        if (start.weight < label.distance) {
            label.distance = start.weight;
            label.parent = kNoNode;
            w.push(start.weight, start.node);
        }
    }
    const bool stop_early = !stop_when_settled.empty();

    const std::uint32_t* const first_arc = graph.first_arc().data();
    const NodeId* const heads = graph.arc_heads().data();
    const PackedWeight* const weights = graph.arc_weights(metric).data();
    DijkstraWorkspace::HeapItem item{};
    while (w.pop(item)) {
        const NodeId node = item.node;
        Label& label = labels[node];
        if (item.key != label.distance || (label.stamp & kSettled)) continue;   // a stale copy
        label.stamp |= kSettled;
        ++w.settled_count_;
        if ((label.stamp & kTarget) && --targets_left == 0 && stop_early) break;
        const PackedWeight base = item.key;
        for (std::uint32_t arc = first_arc[node], end = first_arc[node + 1]; arc < end; ++arc) {
            const NodeId head = heads[arc];
            const PackedWeight candidate = base + weights[arc];
            Label& next = labels[head];
            if ((next.stamp & ~3u) != fresh) {
                next = {candidate, node, fresh};
            } else if (candidate < next.distance) {
                next.distance = candidate;
                next.parent = node;
            } else {
                continue;
            }
            w.push(candidate, head);
        }
    }
}

} // namespace ringroad::router
