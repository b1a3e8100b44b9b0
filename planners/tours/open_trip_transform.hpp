#pragma once
// Open trips as closed tours. One extra city d is added and priced so that every cheap closed
// tour passes through d between the trip's end and its start:
//  * fixed end e (start s): d links only to e and s, at cost 0 (asymmetric: only e->d and d->s);
//    the closed tour ... e d s ... is the trip s..e plus 0;
//  * free end: asymmetric: j->d costs 0 for every j and d->s costs 0, so the closed tour is the
//    trip plus 0 and the trip may end anywhere; symmetric: d-s costs 0 and d-j costs a constant
//    K for every other j, so every sensible closed tour has d next to s and one other stop; the
//    closed tour costs the trip plus K (K is recorded and subtracted).
// Links d must not use cost `unusable` (above any tour), so they are never worth taking.
// The transform keeps a symmetric matrix symmetric, so the symmetric methods still apply.

#include "planners/tours/closed_tour.hpp"
#include "planners/tours/tour_planner.hpp"

#include <cstddef>
#include <vector>

namespace ringroad::planners::tours {

struct ClosedTripProblem {
    matrices::CostMatrix costs;
    int start = 0;
    int joining_city = -1;   // d, or -1 for a closed tour
    double constant = 0.0;   // closed tour cost = trip cost + constant
};

// Takes the matrix by value: a closed tour keeps it as it is (moved, not copied).
ClosedTripProblem close_trip(matrices::CostMatrix finite_costs, bool symmetric, const TourRequest& request,
                             double free_end_constant, double unusable);

// The trip's stops in order, starting at the start; empty if the closed tour does not pass
// through d next to the start (a tour the transform prices out, so never a cheap one).
std::vector<std::size_t> trip_order(const ClosedTripProblem& problem, const ClosedTour& tour, bool symmetric);

} // namespace ringroad::planners::tours
