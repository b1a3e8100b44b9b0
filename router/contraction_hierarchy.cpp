// Building a contraction hierarchy (Geisberger, Sanders, Schultes, Delling 2008).
#include "router/contraction_hierarchy.hpp"

#include "common/progress.hpp"

#include <algorithm>
#include <cstring>
#include <functional>
#include <queue>

namespace ringroad::router {

namespace {

// Witness searches stop after this many settled nodes: a missed witness only adds a needless
// shortcut, never a wrong answer. The estimate for priorities can afford less.
constexpr std::uint32_t kWitnessSettleLimit = 100;
constexpr std::uint32_t kEstimateSettleLimit = 30;

struct DynamicArc {
    NodeId other;
    NodeId middle;
    PackedWeight weight;
};

struct BuiltHierarchy {
    std::vector<std::uint32_t> rank;
    std::vector<std::uint32_t> first_arc;
    std::vector<HierarchyArc> arcs;
};

class Contractor {
public:
    Contractor(const RoutingGraph& graph, Metric metric) : node_count_(graph.node_count()) {
        out_.resize(node_count_);
        in_.resize(node_count_);
        for (NodeId tail = 0; tail < node_count_; ++tail) {
            for (NodeId head : graph.successors(tail)) {
                if (head == tail) continue;   // driving a loop road twice never shortens a path
                const PackedWeight weight = graph.node_weight(metric, head);
                out_[tail].push_back({head, kNoNode, weight});
                in_[head].push_back({tail, kNoNode, weight});
            }
        }
        contracted_.assign(node_count_, 0);
        contracted_neighbours_.assign(node_count_, 0);
        depth_.assign(node_count_, 0);
        witness_distance_.assign(node_count_, kUnreachableWeight);
        witness_stamp_.assign(node_count_, 0);
        target_stamp_.assign(node_count_, 0);
        upward_.resize(node_count_);
    }

    BuiltHierarchy run(Progress* progress) {
        using Entry = std::pair<std::int64_t, NodeId>;
        std::priority_queue<Entry, std::vector<Entry>, std::greater<>> queue;
        if (progress) progress->phase("hierarchy: ordering");
        for (NodeId node = 0; node < node_count_; ++node) {
            queue.push({priority(node), node});
            if (progress && node % 1024 == 0) progress->update(static_cast<double>(node) / node_count_);
        }
        if (progress) progress->phase("hierarchy: contracting");
        BuiltHierarchy result;
        result.rank.assign(node_count_, 0);
        std::uint32_t next_rank = 0;
        while (!queue.empty()) {
            const auto [old_priority, node] = queue.top();
            queue.pop();
            if (contracted_[node]) continue;
            const std::int64_t current = priority(node);
            if (!queue.empty() && current > queue.top().first) {
                queue.push({current, node});
                continue;
            }
            contract(node);
            result.rank[node] = next_rank++;
            // Neighbours keep their queued (usually lower) priority: they are re-evaluated when
            // they reach the top ("lazy updates"), which spares a simulated contraction each.
            if (progress && next_rank % 1024 == 0) progress->update(static_cast<double>(next_rank) / node_count_);
        }
        result.first_arc.assign(node_count_ + 1, 0);
        for (NodeId node = 0; node < node_count_; ++node) {
            result.first_arc[node + 1] = result.first_arc[node] + static_cast<std::uint32_t>(upward_[node].size());
        }
        result.arcs.reserve(result.first_arc.back());
        for (NodeId node = 0; node < node_count_; ++node) {
            result.arcs.insert(result.arcs.end(), upward_[node].begin(), upward_[node].end());
            std::vector<HierarchyArc>().swap(upward_[node]);
        }
        if (progress) progress->finish();
        return result;
    }

private:
    // Edge difference, contracted neighbours and depth, the terms of Geisberger et al. section 3.
    std::int64_t priority(NodeId node) {
        const std::int64_t shortcuts = shortcuts_needed(node, /*add=*/false, kEstimateSettleLimit);
        const std::int64_t removed = static_cast<std::int64_t>(in_[node].size() + out_[node].size());
        return 2 * (shortcuts - removed) + contracted_neighbours_[node] + depth_[node];
    }

