#pragma once
// PackedPieceIndex: the stored spatial index for snapping, a static R-tree packed in Hilbert
// order (Kamel & Faloutsos, "On Packing R-trees", CIKM 1993; the ordering of their Hilbert
// R-tree, VLDB 1994) over the same road pieces the Boost.Geometry fallback indexes. Built once by
// `ringroad build` into the `snap.` sections (layout in router/STORED.md) and searched in place in
// the mapped file: opening a region builds nothing and copies nothing.
//
// nearest() returns exactly the kCandidates smallest pieces in snapping::Candidate order, the
// same set and order the fallback produces, so both give identical snapping results.

#include "graph/road_graph.hpp"
#include "router/snap_geometry.hpp"

#include <optional>
#include <vector>

namespace ringroad::router::snapping {

class PackedPieceIndex {
public:
    // One leaf entry: the piece (segment, first_point).
    struct Piece {
        graph::SegmentId segment;
        std::uint32_t first_point;
    };
    // A node's box in the plane, rounded outwards to float.
    struct Box {
        float min_x, min_y, max_x, max_y;
    };
    static constexpr std::uint32_t kNodeSize = 16;   // children per node

    // The `snap.` sections for `ringroad build`.
    static std::vector<graph::ExtraSection> build_sections(const graph::RoadGraph& road_graph);
    // The index stored in the graph's `snap.` sections, or nullopt when there is none (or of
    // another layout version). Throws InputError naming the section and record when it is
    // damaged or inconsistent: a piece out of range, a node box that does not contain a child.
    static std::optional<PackedPieceIndex> from_sections(const graph::RoadGraph& road_graph);

    double reference_cos_lat() const noexcept { return reference_cos_lat_; }
    bool empty() const noexcept { return pieces_.empty(); }
    // The (at most) kCandidates nearest pieces to `query`, in Candidate order.
    void nearest(PlanePoint query, std::vector<Candidate>& out) const;

private:
    graph::RoadGraph road_graph_;            // shares the mapping the spans point into
    double reference_cos_lat_ = 1.0;
    std::span<const Piece> pieces_;          // in Hilbert order
    std::span<const Box> boxes_;             // leaf nodes first, then each level up; root last
    std::vector<std::uint32_t> level_begin_; // first box of each level (level 0 = leaves), + end
};

} // namespace ringroad::router::snapping
