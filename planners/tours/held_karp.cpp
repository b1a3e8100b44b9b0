#include "planners/tours/held_karp.hpp"

#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <type_traits>

namespace ringroad::planners::tours {
namespace {

// Whether the uint32 table is exact for this matrix: all finite entries are non-negative
// integers and no path (at most n hops) can reach the sentinel.
bool fits_unsigned_table(const matrices::CostMatrix& costs) {
    double largest = 0.0;
    for (std::size_t from = 0; from < costs.size(); ++from)
        for (std::size_t to = 0; to < costs.size(); ++to) {
            const double value = costs(from, to);
            if (!std::isfinite(value)) continue;
            if (value < 0.0 || value != std::floor(value)) return false;
            largest = std::max(largest, value);
        }
    // Below half the range, so two entries add without overflow and no infinity checks are needed.
    const double sentinel = static_cast<double>(std::numeric_limits<std::uint32_t>::max() / 2);
    return largest * static_cast<double>(costs.size() + 1) < sentinel;
}

template <typename Value>
struct ValueTraits {
    static_assert(std::is_same_v<Value, std::uint32_t> || std::is_same_v<Value, double>,
                  "the Held–Karp table holds uint32 (exact integers) or double costs");
    // uint32: "infinite" is half the range; sums of two entries stay below 2^32 and are
    // clamped back, so the inner loop is a plain add and min.
    static Value infinite() {
        if constexpr (std::is_same_v<Value, double>) return matrices::kMissingCost;
        else return std::numeric_limits<Value>::max() / 2;
    }
    static Value from(double cost) { return std::isfinite(cost) ? static_cast<Value>(cost) : infinite(); }
    static Value add(Value a, Value b) { return a + b; }
    static Value clamp(Value v) {
        if constexpr (std::is_same_v<Value, double>) return v;
        else return std::min(v, infinite());
    }
    static double to_double(Value v) { return v >= infinite() ? matrices::kMissingCost : static_cast<double>(v); }
};

template <typename Value>
HeldKarpResult solve(const matrices::CostMatrix& costs, std::size_t start, TripShape shape, std::size_t end) {
    using Traits = ValueTraits<Value>;
    const std::size_t n = costs.size();
    const std::size_t m = n - 1;              // stops other than the start
    std::vector<std::size_t> others;
    for (std::size_t stop = 0; stop < n; ++stop)
        if (stop != start) others.push_back(stop);

    std::vector<Value> between(m * m);
    for (std::size_t k = 0; k < m; ++k)
        for (std::size_t j = 0; j < m; ++j) between[k * m + j] = Traits::from(costs(others[k], others[j]));

    // table[mask * m + j]: cheapest path from the start through exactly the stops of `mask`,
    // ending at others[j] (j in mask).
    const std::size_t masks = std::size_t{1} << m;
    std::vector<Value> table(masks * m, Traits::infinite());
    for (std::size_t j = 0; j < m; ++j) table[(std::size_t{1} << j) * m + j] = Traits::from(costs(start, others[j]));
    for (std::size_t mask = 1; mask < masks; ++mask) {
        if ((mask & (mask - 1)) == 0) continue;
        for (std::size_t j = 0; j < m; ++j) {
            if (!(mask >> j & 1)) continue;
            const std::size_t previous = mask ^ (std::size_t{1} << j);
            const Value* row = &table[previous * m];
            Value best = Traits::infinite();
            for (std::size_t bits = previous; bits != 0; bits &= bits - 1) {
                const auto k = static_cast<std::size_t>(__builtin_ctzll(bits));
                const Value candidate = Traits::add(row[k], between[k * m + j]);
                if (candidate < best) best = candidate;
            }
            table[mask * m + j] = Traits::clamp(best);
        }
    }

    const std::size_t full = masks - 1;
    std::size_t last = 0;
    Value best_total = Traits::infinite();
    for (std::size_t j = 0; j < m; ++j) {
        if (shape == TripShape::open_fixed_end && others[j] != end) continue;
        Value total = table[full * m + j];
        if (shape == TripShape::closed) total = Traits::clamp(Traits::add(total, Traits::from(costs(others[j], start))));
        if (total < best_total) {
            best_total = total;
            last = j;
        }
    }

    HeldKarpResult result;
    result.cost = Traits::to_double(best_total);
    if (best_total == Traits::infinite()) return result;

    // Walk back: the predecessor is any k whose entry plus the hop reproduces the stored value
    // (the same arithmetic as the forward pass, so equality is exact).
    std::vector<std::size_t> reversed{others[last]};
    std::size_t mask = full;
    std::size_t current = last;
    while ((mask & (mask - 1)) != 0) {
        const std::size_t previous = mask ^ (std::size_t{1} << current);
        for (std::size_t k = 0; k < m; ++k) {
            if (!(previous >> k & 1)) continue;
            if (Traits::clamp(Traits::add(table[previous * m + k], between[k * m + current])) == table[mask * m + current]) {
                current = k;
                break;
            }
        }
        mask = previous;
        reversed.push_back(others[current]);
    }
    result.order.push_back(start);
    result.order.insert(result.order.end(), reversed.rbegin(), reversed.rend());
    return result;
}

} // namespace

HeldKarpResult held_karp(const matrices::CostMatrix& costs, std::size_t start, TripShape shape, std::size_t end) {
    const std::size_t n = costs.size();
    if (n == 0 || n > kHeldKarpMaximumStops || start >= n || (shape == TripShape::open_fixed_end && end >= n))
        throw std::invalid_argument("held_karp: matrix size or start/end out of range");
    if (shape == TripShape::open_fixed_end && end == start) shape = TripShape::closed;
    if (n == 1) return HeldKarpResult{{start}, 0.0};
    return fits_unsigned_table(costs) ? solve<std::uint32_t>(costs, start, shape, end)
                                      : solve<double>(costs, start, shape, end);
}

} // namespace ringroad::planners::tours