    // Adds the shortcuts, records the node's upward arcs and removes it from the graph; its
    // neighbours' contracted-neighbour and depth terms grow.
    void contract(NodeId node) {
        shortcuts_needed(node, /*add=*/true, kWitnessSettleLimit);
        record_upward_arcs(node);
        std::vector<NodeId>& neighbours = scratch_neighbours_;
        neighbours.clear();
        for (const DynamicArc& arc : out_[node]) {
            erase_arc(in_[arc.other], node);
            neighbours.push_back(arc.other);
        }
        for (const DynamicArc& arc : in_[node]) {
            erase_arc(out_[arc.other], node);
            neighbours.push_back(arc.other);
        }
        std::sort(neighbours.begin(), neighbours.end());
        neighbours.erase(std::unique(neighbours.begin(), neighbours.end()), neighbours.end());
        for (NodeId neighbour : neighbours) {
            ++contracted_neighbours_[neighbour];
            depth_[neighbour] = std::max(depth_[neighbour], depth_[node] + 1);
        }
        contracted_[node] = 1;
        std::vector<DynamicArc>().swap(out_[node]);
        std::vector<DynamicArc>().swap(in_[node]);
    }

    // The arcs of a node at the moment it is contracted all lead to higher nodes.
    void record_upward_arcs(NodeId node) {
        std::vector<HierarchyArc>& upward = upward_[node];
        for (const DynamicArc& arc : out_[node]) upward.push_back({arc.other, arc.middle, arc.weight, kArcForward, 0});
        for (const DynamicArc& arc : in_[node]) {
            bool merged = false;
            for (HierarchyArc& existing : upward) {
                if (existing.higher_node == arc.other && existing.weight == arc.weight &&
                    existing.middle_node == arc.middle && existing.directions == kArcForward) {
                    existing.directions |= kArcBackward;
                    merged = true;
                    break;
                }
            }
            if (!merged) upward.push_back({arc.other, arc.middle, arc.weight, kArcBackward, 0});
        }
    }

    static void erase_arc(std::vector<DynamicArc>& arcs, NodeId other) {
        for (std::size_t i = 0; i < arcs.size(); ++i) {
            if (arcs[i].other == other) {
                arcs[i] = arcs.back();
                arcs.pop_back();
                return;
            }
        }
    }

    // For every pair u -> node -> w without a witness path, counts (or adds) a shortcut.
    std::int64_t shortcuts_needed(NodeId node, bool add, std::uint32_t settle_limit) {
        if (in_[node].empty() || out_[node].empty()) return 0;
        PackedWeight longest_out = 0;
        for (const DynamicArc& arc : out_[node]) longest_out = std::max(longest_out, arc.weight);
        std::int64_t count = 0;
        // Copies, in reused buffers: adding shortcuts grows the neighbours' lists while these
        // are read.
        std::vector<DynamicArc>& incoming = scratch_in_;
        std::vector<DynamicArc>& outgoing = scratch_out_;
        incoming.assign(in_[node].begin(), in_[node].end());
        outgoing.assign(out_[node].begin(), out_[node].end());
        for (const DynamicArc& in_arc : incoming) {
            const NodeId source = in_arc.other;
            witness_search(source, node, in_arc.weight + longest_out, outgoing, settle_limit);
            for (const DynamicArc& out_arc : outgoing) {
                if (out_arc.other == source) continue;
                const PackedWeight through = in_arc.weight + out_arc.weight;
                if (witness_label(out_arc.other) <= through) continue;
                ++count;
                if (add) add_shortcut(source, out_arc.other, through, node);
            }
        }
        return count;
    }

    PackedWeight witness_label(NodeId node) const {
        return witness_stamp_[node] == witness_query_ ? witness_distance_[node] : kUnreachableWeight;
    }

    void witness_search(NodeId source, NodeId avoided, PackedWeight bound, const std::vector<DynamicArc>& targets,
                        std::uint32_t settle_limit) {
        ++witness_query_;
        std::uint32_t targets_left = 0;
        for (const DynamicArc& target : targets) {
            if (target.other != source && target_stamp_[target.other] != witness_query_) {
                target_stamp_[target.other] = witness_query_;
                ++targets_left;
            }
        }
        using Entry = std::pair<PackedWeight, NodeId>;
        heap_.clear();
        witness_stamp_[source] = witness_query_;
        witness_distance_[source] = 0;
        heap_.push_back({0, source});
        std::uint32_t settled = 0;
        while (!heap_.empty() && targets_left > 0 && settled < settle_limit) {
            std::pop_heap(heap_.begin(), heap_.end(), std::greater<Entry>());
            const auto [distance, node] = heap_.back();
            heap_.pop_back();
            if (distance != witness_distance_[node]) continue;   // stale entry
            if (distance > bound) break;
            ++settled;
            if (target_stamp_[node] == witness_query_) {
                target_stamp_[node] = 0;
                --targets_left;
            }
            for (const DynamicArc& arc : out_[node]) {
                if (arc.other == avoided) continue;
                const PackedWeight candidate = distance + arc.weight;
                if (candidate < witness_label(arc.other)) {
                    witness_stamp_[arc.other] = witness_query_;
                    witness_distance_[arc.other] = candidate;
                    heap_.push_back({candidate, arc.other});
                    std::push_heap(heap_.begin(), heap_.end(), std::greater<Entry>());
                }
            }
        }
    }

