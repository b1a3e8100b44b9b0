#include "synth/grid_planner.hpp"

#include "synth/junction_count.hpp"
#include "synth/mixing_hash.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <unordered_map>

namespace ringroad::synth {

namespace {

// The region's centre: open ocean of the South Pacific, about 2,000 km from any coast
// (from memory: Pitcairn, the nearest land, lies near 25 S 130 W).
constexpr double kCentreLat = -47.0;
constexpr double kCentreLon = -128.0;
constexpr double kMetresPerDegree = 111'320.0;   // of latitude, on a sphere (common practice)
constexpr double kPi = 3.14159265358979323846;

constexpr std::uint32_t kNone = std::numeric_limits<std::uint32_t>::max();

// What a choice_hash decides; the numbers only need to differ.
enum Question : std::uint64_t {
    line_spacing = 1, oneway_line, link_drop, link_feature, link_bend, cul_de_sac_pick, way_break,
    roundabout_pick, restriction_pick, restriction_kind, point_jitter, street_name, speed_limit,
    spur_shape, motorway_wobble, feature_position, cell_layout, collector_crossing, name_change_pick,
    crescent_pick
};

// Residential cells (the blocks of lines between two collectors) are laid out with T-junctions:
// in each cell one direction runs through, the other is broken into single-block cross streets
// staggered like bricks, so a residential crossing meets three streets, not four.
constexpr std::uint32_t kCellLines = 6;
// A residential street that reaches a collector from both sides crosses it this often; otherwise
// one side ends there (a T-junction on the collector).
constexpr double kCollectorCrossingShare = 0.10;
// Cross-street blocks of the brick pattern left out (except on the cell's spine line), so a
// cell is closer to a tree than to a lattice: the through streets meet fewer of them.
constexpr double kMissingCrossStreetShare = 0.75;
// The cross-street line (index within the cell) that keeps all its blocks.
constexpr std::uint32_t kSpineLine = 2;
// Residential links with a crescent: a street that leaves the link and rejoins it further on.
constexpr double kCrescentShare = 0.04;
// Residential links whose way changes name part-way (a junction of two ways end to end).
constexpr double kNameChangeShare = 0.35;

enum class LineClass : std::uint8_t { residential, tertiary, secondary, primary };

constexpr int kRows = 0;      // lines running east-west; position is y
constexpr int kColumns = 1;   // lines running north-south; position is x

// Every 6th line a collector (alternately secondary and tertiary), every 24th an arterial,
// every other arterial a dual carriageway.
LineClass logical_class(std::uint32_t line) {
    if (line % 24 == 12) return LineClass::primary;
    if (line % 6 == 0) return line % 12 == 0 ? LineClass::secondary : LineClass::tertiary;
    return LineClass::residential;
}
bool is_dual(std::uint32_t line) { return line % 48 == 12; }
bool is_collector(LineClass line_class) { return line_class == LineClass::secondary || line_class == LineClass::tertiary; }

// One drawn line of the lattice: a street, or one carriageway of a dual carriageway.
struct LatticeLine {
    double position;            // metres from the south-west corner: y for rows, x for columns
    std::uint32_t logical;
    LineClass line_class;
    std::int8_t oneway;         // +1: travel towards increasing position of the crossing axis
    bool boundary;              // the first or last line: never loses a link
};

struct Axis {
    std::vector<LatticeLine> lattice;
    std::vector<std::uint32_t> first_lattice;   // per logical line
    double extent = 0;
};

// Right-hand traffic: eastbound on the south carriageway, northbound on the east one.
constexpr double kCarriageHalfGap = 11.0;

Axis make_axis(std::uint32_t count, std::uint64_t seed, int orientation) {
    Axis axis;
    double position = 0;
    for (std::uint32_t line = 0; line < count; ++line) {
        if (line > 0) {
            // Blocks of 95..135 m; a little more beside a dual carriageway, whose median takes room.
            position += 95.0 + 40.0 * unit_interval(choice_hash(seed, line_spacing, orientation, line));
            if (is_dual(line) || is_dual(line - 1)) position += 12.0;
        }
        const LineClass line_class = logical_class(line);
        const bool boundary = line == 0 || line + 1 == count;
        axis.first_lattice.push_back(static_cast<std::uint32_t>(axis.lattice.size()));
        if (is_dual(line) && !boundary) {
            const std::int8_t lower = orientation == kRows ? 1 : -1;
            axis.lattice.push_back({position - kCarriageHalfGap, line, line_class, lower, false});
            axis.lattice.push_back({position + kCarriageHalfGap, line, line_class, static_cast<std::int8_t>(-lower), false});
            continue;
        }
        std::int8_t oneway = 0;
        const std::uint64_t hash = choice_hash(seed, oneway_line, orientation, line);
        if (line_class == LineClass::residential && !boundary && unit_interval(hash) < 0.08) {
            oneway = (hash & 1) ? 1 : -1;
        }
        axis.lattice.push_back({position, line, line_class, oneway, boundary});
    }
    axis.extent = position;
    return axis;
}

struct Point2 {
    double x, y;
};

// What a residential link between two neighbouring lattice points carries.
enum class LinkFeature : std::uint8_t { none, bollard, gate, private_service, cul_de_sac, driveway };

struct LinkPlan {
    bool exists = true;
    LinkFeature feature = LinkFeature::none;
    int bend_points = 0;        // shape nodes drawing a bend (0, 1 or 2)
    int name_change = 0;        // 0: none; -1: the way changes name near the link's start, +1: near its end
    bool crescent = false;      // a loop street leaving at 20 % of the link and rejoining at 80 %
};

// Ways that end or start at a crossing, for turn restrictions: index 0 along the row, 1 along
// the column; `before` arrives from decreasing positions, `after` leaves towards increasing ones.
struct CrossingWays {
    std::uint32_t before[2] = {kNone, kNone};
    std::uint32_t after[2] = {kNone, kNone};
};

class GridPlanner {
public:
    GridPlanner(const GridRequest& request, std::vector<std::uint64_t>* candidate_hashes)
        : request_(request), candidate_hashes_(candidate_hashes) {
        if (request.rows < 4 || request.columns < 4) throw std::invalid_argument("plan_street_grid: grid too small");
        axes_[kRows] = make_axis(request.rows, request.seed, kRows);
        axes_[kColumns] = make_axis(request.columns, request.seed, kColumns);
        width_ = axes_[kColumns].extent;
        height_ = axes_[kRows].extent;
        lon_metres_per_degree_ = kMetresPerDegree * std::cos(kCentreLat * kPi / 180.0);
    }

