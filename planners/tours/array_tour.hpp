#pragma once
// ArrayTour: a closed tour stored as an array of cities plus each city's position, so the
// neighbours of a city and the order of three cities are O(1) questions. Changes are path
// reversals; every reversal is written to a journal so that a rejected trial can be undone
// exactly (undo_to), which is what iterated local search needs after a failed perturbation.
// Each element moved is counted in `work`, the deterministic clock of the search.

#include "planners/tours/closed_tour.hpp"

#include <cstddef>
#include <cstdint>
#include <utility>
#include <vector>

namespace ringroad::planners::tours {

class ArrayTour {
public:
    explicit ArrayTour(const ClosedTour& tour);

    int size() const noexcept { return static_cast<int>(order_.size()); }
    int at(int position) const { return order_[static_cast<std::size_t>(wrap(position))]; }
    int position(int city) const { return position_[static_cast<std::size_t>(city)]; }
    int next(int city) const { return at(position(city) + 1); }
    int previous(int city) const { return at(position(city) - 1); }
    // Steps from `from` to `to` walking forward (0 when equal).
    int forward_distance(int from, int to) const { return wrap(position(to) - position(from)); }

    // Reverses the cyclic stretch of positions first..last (inclusive), exactly as given.
    void reverse_positions(int first, int last);
    // Symmetric costs only: reverses the forward path from `from` to `to`, or the rest of the
    // tour when that is shorter (same cycle, opposite orientation).
    void reverse_path(int from, int to);
    // Symmetric 2-opt: removes edges {a,b} and {c,d} and adds {a,c} and {b,d}. Requires b and d
    // to follow a and c in the same direction (both next, or both previous).
    void two_opt_move(int a, int b, int c, int d);
    // Orientation-preserving exchange of two adjacent stretches: positions p+1..p+first_length
    // (B) and the following second_length positions (C) become C then B, each in its own
    // direction (three reversals). Valid for asymmetric costs.
    void exchange_segments(int position_before, int first_length, int second_length);

    std::size_t journal_mark() const noexcept { return journal_.size(); }
    void undo_to(std::size_t mark);
    void clear_journal() { journal_.clear(); }

    ClosedTour cities() const { return order_; }
    std::uint64_t work = 0;

private:
    int wrap(int position) const {
        const int n = size();
        position %= n;
        return position < 0 ? position + n : position;
    }
    void reverse_without_journal(int first, int last);

    std::vector<int> order_;
    std::vector<int> position_;
    std::vector<std::pair<int, int>> journal_;
};

} // namespace ringroad::planners::tours
