#pragma once
// Minimum spanning tree of the stops of a cost matrix, by Kruskal's algorithm with union–find.
//
// A link joins two stops and can be built in either direction (a cable, a pipe, a shared road
// section), so an asymmetric matrix is first made symmetric by a stated rule:
//  * cheaper_direction (default): a link {a,b} costs min(c(a,b), c(b,a)) — it is built once, along
//    whichever direction is cheaper; the tree is then a lower bound for any network that joins
//    the stops in at least one direction;
//  * dearer_direction: max(c(a,b), c(b,a)) — when both directions must be usable at that cost.
// A missing entry in one direction falls back to the other under cheaper_direction and makes the
// link unusable under dearer_direction.
//
// When the stops cannot all be joined, minimum_spanning_forest returns one tree per group
// (component_count > 1); minimum_spanning_tree throws InputError naming a stop that is not joined.

#include "planners/matrices/cost_matrix.hpp"

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace ringroad::planners::networks {

enum class LinkCostRule { cheaper_direction, dearer_direction };
std::string_view link_cost_rule_name(LinkCostRule rule);   // "min(c(a,b), c(b,a))", ...

struct SpanningLink {
    std::size_t from;   // the cheaper direction (from -> to) under cheaper_direction
    std::size_t to;
    double cost;
};

struct SpanningForest {
    std::vector<SpanningLink> links;   // in the order Kruskal accepted them (by cost)
    double cost = 0.0;
    std::size_t component_count = 0;   // 1 when every stop is joined (or size <= 1)
    std::vector<std::size_t> component_of;  // per stop, numbered from 0 in order of first stop
};

SpanningForest minimum_spanning_forest(const matrices::CostMatrix& costs,
                                       LinkCostRule rule = LinkCostRule::cheaper_direction);

// Throws InputError("stop 'X' cannot be joined to stop 'Y' ...") when the forest has more than
// one tree; `ids` name the stops in messages.
SpanningForest minimum_spanning_tree(const matrices::LabelledMatrix& matrix,
                                     LinkCostRule rule = LinkCostRule::cheaper_direction);

} // namespace ringroad::planners::networks
