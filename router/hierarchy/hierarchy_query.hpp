#pragma once
// Queries on a ContractionHierarchy: point-to-point bidirectional search with stall-on-demand,
// and many-to-many by the bucket method (Knopp et al. 2007): a backward upward search from each
// target leaves (target, distance) in a bucket at every node it settles; a forward upward search
// from each source scans the buckets of the nodes it settles. Starts and ends are sets of
// weighted nodes (a stop mid-edge joins the graph at up to two nodes).
// A HierarchySearch is a reusable workspace (labels reset rank by rank); one per thread. It works
// on ranks (ContractionHierarchy numbers nodes by rank) and speaks routing nodes at its interface.

#include "router/dijkstra.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/hierarchy/rank_heap.hpp"

#include <cstdint>
#include <memory>
#include <span>
#include <vector>

namespace ringroad::router::hierarchy {

class HierarchySearch {
public:
    explicit HierarchySearch(const ContractionHierarchy& hierarchy);

    // Shortest weight from any start to any end (ends carry the weight still to pay after the
    // node); kUnreachableWeight if none. When `path` is given it receives the routing nodes
    // from the chosen start node to the chosen end node, inclusive, unpacked.
    PackedWeight shortest(std::span<const WeightedNode> starts, std::span<const WeightedNode> ends,
                          std::vector<NodeId>* path = nullptr);

    // Upward search from `starts` (routing nodes) in one direction (forward: along arcs;
    // backward: against them); appends (rank, weight) for every node settled and not stalled.
    // Used by the bucket many-to-many, whose buckets are indexed by rank.
    void upward_search(std::span<const WeightedNode> starts, bool forward,
                       std::vector<WeightedNode>& settled);

private:
    // Per rank, in two arrays: the distances, which stall tests and relaxations read by the
    // dozen for every label they change, densely (8 bytes a rank, so the top of the hierarchy
    // that every search ends in fits in a few cache pages); and the links, touched only when a
    // label changes or a path is unpacked.
    // Both calloc'ed: a large zeroed allocation comes from fresh pages that the kernel zeroes
    // only when touched, and a search touches a few thousand ranks, so a search on a region of
    // millions of nodes costs nothing up front. Distances are therefore stored inverted
    // (~distance), so that zero reads as unreached; a search resets the ranks the previous one
    // reached instead of the whole array.
    struct Link {
        std::uint32_t parent;      // rank
        std::uint32_t heap_slot;   // position in the side's heap, or RankHeap::kNotQueued
    };
    struct FreeMemory {
        void operator()(void* memory) const noexcept;
    };
    struct Side {
        std::unique_ptr<PackedWeight[], FreeMemory> inverted_distance;
        std::unique_ptr<Link[], FreeMemory> links;
        std::vector<std::uint32_t> reached;   // ranks labelled since the last start
        RankHeap heap;
        bool forward = true;

        PackedWeight label(std::uint32_t rank) const { return ~inverted_distance[rank]; }
        auto slots() {
            return [this](std::uint32_t rank) -> std::uint32_t& { return links[rank].heap_slot; };
        }
    };
    void start(Side& side, std::span<const WeightedNode> starts);
    bool stalled(const Side& side, std::uint32_t rank, PackedWeight weight) const;
    void relax(Side& side, std::uint32_t rank, PackedWeight weight);
    // Labels `rank` with `weight` via `parent` and queues it, if that improves its label.
    void reach(Side& side, std::uint32_t rank, PackedWeight weight, std::uint32_t parent);
    bool pop(Side& side, std::uint32_t& rank, PackedWeight& weight);
    // The routing nodes of the path through `meeting`, from the two sides' parent ranks.
    void unpack_path(std::uint32_t meeting, std::vector<NodeId>& path) const;
    const ContractionHierarchy* hierarchy_;
    Side forward_;
    Side backward_;
};

// Many-to-many: result[i * ends.size() + j] = shortest weight from starts[i] to ends[j], computed
// on `threads` threads (0 = all cores). Each start/end is a set of weighted nodes.
// (router/hierarchy/bucket_many_to_many.cpp)
std::vector<PackedWeight> hierarchy_many_to_many(const ContractionHierarchy& hierarchy,
                                                 const std::vector<std::vector<WeightedNode>>& starts,
                                                 const std::vector<std::vector<WeightedNode>>& ends,
                                                 unsigned threads = 0);

} // namespace ringroad::router::hierarchy