    void add_shortcut(NodeId from, NodeId to, PackedWeight weight, NodeId middle) {
        for (DynamicArc& arc : out_[from]) {
            if (arc.other != to) continue;
            if (arc.weight <= weight) return;
            arc.weight = weight;
            arc.middle = middle;
            for (DynamicArc& reverse : in_[to]) {
                if (reverse.other == from) {
                    reverse.weight = weight;
                    reverse.middle = middle;
                }
            }
            return;
        }
        out_[from].push_back({to, middle, weight});
        in_[to].push_back({from, middle, weight});
    }

    std::uint32_t node_count_;
    std::vector<std::vector<DynamicArc>> out_;
    std::vector<std::vector<DynamicArc>> in_;
    std::vector<std::uint8_t> contracted_;
    std::vector<std::uint32_t> contracted_neighbours_;
    std::vector<std::uint32_t> depth_;
    std::vector<std::vector<HierarchyArc>> upward_;
    std::vector<PackedWeight> witness_distance_;
    std::vector<std::uint32_t> witness_stamp_;
    std::vector<std::uint32_t> target_stamp_;
    std::uint32_t witness_query_ = 0;
    std::vector<std::pair<PackedWeight, NodeId>> heap_;
    std::vector<DynamicArc> scratch_in_;
    std::vector<DynamicArc> scratch_out_;
    std::vector<NodeId> scratch_neighbours_;
};

// Section header for one metric's hierarchy (layout in router/HIERARCHY.md).
struct HierarchyHeader {
    std::uint32_t layout_version;
    std::uint32_t metric;
    std::uint32_t node_count;
    std::uint32_t arc_count;
    std::uint64_t routing_graph_fingerprint;
};
static_assert(sizeof(HierarchyHeader) == 24);
constexpr std::uint32_t kHierarchyLayoutVersion = 1;

std::string section_tag(Metric metric, const char* part) {
    return std::string(metric == Metric::time ? "ch.t." : "ch.d.") + part;
}

template <typename T>
graph::ExtraSection make_section(std::string tag, std::span<const T> values) {
    static_assert(std::is_trivially_copyable_v<T>);
    graph::ExtraSection section;
    section.tag = std::move(tag);
    section.bytes.resize(values.size_bytes());
    if (!values.empty()) std::memcpy(section.bytes.data(), values.data(), values.size_bytes());
    return section;
}

template <typename T>
bool view_as(std::span<const std::byte> bytes, std::span<const T>& out) {
    if (bytes.size() % sizeof(T) != 0) return false;
    if (reinterpret_cast<std::uintptr_t>(bytes.data()) % alignof(T) != 0) return false;
    out = {reinterpret_cast<const T*>(bytes.data()), bytes.size() / sizeof(T)};
    return true;
}

} // namespace

struct OwnedHierarchyStorage {
    BuiltHierarchy built;
    graph::RoadGraph mapped_graph;   // keeps mapped sections alive when viewing a file
};

ContractionHierarchy ContractionHierarchy::build(const RoutingGraph& routing_graph, Metric metric, Progress* progress) {
    Contractor contractor(routing_graph, metric);
    auto storage = std::make_shared<OwnedHierarchyStorage>();
    storage->built = contractor.run(progress);
    ContractionHierarchy hierarchy;
    hierarchy.metric_ = metric;
    hierarchy.fingerprint_ = routing_graph.fingerprint();
    hierarchy.rank_ = storage->built.rank;
    hierarchy.first_arc_ = storage->built.first_arc;
    hierarchy.arcs_ = storage->built.arcs;
    hierarchy.storage_ = storage;
    return hierarchy;
}

std::optional<ContractionHierarchy> ContractionHierarchy::from_sections(const graph::RoadGraph& road_graph,
                                                                        const RoutingGraph& routing_graph,
                                                                        Metric metric) {
    std::span<const HierarchyHeader> header;
    std::span<const std::uint32_t> rank;
    std::span<const std::uint32_t> first_arc;
    std::span<const HierarchyArc> arcs;
    if (!view_as(road_graph.section(section_tag(metric, "header")), header) || header.size() != 1) return std::nullopt;
    if (!view_as(road_graph.section(section_tag(metric, "rank")), rank)) return std::nullopt;
    if (!view_as(road_graph.section(section_tag(metric, "first")), first_arc)) return std::nullopt;
    if (!view_as(road_graph.section(section_tag(metric, "arcs")), arcs)) return std::nullopt;
    const HierarchyHeader& head = header[0];
    const std::uint32_t n = routing_graph.node_count();
    if (head.layout_version != kHierarchyLayoutVersion || head.metric != static_cast<std::uint32_t>(metric) ||
        head.node_count != n || head.routing_graph_fingerprint != routing_graph.fingerprint() ||
        rank.size() != n || first_arc.size() != std::size_t{n} + 1 || arcs.size() != head.arc_count ||
        first_arc.back() != head.arc_count) {
        return std::nullopt;
    }
    for (std::uint32_t node = 0; node < n; ++node) {
        if (first_arc[node] > first_arc[node + 1]) return std::nullopt;
    }
    for (const HierarchyArc& arc : arcs) {
        if (arc.higher_node >= n || (arc.middle_node != kNoNode && arc.middle_node >= n)) return std::nullopt;
    }
    auto storage = std::make_shared<OwnedHierarchyStorage>();
    storage->mapped_graph = road_graph;
    ContractionHierarchy hierarchy;
    hierarchy.metric_ = metric;
    hierarchy.fingerprint_ = head.routing_graph_fingerprint;
    hierarchy.rank_ = rank;
    hierarchy.first_arc_ = first_arc;
    hierarchy.arcs_ = arcs;
    hierarchy.storage_ = storage;
    return hierarchy;
}

std::vector<graph::ExtraSection> ContractionHierarchy::to_sections() const {
    const HierarchyHeader header{kHierarchyLayoutVersion, static_cast<std::uint32_t>(metric_), node_count(),
                                 arc_count(), fingerprint_};
    std::vector<graph::ExtraSection> sections;
    sections.push_back(make_section(section_tag(metric_, "header"), std::span<const HierarchyHeader>(&header, 1)));
    sections.push_back(make_section(section_tag(metric_, "rank"), rank_));
    sections.push_back(make_section(section_tag(metric_, "first"), first_arc_));
    sections.push_back(make_section(section_tag(metric_, "arcs"), arcs_));
    return sections;
}

std::uint32_t ContractionHierarchy::shortcut_count() const noexcept {
    std::uint32_t count = 0;
    for (const HierarchyArc& arc : arcs_) count += arc.middle_node != kNoNode;
    return count;
}

std::size_t ContractionHierarchy::byte_size() const noexcept {
    return rank_.size_bytes() + first_arc_.size_bytes() + arcs_.size_bytes() + sizeof(HierarchyHeader);
}

void ContractionHierarchy::unpack_arc(NodeId from, NodeId to, PackedWeight weight, std::vector<NodeId>& out) const {
    // The arc is stored at its lower end; find it by direction and weight.
    const bool upwards = rank_[from] < rank_[to];
    const NodeId lower = upwards ? from : to;
    const NodeId higher = upwards ? to : from;
    const std::uint32_t direction = upwards ? kArcForward : kArcBackward;
    for (const HierarchyArc& arc : upward_arcs(lower)) {
        if (arc.higher_node != higher || !(arc.directions & direction) || arc.weight != weight) continue;
        if (arc.middle_node == kNoNode) {
            out.push_back(to);
            return;
        }
        // from -> middle is stored at middle (lower than both) as an arc towards `from`.
        const NodeId middle = arc.middle_node;
        for (const HierarchyArc& first_half : upward_arcs(middle)) {
            if (first_half.higher_node != from || !(first_half.directions & kArcBackward)) continue;
            if (first_half.weight > weight) continue;
            const PackedWeight second_weight = weight - first_half.weight;
            for (const HierarchyArc& second_half : upward_arcs(middle)) {
                if (second_half.higher_node == to && (second_half.directions & kArcForward) &&
                    second_half.weight == second_weight) {
                    unpack_arc(from, middle, first_half.weight, out);
                    unpack_arc(middle, to, second_weight, out);
                    return;
                }
            }
        }
    }
    throw std::logic_error("contraction hierarchy: cannot unpack an arc (corrupt hierarchy)");
}

std::vector<graph::ExtraSection> build_hierarchy_sections(const graph::RoadGraph& road_graph, RestrictionPolicy policy,
                                                          Progress* progress) {
    const RoutingGraph routing_graph(road_graph, policy);
    std::vector<graph::ExtraSection> sections;
    for (Metric metric : {Metric::time, Metric::distance}) {
        std::vector<graph::ExtraSection> part = ContractionHierarchy::build(routing_graph, metric, progress).to_sections();
        for (auto& section : part) sections.push_back(std::move(section));
    }
    return sections;
}

bool has_hierarchy_sections(const graph::RoadGraph& road_graph, Metric metric) {
    return !road_graph.section(section_tag(metric, "header")).empty();
}

} // namespace ringroad::router
