#include "router/road_router.hpp"

#include "common/input_error.hpp"
#include "router/dijkstra.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/hierarchy/hierarchy_query.hpp"
#include "router/stop_endpoints.hpp"
#include "router/weight_buffer.hpp"

#include <algorithm>
#include <array>
#include <atomic>
#include <mutex>
#include <thread>
#include <unordered_map>

namespace ringroad::router {

std::optional<Engine> engine_from_name(std::string_view name) {
    if (name == "hierarchy") return Engine::hierarchy;
    if (name == "dijkstra") return Engine::dijkstra;
    if (name == "auto") return Engine::automatic;
    return std::nullopt;
}

namespace {

std::vector<WeightedNode> departure_nodes(const StopEndpoints& endpoints, Metric metric) {
    std::vector<WeightedNode> nodes;
    for (const NodeCost& departure : endpoints.departures) nodes.push_back({departure.node, departure.weight(metric)});
    return nodes;
}

// One weighted node per distinct arrival node (the cheapest entry through it).
std::vector<WeightedNode> arrival_nodes(const StopEndpoints& endpoints, Metric metric) {
    std::vector<WeightedNode> nodes;
    for (const ArrivalEntry& arrival : endpoints.arrivals) nodes.push_back({arrival.from_node, arrival.weight(metric)});
    std::sort(nodes.begin(), nodes.end(), [](const WeightedNode& a, const WeightedNode& b) {
        return a.node != b.node ? a.node < b.node : a.weight < b.weight;
    });
    nodes.erase(std::unique(nodes.begin(), nodes.end(),
                            [](const WeightedNode& a, const WeightedNode& b) { return a.node == b.node; }),
                nodes.end());
    return nodes;
}

PackedWeight direct_weight(const graph::RoadGraph& road_graph, const StopEndpoints& from, const StopEndpoints& to,
                           Metric metric) {
    const std::optional<NodeCost> direct = direct_trip(road_graph, from, to);
    return direct ? direct->weight(metric) : kUnreachableWeight;
}

PathPiece full_piece(const graph::RoadGraph& road_graph, NodeId edge_id) {
    const graph::Edge& edge = road_graph.edges()[edge_id];
    const bool forward = edge.reversed == 0;
    return {edge.segment, forward, forward ? 0.0 : 1.0, forward ? 1.0 : 0.0, edge.time_ds, edge.length_dm};
}

// Turns a node path (first node = a departure node, last = an arrival entry's node) into pieces.
RoutePath assemble_path(const graph::RoadGraph& road_graph, const StopEndpoints& from, const StopEndpoints& to,
                        const std::vector<NodeId>& nodes, Metric metric) {
    RoutePath path;
    const NodeId first = nodes.front();
    const auto departure = std::find_if(from.departures.begin(), from.departures.end(),
                                        [&](const NodeCost& d) { return d.node == first; });
    PathPiece start = full_piece(road_graph, first);
    if (from.junction == graph::kNoVertex) {
        start.from_fraction = from.fraction;
        start.time_ds = departure->time_ds;
        start.length_dm = departure->length_dm;
    }
    path.pieces.push_back(start);
    for (std::size_t i = 1; i < nodes.size(); ++i) path.pieces.push_back(full_piece(road_graph, nodes[i]));
    const ArrivalEntry* arrival = nullptr;
    for (const ArrivalEntry& entry : to.arrivals) {
        if (entry.from_node == nodes.back() && (!arrival || entry.weight(metric) < arrival->weight(metric))) arrival = &entry;
    }
    if (arrival && arrival->stop_edge != kNoNode) {
        PathPiece end = full_piece(road_graph, arrival->stop_edge);
        end.to_fraction = to.fraction;
        end.time_ds = arrival->time_ds;
        end.length_dm = arrival->length_dm;
        path.pieces.push_back(end);
    }
    for (const PathPiece& piece : path.pieces) {
        path.time_ds += piece.time_ds;
        path.length_dm += piece.length_dm;
    }
    path.geometry = path_geometry(road_graph, path.pieces);
    return path;
}

RoutePath assemble_direct(const graph::RoadGraph& road_graph, const StopEndpoints& from, const StopEndpoints& to,
                          const SnappedStop& from_stop) {
    RoutePath path;
    const NodeCost direct = *direct_trip(road_graph, from, to);
    if (direct.node != kNoNode) {
        PathPiece piece = full_piece(road_graph, direct.node);
        piece.from_fraction = from.fraction;
        piece.to_fraction = to.fraction;
        piece.time_ds = direct.time_ds;
        piece.length_dm = direct.length_dm;
        path.pieces.push_back(piece);
        path.time_ds = direct.time_ds;
        path.length_dm = direct.length_dm;
        path.geometry = path_geometry(road_graph, path.pieces);
    } else {
        path.geometry = {from_stop.on_road};
    }
    return path;
}

template <typename Body>
void parallel_rows(std::size_t count, unsigned threads, Body body) {
    if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
    threads = static_cast<unsigned>(std::min<std::size_t>(threads, std::max<std::size_t>(count, 1)));
    std::atomic<std::size_t> next{0};
    const auto worker = [&] { body(next); };
    std::vector<std::thread> pool;
    for (unsigned t = 1; t < threads; ++t) pool.emplace_back(worker);
    worker();
    for (std::thread& thread : pool) thread.join();
}

// What a Dijkstra search towards several stops needs: each stop's arrival nodes, and the set of
// all of them (sorted, unique) that must be settled before the search may stop early.
struct ArrivalTargets {
    std::vector<std::vector<WeightedNode>> ends;
    std::vector<NodeId> stop_set;
};

ArrivalTargets arrival_targets(const std::vector<StopEndpoints>& stops, Metric metric) {
    ArrivalTargets targets;
    for (const StopEndpoints& endpoints : stops) {
        targets.ends.push_back(arrival_nodes(endpoints, metric));
        for (const WeightedNode& end : targets.ends.back()) targets.stop_set.push_back(end.node);
    }
    std::sort(targets.stop_set.begin(), targets.stop_set.end());
    targets.stop_set.erase(std::unique(targets.stop_set.begin(), targets.stop_set.end()), targets.stop_set.end());
    return targets;
}

} // namespace

struct RoadRouter::State {
    graph::RoadGraph road_graph;
    RoutingGraph routing_graph;
    RoadSnapper snapper;
    double top_speed = 0.0;
    std::array<std::optional<hierarchy::ContractionHierarchy>, 2> hierarchies;
    std::array<bool, 2> stored{false, false};
    std::array<std::once_flag, 2> build_once;

