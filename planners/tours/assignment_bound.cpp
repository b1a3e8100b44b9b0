#include "planners/tours/assignment_bound.hpp"

#include <cmath>
#include <vector>

namespace ringroad::planners::tours {

double assignment_bound(const matrices::CostMatrix& costs) {
    const std::size_t n = costs.size();
    if (n < 2) return 0.0;
    // A city may not be its own successor: give the diagonal a cost above any assignment.
    double largest = 0.0;
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j)
            if (i != j && std::isfinite(costs(i, j))) largest = std::max(largest, costs(i, j));
    const double forbidden = (largest + 1.0) * static_cast<double>(n + 1);
    auto cost = [&](std::size_t row, std::size_t column) {
        const double value = costs(row - 1, column - 1);
        return row == column || !std::isfinite(value) ? forbidden : value;
    };
    // Rows and columns are 1-based; column 0 is the virtual start of each augmenting path.
    std::vector<double> row_potential(n + 1, 0.0), column_potential(n + 1, 0.0);
    std::vector<std::size_t> row_of_column(n + 1, 0), way(n + 1, 0);
    for (std::size_t row = 1; row <= n; ++row) {
        row_of_column[0] = row;
        std::size_t column = 0;
        std::vector<double> slack(n + 1, matrices::kMissingCost);
        std::vector<bool> used(n + 1, false);
        do {
            used[column] = true;
            const std::size_t current_row = row_of_column[column];
            double delta = matrices::kMissingCost;
            std::size_t next_column = 0;
            for (std::size_t j = 1; j <= n; ++j) {
                if (used[j]) continue;
                const double reduced = cost(current_row, j) - row_potential[current_row] - column_potential[j];
                if (reduced < slack[j]) {
                    slack[j] = reduced;
                    way[j] = column;
                }
                if (slack[j] < delta) {
                    delta = slack[j];
                    next_column = j;
                }
            }
            for (std::size_t j = 0; j <= n; ++j) {
                if (used[j]) {
                    row_potential[row_of_column[j]] += delta;
                    column_potential[j] -= delta;
                } else {
                    slack[j] -= delta;
                }
            }
            column = next_column;
        } while (row_of_column[column] != 0);
        do {
            const std::size_t previous = way[column];
            row_of_column[column] = row_of_column[previous];
            column = previous;
        } while (column != 0);
    }
    double total = 0.0;
    for (std::size_t j = 1; j <= n; ++j) total += cost(row_of_column[j], j);
    return total;
}

} // namespace ringroad::planners::tours
