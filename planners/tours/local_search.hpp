#pragma once
// Local search on a closed tour: repeatedly applies improving moves around "active" cities
// (a FIFO of cities whose don't-look bit is off, Bentley 1992) until none improves.
//  * symmetric costs: 2-opt and Or-opt (segments of 1-3 cities, inserted either way round);
//  * asymmetric costs: moves that keep every segment's direction: Or-opt without reversal and
//    the segment exchange (the reversal-free 3-opt move a->b'..c->a'..b->c').
// All moves look only at candidate-list neighbours. `cost` is kept up to date by the gains.

#include "planners/matrices/cost_matrix.hpp"
#include "planners/tours/array_tour.hpp"
#include "planners/tours/candidate_lists.hpp"

#include <deque>
#include <vector>

namespace ringroad::planners::tours {

class ActiveCities {
public:
    explicit ActiveCities(std::size_t cities) : queued_(cities, false) {}
    void push(int city) {
        if (queued_[static_cast<std::size_t>(city)]) return;
        queued_[static_cast<std::size_t>(city)] = true;
        fifo_.push_back(city);
    }
    bool empty() const noexcept { return fifo_.empty(); }
    int pop() {
        const int city = fifo_.front();
        fifo_.pop_front();
        queued_[static_cast<std::size_t>(city)] = false;
        return city;
    }

private:
    std::vector<bool> queued_;
    std::deque<int> fifo_;
};

struct SearchState {
    const matrices::CostMatrix& costs;
    const CandidateLists& successors;     // symmetric: the neighbour lists
    const CandidateLists& predecessors;   // symmetric: the same lists
    ArrayTour& tour;
    ActiveCities& active;
    double epsilon;                       // smallest gain worth taking (guards rounding loops)
    double cost;

    double c(int from, int to) const {
        return costs(static_cast<std::size_t>(from), static_cast<std::size_t>(to));
    }
    void activate(std::initializer_list<int> cities) {
        for (int city : cities) active.push(city);
    }
};

void run_local_search(SearchState& state, bool symmetric);

} // namespace ringroad::planners::tours
