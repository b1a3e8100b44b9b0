#include "graph/road_graph.hpp"

#include "graph/components.hpp"

#include <algorithm>
#include <cstdio>
#include <stdexcept>

namespace ringroad::graph {

namespace {

// The vectors behind a graph built in memory; spans in RoadGraph point into them.
struct OwnedStorage {
    std::vector<Coordinate> coordinates;
    std::vector<std::int64_t> vertex_osm_ids;
    std::vector<std::uint32_t> first_out;
    std::vector<Edge> edges;
    std::vector<Segment> segments;
    std::vector<Coordinate> shape_points;
    std::string names;
    std::vector<TurnRestriction> turn_restrictions;
    std::vector<std::uint32_t> components;
};

void check_input(const RoadGraphData& data) {
    const auto n = data.coordinates.size();
    if (!data.vertex_osm_ids.empty() && data.vertex_osm_ids.size() != n) {
        throw std::invalid_argument("road graph: vertex_osm_ids size differs from coordinates");
    }
    for (const auto& input : data.edges) {
        if (input.tail >= n || input.edge.head >= n || input.edge.segment >= data.segments.size()) {
            throw std::invalid_argument("road graph: edge refers to a missing vertex or segment");
        }
    }
    for (const auto& segment : data.segments) {
        if (segment.first_vertex >= n || segment.last_vertex >= n ||
            segment.shape_begin > segment.shape_end || segment.shape_end > data.shape_points.size()) {
            throw std::invalid_argument("road graph: segment refers to a missing vertex or shape point");
        }
    }
    for (const auto& restriction : data.turn_restrictions) {
        if (restriction.via_vertex >= n || restriction.from_segment >= data.segments.size() ||
            restriction.to_segment >= data.segments.size()) {
            throw std::invalid_argument("road graph: turn restriction refers to a missing id");
        }
    }
}

std::string format_bbox(std::span<const Coordinate> coordinates) {
    if (coordinates.empty()) return "";
    std::int32_t min_lat = coordinates[0].lat_e7, max_lat = min_lat;
    std::int32_t min_lon = coordinates[0].lon_e7, max_lon = min_lon;
    for (const auto& c : coordinates) {
        min_lat = std::min(min_lat, c.lat_e7);
        max_lat = std::max(max_lat, c.lat_e7);
        min_lon = std::min(min_lon, c.lon_e7);
        max_lon = std::max(max_lon, c.lon_e7);
    }
    char text[128];
    std::snprintf(text, sizeof text, "%.7f,%.7f,%.7f,%.7f", min_lon * 1e-7, min_lat * 1e-7,
                  max_lon * 1e-7, max_lat * 1e-7);
    return text;
}

void set_metadata(Metadata& metadata, const std::string& key, const std::string& value) {
    for (auto& entry : metadata) {
        if (entry.first == key) {
            entry.second = value;
            return;
        }
    }
    metadata.emplace_back(key, value);
}

} // namespace

std::uint32_t RoadGraphData::add_name(std::string_view name) {
    const auto offset = static_cast<std::uint32_t>(names.size());
    names.append(name);
    names.push_back('\0');
    return offset;
}

std::string_view road_class_name(RoadClass road_class) {
    static constexpr std::string_view names[] = {
        "motorway", "motorway_link", "trunk", "trunk_link", "primary", "primary_link",
        "secondary", "secondary_link", "tertiary", "tertiary_link", "unclassified",
        "residential", "living_street", "service", "track", "road", "pedestrian", "footway",
        "path", "cycleway", "bridleway", "steps", "ferry", "other"};
    const auto index = static_cast<std::size_t>(road_class);
    return index < std::size(names) ? names[index] : std::string_view("other");
}

VertexId RoadGraph::edge_tail(EdgeId e) const {
    // The tail is the last v with first_out[v] <= e.
    const auto it = std::upper_bound(first_out_.begin(), first_out_.end(), e);
    return static_cast<VertexId>(it - first_out_.begin() - 1);
}

std::vector<Coordinate> RoadGraph::segment_geometry(SegmentId s) const {
    const Segment& segment = segments_[s];
    std::vector<Coordinate> points;
    points.reserve(segment.shape_end - segment.shape_begin + 2);
    points.push_back(coordinates_[segment.first_vertex]);
    for (auto i = segment.shape_begin; i < segment.shape_end; ++i) points.push_back(shape_points_[i]);
    points.push_back(coordinates_[segment.last_vertex]);
    return points;
}

std::string_view RoadGraph::name(std::uint32_t name_offset) const {
    if (name_offset == kNoName || name_offset >= names_.size()) return {};
    const auto rest = names_.substr(name_offset);
    return rest.substr(0, rest.find('\0'));
}

std::string RoadGraph::metadata_value(std::string_view key) const {
    for (const auto& [entry_key, value] : metadata_) {
        if (entry_key == key) return value;
    }
    return {};
}

std::span<const std::byte> RoadGraph::section(std::string_view tag) const {
    for (const auto& [section_tag, bytes] : extra_sections_) {
        if (section_tag == tag) return bytes;
    }
    return {};
}

RoadGraph build_road_graph(RoadGraphData data) {
    check_input(data);
    auto storage = std::make_shared<OwnedStorage>();
    const auto n = static_cast<std::uint32_t>(data.coordinates.size());

    // Adjacency array: count per tail, prefix sums, then place edges (stable within a tail).
    storage->first_out.assign(n + 1, 0);
    for (const auto& input : data.edges) ++storage->first_out[input.tail + 1];
    for (std::uint32_t v = 0; v < n; ++v) storage->first_out[v + 1] += storage->first_out[v];
    storage->edges.resize(data.edges.size());
    std::vector<std::uint32_t> next(storage->first_out.begin(), storage->first_out.end() - 1);
    for (const auto& input : data.edges) storage->edges[next[input.tail]++] = input.edge;

    // Link each segment to its directed edges.
    for (auto& segment : data.segments) segment.forward_edge = segment.backward_edge = kNoEdge;
    for (EdgeId e = 0; e < storage->edges.size(); ++e) {
        const Edge& edge = storage->edges[e];
        auto& segment = data.segments[edge.segment];
        (edge.reversed ? segment.backward_edge : segment.forward_edge) = e;
    }

    std::vector<std::uint32_t> heads(storage->edges.size());
    for (std::size_t e = 0; e < heads.size(); ++e) heads[e] = storage->edges[e].head;
    auto labels = strongly_connected_components(storage->first_out, heads);

    std::uint64_t road_length_dm = 0;
    for (const auto& segment : data.segments) {
        if (segment.forward_edge != kNoEdge || segment.backward_edge != kNoEdge) road_length_dm += segment.length_dm;
    }
    const auto main_size = static_cast<std::size_t>(
        std::count(labels.component.begin(), labels.component.end(), 0u));

    Metadata& metadata = data.metadata;
    set_metadata(metadata, "junctions", std::to_string(n));
    set_metadata(metadata, "edges", std::to_string(storage->edges.size()));
    set_metadata(metadata, "segments", std::to_string(data.segments.size()));
    set_metadata(metadata, "road_length_dm", std::to_string(road_length_dm));
    set_metadata(metadata, "components", std::to_string(labels.count));
    set_metadata(metadata, "main_component_junctions", std::to_string(n == 0 ? 0 : main_size));
    set_metadata(metadata, "turn_restrictions", std::to_string(data.turn_restrictions.size()));
    set_metadata(metadata, "bbox", format_bbox(data.coordinates));

    storage->coordinates = std::move(data.coordinates);
    storage->vertex_osm_ids = std::move(data.vertex_osm_ids);
    if (storage->vertex_osm_ids.empty()) storage->vertex_osm_ids.assign(n, 0);
    storage->segments = std::move(data.segments);
    storage->shape_points = std::move(data.shape_points);
    storage->names = std::move(data.names);
    storage->turn_restrictions = std::move(data.turn_restrictions);
    storage->components = std::move(labels.component);

    RoadGraph graph;
    graph.coordinates_ = storage->coordinates;
    graph.vertex_osm_ids_ = storage->vertex_osm_ids;
    graph.first_out_ = storage->first_out;
    graph.edges_ = storage->edges;
    graph.segments_ = storage->segments;
    graph.shape_points_ = storage->shape_points;
    graph.names_ = storage->names;
    graph.turn_restrictions_ = storage->turn_restrictions;
    graph.components_ = storage->components;
    graph.component_count_ = labels.count;
    graph.metadata_ = std::move(metadata);
    graph.storage_ = std::move(storage);
    return graph;
}

RoadGraph attach_sections(const RoadGraph& graph, std::vector<ExtraSection> sections) {
    // The new sections' bytes live in a holder that also keeps the original storage alive.
    struct Holder {
        std::shared_ptr<const void> base;
        std::vector<ExtraSection> sections;
    };
    auto holder = std::make_shared<Holder>(Holder{graph.storage_, std::move(sections)});
    RoadGraph result = graph;
    for (const auto& section : holder->sections) {
        auto existing = std::find_if(result.extra_sections_.begin(), result.extra_sections_.end(),
                                     [&](const auto& entry) { return entry.first == section.tag; });
        if (existing != result.extra_sections_.end()) {
            existing->second = section.bytes;
        } else {
            result.extra_sections_.emplace_back(section.tag, section.bytes);
        }
    }
    result.storage_ = std::move(holder);
    return result;
}

} // namespace ringroad::graph