    RegionPlan run() {
        plan_.seed = request_.seed;
        add_lattice_nodes();
        for (std::uint32_t line = 0; line < axes_[kRows].lattice.size(); ++line) emit_line(kRows, line);
        for (std::uint32_t line = 0; line < axes_[kColumns].lattice.size(); ++line) emit_line(kColumns, line);
        add_restrictions();
        add_motorways(kRows);
        add_motorways(kColumns);
        append_side_ways();
        fill_figures();
        return std::move(plan_);
    }

private:
    std::uint64_t seed() const { return request_.seed; }
    const std::vector<LatticeLine>& lines(int orientation) const { return axes_[orientation].lattice; }
    std::uint32_t lattice_columns() const { return static_cast<std::uint32_t>(lines(kColumns).size()); }

    PlannedNode to_node(Point2 point) const {
        const double lat = kCentreLat + (point.y - height_ / 2) / kMetresPerDegree;
        const double lon = kCentreLon + (point.x - width_ / 2) / lon_metres_per_degree_;
        return {static_cast<std::int32_t>(std::lround(lat * 1e7)), static_cast<std::int32_t>(std::lround(lon * 1e7))};
    }

    std::uint32_t add_node(Point2 point) {
        plan_.nodes.push_back(to_node(point));
        return static_cast<std::uint32_t>(plan_.nodes.size() - 1);
    }

    // Lattice point (row, column) is node row * columns + column.
    std::uint32_t lattice_node(std::uint32_t row, std::uint32_t column) const { return row * lattice_columns() + column; }

    // A point of line `line` of `orientation` where it meets crossing line `cross`.
    std::uint32_t point_node(int orientation, std::uint32_t line, std::uint32_t cross) const {
        return orientation == kRows ? lattice_node(line, cross) : lattice_node(cross, line);
    }

    Point2 lattice_position(std::uint32_t row, std::uint32_t column) const {
        const std::uint64_t hash = choice_hash(seed(), point_jitter, row, column);
        const double dx = 8.0 * (unit_interval(hash) - 0.5);
        const double dy = 8.0 * (unit_interval(mix64(hash)) - 0.5);
        return {lines(kColumns)[column].position + dx, lines(kRows)[row].position + dy};
    }

    Point2 point_position(int orientation, std::uint32_t line, std::uint32_t cross) const {
        return orientation == kRows ? lattice_position(line, cross) : lattice_position(cross, line);
    }

    void add_lattice_nodes() {
        const auto rows = static_cast<std::uint32_t>(lines(kRows).size());
        plan_.nodes.reserve(static_cast<std::size_t>(rows) * lattice_columns() * 2);
        for (std::uint32_t row = 0; row < rows; ++row) {
            for (std::uint32_t column = 0; column < lattice_columns(); ++column) add_node(lattice_position(row, column));
        }
    }

    // ---- roundabouts: some crossings of two collectors away from the edge ----

    bool is_roundabout(std::uint32_t row, std::uint32_t column) const {
        const LatticeLine& row_line = lines(kRows)[row];
        const LatticeLine& column_line = lines(kColumns)[column];
        if (!is_collector(row_line.line_class) || !is_collector(column_line.line_class)) return false;
        if (row_line.boundary || column_line.boundary) return false;
        return unit_interval(choice_hash(seed(), roundabout_pick, row_line.logical, column_line.logical)) < 0.25;
    }

