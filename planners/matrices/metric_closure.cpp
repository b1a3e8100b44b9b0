#include "planners/matrices/metric_closure.hpp"

#include <cmath>

namespace ringroad::planners::matrices {

MetricClosure metric_closure(const CostMatrix& costs) {
    MetricClosure result{costs, 0, 0};
    CostMatrix& closed = result.costs;
    const std::size_t size = costs.size();
    // A stop reached from itself costs nothing; a positive diagonal would leak into chains.
    for (std::size_t i = 0; i < size; ++i) closed(i, i) = 0.0;
    for (std::size_t via = 0; via < size; ++via) {
        for (std::size_t from = 0; from < size; ++from) {
            const double to_via = closed(from, via);
            if (!std::isfinite(to_via)) continue;
            for (std::size_t to = 0; to < size; ++to) {
                const double through = to_via + closed(via, to);
                if (through < closed(from, to)) closed(from, to) = through;
            }
        }
    }
    for (std::size_t from = 0; from < size; ++from) {
        for (std::size_t to = 0; to < size; ++to) {
            if (from == to || closed(from, to) == costs(from, to)) continue;
            if (costs.has(from, to)) ++result.entries_shortened;
            else ++result.entries_filled;
        }
    }
    return result;
}

} // namespace ringroad::planners::matrices
