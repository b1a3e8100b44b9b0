#pragma once
// Snapping: a stop (lat, lon) goes to the nearest point of the nearest road segment of the main
// component (graph component 0, the largest strongly connected one). The index covers the
// straight pieces between consecutive shape points: the packed Hilbert R-tree `ringroad build`
// stores in the file (router/snap_index.hpp), searched in place, or, for a file without one, a
// Boost.Geometry R-tree built at load time. Either yields the kCandidates nearest pieces in a
// local equirectangular plane, ties settled by piece order (router/snap_geometry.hpp), which are
// then ranked by the haversine distance to the foot of the perpendicular (exact enough below a
// few kilometres): both indexes give identical results.
//
// The result says where on the segment the stop sits (a fraction of the segment's geometric
// length from its first vertex) so a route starts or ends there, paying only the part of the edge
// it drives, and only in the directions the edge allows.

#include "graph/coordinate.hpp"
#include "graph/road_graph.hpp"

#include <cstdint>
#include <memory>
#include <string>
#include <string_view>

namespace ringroad::router {

inline constexpr double kDefaultSnapRadiusMeters = 500.0;   // common practice for address points

struct SnappedStop {
    std::string id;
    graph::Coordinate requested;        // where the stop was asked for
    graph::Coordinate on_road;          // the nearest point on the road
    graph::SegmentId segment = 0;
    double fraction = 0.0;              // 0 = segment's first vertex, 1 = its last vertex
    double snap_distance_meters = 0.0;  // requested -> on_road
};

enum class SnapIndexSource : std::uint8_t {
    stored_when_present,   // the file's `snap.` sections when present, else build the fallback
    built,                 // always build the Boost.Geometry fallback (tests compare the two)
};

class RoadSnapper {
public:
    // Indexes the segments of the main component that can be driven in at least one direction.
    // Throws InputError naming the section and record when a stored index is damaged.
    explicit RoadSnapper(const graph::RoadGraph& road_graph,
                         SnapIndexSource source = SnapIndexSource::stored_when_present);
    ~RoadSnapper();
    RoadSnapper(RoadSnapper&&) noexcept;
    RoadSnapper& operator=(RoadSnapper&&) noexcept;

    // Throws InputError naming `stop_id`: coordinates not finite or out of range ("stop 'a':
    // latitude 91 is outside [-90, 90]"), outside the region's bounds (metadata "bbox", widened
    // by twice the snap radius or 2 km, whichever is more), or farther than `radius_meters` from every road ("stop 'a' is 812 m
    // from the nearest road (snap radius 500 m)").
    SnappedStop snap(std::string_view stop_id, double lat, double lon, double radius_meters) const;

    // The same search without the radius/bounds checks; false only when the index is empty.
    bool nearest(double lat, double lon, SnappedStop& result) const;

    // Whether the index is the stored one (mapped from the file) rather than built at load.
    bool uses_stored_index() const noexcept;

private:
    struct Index;
    const graph::RoadGraph* road_graph_ = nullptr;
    std::unique_ptr<Index> index_;
};

} // namespace ringroad::router