    // Ring nodes counter-clockwise from north (right-hand traffic): N NW W SW S SE E NE. The
    // lattice node itself moves north to become N; the other seven are new.
    std::uint32_t ring_node(std::uint32_t row, std::uint32_t column, int compass_index) {
        const std::uint32_t centre_node = lattice_node(row, column);
        auto [found, inserted] = rings_.try_emplace(centre_node, 0);
        if (inserted) found->second = add_ring(row, column, centre_node);
        return compass_index == 0 ? centre_node : found->second + static_cast<std::uint32_t>(compass_index - 1);
    }

    std::uint32_t add_ring(std::uint32_t row, std::uint32_t column, std::uint32_t centre_node) {
        constexpr double kRadius = 16.0;
        const Point2 centre = lattice_position(row, column);
        const auto at = [&](int index) {
            const double angle = kPi / 2 + index * kPi / 4;   // counter-clockwise from north
            return Point2{centre.x + kRadius * std::cos(angle), centre.y + kRadius * std::sin(angle)};
        };
        plan_.nodes[centre_node] = to_node(at(0));
        const auto first = static_cast<std::uint32_t>(plan_.nodes.size());
        for (int index = 1; index < 8; ++index) add_node(at(index));
        std::vector<std::uint32_t> ring{centre_node};
        for (std::uint32_t index = 0; index < 7; ++index) ring.push_back(first + index);
        ring.push_back(centre_node);
        add_side_way(ring, RoadKind::roundabout, 0, 0, 0);
        ++plan_.figures.roundabouts;
        return first;
    }

    // ---- residential links ----

    // Whether a residential link (at least 60 m long) is drawn, before the collector rule: the
    // through direction of its cell keeps every link but a few, the other keeps every second one.
    // The layout hash of the cell holding a link: bit 0 its through direction, bit 1 the shift
    // of its brick pattern.
    std::uint64_t cell_of_link(int orientation, std::uint32_t line, std::uint32_t cross) const {
        const std::uint32_t street = lines(orientation)[line].logical;
        const std::uint32_t along = lines(1 - orientation)[cross].logical;
        const std::uint32_t row_cell = orientation == kRows ? street / kCellLines : along / kCellLines;
        const std::uint32_t column_cell = orientation == kRows ? along / kCellLines : street / kCellLines;
        return choice_hash(seed(), cell_layout, row_cell, column_cell);
    }

    bool is_through_link(int orientation, std::uint32_t line, std::uint32_t cross) const {
        return static_cast<int>(cell_of_link(orientation, line, cross) & 1) == orientation;
    }

    bool cell_link_exists(int orientation, std::uint32_t line, std::uint32_t cross) const {
        const LatticeLine& street = lines(orientation)[line];
        if (street.boundary) return true;
        const std::uint32_t along = lines(1 - orientation)[cross].logical;
        const std::uint64_t cell = cell_of_link(orientation, line, cross);
        const std::uint64_t key = choice_hash(seed(), link_drop, orientation, line, cross);
        if (!is_through_link(orientation, line, cross)) {
            if ((street.logical + along + ((cell >> 1) & 1)) % 2 != 0) return false;
            // One cross-street line per cell keeps all its blocks, joining every through street
            // to a neighbour or a collector, so few pieces of street are cut off entirely.
            const std::uint32_t in_cell = street.logical % kCellLines;
            if (in_cell == kSpineLine) return true;
            return street.oneway != 0 || unit_interval(key) >= kMissingCrossStreetShare;
        }
        return street.oneway != 0 || unit_interval(key) >= 0.03;
    }

    static bool is_long_enough(Point2 from, Point2 to) { return std::hypot(to.x - from.x, to.y - from.y) >= 60.0; }

    // A residential link beside a single-carriageway collector or arterial it would cross: when
    // the street's link on the far side exists too, the street crosses only sometimes; otherwise
    // one of the two links (by hash) is left out.
    bool cut_at_major_crossing(int orientation, std::uint32_t line, std::uint32_t cross) const {
        const LatticeLine& street = lines(orientation)[line];
        if (street.oneway != 0 || street.boundary) return false;
        const std::vector<LatticeLine>& crossing = lines(1 - orientation);
        const auto side_cut = [&](std::uint32_t major, std::uint32_t other_link_start, bool this_is_after) {
            const LatticeLine& major_line = crossing[major];
            if (major_line.line_class == LineClass::residential || is_dual(major_line.logical) || major_line.boundary) return false;
            if (other_link_start + 1 >= crossing.size()) return false;
            const Point2 from = point_position(orientation, line, other_link_start);
            const Point2 to = point_position(orientation, line, other_link_start + 1);
            if (!is_long_enough(from, to) || !cell_link_exists(orientation, line, other_link_start)) return false;
            const std::uint64_t hash = choice_hash(seed(), collector_crossing, orientation, line, major);
            if (unit_interval(hash) < kCollectorCrossingShare) return false;
            // A through street keeps its way to the collector; a single-block cross street gives
            // way, so fewer pieces of street are cut off from everything.
            const bool this_through = is_through_link(orientation, line, this_is_after ? major : major - 1);
            const bool other_through = is_through_link(orientation, line, other_link_start);
            if (this_through != other_through) return !this_through;
            return ((hash >> 7) & 1) == (this_is_after ? 1u : 0u);
        };
        if (cross > 0 && side_cut(cross, cross - 1, true)) return true;
        return side_cut(cross + 1, cross + 1, false);
    }

