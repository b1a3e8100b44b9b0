#pragma once
// RoadGraph: the compact, read-only road graph every other component works on.
//
//  * Vertices are junctions (OSM nodes shared by roads), road ends and barrier nodes.
//  * A Segment is one undirected piece of road between two vertices with its shape points; it is
//    the unit of geometry (snapping, drawing, "unique road segments" of a network).
//  * An Edge is one allowed direction of travel along a segment, stored in a compressed
//    adjacency array sorted by tail vertex (first_out[v] .. first_out[v+1]).
//  * All costs sit on edges, as integers: travel time in tenths of a second and length in
//    decimetres, so two algorithms on the same graph agree exactly.
//  * Component ids are strongly connected components numbered by size: 0 is the largest
//    ("main") component.
//
// A RoadGraph is a set of spans over storage it shares: either vectors built in memory
// (build_road_graph) or a memory-mapped .rrg file (load_road_graph in graph_file.hpp). Copies are
// cheap and share the storage. The graph knows nothing about OSM tags, profiles' rules or HTTP.

#include "graph/coordinate.hpp"

#include <cstddef>
#include <cstdint>
#include <limits>
#include <memory>
#include <span>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace ringroad::graph {

using VertexId = std::uint32_t;
using EdgeId = std::uint32_t;
using SegmentId = std::uint32_t;

inline constexpr VertexId kNoVertex = std::numeric_limits<VertexId>::max();
inline constexpr EdgeId kNoEdge = std::numeric_limits<EdgeId>::max();
inline constexpr std::uint32_t kNoName = std::numeric_limits<std::uint32_t>::max();

// Road classes, kept per edge for avoid-options and for reporting. Values are part of the file
// format: append only.
enum class RoadClass : std::uint8_t {
    motorway, motorway_link, trunk, trunk_link, primary, primary_link, secondary, secondary_link,
    tertiary, tertiary_link, unclassified, residential, living_street, service, track, road,
    pedestrian, footway, path, cycleway, bridleway, steps, ferry, other
};
std::string_view road_class_name(RoadClass road_class);

// Bits of Edge::flags. Values are part of the file format: append only.
namespace edge_flag {
inline constexpr std::uint16_t toll = 1u << 0;
inline constexpr std::uint16_t ferry = 1u << 1;
inline constexpr std::uint16_t destination_only = 1u << 2;   // access=destination and kin
inline constexpr std::uint16_t roundabout = 1u << 3;
inline constexpr std::uint16_t barrier_delay = 1u << 4;      // time includes a gate's delay
inline constexpr std::uint16_t unpaved = 1u << 5;
} // namespace edge_flag

struct Edge {
    VertexId head;
    SegmentId segment;
    std::uint32_t time_ds;      // travel time, tenths of a second
    std::uint32_t length_dm;    // length, decimetres (equal to the segment's)
    std::uint16_t flags;        // edge_flag bits
    std::uint8_t road_class;    // RoadClass
    std::uint8_t reversed;      // 1 when it runs from the segment's last vertex to its first
};
static_assert(sizeof(Edge) == 20);

struct Segment {
    VertexId first_vertex;
    VertexId last_vertex;
    std::uint32_t shape_begin;  // interior shape points: shape_points[shape_begin, shape_end)
    std::uint32_t shape_end;
    std::uint32_t length_dm;
    std::uint32_t name;         // offset into the name table, or kNoName
    EdgeId forward_edge;        // first -> last, or kNoEdge when that direction is closed
    EdgeId backward_edge;       // last -> first, or kNoEdge
    std::int64_t way_id;        // the OSM way it came from
};
static_assert(sizeof(Segment) == 40);

enum class RestrictionKind : std::uint8_t { no_turn = 0, only_turn = 1 };

// Arriving at via_vertex along from_segment, leaving along to_segment is forbidden (no_turn), or
// is the only allowed way to leave (only_turn).
struct TurnRestriction {
    SegmentId from_segment;
    VertexId via_vertex;
    SegmentId to_segment;
    std::uint8_t kind;          // RestrictionKind
    std::uint8_t padding[3];
    std::int64_t relation_id;
};
static_assert(sizeof(TurnRestriction) == 24);

// Provenance and counts as ordered key/value text pairs (source, source_timestamp, profile,
// built_at, junctions, edges, road_length_dm, ways_missing_nodes, restrictions_unmatched...).
using Metadata = std::vector<std::pair<std::string, std::string>>;

// Input to build_road_graph: what an extractor (or a test) produces.
struct DirectedEdgeInput {
    VertexId tail;
    Edge edge;                  // head, segment, costs, flags
};

