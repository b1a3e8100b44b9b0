#pragma once
// Queries on a ContractionHierarchy: point-to-point bidirectional search with stall-on-demand,
// and many-to-many by the bucket method (Knopp et al. 2007): a backward upward search from each
// target leaves (target, distance) in a bucket at every node it settles; a forward upward search
// from each source scans the buckets of the nodes it settles. Starts and ends are sets of
// weighted nodes (a stop mid-edge joins the graph at up to two nodes).
// A HierarchySearch is a reusable workspace (stamped labels); one per thread. It works on ranks
// (ContractionHierarchy numbers nodes by rank) and speaks routing nodes at its interface.

#include "router/contraction_hierarchy.hpp"
#include "router/dijkstra.hpp"

#include <cstdint>
#include <memory>
#include <span>
#include <vector>

namespace ringroad::router {

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
    // One label per rank in a single array, so a relaxation touches one cache line, not three.
    struct Label {
        PackedWeight distance;
        std::uint32_t stamp;    // the label is valid when stamp == the side's query number
        std::uint32_t parent;   // rank
    };
    // calloc'ed: a large zeroed allocation comes from fresh pages that the kernel zeroes only
    // when touched, and a search touches a few thousand nodes, so setting up a search on a
    // region of millions of nodes costs nothing up front (value-initialising a vector wrote
    // 16 bytes per node, tens of megabytes, per search object).
    struct FreeLabels {
        void operator()(Label* labels) const noexcept;
    };
    struct Side {
        std::unique_ptr<Label[], FreeLabels> labels;
        std::vector<std::pair<PackedWeight, std::uint32_t>> heap;   // (weight, rank); lazy deletion
        std::uint32_t query = 0;
        bool forward = true;

        PackedWeight label(std::uint32_t rank) const {
            return labels[rank].stamp == query ? labels[rank].distance : kUnreachableWeight;
        }
    };
    void start(Side& side, std::span<const WeightedNode> starts);
    bool stalled(const Side& side, std::uint32_t rank, PackedWeight weight) const;
    void relax(Side& side, std::uint32_t rank, PackedWeight weight);
    bool pop(Side& side, std::uint32_t& rank, PackedWeight& weight);
    // The routing nodes of the path through `meeting`, from the two sides' parent ranks.
    void unpack_path(std::uint32_t meeting, std::vector<NodeId>& path) const;
    const ContractionHierarchy* hierarchy_;
    Side forward_;
    Side backward_;
};

// Many-to-many: result[i * ends.size() + j] = shortest weight from starts[i] to ends[j], computed
// on `threads` threads (0 = all cores). Each start/end is a set of weighted nodes.
// (router/bucket_many_to_many.cpp)
std::vector<PackedWeight> hierarchy_many_to_many(const ContractionHierarchy& hierarchy,
                                                 const std::vector<std::vector<WeightedNode>>& starts,
                                                 const std::vector<std::vector<WeightedNode>>& ends,
                                                 unsigned threads = 0);

} // namespace ringroad::router