    LinkPlan plan_link(int orientation, std::uint32_t line, std::uint32_t cross, double length) {
        LinkPlan link;
        const LatticeLine& street = lines(orientation)[line];
        if (street.line_class != LineClass::residential || length < 60.0) return link;
        if (!cell_link_exists(orientation, line, cross) || cut_at_major_crossing(orientation, line, cross)) {
            link.exists = false;
            return link;
        }
        const std::uint64_t change = choice_hash(seed(), name_change_pick, orientation, line, cross);
        if (unit_interval(change) < kNameChangeShare) link.name_change = (change >> 9) & 1 ? 1 : -1;
        const double feature = unit_interval(choice_hash(seed(), link_feature, orientation, line, cross));
        if (feature < 0.010 && street.oneway == 0) link.feature = LinkFeature::bollard;
        else if (feature < 0.015) link.feature = LinkFeature::gate;
        else if (feature < 0.055) link.feature = LinkFeature::private_service;
        else {
            const std::uint64_t pick = choice_hash(seed(), cul_de_sac_pick, orientation, line, cross);
            if (candidate_hashes_ != nullptr) candidate_hashes_->push_back(pick);
            if (pick < request_.cul_de_sac_threshold) {
                link.feature = feature < 0.80 ? LinkFeature::cul_de_sac : LinkFeature::driveway;
            }
        }
        // Decided apart from the cul-de-sac, so that each cul-de-sac still adds exactly two vertices.
        link.crescent = unit_interval(choice_hash(seed(), crescent_pick, orientation, line, cross)) < kCrescentShare;
        if (link.feature == LinkFeature::none && !link.crescent) {
            const double bend = unit_interval(choice_hash(seed(), link_bend, orientation, line, cross));
            if (bend < 0.25) link.bend_points = bend < 0.10 ? 2 : 1;
        }
        return link;
    }

    // Appends the nodes strictly between two lattice points of a link (bend, barrier, spur).
    void add_link_interior(int orientation, std::uint32_t line, std::uint32_t cross, const LinkPlan& link, Point2 from,
                           Point2 to) {
        const std::uint64_t shape = choice_hash(seed(), feature_position, orientation, line, cross);
        const double side = (shape & 1) ? 1.0 : -1.0;
        // Unit vectors along the link and across it.
        const double dx = to.x - from.x, dy = to.y - from.y;
        const double length = std::hypot(dx, dy);
        const Point2 along{dx / length, dy / length};
        const Point2 across{-along.y * side, along.x * side};
        const auto point_at = [&](double fraction, double offset) {
            return Point2{from.x + dx * fraction + across.x * offset, from.y + dy * fraction + across.y * offset};
        };
        if (link.bend_points > 0) {
            const double offset = 6.0 + 8.0 * unit_interval(mix64(shape));
            if (link.bend_points == 1) current_.push_back(add_node(point_at(0.5, offset)));
            else {
                current_.push_back(add_node(point_at(1.0 / 3, offset)));
                current_.push_back(add_node(point_at(2.0 / 3, offset * 0.8)));
            }
            return;
        }
        std::uint32_t crescent_end = kNone;
        if (link.crescent) {
            // On the side away from any spur: a loop 25-35 m deep, from 20 % to 80 % of the link.
            const double depth = -(25.0 + 10.0 * unit_interval(mix64(shape + 2)));
            const std::uint32_t start = add_node(point_at(0.2, 0));
            crescent_end = add_node(point_at(0.8, 0));
            add_side_way({start, add_node(point_at(0.3, depth)), add_node(point_at(0.5, depth * 1.15)), add_node(point_at(0.7, depth)),
                          crescent_end},
                         RoadKind::residential, name_key(street_name, 4, start), 0, 0);
            current_.push_back(start);
        }
        add_link_feature(link, shape, point_at, along, across);
        if (crescent_end != kNone) current_.push_back(crescent_end);
    }

