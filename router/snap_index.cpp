// The packed Hilbert R-tree for snapping (Kamel & Faloutsos 1993): pieces sorted by the Hilbert
// value of their centres, cut into nodes of kNodeSize, each level's nodes again cut into nodes of
// kNodeSize up to one root. Layout in router/STORED.md.
#include "router/snap_index.hpp"

#include "router/stored_section.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <queue>

namespace ringroad::router::snapping {

namespace {

// 1: first layout.
constexpr std::uint32_t kSnapLayoutVersion = 1;

struct SnapHeader {
    std::uint32_t layout_version;
    std::uint32_t piece_count;
    std::uint32_t node_size;
    std::uint32_t node_count;
    double reference_cos_lat;
    std::uint64_t reserved;
};
static_assert(sizeof(SnapHeader) == 32);

constexpr const char* kHeaderTag = "snap.header";
constexpr const char* kPiecesTag = "snap.pieces";
constexpr const char* kBoxesTag = "snap.boxes";

using Piece = PackedPieceIndex::Piece;
using Box = PackedPieceIndex::Box;

// First box of each level, leaves first, and the end: a level of c entries has ceil(c / size) nodes.
std::vector<std::uint32_t> level_starts(std::uint32_t piece_count) {
    std::vector<std::uint32_t> starts{0};
    std::uint32_t entries = piece_count;
    while (entries > 0) {
        const std::uint32_t nodes = (entries + PackedPieceIndex::kNodeSize - 1) / PackedPieceIndex::kNodeSize;
        starts.push_back(starts.back() + nodes);
        if (nodes == 1) break;
        entries = nodes;
    }
    return starts;
}

struct PlaneBox {
    double min_x, min_y, max_x, max_y;
};

PlaneBox piece_box(const graph::RoadGraph& road_graph, const PlaneProjection& plane, Piece piece) {
    const graph::Segment& segment = road_graph.segments()[piece.segment];
    const PlanePoint a = plane(segment_point(road_graph, segment, piece.first_point));
    const PlanePoint b = plane(segment_point(road_graph, segment, piece.first_point + 1));
    return {std::min(a.x, b.x), std::min(a.y, b.y), std::max(a.x, b.x), std::max(a.y, b.y)};
}

// Rounded outwards, so the float box always contains the double one.
float round_down(double value) {
    float result = static_cast<float>(value);
    if (static_cast<double>(result) > value) result = std::nextafter(result, -std::numeric_limits<float>::infinity());
    return result;
}
float round_up(double value) {
    float result = static_cast<float>(value);
    if (static_cast<double>(result) < value) result = std::nextafter(result, std::numeric_limits<float>::infinity());
    return result;
}

bool contains(const Box& outer, const PlaneBox& inner) {
    return outer.min_x <= inner.min_x && outer.min_y <= inner.min_y && outer.max_x >= inner.max_x &&
           outer.max_y >= inner.max_y;
}
PlaneBox widened(const Box& box) { return {box.min_x, box.min_y, box.max_x, box.max_y}; }

// Position of (x, y) along the Hilbert curve filling a 2^16 x 2^16 grid (the classic
// quadrant-by-quadrant conversion: rotate so each sub-square is entered in the curve's order).
std::uint32_t hilbert_value(std::uint32_t x, std::uint32_t y) {
    constexpr std::uint32_t kSide = 1u << 16;
    std::uint32_t d = 0;
    for (std::uint32_t s = kSide / 2; s > 0; s /= 2) {
        const std::uint32_t rx = (x & s) ? 1 : 0;
        const std::uint32_t ry = (y & s) ? 1 : 0;
        d += s * s * ((3 * rx) ^ ry);
        if (ry == 0) {
            if (rx == 1) {
                x = kSide - 1 - x;
                y = kSide - 1 - y;
            }
            std::swap(x, y);
        }
    }
    return d;
}

double box_distance(const Box& box, PlanePoint q) {
    const double dx = std::max({static_cast<double>(box.min_x) - q.x, q.x - static_cast<double>(box.max_x), 0.0});
    const double dy = std::max({static_cast<double>(box.min_y) - q.y, q.y - static_cast<double>(box.max_y), 0.0});
    return dx * dx + dy * dy;
}

// A node may hold a candidate only if its box is no farther than the worst one kept; the slack
// covers rounding between the box and the piece distance.
bool beyond(double node_distance, double worst) { return node_distance > worst + worst * 1e-9 + 1e-9; }

} // namespace

std::vector<graph::ExtraSection> PackedPieceIndex::build_sections(const graph::RoadGraph& road_graph) {
    const PlaneProjection plane{snapping::reference_cos_lat(road_graph)};
    std::vector<Piece> pieces;
    const auto segments = road_graph.segments();
    for (graph::SegmentId s = 0; s < road_graph.segment_count(); ++s) {
        if (!is_snappable(road_graph, segments[s])) continue;
        for (std::uint32_t point = 0; point + 1 < segment_point_count(segments[s]); ++point) pieces.push_back({s, point});
    }

    // Hilbert values of the pieces' centres on a grid over the centres' extent.
    std::vector<PlanePoint> centres(pieces.size());
    PlaneBox extent{std::numeric_limits<double>::infinity(), std::numeric_limits<double>::infinity(),
                    -std::numeric_limits<double>::infinity(), -std::numeric_limits<double>::infinity()};
    for (std::size_t i = 0; i < pieces.size(); ++i) {
        const PlaneBox box = piece_box(road_graph, plane, pieces[i]);
        centres[i] = {(box.min_x + box.max_x) / 2, (box.min_y + box.max_y) / 2};
        extent = {std::min(extent.min_x, centres[i].x), std::min(extent.min_y, centres[i].y),
                  std::max(extent.max_x, centres[i].x), std::max(extent.max_y, centres[i].y)};
    }
    const auto grid = [](double value, double low, double high) {
        return high > low ? static_cast<std::uint32_t>(std::clamp((value - low) / (high - low) * 65535.0, 0.0, 65535.0)) : 0u;
    };
    std::vector<std::pair<std::uint32_t, std::uint32_t>> order(pieces.size());   // (Hilbert value, piece)
    for (std::size_t i = 0; i < pieces.size(); ++i) {
        order[i] = {hilbert_value(grid(centres[i].x, extent.min_x, extent.max_x), grid(centres[i].y, extent.min_y, extent.max_y)),
                    static_cast<std::uint32_t>(i)};
    }
    std::sort(order.begin(), order.end());
    std::vector<Piece> sorted(pieces.size());
    for (std::size_t i = 0; i < order.size(); ++i) sorted[i] = pieces[order[i].second];

    const std::vector<std::uint32_t> starts = level_starts(static_cast<std::uint32_t>(sorted.size()));
    std::vector<Box> boxes(starts.back());
    for (std::uint32_t node = 0; starts.size() > 1 && node < starts[1]; ++node) {
        PlaneBox box = piece_box(road_graph, plane, sorted[std::size_t{node} * kNodeSize]);
        const std::size_t end = std::min<std::size_t>(sorted.size(), (std::size_t{node} + 1) * kNodeSize);
        for (std::size_t i = std::size_t{node} * kNodeSize; i < end; ++i) {
            const PlaneBox piece = piece_box(road_graph, plane, sorted[i]);
            box = {std::min(box.min_x, piece.min_x), std::min(box.min_y, piece.min_y),
                   std::max(box.max_x, piece.max_x), std::max(box.max_y, piece.max_y)};
        }
        boxes[node] = {round_down(box.min_x), round_down(box.min_y), round_up(box.max_x), round_up(box.max_y)};
    }
    for (std::size_t level = 1; level + 1 < starts.size(); ++level) {
        for (std::uint32_t node = starts[level]; node < starts[level + 1]; ++node) {
            const std::uint32_t first_child = starts[level - 1] + (node - starts[level]) * kNodeSize;
            const std::uint32_t end_child = std::min(starts[level], first_child + kNodeSize);
            Box box = boxes[first_child];
            for (std::uint32_t child = first_child; child < end_child; ++child) {
                box = {std::min(box.min_x, boxes[child].min_x), std::min(box.min_y, boxes[child].min_y),
                       std::max(box.max_x, boxes[child].max_x), std::max(box.max_y, boxes[child].max_y)};
            }
            boxes[node] = box;
        }
    }

    const SnapHeader header{kSnapLayoutVersion, static_cast<std::uint32_t>(sorted.size()), kNodeSize,
                            static_cast<std::uint32_t>(boxes.size()), plane.reference_cos_lat, 0};
    std::vector<graph::ExtraSection> sections;
    sections.push_back(make_stored_section(kHeaderTag, std::span<const SnapHeader>(&header, 1)));
    sections.push_back(make_stored_section(kPiecesTag, std::span<const Piece>(sorted)));
    sections.push_back(make_stored_section(kBoxesTag, std::span<const Box>(boxes)));
    return sections;
}

std::optional<PackedPieceIndex> PackedPieceIndex::from_sections(const graph::RoadGraph& road_graph) {
    if (road_graph.section(kHeaderTag).empty()) return std::nullopt;
    const SnapHeader header = view_stored_section<SnapHeader>(road_graph, kHeaderTag, 1)[0];
    if (header.layout_version != kSnapLayoutVersion) return std::nullopt;
    if (header.node_size != kNodeSize) {
        refuse_stored_record(kHeaderTag, 0, "node size " + std::to_string(header.node_size) + ", expected " +
                                                std::to_string(kNodeSize));
    }
    if (!(header.reference_cos_lat > 0.0 && header.reference_cos_lat <= 1.0)) {
        refuse_stored_record(kHeaderTag, 0, "the plane's scale is outside (0, 1]");
    }
    PackedPieceIndex index;
    index.level_begin_ = level_starts(header.piece_count);
    if (header.node_count != index.level_begin_.back()) {
        refuse_stored_record(kHeaderTag, 0, std::to_string(header.node_count) + " nodes, " +
                                                std::to_string(index.level_begin_.back()) + " expected for " +
                                                std::to_string(header.piece_count) + " pieces");
    }
    index.reference_cos_lat_ = header.reference_cos_lat;
    index.pieces_ = view_stored_section<Piece>(road_graph, kPiecesTag, header.piece_count);
    index.boxes_ = view_stored_section<Box>(road_graph, kBoxesTag, header.node_count);

    const auto segments = road_graph.segments();
    for (std::size_t i = 0; i < index.pieces_.size(); ++i) {
        const Piece piece = index.pieces_[i];
        if (piece.segment >= segments.size()) {
            refuse_stored_record(kPiecesTag, i, "segment " + std::to_string(piece.segment) + " is out of range (" +
                                                    std::to_string(segments.size()) + " segments)");
        }
        if (std::uint64_t{piece.first_point} + 1 >= segment_point_count(segments[piece.segment])) {
            refuse_stored_record(kPiecesTag, i, "point " + std::to_string(piece.first_point) + " of segment " +
                                                    std::to_string(piece.segment) + " has no next point");
        }
    }
    // Every node's box contains its children: the search prunes by boxes, so a box that does not
    // would silently lose the nearest road.
    const PlaneProjection plane{index.reference_cos_lat_};
    const auto& starts = index.level_begin_;
    for (std::uint32_t node = 0; starts.size() > 1 && node < starts[1]; ++node) {
        const std::size_t end = std::min<std::size_t>(index.pieces_.size(), (std::size_t{node} + 1) * kNodeSize);
        for (std::size_t i = std::size_t{node} * kNodeSize; i < end; ++i) {
            if (!contains(index.boxes_[node], piece_box(road_graph, plane, index.pieces_[i]))) {
                refuse_stored_record(kBoxesTag, node, "the box does not contain its piece " + std::to_string(i));
            }
        }
    }
    for (std::size_t level = 1; level + 1 < starts.size(); ++level) {
        for (std::uint32_t node = starts[level]; node < starts[level + 1]; ++node) {
            const std::uint32_t first_child = starts[level - 1] + (node - starts[level]) * kNodeSize;
            const std::uint32_t end_child = std::min(starts[level], first_child + kNodeSize);
            for (std::uint32_t child = first_child; child < end_child; ++child) {
                if (!contains(index.boxes_[node], widened(index.boxes_[child]))) {
                    refuse_stored_record(kBoxesTag, node, "the box does not contain its child node " + std::to_string(child));
                }
            }
        }
    }
    index.road_graph_ = road_graph;
    return index;
}

void PackedPieceIndex::nearest(PlanePoint query, std::vector<Candidate>& out) const {
    out.clear();
    if (pieces_.empty()) return;
    struct Entry {
        double distance;
        std::uint32_t level;
        std::uint32_t node;
        bool operator>(const Entry& other) const { return distance > other.distance; }
    };
    std::priority_queue<Entry, std::vector<Entry>, std::greater<>> queue;
    const auto top_level = static_cast<std::uint32_t>(level_begin_.size() - 2);
    queue.push({box_distance(boxes_[level_begin_[top_level]], query), top_level, 0});
    const PlaneProjection plane{reference_cos_lat_};
    const auto segments = road_graph_.segments();
    const auto full = [&] { return out.size() == kCandidates; };
    while (!queue.empty()) {
        const Entry entry = queue.top();
        queue.pop();
        if (full() && beyond(entry.distance, out.back().distance)) break;   // the rest are farther
        if (entry.level == 0) {
            const std::size_t end = std::min<std::size_t>(pieces_.size(), (std::size_t{entry.node} + 1) * kNodeSize);
            for (std::size_t i = std::size_t{entry.node} * kNodeSize; i < end; ++i) {
                const graph::Segment& segment = segments[pieces_[i].segment];
                const Candidate candidate{
                    comparable_distance(query, plane(segment_point(road_graph_, segment, pieces_[i].first_point)),
                                        plane(segment_point(road_graph_, segment, pieces_[i].first_point + 1))),
                    pieces_[i].segment, pieces_[i].first_point};
                if (full() && !(candidate < out.back())) continue;
                out.insert(std::upper_bound(out.begin(), out.end(), candidate), candidate);
                if (out.size() > kCandidates) out.pop_back();
            }
            continue;
        }
        const std::uint32_t level_first = level_begin_[entry.level - 1];
        const std::uint32_t first_child = entry.node * kNodeSize;
        const std::uint32_t end_child = std::min(level_begin_[entry.level] - level_first, first_child + kNodeSize);
        for (std::uint32_t child = first_child; child < end_child; ++child) {
            const double distance = box_distance(boxes_[level_first + child], query);
            if (full() && beyond(distance, out.back().distance)) continue;
            queue.push({distance, entry.level - 1, child});
        }
    }
}

} // namespace ringroad::router::snapping