struct RoadGraphData {
    std::vector<Coordinate> coordinates;        // per vertex
    std::vector<std::int64_t> vertex_osm_ids;   // per vertex (0 when synthetic)
    std::vector<Segment> segments;              // forward_edge/backward_edge are filled in by the build
    std::vector<Coordinate> shape_points;
    std::string names;                          // NUL-terminated names; Segment::name is an offset
    std::vector<DirectedEdgeInput> edges;       // any order
    std::vector<TurnRestriction> turn_restrictions;
    Metadata metadata;

    // Appends a name (deduplicated by the caller if it wishes) and returns its offset.
    std::uint32_t add_name(std::string_view name);
};

// An extra named section carried in the file (the contraction hierarchy, for instance).
struct ExtraSection {
    std::string tag;                            // at most 15 bytes
    std::vector<std::byte> bytes;
};

class RoadGraph {
public:
    RoadGraph() = default;

    std::uint32_t vertex_count() const noexcept { return static_cast<std::uint32_t>(coordinates_.size()); }
    std::uint32_t edge_count() const noexcept { return static_cast<std::uint32_t>(edges_.size()); }
    std::uint32_t segment_count() const noexcept { return static_cast<std::uint32_t>(segments_.size()); }

    std::span<const Coordinate> coordinates() const noexcept { return coordinates_; }
    Coordinate coordinate(VertexId v) const { return coordinates_[v]; }
    std::span<const std::int64_t> vertex_osm_ids() const noexcept { return vertex_osm_ids_; }

    std::span<const std::uint32_t> first_out() const noexcept { return first_out_; }
    std::span<const Edge> edges() const noexcept { return edges_; }
    std::span<const Edge> out_edges(VertexId v) const {
        return edges_.subspan(first_out_[v], first_out_[v + 1] - first_out_[v]);
    }
    // The tail of an edge (binary search in first_out).
    VertexId edge_tail(EdgeId e) const;

    std::span<const Segment> segments() const noexcept { return segments_; }
    std::span<const Coordinate> shape_points() const noexcept { return shape_points_; }
    // All points of a segment from its first vertex to its last.
    std::vector<Coordinate> segment_geometry(SegmentId s) const;
    std::string_view name(std::uint32_t name_offset) const;
    std::string_view names_blob() const noexcept { return names_; }

    std::span<const TurnRestriction> turn_restrictions() const noexcept { return turn_restrictions_; }

    // Strongly connected component of each vertex; 0 is the largest.
    std::span<const std::uint32_t> components() const noexcept { return components_; }
    bool in_main_component(VertexId v) const { return components_[v] == 0; }
    std::uint32_t component_count() const noexcept { return component_count_; }

    const Metadata& metadata() const noexcept { return metadata_; }
    // Value of a metadata key, or an empty string.
    std::string metadata_value(std::string_view key) const;

    // Extra sections by tag; empty span when absent.
    std::span<const std::byte> section(std::string_view tag) const;
    const std::vector<std::pair<std::string, std::span<const std::byte>>>& extra_sections() const noexcept {
        return extra_sections_;
    }

private:
    friend RoadGraph build_road_graph(RoadGraphData data);
    friend RoadGraph attach_sections(const RoadGraph& graph, std::vector<ExtraSection> sections);
    friend class GraphFileLoader;

    std::shared_ptr<const void> storage_;
    std::span<const Coordinate> coordinates_;
    std::span<const std::int64_t> vertex_osm_ids_;
    std::span<const std::uint32_t> first_out_;
    std::span<const Edge> edges_;
    std::span<const Segment> segments_;
    std::span<const Coordinate> shape_points_;
    std::string_view names_;
    std::span<const TurnRestriction> turn_restrictions_;
    std::span<const std::uint32_t> components_;
    std::uint32_t component_count_ = 0;
    Metadata metadata_;
    std::vector<std::pair<std::string, std::span<const std::byte>>> extra_sections_;
};

// Sorts the edges into the adjacency array, links segments to their edges, computes strongly
// connected components (largest = 0) and adds the counts to the metadata (junctions, edges,
// segments, road_length_dm, components, main_component_junctions, bbox). Throws
// std::invalid_argument on inconsistent input (an id out of range): that is a bug in the caller.
RoadGraph build_road_graph(RoadGraphData data);

// A graph sharing `graph`'s storage, with extra sections added or replaced (the hierarchy).
RoadGraph attach_sections(const RoadGraph& graph, std::vector<ExtraSection> sections);

} // namespace ringroad::graph