    // The barrier or spur in the middle of a link, if any.
    template <typename PointAt>
    void add_link_feature(const LinkPlan& link, std::uint64_t shape, const PointAt& point_at, Point2 along, Point2 across) {
        if (link.feature == LinkFeature::none) return;
        const double fraction = 0.35 + 0.3 * unit_interval(mix64(shape));
        const Point2 middle = point_at(fraction, 0);
        const std::uint32_t middle_node = add_node(middle);
        current_.push_back(middle_node);
        const auto spur_point = [&](double depth, double sideways) {
            return Point2{middle.x + across.x * depth + along.x * sideways, middle.y + across.y * depth + along.y * sideways};
        };
        const double depth = 35.0 + 15.0 * unit_interval(mix64(shape + 1));
        switch (link.feature) {
        case LinkFeature::bollard: plan_.barriers.push_back({middle_node, BarrierKind::bollard}); break;
        case LinkFeature::gate: plan_.barriers.push_back({middle_node, BarrierKind::gate}); break;
        case LinkFeature::private_service:
            add_side_way({middle_node, add_node(spur_point(20, 0)), add_node(spur_point(20, 15))}, RoadKind::private_service, 0, 0, 0);
            break;
        case LinkFeature::cul_de_sac:
            add_side_way({middle_node, add_node(spur_point(depth * 0.6, 5)), add_node(spur_point(depth, 4))}, RoadKind::cul_de_sac,
                         name_key(street_name, 3, middle_node), 0, 0);
            ++plan_.figures.cul_de_sacs;
            break;
        case LinkFeature::driveway:
            add_side_way({middle_node, add_node(spur_point(25, 0))}, RoadKind::driveway, 0, 0, 0);
            ++plan_.figures.cul_de_sacs;
            break;
        case LinkFeature::none: break;
        }
    }

    // ---- streets drawn along one lattice line ----

    std::uint32_t name_key(std::uint64_t question, std::uint64_t a, std::uint64_t b, std::uint64_t c = 0) const {
        return static_cast<std::uint32_t>(choice_hash(seed(), question, a, b, c)) | 1u;
    }

    static RoadKind road_kind(LineClass line_class) {
        switch (line_class) {
        case LineClass::primary: return RoadKind::primary;
        case LineClass::secondary: return RoadKind::secondary;
        case LineClass::tertiary: return RoadKind::tertiary;
        case LineClass::residential: break;
        }
        return RoadKind::residential;
    }

    // Signed limits on about half the lines (km/h); the rest use the class default.
    std::uint8_t speed_limit_of(int orientation, const LatticeLine& line) const {
        const double pick = unit_interval(choice_hash(seed(), speed_limit, orientation, line.logical));
        switch (line.line_class) {
        case LineClass::residential: return pick < 0.3 ? 30 : pick < 0.4 ? 40 : 0;
        case LineClass::tertiary: return pick < 0.5 ? 50 : 0;
        case LineClass::secondary: return pick < 0.5 ? 60 : 0;
        case LineClass::primary: return pick < 0.4 ? 70 : pick < 0.7 ? 60 : pick < 0.8 ? 80 : 0;
        }
        return 0;
    }

    bool restriction_candidate(std::uint32_t row, std::uint32_t column) const {
        const LineClass row_class = lines(kRows)[row].line_class;
        const LineClass column_class = lines(kColumns)[column].line_class;
        if (row_class == LineClass::residential || column_class == LineClass::residential) return false;
        if (row_class != LineClass::primary && column_class != LineClass::primary) return false;
        if (is_roundabout(row, column)) return false;
        return unit_interval(choice_hash(seed(), restriction_pick, row, column)) < 0.35;
    }

    void note_crossing(int orientation, std::uint32_t line, std::uint32_t cross, bool before, std::uint32_t way) {
        const std::uint32_t row = orientation == kRows ? line : cross;
        const std::uint32_t column = orientation == kRows ? cross : line;
        if (!restriction_candidate(row, column)) return;
        CrossingWays& ways = crossings_[lattice_node(row, column)];
        (before ? ways.before : ways.after)[orientation] = way;
    }

    bool roundabout_at(int orientation, std::uint32_t line, std::uint32_t cross) const {
        return orientation == kRows ? is_roundabout(line, cross) : is_roundabout(cross, line);
    }

    // The ring node where a line arrives (from decreasing positions) or leaves (towards increasing ones).
    std::uint32_t ring_entry(int orientation, std::uint32_t line, std::uint32_t cross, bool arriving) {
        const std::uint32_t row = orientation == kRows ? line : cross;
        const std::uint32_t column = orientation == kRows ? cross : line;
        // Compass indices: 0 N, 2 W, 4 S, 6 E. Rows arrive from the west, columns from the south.
        if (orientation == kRows) return ring_node(row, column, arriving ? 2 : 6);
        return ring_node(row, column, arriving ? 4 : 0);
    }