    State(graph::RoadGraph graph, RestrictionPolicy policy)
        : road_graph(std::move(graph)), routing_graph(road_graph, policy), snapper(road_graph) {
        for (const graph::Edge& edge : road_graph.edges()) {
            if (edge.time_ds > 0) top_speed = std::max(top_speed, static_cast<double>(edge.length_dm) / edge.time_ds);
        }
        for (Metric metric : {Metric::time, Metric::distance}) {
            const auto index = static_cast<std::size_t>(metric);
            hierarchies[index] = hierarchy::ContractionHierarchy::from_sections(road_graph, routing_graph, metric);
            stored[index] = hierarchies[index].has_value();
            if (stored[index]) std::call_once(build_once[index], [] {});
        }
    }

    const hierarchy::ContractionHierarchy& hierarchy(Metric metric) {
        const auto index = static_cast<std::size_t>(metric);
        std::call_once(build_once[index], [&] {
            hierarchies[index] = hierarchy::ContractionHierarchy::build(routing_graph, metric);
        });
        return *hierarchies[index];
    }

    bool use_hierarchy(Metric metric, Engine engine) const {
        return engine == Engine::hierarchy || (engine == Engine::automatic && stored[static_cast<std::size_t>(metric)]);
    }

    std::vector<StopEndpoints> endpoints(const std::vector<SnappedStop>& stops) const {
        std::vector<StopEndpoints> result;
        result.reserve(stops.size());
        for (const SnappedStop& stop : stops) result.push_back(stop_endpoints(road_graph, routing_graph, stop));
        return result;
    }
};

RoadRouter::RoadRouter(graph::RoadGraph road_graph, RouterOptions options)
    : options_(options), state_(std::make_unique<State>(std::move(road_graph), options.restrictions)) {}

RoadRouter::~RoadRouter() = default;

const graph::RoadGraph& RoadRouter::road_graph() const noexcept { return state_->road_graph; }
const RoutingGraph& RoadRouter::routing_graph() const noexcept { return state_->routing_graph; }
bool RoadRouter::has_stored_hierarchy(Metric metric) const { return state_->stored[static_cast<std::size_t>(metric)]; }

bool RoadRouter::has_unusable_hierarchy(Metric metric) const {
    return hierarchy::has_hierarchy_sections(state_->road_graph, metric) && !has_stored_hierarchy(metric);
}
double RoadRouter::top_speed_meters_per_second() const noexcept { return state_->top_speed; }

const RoadSnapper& RoadRouter::snapper() const noexcept { return state_->snapper; }

SnappedStop RoadRouter::snap(std::string_view stop_id, double lat, double lon) const {
    return state_->snapper.snap(stop_id, lat, lon, options_.snap_radius_meters);
}

std::vector<SnappedStop> RoadRouter::snap_stops(const StopList& stops) const {
    std::vector<SnappedStop> result;
    result.reserve(stops.stops.size());
    for (const Stop& stop : stops.stops) {
        try {
            result.push_back(snap(stop.id, stop.lat, stop.lon));
        } catch (const InputError& error) {
            const std::string where = stop.line > 0 ? stops.source + ":" + std::to_string(stop.line) + ": " : "";
            throw InputError(where + error.what(), error.field());
        }
    }
    return result;
}

TravelMatrix RoadRouter::matrix(const std::vector<SnappedStop>& stops, Metric metric, Engine engine) const {
    TravelMatrix result(stops.size(), metric, matrix(stops, stops, metric, engine));
    for (std::size_t stop = 0; stop < stops.size(); ++stop) result.set_weight(stop, stop, 0);
    return result;
}

std::vector<PackedWeight> RoadRouter::matrix(const std::vector<SnappedStop>& sources,
                                             const std::vector<SnappedStop>& targets, Metric metric,
                                             Engine engine) const {
    State& state = *state_;
    const std::vector<StopEndpoints> from = state.endpoints(sources);
    const std::vector<StopEndpoints> to = state.endpoints(targets);
    std::vector<PackedWeight> result;
    if (state.use_hierarchy(metric, engine)) {
        std::vector<std::vector<WeightedNode>> starts, ends;
        for (const StopEndpoints& endpoints : from) starts.push_back(departure_nodes(endpoints, metric));
        for (const StopEndpoints& endpoints : to) ends.push_back(arrival_nodes(endpoints, metric));
        result = hierarchy::hierarchy_many_to_many(state.hierarchy(metric), starts, ends, options_.threads);
    } else {
        result = make_weight_buffer(sources.size() * targets.size(), kUnreachableWeight);
        const ArrivalTargets arrivals = arrival_targets(to, metric);
        const auto& ends = arrivals.ends;
        const auto& stop_set = arrivals.stop_set;
        parallel_rows(sources.size(), options_.threads, [&](std::atomic<std::size_t>& next) {
            DijkstraWorkspace workspace(state.routing_graph.node_count());
            for (std::size_t source = next++; source < sources.size(); source = next++) {
                const std::vector<WeightedNode> starts = departure_nodes(from[source], metric);
                run_dijkstra(state.routing_graph, metric, starts, stop_set, workspace);
                for (std::size_t target = 0; target < targets.size(); ++target) {
                    PackedWeight best = kUnreachableWeight;
                    for (const WeightedNode& end : ends[target]) {
                        const PackedWeight reached = workspace.distance(end.node);
                        if (reached != kUnreachableWeight) best = std::min(best, reached + end.weight);
                    }
                    result[source * targets.size() + target] = best;
                }
            }
        });
    }
    // Direct trips exist only between stops sharing a segment or a junction: look those up
    // instead of testing all N x N pairs.
    std::unordered_map<std::uint64_t, std::vector<std::size_t>> targets_at;
    const auto place_keys = [](const StopEndpoints& endpoints) {
        std::vector<std::uint64_t> keys{endpoints.segment};
        if (endpoints.junction != graph::kNoVertex) keys.push_back((std::uint64_t{1} << 32) | endpoints.junction);
        return keys;
    };
    for (std::size_t target = 0; target < targets.size(); ++target) {
        for (std::uint64_t key : place_keys(to[target])) targets_at[key].push_back(target);
    }
    for (std::size_t source = 0; source < sources.size(); ++source) {
        for (std::uint64_t key : place_keys(from[source])) {
            const auto found = targets_at.find(key);
            if (found == targets_at.end()) continue;
            for (std::size_t target : found->second) {
                PackedWeight& cell = result[source * targets.size() + target];
                cell = std::min(cell, direct_weight(state.road_graph, from[source], to[target], metric));
            }
        }
    }
    return result;
}

std::optional<RoutePath> RoadRouter::route(const SnappedStop& from_stop, const SnappedStop& to_stop, Metric metric,
                                           Engine engine) const {
    State& state = *state_;
    const StopEndpoints from = stop_endpoints(state.road_graph, state.routing_graph, from_stop);
    const StopEndpoints to = stop_endpoints(state.road_graph, state.routing_graph, to_stop);
    const std::vector<WeightedNode> starts = departure_nodes(from, metric);
    const std::vector<WeightedNode> ends = arrival_nodes(to, metric);
    PackedWeight best = kUnreachableWeight;
    std::vector<NodeId> nodes;
    if (state.use_hierarchy(metric, engine)) {
        hierarchy::HierarchySearch search(state.hierarchy(metric));
        best = search.shortest(starts, ends, &nodes);
    } else {
        DijkstraWorkspace workspace(state.routing_graph.node_count());
        std::vector<NodeId> stop_set;
        for (const WeightedNode& end : ends) stop_set.push_back(end.node);
        run_dijkstra(state.routing_graph, metric, starts, stop_set, workspace);
        NodeId best_end = kNoNode;
        for (const WeightedNode& end : ends) {
            const PackedWeight reached = workspace.distance(end.node);
            if (reached != kUnreachableWeight && reached + end.weight < best) {
                best = reached + end.weight;
                best_end = end.node;
            }
        }
        if (best_end != kNoNode) nodes = workspace.tree_path(best_end);
    }
    const PackedWeight direct = direct_weight(state.road_graph, from, to, metric);
    if (direct != kUnreachableWeight && direct <= best) return assemble_direct(state.road_graph, from, to, from_stop);
    if (best == kUnreachableWeight) return std::nullopt;
    return assemble_path(state.road_graph, from, to, nodes, metric);
}

std::vector<PathResult> RoadRouter::routes_from(const SnappedStop& from_stop, const std::vector<SnappedStop>& targets,
                                                Metric metric) const {
    State& state = *state_;
    const StopEndpoints from = stop_endpoints(state.road_graph, state.routing_graph, from_stop);
    const std::vector<StopEndpoints> to = state.endpoints(targets);
    const ArrivalTargets arrivals = arrival_targets(to, metric);
    const auto& ends = arrivals.ends;
    const auto& stop_set = arrivals.stop_set;
    DijkstraWorkspace workspace(state.routing_graph.node_count());
    run_dijkstra(state.routing_graph, metric, departure_nodes(from, metric), stop_set, workspace);

    std::vector<PathResult> results(targets.size());
    for (std::size_t target = 0; target < targets.size(); ++target) {
        PackedWeight best = kUnreachableWeight;
        NodeId best_end = kNoNode;
        for (const WeightedNode& end : ends[target]) {
            const PackedWeight reached = workspace.distance(end.node);
            if (reached != kUnreachableWeight && reached + end.weight < best) {
                best = reached + end.weight;
                best_end = end.node;
            }
        }
        const PackedWeight direct = direct_weight(state.road_graph, from, to[target], metric);
        if (direct != kUnreachableWeight && direct <= best) {
            results[target] = {true, assemble_direct(state.road_graph, from, to[target], from_stop)};
        } else if (best_end != kNoNode) {
            results[target] = {true, assemble_path(state.road_graph, from, to[target], workspace.tree_path(best_end), metric)};
        }
    }
    return results;
}

} // namespace ringroad::router
