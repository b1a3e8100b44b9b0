#include "extract/graph_assembly.hpp"

#include "graph/haversine.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <stdexcept>
#include <unordered_map>

namespace ringroad::extract {

namespace {

constexpr std::uint32_t kSkippedWay = std::numeric_limits<std::uint32_t>::max();

std::uint32_t rounded_decimetres(double metres) {
    return static_cast<std::uint32_t>(std::lround(metres * 10.0));
}

std::uint32_t seconds_to_ds(double seconds) {
    return static_cast<std::uint32_t>(std::lround(seconds * 10.0));
}

// One piece of a way between two vertices: positions in the way's resolved node list.
struct Piece {
    std::uint32_t first_position;
    std::uint32_t last_position;
    double length_m;
};

class Assembler {
public:
    Assembler(const CollectedRoads& roads, AssemblyCounts& counts) : roads_(roads), counts_(counts) {}

    graph::RoadGraphData run() {
        resolve_ways();
        mark_vertices();
        reserve_output();
        for (std::uint32_t way = 0; way < roads_.ways.size(); ++way) add_way(way);
        match_restrictions();
        data_.names = roads_.names;
        return std::move(data_);
    }

private:
    // Node ids -> indices into road_nodes; a way with a node missing from the extract is skipped.
    void resolve_ways() {
        way_begin_.assign(roads_.ways.size(), kSkippedWay);
        way_end_.assign(roads_.ways.size(), kSkippedWay);
        for (std::uint32_t way = 0; way < roads_.ways.size(); ++way) {
            const CollectedWay& collected = roads_.ways[way];
            const auto begin = static_cast<std::uint32_t>(resolved_.size());
            bool complete = true;
            for (std::uint32_t i = 0; i < collected.node_count; ++i) {
                const std::uint32_t node = node_index(roads_.way_node_ids[collected.first_node + i]);
                if (node == kSkippedWay || !roads_.road_nodes[node].found) {
                    complete = false;
                    break;
                }
                // A node repeated in a row is a tagging slip, not a zero-length piece of road.
                if (resolved_.size() > begin && resolved_.back() == node) continue;
                resolved_.push_back(node);
            }
            if (!complete) ++counts_.ways_missing_nodes;
            if (!complete || resolved_.size() - begin < 2) {
                resolved_.resize(begin);
                continue;
            }
            way_begin_[way] = begin;
            way_end_[way] = static_cast<std::uint32_t>(resolved_.size());
            ++counts_.road_ways;
        }
    }

    std::uint32_t node_index(std::int64_t node_id) const {
        const auto& ids = roads_.road_node_ids;
        const auto found = std::lower_bound(ids.begin(), ids.end(), node_id);
        if (found == ids.end() || *found != node_id) return kSkippedWay;
        return static_cast<std::uint32_t>(found - ids.begin());
    }

    void mark_vertices() {
        std::vector<std::uint8_t> uses(roads_.road_nodes.size(), 0);
        is_vertex_.assign(roads_.road_nodes.size(), 0);
        for (std::uint32_t way = 0; way < roads_.ways.size(); ++way) {
            if (way_begin_[way] == kSkippedWay) continue;
            for (std::uint32_t position = way_begin_[way]; position < way_end_[way]; ++position) {
                auto& count = uses[resolved_[position]];
                if (count < 2) ++count;
            }
            is_vertex_[resolved_[way_begin_[way]]] = 1;
            is_vertex_[resolved_[way_end_[way] - 1]] = 1;
        }
        for (std::size_t node = 0; node < uses.size(); ++node) {
            if (uses[node] == 0) continue;
            const BarrierEffect effect = roads_.road_nodes[node].barrier.effect;
            if (effect == BarrierEffect::blocks) ++counts_.blocking_barriers;
            if (effect == BarrierEffect::delays) ++counts_.delaying_barriers;
            if (uses[node] >= 2 || effect != BarrierEffect::none) is_vertex_[node] = 1;
        }
        vertex_of_node_.assign(roads_.road_nodes.size(), graph::kNoVertex);
    }

    // Growing the output vectors by doubling would touch and copy several times the final memory.
    void reserve_output() {
        std::size_t vertices = 0;
        for (std::size_t node = 0; node < is_vertex_.size(); ++node) vertices += is_vertex_[node];
        std::size_t segments = 0;   // exact: one per vertex occurrence after a way's first node
        for (std::uint32_t way = 0; way < roads_.ways.size(); ++way) {
            if (way_begin_[way] == kSkippedWay) continue;
            for (std::uint32_t position = way_begin_[way] + 1; position < way_end_[way]; ++position) {
                segments += is_vertex_[resolved_[position]];
            }
        }
        data_.coordinates.reserve(vertices);
        data_.vertex_osm_ids.reserve(vertices);
        data_.segments.reserve(segments);
        data_.edges.reserve(2 * segments);
        data_.shape_points.reserve(resolved_.size());
        way_first_segment_.reserve(roads_.ways.size());
    }