    void emit_line(int orientation, std::uint32_t line) {
        const LatticeLine& street = lines(orientation)[line];
        const auto crossing = static_cast<std::uint32_t>(lines(1 - orientation).size());
        way_template_ = PlannedWay{0, 0, 0, road_kind(street.line_class), street.oneway, speed_limit_of(orientation, street)};
        std::uint32_t section = 0;
        const auto name_of_section = [&] {
            return street.line_class == LineClass::residential ? name_key(street_name, orientation, street.logical, section + 1)
                                                               : name_key(street_name, orientation, street.logical);
        };
        current_.assign(1, point_node(orientation, line, 0));
        note_crossing(orientation, line, 0, false, static_cast<std::uint32_t>(plan_.ways.size()));
        for (std::uint32_t cross = 0; cross + 1 < crossing; ++cross) {
            const std::uint32_t next = cross + 1;
            const Point2 from = point_position(orientation, line, cross);
            const Point2 to = point_position(orientation, line, next);
            const LinkPlan link = plan_link(orientation, line, cross, std::hypot(to.x - from.x, to.y - from.y));
            if (!link.exists) {
                finish_way(name_of_section());
                current_.assign(1, point_node(orientation, line, next));
                continue;
            }
            if (link.name_change < 0) change_name_at(from, to, 0.15, name_of_section(), section);
            add_link_interior(orientation, line, cross, link, from, to);
            if (link.name_change > 0) change_name_at(from, to, 0.85, name_of_section(), section);
            const bool last = next + 1 == crossing;
            if (roundabout_at(orientation, line, next)) {
                current_.push_back(ring_entry(orientation, line, next, true));
                finish_way(name_of_section());
                current_.assign(1, ring_entry(orientation, line, next, false));
                continue;
            }
            current_.push_back(point_node(orientation, line, next));
            const bool major_crossing = lines(1 - orientation)[next].line_class != LineClass::residential;
            const bool random_break = street.line_class == LineClass::residential &&
                                      unit_interval(choice_hash(seed(), way_break, orientation, line, next)) < 0.2;
            if (!last && !major_crossing && !random_break) continue;
            note_crossing(orientation, line, next, true, static_cast<std::uint32_t>(plan_.ways.size()));
            finish_way(name_of_section());
            if (major_crossing) ++section;
            current_.assign(1, point_node(orientation, line, next));
            if (!last) note_crossing(orientation, line, next, false, static_cast<std::uint32_t>(plan_.ways.size()));
        }
        finish_way(name_of_section());
    }

    // Ends the current way at a new node part-way along the link and starts the next section,
    // under another name, from the same node.
    void change_name_at(Point2 from, Point2 to, double fraction, std::uint32_t name, std::uint32_t& section) {
        const std::uint32_t node = add_node({from.x + (to.x - from.x) * fraction, from.y + (to.y - from.y) * fraction});
        current_.push_back(node);
        finish_way(name);
        ++section;
        current_.assign(1, node);
    }

    void finish_way(std::uint32_t name) {
        if (current_.size() >= 2) {
            PlannedWay way = way_template_;
            way.first_ref = static_cast<std::uint32_t>(plan_.way_nodes.size());
            way.node_count = static_cast<std::uint32_t>(current_.size());
            way.name_key = name;
            plan_.way_nodes.insert(plan_.way_nodes.end(), current_.begin(), current_.end());
            plan_.ways.push_back(way);
        }
        current_.clear();
    }

    // Spurs, rings and motorways go to a list of their own, appended after the streets, so a
    // street's way id is known when it starts (turn restrictions need it).
    void add_side_way(const std::vector<std::uint32_t>& nodes, RoadKind kind, std::uint32_t name, std::int8_t oneway,
                      std::uint8_t maxspeed) {
        side_ways_.push_back({static_cast<std::uint32_t>(side_way_nodes_.size()), static_cast<std::uint32_t>(nodes.size()), name,
                              kind, oneway, maxspeed});
        side_way_nodes_.insert(side_way_nodes_.end(), nodes.begin(), nodes.end());
    }

    void append_side_ways() {
        const auto offset = static_cast<std::uint32_t>(plan_.way_nodes.size());
        plan_.way_nodes.insert(plan_.way_nodes.end(), side_way_nodes_.begin(), side_way_nodes_.end());
        for (PlannedWay way : side_ways_) {
            way.first_ref += offset;
            plan_.ways.push_back(way);
        }
        side_ways_ = {};
        side_way_nodes_ = {};
    }

    // ---- turn restrictions at arterial crossings ----

    void add_restrictions() {
        std::vector<std::uint32_t> points;
        points.reserve(crossings_.size());
        for (const auto& entry : crossings_) points.push_back(entry.first);
        std::sort(points.begin(), points.end());   // a fixed order, whatever the hash map does
        for (std::uint32_t point : points) add_restriction(point, crossings_.at(point));
    }

