#pragma once
// RoadRouter: the library face of the router, used directly by the command line, the planners'
// road-network code and the daemon. Made from a graph::RoadGraph, it owns what it derives: the
// edge-based routing graph (turn restrictions, U-turn rule), the snapping index, and the
// contraction hierarchies (mapped from the graph's sections when present, otherwise built in
// memory on first use).
//
// All const member functions are safe to call from several threads at once.
//
// Typical use:
//     RoadRouter router(graph::load_road_graph("region.rrg"));
//     auto stops = router.snap_stops(read_stops_csv("stops.csv"));      // InputError if far
//     TravelMatrix matrix = router.matrix(stops, Metric::time);          // N x N, all cores
//     std::optional<RoutePath> path = router.route(stops[0], stops[1], Metric::time);

#include "graph/road_graph.hpp"
#include "router/metric.hpp"
#include "router/route_path.hpp"
#include "router/routing_graph.hpp"
#include "router/snapping.hpp"
#include "router/stops.hpp"
#include "router/travel_matrix.hpp"

#include <memory>
#include <optional>
#include <string_view>
#include <vector>

namespace ringroad::router {

enum class Engine : std::uint8_t {
    automatic,   // the hierarchy when the graph file has one, Dijkstra otherwise
    hierarchy,   // the hierarchy; built in memory when the file has none
    dijkstra,
};
// "hierarchy" / "dijkstra" (and "auto"); nullopt otherwise.
std::optional<Engine> engine_from_name(std::string_view name);

struct RouterOptions {
    double snap_radius_meters = kDefaultSnapRadiusMeters;
    RestrictionPolicy restrictions = RestrictionPolicy::automatic;
    unsigned threads = 0;        // for matrices; 0 = all cores
};

// One target of a one-to-many search: the weight and the path, or nothing when unreachable.
struct PathResult {
    bool reachable = false;
    RoutePath path;
};

class RoadRouter {
public:
    explicit RoadRouter(graph::RoadGraph road_graph, RouterOptions options = {});
    ~RoadRouter();
    RoadRouter(const RoadRouter&) = delete;
    RoadRouter& operator=(const RoadRouter&) = delete;

    const graph::RoadGraph& road_graph() const noexcept;
    const RoutingGraph& routing_graph() const noexcept;
    const RouterOptions& options() const noexcept { return options_; }
    // Whether the graph file carried a hierarchy for `metric` (Engine::automatic picks it).
    bool has_stored_hierarchy(Metric metric) const;
    // Whether the file carries a hierarchy for `metric` that cannot be used: written in another
    // layout version, for other restriction settings, or damaged (router/hierarchy/HIERARCHY.md).
    bool has_unusable_hierarchy(Metric metric) const;
    // The fastest speed of any edge in m/s (a lower bound on travel time is distance / this).
    double top_speed_meters_per_second() const noexcept;

    // The snapping index, for a radius other than the configured one or the nearest road at any
    // distance (the answer layer's per-request snap radius and far-stop policy).
    const RoadSnapper& snapper() const noexcept;
    // Snapping with the configured radius; InputError names the stop (see RoadSnapper::snap).
    SnappedStop snap(std::string_view stop_id, double lat, double lon) const;
    std::vector<SnappedStop> snap_stops(const StopList& stops) const;

    // N x N matrix between snapped stops (metric closure), on options().threads threads.
    TravelMatrix matrix(const std::vector<SnappedStop>& stops, Metric metric,
                        Engine engine = Engine::automatic) const;
    // Rectangular variant: result weight(i, j) lives at [i * targets.size() + j].
    std::vector<PackedWeight> matrix(const std::vector<SnappedStop>& sources,
                                     const std::vector<SnappedStop>& targets, Metric metric,
                                     Engine engine) const;

    // The shortest path from one stop to another; nullopt when unreachable.
    std::optional<RoutePath> route(const SnappedStop& from, const SnappedStop& to, Metric metric,
                                   Engine engine = Engine::automatic) const;

    // One-to-many by Dijkstra from `from`, stopping once every target is settled: per target the
    // cost and path (in the order of `targets`).
    std::vector<PathResult> routes_from(const SnappedStop& from, const std::vector<SnappedStop>& targets,
                                        Metric metric) const;

private:
    struct State;
    RouterOptions options_;
    std::unique_ptr<State> state_;
};

} // namespace ringroad::router