    bool blocks(std::uint32_t node) const { return roads_.road_nodes[node].barrier.effect == BarrierEffect::blocks; }

    // The vertex of a node; a blocking barrier gets a new vertex for every segment end.
    graph::VertexId vertex_at(std::uint32_t node) {
        if (!blocks(node) && vertex_of_node_[node] != graph::kNoVertex) return vertex_of_node_[node];
        const auto vertex = static_cast<graph::VertexId>(data_.coordinates.size());
        data_.coordinates.push_back(roads_.road_nodes[node].location);
        data_.vertex_osm_ids.push_back(roads_.road_node_ids[node]);
        if (!blocks(node)) vertex_of_node_[node] = vertex;
        return vertex;
    }

    graph::Coordinate location(std::uint32_t position) const { return roads_.road_nodes[resolved_[position]].location; }

    std::vector<Piece> split_way(std::uint32_t way) const {
        std::vector<Piece> pieces;
        Piece piece{way_begin_[way], way_begin_[way], 0.0};
        for (std::uint32_t position = way_begin_[way] + 1; position < way_end_[way]; ++position) {
            piece.length_m += graph::haversine_meters(location(position - 1), location(position));
            if (!is_vertex_[resolved_[position]]) continue;
            piece.last_position = position;
            pieces.push_back(piece);
            piece = Piece{position, position, 0.0};
        }
        return pieces;
    }

    void add_way(std::uint32_t way) {
        way_first_segment_.push_back(static_cast<graph::SegmentId>(data_.segments.size()));
        if (way_begin_[way] == kSkippedWay) return;
        const std::vector<Piece> pieces = split_way(way);
        double way_length_m = 0;
        for (const Piece& piece : pieces) way_length_m += piece.length_m;
        for (const Piece& piece : pieces) {
            // A ferry's stated duration is shared in proportion to length (evenly if it has none).
            std::optional<double> ferry_seconds;
            if (const auto& duration = roads_.ways[way].rule.ferry_duration_seconds) {
                const double share = way_length_m > 0 ? piece.length_m / way_length_m : 1.0 / static_cast<double>(pieces.size());
                ferry_seconds = *duration * share;
            }
            add_segment(way, piece, ferry_seconds);
        }
    }

    void add_segment(std::uint32_t way, const Piece& piece, std::optional<double> ferry_seconds) {
        const CollectedWay& collected = roads_.ways[way];
        const std::uint32_t first_node = resolved_[piece.first_position];
        const std::uint32_t last_node = resolved_[piece.last_position];
        graph::Segment segment{};
        segment.first_vertex = vertex_at(first_node);
        segment.last_vertex = vertex_at(last_node);
        segment.shape_begin = static_cast<std::uint32_t>(data_.shape_points.size());
        for (std::uint32_t position = piece.first_position + 1; position < piece.last_position; ++position) {
            data_.shape_points.push_back(location(position));
        }
        segment.shape_end = static_cast<std::uint32_t>(data_.shape_points.size());
        segment.length_dm = rounded_decimetres(piece.length_m);
        segment.name = collected.name;
        segment.forward_edge = graph::kNoEdge;
        segment.backward_edge = graph::kNoEdge;
        segment.way_id = collected.way_id;
        const auto segment_id = static_cast<graph::SegmentId>(data_.segments.size());
        data_.segments.push_back(segment);

        const WayRule& rule = collected.rule;
        const auto time_ds = [&](double speed_kmh) {
            return ferry_seconds ? seconds_to_ds(*ferry_seconds) : travel_time_ds(segment.length_dm, speed_kmh);
        };
        if (rule.forward) {
            add_edge(segment_id, segment.first_vertex, segment.last_vertex, last_node, false,
                     time_ds(rule.forward_speed_kmh), rule);
        }
        if (rule.backward) {
            add_edge(segment_id, segment.last_vertex, segment.first_vertex, first_node, true,
                     time_ds(rule.backward_speed_kmh), rule);
        }
    }