    void add_restriction(std::uint32_t point, const CrossingWays& ways) {
        const std::uint32_t row = point / lattice_columns();
        const std::uint32_t column = point % lattice_columns();
        // The arterial is the line the turn starts from.
        const int from_line = lines(kRows)[row].line_class == LineClass::primary ? kRows : kColumns;
        const int cross_line = 1 - from_line;
        const std::int8_t oneway = from_line == kRows ? lines(kRows)[row].oneway : lines(kColumns)[column].oneway;
        const std::uint64_t hash = choice_hash(seed(), restriction_kind, row, column);
        const bool increasing = oneway != 0 ? oneway > 0 : (hash & 1) != 0;
        const std::uint32_t from_way = increasing ? ways.before[from_line] : ways.after[from_line];
        const std::uint32_t straight_way = increasing ? ways.after[from_line] : ways.before[from_line];
        // Heading east (rows, increasing) the left turn is north (the column's `after`); heading
        // north (columns, increasing) the left turn is west (the row's `before`).
        const bool left_is_after = (from_line == kRows) == increasing;
        const std::uint32_t left_way = left_is_after ? ways.after[cross_line] : ways.before[cross_line];
        const std::uint32_t right_way = left_is_after ? ways.before[cross_line] : ways.after[cross_line];
        // A turn onto a one-way carriageway against its direction needs no sign: ban only real turns.
        const std::int8_t cross_oneway = cross_line == kRows ? lines(kRows)[row].oneway : lines(kColumns)[column].oneway;
        const bool left_open = left_is_after ? cross_oneway >= 0 : cross_oneway <= 0;
        const bool right_open = left_is_after ? cross_oneway <= 0 : cross_oneway >= 0;
        RestrictionValue value = RestrictionValue::only_straight_on;
        std::uint32_t to_way = straight_way;
        switch ((hash >> 1) % 4) {
        case 0:
            if (left_open) { value = RestrictionValue::no_left_turn; to_way = left_way; }
            break;
        case 1:
            if (right_open) { value = RestrictionValue::no_right_turn; to_way = right_way; }
            break;
        case 3:
            if (oneway == 0) { value = RestrictionValue::no_u_turn; to_way = from_way; }
            break;
        default: break;
        }
        if (from_way == kNone || to_way == kNone) return;
        plan_.restrictions.push_back({from_way, point, to_way, value});
    }

    // ---- motorways ----

    // Horizontal motorways (orientation kRows) run between two residential rows r, r+1 and meet
    // single-carriageway arterial columns at diamond interchanges; vertical ones likewise.
    void add_motorways(int orientation) {
        const std::uint32_t count = orientation == kRows ? request_.rows : request_.columns;
        const std::uint32_t motorways = count < 60 ? 0 : std::max<std::uint32_t>(1, count / 100);
        for (std::uint32_t index = 0; index < motorways; ++index) {
            std::uint32_t line = static_cast<std::uint32_t>((index + 0.5) * count / motorways);
            line = line - line % 6 + 2;                   // lines 6k+2 and 6k+3 are residential
            if (line + 2 >= count) continue;
            add_motorway(orientation, line);
        }
    }

    Point2 motorway_point(int orientation, double along, double across) const {
        return orientation == kRows ? Point2{along, across} : Point2{across, along};
    }

