#include "planners/networks/spanning_tree.hpp"

#include "planners/networks/disjoint_sets.hpp"

#include "common/input_error.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

namespace ringroad::planners::networks {

namespace {


// The symmetric cost of the link {a, b} under `rule`, oriented along the direction it uses.
SpanningLink candidate_link(const matrices::CostMatrix& costs, std::size_t a, std::size_t b, LinkCostRule rule) {
    const double forward = costs(a, b);
    const double backward = costs(b, a);
    if (rule == LinkCostRule::dearer_direction) return {a, b, std::max(forward, backward)};
    if (backward < forward) return {b, a, backward};
    return {a, b, forward};
}

std::vector<SpanningLink> sorted_candidates(const matrices::CostMatrix& costs, LinkCostRule rule) {
    std::vector<SpanningLink> candidates;
    const std::size_t size = costs.size();
    candidates.reserve(size * (size - 1) / 2);
    for (std::size_t a = 0; a < size; ++a) {
        for (std::size_t b = a + 1; b < size; ++b) {
            const SpanningLink link = candidate_link(costs, a, b, rule);
            if (std::isfinite(link.cost)) candidates.push_back(link);
        }
    }
    // Ties broken by stop indices so the tree does not depend on the sort's whims.
    std::sort(candidates.begin(), candidates.end(), [](const SpanningLink& x, const SpanningLink& y) {
        if (x.cost != y.cost) return x.cost < y.cost;
        const auto low_x = std::minmax(x.from, x.to);
        const auto low_y = std::minmax(y.from, y.to);
        return low_x < low_y;
    });
    return candidates;
}

void number_components(DisjointSets& sets, std::size_t size, SpanningForest& forest) {
    std::vector<std::size_t> number_of_root(size, size);
    forest.component_of.resize(size);
    for (std::size_t stop = 0; stop < size; ++stop) {
        const std::size_t root = sets.find(stop);
        if (number_of_root[root] == size) number_of_root[root] = forest.component_count++;
        forest.component_of[stop] = number_of_root[root];
    }
}

} // namespace

std::string_view link_cost_rule_name(LinkCostRule rule) {
    return rule == LinkCostRule::cheaper_direction ? "min(c(a,b), c(b,a))" : "max(c(a,b), c(b,a))";
}

SpanningForest minimum_spanning_forest(const matrices::CostMatrix& costs, LinkCostRule rule) {
    const std::size_t size = costs.size();
    SpanningForest forest;
    if (size == 0) return forest;
    DisjointSets sets(size);
    for (const SpanningLink& link : sorted_candidates(costs, rule)) {
        if (!sets.unite(link.from, link.to)) continue;
        forest.links.push_back(link);
        forest.cost += link.cost;
        if (forest.links.size() + 1 == size) break;
    }
    number_components(sets, size, forest);
    return forest;
}

SpanningForest minimum_spanning_tree(const matrices::LabelledMatrix& matrix, LinkCostRule rule) {
    SpanningForest forest = minimum_spanning_forest(matrix.costs, rule);
    if (forest.component_count <= 1) return forest;
    const auto unjoined = std::find_if(forest.component_of.begin(), forest.component_of.end(),
                                       [](std::size_t component) { return component != 0; });
    const std::size_t stop = static_cast<std::size_t>(unjoined - forest.component_of.begin());
    const std::string rule_note = rule == LinkCostRule::cheaper_direction
                                      ? "no chain of entries in either direction"
                                      : "no chain of links usable in both directions";
    throw InputError("stop '" + matrix.ids[stop] + "' cannot be joined to stop '" + matrix.ids[0] +
                     "': " + rule_note + " (" + std::to_string(forest.component_count) +
                     " separate groups of stops)");
}

} // namespace ringroad::planners::networks