    void add_edge(graph::SegmentId segment_id, graph::VertexId tail, graph::VertexId head, std::uint32_t head_node,
                  bool reversed, std::uint32_t time_ds, const WayRule& rule) {
        graph::Edge edge{};
        edge.head = head;
        edge.segment = segment_id;
        edge.time_ds = time_ds;
        edge.length_dm = data_.segments[segment_id].length_dm;
        edge.flags = rule.flags;
        edge.road_class = static_cast<std::uint8_t>(rule.road_class);
        edge.reversed = reversed ? 1 : 0;
        const BarrierRule& barrier = roads_.road_nodes[head_node].barrier;
        if (barrier.effect == BarrierEffect::delays) {
            edge.time_ds += seconds_to_ds(barrier.delay_seconds);   // paid on arrival at the gate
            edge.flags |= graph::edge_flag::barrier_delay;
        }
        data_.edges.push_back(graph::DirectedEdgeInput{tail, edge});
    }

    // The one segment of `way` that touches `via`, or nullopt (not a road, skipped, or ambiguous:
    // the way passes through the via vertex or touches it at both ends).
    std::optional<graph::SegmentId> segment_touching(std::int64_t way_id, graph::VertexId via) const {
        const auto found = way_by_id_.find(way_id);
        if (found == way_by_id_.end()) return std::nullopt;
        const std::uint32_t way = found->second;
        const graph::SegmentId end = way + 1 < way_first_segment_.size() ? way_first_segment_[way + 1]
                                                                         : static_cast<graph::SegmentId>(data_.segments.size());
        std::optional<graph::SegmentId> touching;
        for (graph::SegmentId segment = way_first_segment_[way]; segment < end; ++segment) {
            const auto& piece = data_.segments[segment];
            if (piece.first_vertex != via && piece.last_vertex != via) continue;
            if (touching) return std::nullopt;
            touching = segment;
        }
        return touching;
    }

    std::optional<graph::VertexId> via_vertex(std::int64_t node_id) const {
        const std::uint32_t node = node_index(node_id);
        if (node == kSkippedWay || blocks(node) || vertex_of_node_[node] == graph::kNoVertex) return std::nullopt;
        return vertex_of_node_[node];
    }

    bool match_restriction(const CollectedRestriction& restriction) {
        if (!restriction.readable) return false;
        const auto via = via_vertex(restriction.via_node);
        if (!via) return false;
        std::vector<graph::TurnRestriction> matched;
        for (std::int64_t from_way : restriction.from_ways) {
            for (std::int64_t to_way : restriction.to_ways) {
                const auto from = segment_touching(from_way, *via);
                const auto to = segment_touching(to_way, *via);
                if (!from || !to) return false;
                graph::TurnRestriction stored{};
                stored.from_segment = *from;
                stored.via_vertex = *via;
                stored.to_segment = *to;
                stored.kind = static_cast<std::uint8_t>(restriction.kind);
                stored.relation_id = restriction.relation_id;
                matched.push_back(stored);
            }
        }
        data_.turn_restrictions.insert(data_.turn_restrictions.end(), matched.begin(), matched.end());
        return true;
    }

    void match_restrictions() {
        if (roads_.restrictions.empty()) return;
        for (std::uint32_t way = 0; way < roads_.ways.size(); ++way) way_by_id_.emplace(roads_.ways[way].way_id, way);
        for (const CollectedRestriction& restriction : roads_.restrictions) {
            ++counts_.restrictions_read;
            if (!match_restriction(restriction)) ++counts_.restrictions_unmatched;
        }
    }

    const CollectedRoads& roads_;
    AssemblyCounts& counts_;
    graph::RoadGraphData data_;
    std::vector<std::uint32_t> resolved_;          // node indices of the usable ways, concatenated
    std::vector<std::uint32_t> way_begin_;         // per way: its range in resolved_, or kSkippedWay
    std::vector<std::uint32_t> way_end_;
    std::vector<std::uint8_t> is_vertex_;          // per road node
    std::vector<graph::VertexId> vertex_of_node_;  // per road node (not for blocking barriers)
    std::vector<graph::SegmentId> way_first_segment_;
    std::unordered_map<std::int64_t, std::uint32_t> way_by_id_;
};

} // namespace

std::uint32_t travel_time_ds(std::uint32_t length_dm, double speed_kmh) {
    if (!(speed_kmh > 0)) throw std::invalid_argument("travel_time_ds: speed must be positive");
    // decimetres / (km/h) = dm * 3600 s / 10000 dm = 0.36 s; in tenths of a second: 3.6.
    return static_cast<std::uint32_t>(std::lround(static_cast<double>(length_dm) * 3.6 / speed_kmh));
}

graph::RoadGraphData assemble_road_graph(const CollectedRoads& roads, AssemblyCounts& counts) {
    return Assembler{roads, counts}.run();
}

} // namespace ringroad::extract