    void add_motorway(int orientation, std::uint32_t line) {
        const Axis& axis = axes_[orientation];
        const Axis& other = axes_[1 - orientation];
        const std::uint32_t lower = axis.first_lattice[line];
        const std::uint32_t upper = axis.first_lattice[line + 1];
        const double centre = (axis.lattice[lower].position + axis.lattice[upper].position) / 2;
        // Arterials it meets at interchanges: single carriageways at least 400 m from the edge.
        std::vector<std::uint32_t> exits;
        for (std::uint32_t cross = 0; cross < other.lattice.size(); ++cross) {
            const LatticeLine& arterial = other.lattice[cross];
            if (arterial.line_class == LineClass::primary && !is_dual(arterial.logical) && arterial.position > 400 &&
                arterial.position < other.extent - 400) {
                exits.push_back(cross);
            }
        }
        if (exits.empty()) return;
        const std::uint32_t number = ++plan_.figures.motorways;
        plan_.figures.interchanges += static_cast<std::uint32_t>(exits.size());
        // Travelling towards increasing `along`, the right-hand carriageway lies south of a
        // horizontal motorway and east of a vertical one; it serves the lattice line on its side.
        const double side = orientation == kRows ? -1.0 : 1.0;
        constexpr double kHalfGap = 14.0;
        constexpr double kRampReach = 260.0;
        const double start = -150.0, end = other.extent + 150.0;

        // Carriageway node positions: ends, interchange nodes, shape points about every 800 m.
        std::vector<double> stations{start, end};
        for (std::uint32_t exit : exits) {
            stations.push_back(other.lattice[exit].position - kRampReach);
            stations.push_back(other.lattice[exit].position + kRampReach);
        }
        for (double along = start + 800; along < end - 400; along += 800) {
            bool near_exit = false;
            for (std::uint32_t exit : exits) near_exit |= std::abs(along - other.lattice[exit].position) < kRampReach + 200;
            if (!near_exit) stations.push_back(along);
        }
        std::sort(stations.begin(), stations.end());
        const auto node_row = [&](double across_offset) {
            std::vector<std::uint32_t> nodes;
            for (double along : stations) {
                const double wobble = 3.0 * (unit_interval(choice_hash(seed(), motorway_wobble, number, static_cast<std::uint64_t>(static_cast<std::int64_t>(along + 1000)))) - 0.5);
                nodes.push_back(add_node(motorway_point(orientation, along, centre + across_offset + wobble)));
            }
            return nodes;
        };
        const std::vector<std::uint32_t> increasing = node_row(side * kHalfGap);
        std::vector<std::uint32_t> decreasing = node_row(-side * kHalfGap);
        std::reverse(decreasing.begin(), decreasing.end());
        const auto station_index = [&](double along) {
            return static_cast<std::size_t>(std::lower_bound(stations.begin(), stations.end(), along) - stations.begin());
        };
        const std::uint32_t name = number;
        // Carriageways, split at every ramp node.
        const auto add_carriageway = [&](const std::vector<std::uint32_t>& nodes, bool forward) {
            std::vector<std::uint32_t> piece{nodes.front()};
            for (std::size_t i = 1; i < nodes.size(); ++i) {
                piece.push_back(nodes[i]);
                const double along = stations[forward ? i : stations.size() - 1 - i];
                bool ramp_node = i + 1 == nodes.size();
                for (std::uint32_t exit : exits) ramp_node |= std::abs(std::abs(along - other.lattice[exit].position) - kRampReach) < 1e-6;
                if (!ramp_node) continue;
                add_side_way(piece, RoadKind::motorway, name, 1, (number % 3 == 0) ? 100 : 0);
                piece.assign(1, nodes[i]);
            }
        };
        add_carriageway(increasing, true);
        add_carriageway(decreasing, false);

        const std::uint32_t near_line = side < 0 ? lower : upper;   // the line beside the increasing carriageway
        const std::uint32_t far_line = side < 0 ? upper : lower;
        const auto lattice_point = [&](std::uint32_t street_line, std::uint32_t cross) {
            return orientation == kRows ? lattice_node(street_line, cross) : lattice_node(cross, street_line);
        };
        const auto ramp = [&](std::uint32_t from, Point2 bend, std::uint32_t to) {
            add_side_way({from, add_node(bend), to}, RoadKind::motorway_link, 0, 0, 0);
        };
        for (std::uint32_t exit : exits) {
            const double at = other.lattice[exit].position;
            const std::size_t before = station_index(at - kRampReach), after = station_index(at + kRampReach);
            const double near_across = (centre + side * kHalfGap + axis.lattice[near_line].position) / 2;
            const double far_across = (centre - side * kHalfGap + axis.lattice[far_line].position) / 2;
            const std::uint32_t near_point = lattice_point(near_line, exit), far_point = lattice_point(far_line, exit);
            // Increasing carriageway: off before the arterial, on after it; decreasing: the mirror.
            ramp(increasing[before], motorway_point(orientation, at - 90, near_across), near_point);
            ramp(near_point, motorway_point(orientation, at + 90, near_across), increasing[after]);
            const std::size_t last = stations.size() - 1;
            ramp(decreasing[last - after], motorway_point(orientation, at + 90, far_across), far_point);
            ramp(far_point, motorway_point(orientation, at - 90, far_across), decreasing[last - before]);
        }
        // Turnarounds at both ends keep each carriageway from running into nothing.
        ramp(increasing.back(), motorway_point(orientation, end + 60, centre), decreasing.front());
        ramp(decreasing.back(), motorway_point(orientation, start - 60, centre), increasing.front());
    }

    void fill_figures() {
        PlanFigures& figures = plan_.figures;
        figures.grid_rows = request_.rows;
        figures.grid_columns = request_.columns;
        figures.width_m = width_;
        figures.height_m = height_;
        std::int32_t min_lat = std::numeric_limits<std::int32_t>::max(), min_lon = min_lat;
        std::int32_t max_lat = std::numeric_limits<std::int32_t>::min(), max_lon = max_lat;
        for (const PlannedNode& node : plan_.nodes) {
            min_lat = std::min(min_lat, node.lat), max_lat = std::max(max_lat, node.lat);
            min_lon = std::min(min_lon, node.lon), max_lon = std::max(max_lon, node.lon);
        }
        figures.min_lat = min_lat * 1e-7, figures.max_lat = max_lat * 1e-7;
        figures.min_lon = min_lon * 1e-7, figures.max_lon = max_lon * 1e-7;
        figures.junctions = count_car_junctions(plan_);
    }

    GridRequest request_;
    std::vector<std::uint64_t>* candidate_hashes_;
    Axis axes_[2];
    double width_ = 0, height_ = 0, lon_metres_per_degree_ = 0;
    RegionPlan plan_;
    std::vector<std::uint32_t> current_;
    PlannedWay way_template_{};
    std::vector<PlannedWay> side_ways_;
    std::vector<std::uint32_t> side_way_nodes_;
    std::unordered_map<std::uint32_t, std::uint32_t> rings_;
    std::unordered_map<std::uint32_t, CrossingWays> crossings_;
};

} // namespace

RegionPlan plan_street_grid(const GridRequest& request, std::vector<std::uint64_t>* candidate_hashes) {
    return GridPlanner{request, candidate_hashes}.run();
}

} // namespace ringroad::synth
