// A tour request's time limit must be a number of seconds from 0 to a day: NaN, infinities and
// values whose work budget would not fit a 64-bit count are refused as input errors, whichever
// front door the request came through. The matrix: six points on a line (any would do).
#include "common/input_error.hpp"
#include "planners/tours/tour_planner.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

using namespace ringroad;

TEST_CASE("time limits outside 0 .. 86400 seconds are refused") {
    planners::matrices::CostMatrix costs(6);
    for (std::size_t i = 0; i < 6; ++i)
        for (std::size_t j = 0; j < 6; ++j)
            if (i != j) costs(i, j) = std::fabs(static_cast<double>(i) - static_cast<double>(j));
    for (const double limit : {std::nan(""), std::numeric_limits<double>::infinity(), 1e20, 86400.5, -1.0}) {
        CAPTURE(limit);
        planners::tours::TourRequest request;
        request.time_limit_seconds = limit;
        request.exact_limit = 0;
        CHECK_THROWS_AS(planners::tours::plan_tour(costs, request), InputError);
    }
    planners::tours::TourRequest request;
    request.time_limit_seconds = 0.0;
    request.exact_limit = 0;
    CHECK(planners::tours::plan_tour(costs, request).order.size() == 6);
}
